/**
 * Request schemas of /api/v1/account (the signed-in person's profile and password): mounted by the
 * routes through validate(); refused fields answer 422 with one detail per field, shown beside it.
 * The normalized forms (names with single spaces, a bare upper-case ORCID iD) are made by the controller.
 */
import type { RequestSchema } from "../../middlewares/validate";
import { displayNameField, passwordRule } from "../auth/auth.schemas";

/** ORCID iD check digit: ISO 7064 MOD 11-2 over the first 15 digits, as ORCID documents for its identifiers ("X" stands for 10). */
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

export const profileSchema: RequestSchema = {
  body: {
    type: "object",
    properties: {
      displayName: displayNameField,
      affiliation: { type: ["string", "null"], maxLength: 200, description: "Your institution (empty or null: none)" },
      orcid: {
        type: ["string", "null"],
        pattern: "^\\s*((https?://(www\\.)?orcid\\.org/)?[0-9]{4}-[0-9]{4}-[0-9]{4}-[0-9]{3}[0-9Xx])?\\s*$",
        "x-rule": "must be an ORCID iD such as 0000-0002-1825-0097 (four groups of four digits; the last may be X), or its https://orcid.org/ address; empty or null removes it.",
        description: "Your ORCID iD (typed; a verified one is linked through ORCID sign-in)",
      },
    },
    additionalProperties: false,
  },
  bodyStatus: 422,
  bodyRules: (b, failed) =>
    typeof b.orcid === "string" && b.orcid.trim() && !failed.has("/orcid") && !orcidChecksumOk(normalizeOrcid(b.orcid))
      ? [{ path: "/orcid", message: "This ORCID iD's check digit is wrong: check for a typing error." }]
      : [],
};

export const passwordChangeSchema: RequestSchema = {
  body: {
    type: "object",
    properties: {
      currentPassword: { type: "string", minLength: 1, "x-rule": "must be your current password.", description: "Your current password" },
      newPassword: { type: "string", "x-rule": "must be 10 to 200 characters with at least one letter and one digit.", description: "The new password: 10 to 200 characters with at least one letter and one digit" },
    },
    required: ["currentPassword", "newPassword"],
    additionalProperties: false,
  },
  bodyStatus: 422,
  bodyRules: (b, failed) => [
    ...passwordRule("newPassword")(b, failed),
    ...(typeof b.newPassword === "string" && b.newPassword === b.currentPassword ? [{ path: "/newPassword", message: "The new password must differ from the current one." }] : []),
  ],
};
