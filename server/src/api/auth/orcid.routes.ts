/**
 * /api/v1/auth/orcid — sign-in with ORCID (OpenID Connect) and linking an iD to the signed-in account.
 *
 * | POST /start     | anyone (session; `link` needs a signed-in session) | `{ intent: "sign-in"|"link", next? }` → `{ url }` of ORCID's sign-in |
 * | GET  /callback  | the browser, redirected by ORCID | checks state, nonce, PKCE and the ID token; redirects to the page that shows the outcome |
 * | GET  /pending   | the session that just verified an iD with no account | `{ orcid, givenName, familyName }` (404 otherwise) |
 * | POST /sign-up   | that session (rate-limited) | `{ email, displayName }` → 201, signed in, confirmation e-mail sent |
 */
import { Router, type NextFunction, type Request, type Response } from "express";
import { ApiError } from "../../lib/api-error";
import { csrfToken } from "../../middlewares/csrf";
import { toAuthUser } from "../../middlewares/authenticate";
import { signUpRateLimit } from "../../middlewares/rate-limit";
import { config } from "../../config/env";
import { validate } from "../../middlewares/validate";
import { orcidSignUpSchema, orcidStartSchema } from "./auth.schemas";
import * as s from "./orcid.service";

const regenerate = (req: Request) => new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
const save = (req: Request) => new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));

export const orcidRouter = Router();

orcidRouter.post("/start", validate(orcidStartSchema), async (req, res) => {
  if (!req.session) throw ApiError.badRequest("ORCID sign-in needs a browser session, not an API token.");
  const b = req.body as { intent: "sign-in" | "link"; next?: string };
  const intent = b.intent;
  if (intent === "link" && !req.user) throw ApiError.unauthorized();
  const { url, flow } = await s.startFlow(intent, req.user?.id, s.safeNext(b.next));
  req.session.orcidFlow = flow;
  await save(req);
  res.json({ url });
});

orcidRouter.get("/callback", async (req, res: Response) => {
  const flow = req.session?.orcidFlow;
  const failPage = (intent: "sign-in" | "link" | undefined, code: s.OrcidErrorCode) => res.redirect(303, `${intent === "link" ? "/account" : "/sign-in"}?orcidError=${code}`);
  if (!req.session || !flow || Date.now() - flow.at > s.FLOW_TTL_MS) return failPage(flow?.intent, "orcid_expired");
  delete req.session.orcidFlow; // one answer per flow: a replayed callback finds nothing
  await save(req);
  try {
    const verified = await s.finishFlow(new URL(req.originalUrl, config().publicUrl), flow);
    if (flow.intent === "link") {
      if (!req.user || req.user.id !== flow.userId) return failPage("link", "orcid_expired");
      await s.linkOrcid(req.user.id, verified);
      return res.redirect(303, "/account?orcid=linked");
    }
    const user = await s.accountWithOrcid(verified.orcid);
    if (user) {
      await regenerate(req); // a new session id at sign-in (no fixation)
      req.session.userId = user.id;
      await save(req);
      return res.redirect(303, flow.next ?? "/");
    }
    req.session.orcidPending = { ...verified, at: Date.now() };
    await save(req);
    return res.redirect(303, "/sign-up/orcid");
  } catch (err) {
    if (err instanceof s.OrcidFlowError) return failPage(flow.intent, err.code);
    throw err;
  }
});

function pendingOf(req: Request) {
  const p = req.session?.orcidPending;
  if (!p || Date.now() - p.at > s.PENDING_TTL_MS) throw ApiError.notFound("No ORCID iD is waiting for an account: sign in with ORCID first.");
  return p;
}

orcidRouter.get("/pending", (req, res) => {
  const p = pendingOf(req);
  res.json({ orcid: p.orcid, givenName: p.givenName, familyName: p.familyName });
});

/** Only while an ORCID iD waits for an account (checked before the body). */
function requirePending(req: Request, _res: Response, next: NextFunction) {
  pendingOf(req);
  next();
}

orcidRouter.post("/sign-up", signUpRateLimit, requirePending, validate(orcidSignUpSchema), async (req, res) => {
  const p = pendingOf(req);
  const b = req.body as { email: string; displayName: string };
  const user = await s.signUpWithOrcid(p, { email: b.email.trim().toLowerCase(), displayName: b.displayName.trim().replace(/\s+/g, " ") });
  await regenerate(req);
  req.session.userId = user.id;
  const token = csrfToken(req);
  await save(req);
  res.status(201).json({ user: toAuthUser(user), csrfToken: token, message: `Account created with your ORCID iD ${p.orcid}. We sent a confirmation link to ${user.email}.` });
});
