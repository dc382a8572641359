/**
 * Account rules: sign-up, one-time links (address verification, password reset), credential checks,
 * and ending a person's other sessions. Only the SHA-256 of a link's token is stored.
 *
 * Decision: an account whose address is not yet confirmed may sign in (so the person can resend the link
 * and fill in the profile), but `emailVerified` is false and depositing needs a confirmed address
 * (`requireVerifiedEmail`).
 */
import { createHash, randomBytes } from "node:crypto";
import { Op, QueryTypes, type Transaction, where, fn, col } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { ApiToken, User, UserToken } from "../../models";
import type { UserTokenPurpose } from "../../models/user-token.model";
import { ApiError } from "../../lib/api-error";
import { hashPassword, verifyPassword } from "../../lib/passwords";
import { audit } from "../../lib/audit";
import { config } from "../../config/env";
import { sendMail, type EmailContent } from "../../emails/mailer";
import { accountVerifyEmail } from "../../emails/templates/account-verify-email";
import { accountPasswordReset } from "../../emails/templates/account-password-reset";
import { logger } from "../../lib/logger";

export const VERIFY_TTL_HOURS = 48;
export const RESET_TTL_MINUTES = 60;

export function hashLinkToken(raw: string): string {
  return createHash("sha256").update(raw).digest("hex");
}

/** Looks a user up by e-mail, case-insensitively (the unique index is on lower(email)). */
export function findUserByEmail(email: string, transaction?: Transaction): Promise<User | null> {
  return User.findOne({ where: where(fn("lower", col("email")), email.trim().toLowerCase()), transaction });
}

async function issueLinkToken(userId: number, purpose: UserTokenPurpose, ttlMs: number, transaction?: Transaction): Promise<string> {
  const raw = randomBytes(32).toString("base64url");
  await UserToken.create({ userId, purpose, tokenHash: hashLinkToken(raw), expiresAt: new Date(Date.now() + ttlMs) }, { transaction });
  return raw;
}

/** Sends without making the caller wait for (or fail on) the mail server; a failure is logged. */
function deliver(to: string, content: EmailContent): Promise<void> {
  return sendMail(to, content).catch((err: unknown) => logger.error({ err, to, subject: content.subject }, "could not send mail"));
}

function linkUrl(page: "verify-email" | "reset-password", raw: string): string {
  return `${config().publicUrl}/${page}?token=${encodeURIComponent(raw)}`;
}

/**
 * Finds the token row for a one-time link and locks it. Unknown → 400 link_invalid; used → 410 link_used;
 * past its expiry → 410 link_expired.
 */
async function takeLinkToken(raw: string, purpose: UserTokenPurpose, transaction: Transaction): Promise<UserToken> {
  const token = await UserToken.findOne({ where: { tokenHash: hashLinkToken(raw), purpose }, transaction, lock: transaction.LOCK.UPDATE });
  const what = purpose === "verify-email" ? "confirmation" : "password reset";
  if (!token) throw new ApiError(400, "link_invalid", `This ${what} link is not valid. Check that you copied the whole address from the e-mail.`);
  if (token.usedAt) throw new ApiError(410, "link_used", `This ${what} link has already been used. Each link works once.`);
  if (token.expiresAt.getTime() <= Date.now()) throw new ApiError(410, "link_expired", `This ${what} link has expired. Ask for a new one.`);
  return token;
}

/** Stores a new confirmation token and hands the mail to SMTP without waiting for it (a slow mail server must not hold up the answer). */
export async function sendVerificationEmail(user: User): Promise<void> {
  const raw = await issueLinkToken(user.id, "verify-email", VERIFY_TTL_HOURS * 3600 * 1000);
  void deliver(user.email, accountVerifyEmail({ displayName: user.displayName, url: linkUrl("verify-email", raw), validHours: VERIFY_TTL_HOURS }));
}

export async function signUp(input: { email: string; displayName: string; password: string }): Promise<User> {
  const passwordHash = await hashPassword(input.password);
  const user = await sequelize().transaction(async (t) => {
    if (await findUserByEmail(input.email, t)) {
      throw ApiError.conflict("An account with this e-mail address already exists. Sign in, or reset your password if you forgot it.", [
        { path: "/email", message: "An account with this e-mail address already exists." },
      ]);
    }
    const u = await User.create({ email: input.email, displayName: input.displayName, passwordHash }, { transaction: t });
    await audit({ actorId: u.id, action: "user.signed_up", entityType: "user", entityId: u.id }, t);
    return u;
  });
  await sendVerificationEmail(user);
  return user;
}

export async function verifyEmail(raw: string): Promise<User> {
  return sequelize().transaction(async (t) => {
    const token = await takeLinkToken(raw, "verify-email", t);
    const user = await User.findByPk(token.userId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!user) throw new ApiError(400, "link_invalid", "This confirmation link is not valid.");
    token.usedAt = new Date();
    await token.save({ transaction: t });
    if (!user.emailVerifiedAt) {
      user.emailVerifiedAt = new Date();
      await user.save({ transaction: t });
      await audit({ actorId: user.id, action: "user.email_verified", entityType: "user", entityId: user.id }, t);
    }
    return user;
  });
}

/** A new confirmation link for an unconfirmed account; silent when there is none (no account discovery). */
export async function resendVerification(email: string): Promise<void> {
  const user = await findUserByEmail(email);
  if (!user || user.emailVerifiedAt) return;
  await sendVerificationEmail(user);
}

// A real scrypt hash of a random password: comparing against it costs what a real check costs, so a
// missing account answers as slowly as a wrong password.
let dummyHash: Promise<string> | undefined;

/** The account for these credentials, or 401 with one message that does not say which part was wrong. */
export async function checkCredentials(email: string, password: string): Promise<User> {
  const user = await findUserByEmail(email);
  dummyHash ??= hashPassword(randomBytes(16).toString("hex"));
  const ok = await verifyPassword(password, user?.passwordHash ?? (await dummyHash));
  if (!user || !ok) throw new ApiError(401, "invalid_credentials", "The e-mail address or the password is not correct.");
  return user;
}

/** Always succeeds from the caller's view, whether or not the account exists. */
export async function requestPasswordReset(email: string): Promise<void> {
  const user = await findUserByEmail(email);
  if (!user) return;
  const raw = await issueLinkToken(user.id, "reset-password", RESET_TTL_MINUTES * 60 * 1000);
  void deliver(user.email, accountPasswordReset({ displayName: user.displayName, url: linkUrl("reset-password", raw), validMinutes: RESET_TTL_MINUTES }));
}

/**
 * Sets the new password, uses up this link and every other open reset link of the account, confirms the
 * address (the person just proved they read its mail), ends all the account's sessions and revokes its
 * personal API tokens (whoever knew the old password may have made one); says how many were revoked.
 */
export async function resetPassword(raw: string, password: string): Promise<User & { revokedTokens?: number }> {
  const passwordHash = await hashPassword(password);
  return sequelize().transaction(async (t) => {
    const token = await takeLinkToken(raw, "reset-password", t);
    const user = await User.findByPk(token.userId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!user) throw new ApiError(400, "link_invalid", "This password reset link is not valid.");
    const now = new Date();
    await UserToken.update({ usedAt: now }, { where: { userId: user.id, purpose: "reset-password", usedAt: { [Op.is]: null } }, transaction: t });
    user.passwordHash = passwordHash;
    user.emailVerifiedAt ??= now;
    await user.save({ transaction: t });
    await audit({ actorId: user.id, action: "user.password_reset", entityType: "user", entityId: user.id }, t);
    await endSessions(user.id, undefined, t);
    const [revoked] = await ApiToken.update({ revokedAt: now }, { where: { userId: user.id, revokedAt: { [Op.is]: null } }, transaction: t });
    return Object.assign(user, { revokedTokens: revoked });
  });
}

/** Deletes the account's stored sessions except `keepSid` (e.g. after a password change). */
export async function endSessions(userId: number, keepSid?: string, transaction?: Transaction): Promise<void> {
  await sequelize().query(`DELETE FROM session WHERE (sess->>'userId') = :uid AND sid <> :keep`, {
    replacements: { uid: String(userId), keep: keepSid ?? "" },
    type: QueryTypes.DELETE,
    transaction,
  });
}
