/** The compare view's query: which networks to compare. */
import { ApiError } from "../../lib/api-error";

/** `refs` as a comma-separated list (or repeated parameter) of TB-000042/v2/3. */
export function parseRefs(q: unknown): string[] {
  const raw = Array.isArray(q) ? q.join(",") : typeof q === "string" ? q : "";
  if (!raw.trim()) throw ApiError.badRequest("Give the networks to compare as refs=TB-000042/v2/3,…", [{ path: "refs", message: "missing" }]);
  return [...new Set(raw.split(",").map((s) => s.trim()).filter(Boolean))];
}
