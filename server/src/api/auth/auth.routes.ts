/**
 * Accounts: session info, sign-up, e-mail verification, sign-in, sign-out, password reset.
 * Every route here is open to visitors; rate limits per IP guard sign-in, sign-up and the mail-sending ones.
 */
import { Router } from "express";
import { authMailRateLimit, signInRateLimit, signUpRateLimit } from "../../middlewares/rate-limit";
import { validate } from "../../middlewares/validate";
import * as c from "./auth.controller";
import * as v from "./auth.schemas";

export const authRouter = Router();

/** GET /api/v1/auth/session — the signed-in user (or null) and the CSRF token for state-changing calls. */
authRouter.get("/session", c.session);
authRouter.post("/sign-up", signUpRateLimit, validate(v.signUpSchema), c.signUp);
authRouter.post("/sign-in", signInRateLimit, validate(v.signInSchema), c.signIn);
authRouter.post("/sign-out", c.signOut);
authRouter.post("/verify-email", validate(v.linkTokenSchema), c.verifyEmail);
authRouter.post("/verification-email", authMailRateLimit, validate(v.resendSchema), c.resendVerification);
authRouter.post("/password-reset", authMailRateLimit, validate(v.emailOnlySchema), c.requestPasswordReset);
authRouter.post("/password-reset/confirm", validate(v.linkTokenSchema), validate(v.resetPasswordSchema), c.confirmPasswordReset);
