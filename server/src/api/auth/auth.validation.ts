/**
 * Request-body checks for the account routes. Each returns the clean values or throws 422 with one
 * detail per bad field (`path` is the field name), so forms can show the message beside the field.
 */
import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { passwordProblem } from "../../lib/passwords";

type Body = Record<string, unknown>;

const EMAIL_RE = /^[^\s@]+@[^\s@.]+(\.[^\s@.]+)+$/;

export function asBody(raw: unknown): Body {
  if (!raw || typeof raw !== "object" || Array.isArray(raw)) throw ApiError.badRequest("The request body must be a JSON object.");
  return raw as Body;
}

export function checkEmail(value: unknown, details: ErrorDetail[], path = "email"): string {
  if (typeof value !== "string" || !value.trim()) {
    details.push({ path, message: "E-mail address is required." });
    return "";
  }
  const email = value.trim().toLowerCase();
  if (email.length > 254 || !EMAIL_RE.test(email)) details.push({ path, message: "This is not a valid e-mail address (expected name@example.org)." });
  return email;
}

export function checkDisplayName(value: unknown, details: ErrorDetail[], path = "displayName"): string {
  if (typeof value !== "string" || !value.trim()) {
    details.push({ path, message: "Name is required." });
    return "";
  }
  const name = value.trim().replace(/\s+/g, " ");
  if (name.length > 100) details.push({ path, message: "Name must be at most 100 characters long." });
  return name;
}

export function checkNewPassword(value: unknown, details: ErrorDetail[], path = "password"): string {
  const problem = passwordProblem(value);
  if (problem) details.push({ path, message: problem, rule: "password_policy" });
  return typeof value === "string" ? value : "";
}

export function checkToken(value: unknown, details: ErrorDetail[], path = "token"): string {
  if (typeof value !== "string" || !/^[A-Za-z0-9_-]{20,200}$/.test(value)) {
    details.push({ path, message: "The link's token is missing or malformed. Open the link from the e-mail again." });
    return "";
  }
  return value;
}

export function fail(details: ErrorDetail[]): void {
  if (details.length) {
    const pw = details.find((d) => d.rule === "password_policy");
    throw ApiError.unprocessable(pw && details.length === 1 ? pw.message : "Some fields need attention.", details);
  }
}

export function validateSignUp(raw: unknown) {
  const b = asBody(raw);
  const d: ErrorDetail[] = [];
  const out = { email: checkEmail(b.email, d), displayName: checkDisplayName(b.displayName, d), password: checkNewPassword(b.password, d) };
  fail(d);
  return out;
}

export function validateSignIn(raw: unknown) {
  const b = asBody(raw);
  const d: ErrorDetail[] = [];
  const email = typeof b.email === "string" ? b.email.trim().toLowerCase() : "";
  if (!email) d.push({ path: "email", message: "E-mail address is required." });
  if (typeof b.password !== "string" || !b.password) d.push({ path: "password", message: "Password is required." });
  fail(d);
  return { email, password: b.password as string };
}

export function validateEmailOnly(raw: unknown) {
  const b = asBody(raw);
  const d: ErrorDetail[] = [];
  const email = checkEmail(b.email, d);
  fail(d);
  return { email };
}

export function validateTokenOnly(raw: unknown) {
  const b = asBody(raw);
  const d: ErrorDetail[] = [];
  const token = checkToken(b.token, d);
  if (d.length) throw new ApiError(400, "link_invalid", d[0].message, d);
  return { token };
}

export function validateResetConfirm(raw: unknown) {
  const b = asBody(raw);
  const d: ErrorDetail[] = [];
  const token = checkToken(b.token, d);
  if (d.length) throw new ApiError(400, "link_invalid", d[0].message, d);
  const password = checkNewPassword(b.password, d);
  fail(d);
  return { token, password };
}
