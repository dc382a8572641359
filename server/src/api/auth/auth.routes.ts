/**
 * Accounts: session info, sign-up, e-mail verification, sign-in, sign-out, password reset.
 */
import { Router } from "express";
import { csrfToken } from "../../middlewares/csrf";

export const authRouter = Router();

/** GET /api/v1/auth/session — the signed-in user (or null) and the CSRF token for state-changing calls. */
authRouter.get("/session", (req, res) => {
  res.json({ user: req.user ?? null, csrfToken: req.session ? csrfToken(req) : "" });
});
