/**
 * The catalogue's state lives in the URL (a shareable link): the same parameter names as the API.
 * Multi-valued filters are comma-separated.
 */
export const LIST_FILTERS = ["interactionType", "kind", "weighted", "habitat", "country", "licence"] as const;
export type ListFilter = (typeof LIST_FILTERS)[number];
export const RANGE_FILTERS = [
  { key: "year", label: "Sampling year", min: "yearMin", max: "yearMax", step: "1" },
  { key: "nodes", label: "Nodes (S)", min: "nodesMin", max: "nodesMax", step: "1" },
  { key: "connectance", label: "Connectance (C)", min: "connectanceMin", max: "connectanceMax", step: "0.01" },
  { key: "Q", label: "Modularity (Q)", min: "qMin", max: "qMax", step: "0.01" },
  { key: "z", label: "z against the chosen null model", min: "zMin", max: "zMax", step: "0.1" },
  { key: "p", label: "p against the chosen null model", min: "pMin", max: "pMax", step: "0.01" },
] as const;
export const PAGE_SIZE = 25;

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
