/** Address parts of the network-view routes; a malformed address is a 404 (no such page), a bad query a 400. */
import { ApiError } from "../../lib/api-error";
import { ACCESSION_RE, parseVersionParam } from "./network-views.access";

export function parseAccession(s: string): string {
  if (!ACCESSION_RE.test(s)) throw ApiError.notFound(`No dataset "${s}": accessions look like TB-000042.`);
  return s;
}

export function parseVersion(s: string): number {
  return parseVersionParam(s);
}

export function parsePosition(s: string): number {
  if (!/^\d{1,6}$/.test(s) || Number(s) < 1) throw ApiError.notFound(`No network "${s}": networks are numbered from 1.`);
  return Number(s);
}

/** `refs` as a comma-separated list (or repeated parameter) of TB-000042/v2/3. */
export function parseRefs(q: unknown): string[] {
  const raw = Array.isArray(q) ? q.join(",") : typeof q === "string" ? q : "";
  if (!raw.trim()) throw ApiError.badRequest("Give the networks to compare as refs=TB-000042/v2/3,…", [{ path: "refs", message: "missing" }]);
  return [...new Set(raw.split(",").map((s) => s.trim()).filter(Boolean))];
}
