import { randomBytes, timingSafeEqual } from "node:crypto";
import type { Request, RequestHandler } from "express";
import { ApiError } from "../lib/api-error";

/**
 * Cross-site request forgery protection (synchronizer token): every state-changing request authenticated
 * by the session cookie must carry the session's token in the `X-CSRF-Token` header. A cross-site page can
 * neither read the token nor set custom headers without a CORS pre-flight, which we never grant. Requests
 * with a Bearer token carry no cookie credentials and are exempt, and so are requests that carry no session
 * cookie at all (a script's anonymous POST /bundles: there is no session to ride on), except the /auth
 * routes, which start sessions. Cookies are also SameSite=Lax, and the API reads only JSON and multipart
 * bodies (middlewares/body.ts), which a cross-site form cannot send as JSON.
 */
export function csrfToken(req: Request): string {
  req.session.csrfToken ??= randomBytes(24).toString("base64url");
  return req.session.csrfToken;
}

const SAFE = new Set(["GET", "HEAD", "OPTIONS"]);
const SESSION_COOKIE = /(?:^|;\s*)tb\.sid=/;

export const csrfProtection: RequestHandler = (req, _res, next) => {
  if (SAFE.has(req.method) || req.authVia === "token") return next();
  if (!SESSION_COOKIE.test(req.headers.cookie ?? "") && !req.path.startsWith("/auth")) return next();
  const expected = req.session?.csrfToken;
  const got = req.get("x-csrf-token");
  if (!expected || !got || got.length !== expected.length || !timingSafeEqual(Buffer.from(got), Buffer.from(expected))) {
    throw new ApiError(403, "csrf_failed", "Missing or invalid CSRF token. Reload the page and try again.");
  }
  next();
};
