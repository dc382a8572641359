import type { RequestHandler } from "express";
import { ApiError } from "../lib/api-error";
import { hasRole, type Role } from "@shared/types/auth";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * 401 for a visitor; 403 when the signed-in role ranks below `min` (admin ⊃ curator ⊃ depositor).
 *
 * Personal API tokens (Bearer) carry their owner's role for reading, and may do what a depositor does
 * (deposits, new versions). Curator and admin *writes* (review decisions, corrections, withdrawal, role
 * changes, pipeline settings and batches) need a signed-in browser session: a leaked script token must
 * not publish, withdraw or hand out roles. Such a request answers 403 `session_required`.
 */
export function requireRole(min: Role): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) throw ApiError.unauthorized();
    if (!hasRole(req.user, min)) throw ApiError.forbidden(`This needs the ${min} role.`);
    if (min !== "depositor" && req.authVia === "token" && !SAFE_METHODS.has(req.method)) throw sessionRequired();
    next();
  };
}

export function sessionRequired(): ApiError {
  return new ApiError(403, "session_required", "This action needs a signed-in browser session; API tokens cannot do it.");
}

/** Only a browser session, never an API token (e.g. reading the outbox, which holds live account links). */
export const requireBrowserSession: RequestHandler = (req, _res, next) => {
  if (!req.user) throw ApiError.unauthorized();
  if (req.authVia === "token") throw sessionRequired();
  next();
};

/** Any signed-in account. */
export const requireSignedIn: RequestHandler = requireRole("depositor");

export { hasRole };
