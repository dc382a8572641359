import { ApiClientError } from "../../../lib/api-client";
import type { OneTimeLinkErrorCode } from "@shared/types/auth";

/** Only same-site paths are followed after sign-in (no open redirect through `?next=`). */
export function safeNext(next: string | null, fallback: string): string {
  if (!next || !next.startsWith("/") || next.startsWith("//") || next.startsWith("/\\")) return fallback;
  return next;
}

/** What a page says about a one-time link the server refused. */
export function linkProblem(err: unknown, what: "confirmation" | "password reset"): { code: OneTimeLinkErrorCode | "other"; title: string; text: string } {
  const code = err instanceof ApiClientError ? err.code : "other";
  switch (code) {
    case "link_expired":
      return { code, title: "This link has expired", text: `The ${what} link is too old. Ask for a new one below; it arrives within a minute.` };
    case "link_used":
      return {
        code,
        title: "This link has already been used",
        text: what === "confirmation" ? "Each link works once. If you opened it before, your address is already confirmed: just sign in." : "Each link works once. If you need to change your password again, ask for a new link.",
      };
    case "link_invalid":
      return { code, title: "This link is not valid", text: `Check that you opened the whole address from the e-mail; some mail programs break long links. You can ask for a new ${what} link.` };
    default:
      return { code: "other", title: "Something went wrong", text: err instanceof Error ? err.message : "Please try again." };
  }
}

export const PASSWORD_HINT = "At least 10 characters, with at least one letter and one digit.";
