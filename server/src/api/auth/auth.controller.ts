import type { Request, Response } from "express";
import { ApiError } from "../../lib/api-error";
import { csrfToken } from "../../middlewares/csrf";
import { toAuthUser } from "../../middlewares/authenticate";
import * as service from "./auth.service";
import { config } from "../../config/env";

const regenerate = (req: Request) => new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
const save = (req: Request) => new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
const destroy = (req: Request) => new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));

// Bodies are checked by validate() with auth.schemas.ts in auth.routes.ts; addresses are compared trimmed and lower-cased.
const emailOf = (raw: string) => raw.trim().toLowerCase();
type Body = Record<string, string>;

export function session(req: Request, res: Response) {
  res.json({ user: req.user ?? null, csrfToken: req.session ? csrfToken(req) : "", orcidSignIn: config().orcid.enabled });
}

export async function signUp(req: Request, res: Response) {
  const b = req.body as Body;
  const user = await service.signUp({ email: emailOf(b.email), displayName: b.displayName.trim().replace(/\s+/g, " "), password: b.password });
  res.status(201).json({
    user: toAuthUser(user),
    message: `Account created. We sent a confirmation link to ${user.email}; open it, then sign in.`,
  });
}

export async function signIn(req: Request, res: Response) {
  // Requests with an Authorization header get no session (app.ts): signing in needs a plain browser request.
  if (!req.session) throw ApiError.badRequest("Sign in without an Authorization header: API tokens need no sign-in.");
  const b = req.body as Body;
  const user = await service.checkCredentials(emailOf(b.email), b.password);
  // A new session id at sign-in (no session fixation) with a fresh CSRF token.
  await regenerate(req);
  req.session.userId = user.id;
  const token = csrfToken(req);
  await save(req);
  res.json({ user: toAuthUser(user), csrfToken: token });
}

export async function signOut(req: Request, res: Response) {
  if (req.session) await destroy(req);
  res.clearCookie("tb.sid", { path: "/" });
  res.status(204).end();
}

export async function verifyEmail(req: Request, res: Response) {
  const user = await service.verifyEmail((req.body as Body).token);
  res.json({ user: { email: user.email, emailVerified: true }, message: "Your e-mail address is confirmed." });
}

/** A new confirmation link: for the signed-in account, or for the address given (always 202). */
export async function resendVerification(req: Request, res: Response) {
  const given = (req.body as Partial<Body>).email;
  // signed out, the address is the only way to tell which account: required then (the schema cannot see the session)
  if (!req.user && given === undefined) throw ApiError.unprocessable("E-mail address is required.", [{ path: "/email", message: "E-mail address is required." }]);
  await service.resendVerification(req.user ? req.user.email : emailOf(given!));
  res.status(202).json({ message: "If an unconfirmed account uses this address, a new confirmation link is on its way." });
}

export async function requestPasswordReset(req: Request, res: Response) {
  await service.requestPasswordReset(emailOf((req.body as Body).email));
  res.status(202).json({ message: "If an account uses this address, a link to choose a new password is on its way. It works for one hour." });
}

export async function confirmPasswordReset(req: Request, res: Response) {
  const b = req.body as Body;
  const user = await service.resetPassword(b.token, b.password);
  const n = user.revokedTokens ?? 0;
  const tokens = n ? ` Your ${n === 1 ? "personal API token was" : `${n} personal API tokens were`} revoked, since whoever knew the old password could have made ${n === 1 ? "it" : "them"}: create new ones on your account page.` : "";
  res.json({ user: { email: user.email }, revokedTokens: n, message: `Your new password is set. Sign in with it.${tokens}` });
}
