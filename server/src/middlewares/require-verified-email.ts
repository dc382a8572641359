import type { RequestHandler } from "express";
import { ApiError } from "../lib/api-error";

/**
 * For actions that need a confirmed e-mail address (depositing). Use after `requireRole(...)`.
 * 401 for a visitor; 403 `email_unverified` for an account whose address is not confirmed yet.
 */
export const requireVerifiedEmail: RequestHandler = (req, _res, next) => {
  if (!req.user) throw ApiError.unauthorized();
  if (!req.user.emailVerified) {
    throw new ApiError(403, "email_unverified", "Confirm your e-mail address first: open the link we sent you, or ask for a new one on your account page.");
  }
  next();
};
