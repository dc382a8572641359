/**
 * The catalogue's state lives in the URL (a shareable link): the same parameter names as the API.
 * Multi-valued filters are comma-separated.
 */
export const LIST_FILTERS = ["interactionType", "kind", "weighted", "habitat", "continent", "country", "licence"] as const;
export type ListFilter = (typeof LIST_FILTERS)[number];
export interface RangeFilter {
  key: "year" | "nodes" | "connectance" | "Q" | "z" | "p" | "latitude" | "elevation";
  label: string;
  min: string;
  max: string;
  step: string;
  /** Whole numbers only, and the bounds the API accepts (as catalogue.schemas.ts on the server). */
  integer?: boolean;
  lo?: number;
  hi?: number;
}
export const RANGE_FILTERS: readonly RangeFilter[] = [
  { key: "year", label: "Sampling year", min: "yearMin", max: "yearMax", step: "1", integer: true, lo: 1000, hi: 3000 },
  { key: "nodes", label: "Nodes (S)", min: "nodesMin", max: "nodesMax", step: "1", integer: true, lo: 0 },
  { key: "connectance", label: "Connectance (C)", min: "connectanceMin", max: "connectanceMax", step: "0.01", lo: 0, hi: 1 },
  { key: "Q", label: "Modularity (Q)", min: "qMin", max: "qMax", step: "0.01" },
  { key: "z", label: "z against the chosen null model", min: "zMin", max: "zMax", step: "0.1" },
  { key: "p", label: "p against the chosen null model", min: "pMin", max: "pMax", step: "0.01", lo: 0, hi: 1 },
  { key: "latitude", label: "Latitude (°, south negative)", min: "latitudeMin", max: "latitudeMax", step: "0.1", lo: -90, hi: 90 },
  { key: "elevation", label: "Elevation (m)", min: "elevationMin", max: "elevationMax", step: "1", lo: -500, hi: 9000 },
];
export const PAGE_SIZE = 25;
export { CATALOGUE_PAGE_SIZES } from "@shared/types/catalogue";

/**
 * What is wrong with the typed ranges, per range key (absent when nothing is): not a number, not whole,
 * outside what the figure can be, or a minimum above the maximum (which would match nothing).
 */
export function rangeProblems(values: Record<string, string>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const r of RANGE_FILTERS) {
    const read = (name: string, side: string): number | undefined | string => {
      const s = (values[name] ?? "").trim();
      if (!s) return undefined;
      const n = Number(s);
      if (!Number.isFinite(n)) return `The ${side} “${s}” is not a number.`;
      if (r.integer && !Number.isInteger(n)) return `The ${side} must be a whole number (got ${s}).`;
      if ((r.lo !== undefined && n < r.lo) || (r.hi !== undefined && n > r.hi)) {
        return `The ${side} must be ${r.hi === undefined ? `at least ${r.lo}` : r.lo === undefined ? `at most ${r.hi}` : `between ${r.lo} and ${r.hi}`} (got ${s}).`;
      }
      return n;
    };
    const lo = read(r.min, "minimum");
    const hi = read(r.max, "maximum");
    if (typeof lo === "string") out[r.key] = lo;
    else if (typeof hi === "string") out[r.key] = hi;
    else if (lo !== undefined && hi !== undefined && lo > hi) out[r.key] = `The minimum (${lo}) is above the maximum (${hi}): no network could match. Swap them or change one.`;
  }
  return out;
}

/** Server answers naming a range parameter (`connectanceMin`…), keyed by range like rangeProblems. */
export function rangeProblemsFromApi(details: Array<{ path?: string; message: string }> | undefined): Record<string, string> {
  const out: Record<string, string> = {};
  for (const d of details ?? []) {
    const r = RANGE_FILTERS.find((x) => x.min === d.path || x.max === d.path);
    if (r && !out[r.key]) out[r.key] = d.message;
  }
  return out;
}

export function listValues(params: URLSearchParams, key: ListFilter): string[] {
  return (params.get(key) ?? "").split(",").filter(Boolean);
}

/** A copy of `params` with `key` toggled for `value` (and back to page 1). */
export function toggleValue(params: URLSearchParams, key: ListFilter, value: string): URLSearchParams {
  const p = new URLSearchParams(params);
  const set = new Set(listValues(params, key));
  if (set.has(value)) set.delete(value);
  else set.add(value);
  if (set.size) p.set(key, [...set].join(","));
  else p.delete(key);
  p.delete("page");
  return p;
}

/** A copy of `params` with the given values set (empty → removed). */
export function withParams(params: URLSearchParams, next: Record<string, string | undefined | null>): URLSearchParams {
  const p = new URLSearchParams(params);
  for (const [k, v] of Object.entries(next)) {
    if (v === undefined || v === null || v === "") p.delete(k);
    else p.set(k, v);
  }
  return p;
}

/** The filter part only (no sorting or paging): what "everything matching" means for a bundle. */
export function filterOnly(params: URLSearchParams): URLSearchParams {
  const p = new URLSearchParams(params);
  for (const k of ["page", "pageSize", "sort", "order"]) p.delete(k);
  return p;
}

export function hasFilters(params: URLSearchParams): boolean {
  return [...filterOnly(params).keys()].length > 0;
}

/** Labels for facet values. */
export function valueLabel(key: ListFilter, value: string): string {
  if (key === "weighted") return value === "true" ? "weighted" : "binary";
  if (key === "interactionType") return value.replace(/-/g, " ");
  return value;
}
