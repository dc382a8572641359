import { createHash } from "node:crypto";
import type { RequestHandler } from "express";
import { ApiToken, User } from "../models";
import { ApiError } from "../lib/api-error";
import type { AuthUser } from "../types";

export function toAuthUser(u: User): AuthUser {
  return { id: u.id, email: u.email, displayName: u.displayName, role: u.role, emailVerified: u.emailVerifiedAt !== null };
}

export function hashApiToken(secret: string): string {
  return createHash("sha256").update(secret).digest("hex");
}

/**
 * Sets `req.user` from a Bearer API token (scripts) or from the session (browser). A bad or revoked
 * token is a 401, never a silent fall-back to visitor.
 */
export const authenticate: RequestHandler = async (req, _res, next) => {
  const header = req.headers.authorization;
  if (header && /^Bearer\s+/i.test(header)) {
    const secret = header.replace(/^Bearer\s+/i, "").trim();
    const token = await ApiToken.findOne({ where: { tokenHash: hashApiToken(secret) } });
    if (!token || token.revokedAt) throw new ApiError(401, "invalid_token", "The API token is not valid or has been revoked.");
    const user = await User.findByPk(token.userId);
    if (!user) throw new ApiError(401, "invalid_token", "The API token is not valid or has been revoked.");
    req.user = toAuthUser(user);
    req.authVia = "token";
    req.apiTokenId = token.id;
    // Not awaited on the hot path: last use is informative only.
    void ApiToken.update({ lastUsedAt: new Date() }, { where: { id: token.id } }).catch(() => undefined);
    return next();
  }
  const userId = req.session?.userId;
  if (userId) {
    const user = await User.findByPk(userId);
    if (user) {
      req.user = toAuthUser(user);
      req.authVia = "session";
    } else {
      delete req.session.userId;
    }
  }
  next();
};
