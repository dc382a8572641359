/** Address parts naming a dataset and its version; a malformed address is a 404 (no such page). */
import { ApiError } from "../../lib/api-error";
import { ACCESSION_RE, parseVersionParam } from "./datasets.access";

export function parseAccession(s: string): string {
  if (!ACCESSION_RE.test(s)) throw ApiError.notFound(`No dataset "${s}": accessions look like TB-000042.`);
  return s;
}

export function parseVersion(s: string): number {
  return parseVersionParam(s);
}
