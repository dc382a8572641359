/**
 * Request schemas of /api/v1/auth (sign-up, sign-in, e-mail confirmation, password reset, ORCID sign-up):
 * mounted by the routes through validate(). The forms show each detail beside its field, so the messages
 * are in the user's words (x-message, x-required); a refused field answers 422, a malformed link's token
 * 400 `link_invalid`. E-mail addresses are trimmed and lower-cased by the controllers.
 */
import type { ErrorDetail } from "@shared/types/api";
import type { FieldSchema, RequestSchema } from "../../middlewares/validate";
import { passwordProblem } from "../../lib/passwords";

export const emailField: FieldSchema = {
  type: "string",
  maxLength: 254,
  pattern: "^\\s*[^\\s@]+@[^\\s@.]+(\\.[^\\s@.]+)+\\s*$",
  "x-message": "This is not a valid e-mail address (expected name@example.org).",
  "x-required": "E-mail address is required.",
  description: "E-mail address",
};

/** A person's name as shown on their deposits (sign-up and the account page). */
export const displayNameField: FieldSchema = {
  type: "string",
  minLength: 1,
  maxLength: 100,
  pattern: "\\S",
  "x-message": "Name must be 1 to 100 characters long, not only spaces.",
  "x-required": "Name is required.",
  description: "Your name as shown on your deposits",
};

/** A new password: its policy (lib/passwords.ts) is a body rule, with `rule: "password_policy"` in the detail. */
export const newPasswordField: FieldSchema = { type: "string", "x-required": "Password is required.", "x-message": "Password must be text.", description: "10 to 200 characters with at least one letter and one digit" };

export function passwordRule(field: string) {
  return (b: Record<string, unknown>, failed: ReadonlySet<string>): ErrorDetail[] => {
    if (failed.has(`/${field}`)) return [];
    const problem = passwordProblem(b[field]);
    return problem ? [{ path: `/${field}`, message: problem, rule: "password_policy" }] : [];
  };
}

const tokenField: FieldSchema = {
  type: "string",
  pattern: "^[A-Za-z0-9_-]{20,200}$",
  "x-message": "The link's token is missing or malformed. Open the link from the e-mail again.",
  "x-required": "The link's token is missing or malformed. Open the link from the e-mail again.",
  description: "The token of the link in the e-mail",
};

export const signUpSchema: RequestSchema = {
  body: { type: "object", properties: { email: emailField, displayName: displayNameField, password: newPasswordField }, required: ["email", "displayName", "password"] },
  bodyStatus: 422,
  bodyRules: passwordRule("password"),
};

export const signInSchema: RequestSchema = {
  body: {
    type: "object",
    properties: {
      email: { type: "string", pattern: "\\S", "x-message": "E-mail address is required.", "x-required": "E-mail address is required.", description: "E-mail address" },
      password: { type: "string", minLength: 1, "x-message": "Password is required.", "x-required": "Password is required.", description: "Password" },
    },
    required: ["email", "password"],
  },
  bodyStatus: 422,
};

export const emailOnlySchema: RequestSchema = { body: { type: "object", properties: { email: emailField }, required: ["email"] }, bodyStatus: 422 };

/** Resending the confirmation link: the signed-in account's address, or the one given. */
export const resendSchema: RequestSchema = { body: { type: "object", properties: { email: emailField } }, bodyStatus: 422 };

/** The link's token alone: 400 link_invalid (checked before anything else the link's form sends). */
export const linkTokenSchema: RequestSchema = { body: { type: "object", properties: { token: tokenField }, required: ["token"] }, bodyCode: "link_invalid" };

export const resetPasswordSchema: RequestSchema = {
  body: { type: "object", properties: { password: newPasswordField }, required: ["password"] },
  bodyStatus: 422,
  bodyRules: passwordRule("password"),
};

export const orcidStartSchema: RequestSchema = {
  body: {
    type: "object",
    properties: {
      intent: { type: "string", enum: ["sign-in", "link"], default: "sign-in", "x-message": 'intent must be "sign-in" or "link".', description: "Sign in (or sign up) with ORCID, or link an iD to your account" },
      next: { type: "string", maxLength: 2000, description: "Where to go after signing in (a path of this site)" },
    },
  },
  bodyStatus: 422,
};

export const orcidSignUpSchema: RequestSchema = {
  body: { type: "object", properties: { email: emailField, displayName: displayNameField }, required: ["email", "displayName"] },
  bodyStatus: 422,
};
