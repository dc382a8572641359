/**
 * Sign-in with ORCID through OpenID Connect (openid-client, a certified relying-party package): the
 * authorization code flow with PKCE (S256), `state` and `nonce` checked by the package, and the ID token's
 * signature, issuer, audience and expiry verified against the provider's published keys. The subject of
 * ORCID's ID token is the person's ORCID iD.
 *
 * Two intents: "sign-in" (an account whose verified iD is the subject is signed in; otherwise the iD waits
 * in the session, 15 minutes, for the person to create an account from it) and "link" (the signed-in
 * account gets the iD, verified). An iD verifies at most one account. Every outcome is audited.
 */
import * as oidc from "openid-client";
import { Op, where, fn, col } from "sequelize";
import { config } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { logger } from "../../lib/logger";
import { User } from "../../models";
import { findUserByEmail, sendVerificationEmail } from "./auth.service";

export const CALLBACK_PATH = "/api/v1/auth/orcid/callback";
export const FLOW_TTL_MS = 10 * 60 * 1000;
export const PENDING_TTL_MS = 15 * 60 * 1000;

/** Why an ORCID sign-in was refused; the pages turn these codes into plain messages. */
export type OrcidErrorCode = "orcid_state" | "orcid_nonce" | "orcid_denied" | "orcid_expired" | "orcid_taken" | "orcid_failed" | "orcid_off";

export class OrcidFlowError extends Error {
  constructor(
    readonly code: OrcidErrorCode,
    message: string,
  ) {
    super(message);
  }
}

let discovered: { key: string; config: Promise<oidc.Configuration> } | undefined;

/** The provider's configuration from its discovery document (cached per issuer and client). */
export function orcidClient(): Promise<oidc.Configuration> {
  const c = config().orcid;
  if (!c.enabled) return Promise.reject(new OrcidFlowError("orcid_off", "Sign-in with ORCID is turned off on this server."));
  const key = `${c.issuer}|${c.clientId}`;
  if (discovered?.key !== key) {
    const options = c.issuer.startsWith("http:") ? { execute: [oidc.allowInsecureRequests] } : undefined;
    const p = oidc.discovery(new URL(c.issuer), c.clientId, c.clientSecret, undefined, options);
    discovered = { key, config: p };
    p.catch(() => {
      if (discovered?.config === p) discovered = undefined; // try again next time
    });
  }
  return discovered.config;
}

/** Tests start a new provider: forget the discovered one. */
export function resetOrcidClient(): void {
  discovered = undefined;
}

export function redirectUri(): string {
  return `${config().publicUrl}${CALLBACK_PATH}`;
}

/** Only paths of this site (no scheme, no "//host", no backslash) may be a destination after sign-in. */
export function safeNext(next: unknown): string | undefined {
  return typeof next === "string" && /^\/(?![/\\])[^\\\s]*$/.test(next) ? next : undefined;
}

export async function startFlow(intent: "sign-in" | "link", userId: number | undefined, next: string | undefined) {
  const client = await orcidClient();
  const verifier = oidc.randomPKCECodeVerifier();
  const state = oidc.randomState();
  const nonce = oidc.randomNonce();
  const url = oidc.buildAuthorizationUrl(client, {
    redirect_uri: redirectUri(),
    scope: "openid",
    code_challenge: await oidc.calculatePKCECodeChallenge(verifier),
    code_challenge_method: "S256",
    state,
    nonce,
  });
  return { url: url.href, flow: { state, nonce, verifier, intent, userId, next, at: Date.now() } };
}

export interface VerifiedOrcid {
  orcid: string;
  givenName: string;
  familyName: string;
}

/** Exchanges the code and verifies the ID token; a refused check throws OrcidFlowError with its reason. */
export async function finishFlow(callbackUrl: URL, flow: { state: string; nonce: string; verifier: string }): Promise<VerifiedOrcid> {
  const client = await orcidClient();
  let tokens: Awaited<ReturnType<typeof oidc.authorizationCodeGrant>>;
  try {
    tokens = await oidc.authorizationCodeGrant(client, callbackUrl, { pkceCodeVerifier: flow.verifier, expectedState: flow.state, expectedNonce: flow.nonce, idTokenExpected: true });
  } catch (err) {
    // openid-client's message is general ("invalid response encountered"); the check that failed is in its cause
    const e = err as { error?: string; message?: string; cause?: { message?: string } };
    const text = `${e.message ?? ""}: ${e.cause?.message ?? ""}`;
    logger.warn({ err: { message: text, error: e.error } }, "ORCID sign-in refused");
    if (e.error === "access_denied") throw new OrcidFlowError("orcid_denied", "ORCID sign-in was cancelled: your iD was not shared.");
    if (/"state"/i.test(text)) throw new OrcidFlowError("orcid_state", "The answer from ORCID does not belong to this sign-in (its state did not match). Nothing was changed.");
    if (/"nonce"/i.test(text)) throw new OrcidFlowError("orcid_nonce", "ORCID's identity token does not belong to this sign-in (its nonce did not match). Nothing was changed.");
    throw new OrcidFlowError("orcid_failed", "ORCID sign-in could not be completed. Try again.");
  }
  const claims = tokens.claims();
  const orcid = String(claims?.sub ?? "").toUpperCase();
  if (!/^\d{4}-\d{4}-\d{4}-\d{3}[\dX]$/.test(orcid)) throw new OrcidFlowError("orcid_failed", "ORCID's answer did not carry an ORCID iD.");
  return { orcid, givenName: String(claims?.given_name ?? ""), familyName: String(claims?.family_name ?? "") };
}

const byVerifiedOrcid = (orcid: string, excludeUserId?: number) =>
  User.findOne({ where: { [Op.and]: [where(fn("upper", col("orcid")), orcid.toUpperCase()), { orcidVerifiedAt: { [Op.ne]: null } }, ...(excludeUserId ? [{ id: { [Op.ne]: excludeUserId } }] : [])] } });

/** The account whose verified iD this is (sign-in), or null. */
export function accountWithOrcid(orcid: string): Promise<User | null> {
  return byVerifiedOrcid(orcid);
}

/** Links a verified iD to the signed-in account. */
export async function linkOrcid(userId: number, v: VerifiedOrcid): Promise<void> {
  if (await byVerifiedOrcid(v.orcid, userId)) throw new OrcidFlowError("orcid_taken", `The ORCID iD ${v.orcid} is already linked to another Tanglebank account.`);
  await sequelize().transaction(async (t) => {
    const u = await User.findByPk(userId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!u) throw new OrcidFlowError("orcid_failed", "Your session ended: sign in again, then link your iD.");
    await u.update({ orcid: v.orcid, orcidVerifiedAt: new Date() }, { transaction: t });
    await audit({ actorId: u.id, action: "user.orcid_linked", entityType: "user", entityId: u.id, details: { orcid: v.orcid } }, t);
  });
}

/** A new account from a verified iD: no password (sign in with ORCID, or set one by a reset link). */
export async function signUpWithOrcid(v: VerifiedOrcid, input: { email: string; displayName: string }): Promise<User> {
  if (await byVerifiedOrcid(v.orcid)) throw ApiError.conflict(`The ORCID iD ${v.orcid} already belongs to an account: sign in with ORCID.`);
  const user = await sequelize().transaction(async (t) => {
    if (await findUserByEmail(input.email, t)) {
      throw ApiError.conflict("An account with this e-mail address already exists. Sign in with it, then link your ORCID iD from the Account page.", [
        { path: "/email", message: "An account with this e-mail address already exists." },
      ]);
    }
    const u = await User.create({ email: input.email, displayName: input.displayName, passwordHash: "!orcid-only", orcid: v.orcid, orcidVerifiedAt: new Date() }, { transaction: t });
    await audit({ actorId: u.id, action: "user.signed_up", entityType: "user", entityId: u.id, details: { via: "orcid", orcid: v.orcid } }, t);
    return u;
  });
  await sendVerificationEmail(user);
  return user;
}

/** ORCID iDs among these that verify an account (creators "verified" on dataset pages). */
export async function verifiedOrcids(ids: string[]): Promise<Set<string>> {
  const wanted = [...new Set(ids.map((i) => i.replace(/^https?:\/\/(www\.)?orcid\.org\//i, "").toUpperCase()).filter(Boolean))];
  if (!wanted.length) return new Set();
  const rows = await User.findAll({ attributes: ["orcid"], where: { [Op.and]: [where(fn("upper", col("orcid")), { [Op.in]: wanted }), { orcidVerifiedAt: { [Op.ne]: null } }] } });
  return new Set(rows.map((r) => (r.orcid ?? "").toUpperCase()));
}
