/**
 * Accounts: session info, sign-up, e-mail verification, sign-in, sign-out, password reset.
 * Every route here is open to visitors; rate limits per IP guard sign-in, sign-up and the mail-sending ones.
 */
import { Router } from "express";
import { authMailRateLimit, signInRateLimit, signUpRateLimit } from "../../middlewares/rate-limit";
import * as c from "./auth.controller";

export const authRouter = Router();

/** GET /api/v1/auth/session — the signed-in user (or null) and the CSRF token for state-changing calls. */
authRouter.get("/session", c.session);
authRouter.post("/sign-up", signUpRateLimit, c.signUp);
authRouter.post("/sign-in", signInRateLimit, c.signIn);
authRouter.post("/sign-out", c.signOut);
authRouter.post("/verify-email", c.verifyEmail);
authRouter.post("/verification-email", authMailRateLimit, c.resendVerification);
authRouter.post("/password-reset", authMailRateLimit, c.requestPasswordReset);
authRouter.post("/password-reset/confirm", c.confirmPasswordReset);
