import type { RequestHandler } from "express";
import { ApiError } from "../lib/api-error";
import type { Role } from "../models/user.model";

const RANK: Record<Role, number> = { depositor: 1, curator: 2, admin: 3 };

/** 401 for a visitor; 403 when the signed-in role ranks below `min` (admin ⊃ curator ⊃ depositor). */
export function requireRole(min: Role): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) throw ApiError.unauthorized();
    if (RANK[req.user.role] < RANK[min]) throw ApiError.forbidden(`This needs the ${min} role.`);
    next();
  };
}

/** Any signed-in account. */
export const requireSignedIn: RequestHandler = requireRole("depositor");

export function hasRole(user: { role: Role } | undefined, min: Role): boolean {
  return !!user && RANK[user.role] >= RANK[min];
}
