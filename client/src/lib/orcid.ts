/**
 * Sign-in with ORCID from any page: ask the server for ORCID's sign-in address (it keeps the OpenID
 * Connect state, nonce and PKCE verifier in the session) and go there. The outcome comes back as a
 * redirect: `?orcidError=<code>` on the sign-in or Account page, whose messages are here.
 */
import { apiFetch } from "./api-client";

export async function goToOrcid(intent: "sign-in" | "link", next?: string): Promise<void> {
  const { url } = await apiFetch<{ url: string }>("/auth/orcid/start", { method: "POST", json: { intent, next } });
  window.location.assign(url);
}

export const ORCID_ERRORS: Record<string, string> = {
  orcid_state: "The answer from ORCID did not belong to this sign-in (its state did not match), so it was refused and nothing was changed. Start again from this page.",
  orcid_nonce: "ORCID's identity token did not belong to this sign-in (its nonce did not match), so it was refused and nothing was changed. Start again from this page.",
  orcid_denied: "You cancelled at ORCID: your iD was not shared and nothing was changed.",
  orcid_expired: "That ORCID sign-in had expired or was already used. Start again from this page.",
  orcid_taken: "This ORCID iD is already linked to another Tanglebank account. Sign in to that account, or unlink the iD there first.",
  orcid_failed: "ORCID sign-in could not be completed. Try again in a moment.",
  orcid_off: "Sign-in with ORCID is turned off on this server.",
};

export function orcidErrorMessage(code: string | null): string | null {
  return code ? (ORCID_ERRORS[code] ?? ORCID_ERRORS.orcid_failed) : null;
}
