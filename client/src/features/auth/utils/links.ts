import { ApiClientError } from "../../../lib/api-client";
import type { OneTimeLinkErrorCode } from "@shared/types/auth";

/**
 * Only same-origin paths are followed after sign-in (no open redirect through `?next=`). Browsers drop tabs
 * and line breaks from addresses and read a backslash as a slash, so `/\t/host` or `/\\host` would go to
 * another site: any white space, control character or backslash is refused, and the path must stay on this
 * origin once resolved the way the browser resolves it.
 */
export function safeNext(next: string | null, fallback: string): string {
  // eslint-disable-next-line no-control-regex
  if (!next || !next.startsWith("/") || /[\s\u0000-\u001f\u007f\\]/.test(next)) return fallback;
  const base = "http://same-origin.invalid";
  try {
    const u = new URL(next, base);
    return u.origin === base ? `${u.pathname}${u.search}${u.hash}` : fallback;
  } catch {
    return fallback;
  }
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
