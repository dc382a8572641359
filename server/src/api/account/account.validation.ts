import type { ErrorDetail } from "../../lib/api-error";
import { ApiError } from "../../lib/api-error";
import { asBody, checkDisplayName, checkNewPassword, fail } from "../auth/auth.validation";

/**
 * ORCID iD check digit: ISO 7064 MOD 11-2 over the first 15 digits, as ORCID documents for its
 * identifiers ("X" stands for 10).
 */
export function orcidChecksumOk(id: string): boolean {
  const digits = id.replace(/-/g, "");
  let total = 0;
  for (const ch of digits.slice(0, 15)) total = (total + Number(ch)) * 2;
  const result = (12 - (total % 11)) % 11;
  const check = result === 10 ? "X" : String(result);
  return digits[15] === check;
}

/** Accepts a bare iD or its https://orcid.org/ URL; returns the bare iD. */
export function normalizeOrcid(value: string): string {
  return value.trim().replace(/^https?:\/\/(www\.)?orcid\.org\//i, "").toUpperCase();
}

export function validateProfilePatch(raw: unknown): { displayName?: string; affiliation?: string | null; orcid?: string | null } {
  const b = asBody(raw);
  const d: ErrorDetail[] = [];
  const out: { displayName?: string; affiliation?: string | null; orcid?: string | null } = {};
  const known = new Set(["displayName", "affiliation", "orcid"]);
  for (const k of Object.keys(b)) if (!known.has(k)) d.push({ path: k, message: `Unknown field "${k}": a profile has displayName, affiliation and orcid.` });
  if ("displayName" in b) out.displayName = checkDisplayName(b.displayName, d);
  if ("affiliation" in b) {
    if (b.affiliation === null || b.affiliation === "") out.affiliation = null;
    else if (typeof b.affiliation !== "string") d.push({ path: "affiliation", message: "Affiliation must be text." });
    else if (b.affiliation.trim().length > 200) d.push({ path: "affiliation", message: "Affiliation must be at most 200 characters long." });
    else out.affiliation = b.affiliation.trim() || null;
  }
  if ("orcid" in b) {
    if (b.orcid === null || b.orcid === "") out.orcid = null;
    else if (typeof b.orcid !== "string") d.push({ path: "orcid", message: "ORCID iD must be text." });
    else {
      const id = normalizeOrcid(b.orcid);
      if (!/^\d{4}-\d{4}-\d{4}-\d{3}[\dX]$/.test(id)) d.push({ path: "orcid", message: "An ORCID iD looks like 0000-0002-1825-0097 (four groups of four digits; the last may be X)." });
      else if (!orcidChecksumOk(id)) d.push({ path: "orcid", message: "This ORCID iD's check digit is wrong: check for a typing error." });
      else out.orcid = id;
    }
  }
  fail(d);
  return out;
}

export function validatePasswordChange(raw: unknown): { currentPassword: string; newPassword: string } {
  const b = asBody(raw);
  const d: ErrorDetail[] = [];
  if (typeof b.currentPassword !== "string" || !b.currentPassword) d.push({ path: "currentPassword", message: "Your current password is required." });
  const newPassword = checkNewPassword(b.newPassword, d, "newPassword");
  fail(d);
  if (b.currentPassword === newPassword) throw ApiError.unprocessable("The new password must differ from the current one.", [{ path: "newPassword", message: "The new password must differ from the current one." }]);
  return { currentPassword: b.currentPassword as string, newPassword };
}
