/**
 * Catalogue query parameters: parsed strictly, every bad value reported with the parameter's name.
 * Multi-valued filters accept repeated parameters or comma-separated lists.
 */
import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { NULL_MODELS } from "@shared/network/null-models/index";
import { CATALOGUE_PAGE_SIZES } from "@shared/types/catalogue";
import { CONTINENT_CODES } from "../../lib/continents";

/**
 * The null model of the catalogue's z column and z/p filters when the reader names none: fixed degrees
 * (curveball), the primary null of every kind of data, so every network with metrics has it.
 */
export const DEFAULT_CATALOGUE_NULL_MODEL = "curveball";

export const SORT_KEYS = ["accession", "title", "type", "S", "C", "Q", "z", "year", "relevance"] as const;
export type SortKey = (typeof SORT_KEYS)[number];

export interface Range {
  min?: number;
  max?: number;
}

/** An area in degrees (GeoJSON bbox order); `west > east` crosses the antimeridian. */
export interface BoundingBox {
  west: number;
  south: number;
  east: number;
  north: number;
}

export interface CatalogueQuery {
  q?: string;
  interactionType?: string[];
  kind?: string[];
  weighted?: boolean[];
  habitat?: string[];
  country?: string[];
  licence?: string[];
  /** Continent codes (AF, AN, AS, EU, NA, OC, SA), derived from the country code. */
  continent?: string[];
  year: Range;
  nodes: Range;
  connectance: Range;
  Q: Range;
  /** z and p of `nullModel` (one model for the whole column and filter). */
  z: Range;
  p: Range;
  /** Public (generalised) coordinates: latitude in degrees, elevation in metres. */
  latitude: Range;
  elevation: Range;
  bbox?: BoundingBox;
  nullModel: string;
  sort: SortKey;
  order: "asc" | "desc";
  page: number;
  pageSize: number;
}

export const MAX_PAGE_SIZE = CATALOGUE_PAGE_SIZES[CATALOGUE_PAGE_SIZES.length - 1];

/** Every query parameter name the catalogue understands (shared with the OpenAPI document). */
export const CATALOGUE_PARAMS = [
  "q",
  "interactionType",
  "kind",
  "weighted",
  "habitat",
  "country",
  "licence",
  "continent",
  "yearMin",
  "yearMax",
  "nodesMin",
  "nodesMax",
  "connectanceMin",
  "connectanceMax",
  "qMin",
  "qMax",
  "zMin",
  "zMax",
  "pMin",
  "pMax",
  "latitudeMin",
  "latitudeMax",
  "elevationMin",
  "elevationMax",
  "bbox",
  "nullModel",
  "sort",
  "order",
  "page",
  "pageSize",
] as const;

function list(v: unknown): string[] | undefined {
  if (v === undefined) return undefined;
  const arr = Array.isArray(v) ? v : [v];
  const out = arr.flatMap((x) => String(x).split(",")).map((s) => s.trim()).filter(Boolean);
  return out.length ? out : undefined;
}

function scalar(v: unknown): string | undefined {
  if (v === undefined) return undefined;
  if (Array.isArray(v)) return v.length ? String(v[v.length - 1]) : undefined;
  const s = String(v).trim();
  return s === "" ? undefined : s;
}

function nullModelParam(v: string | undefined, errors: ErrorDetail[]): string {
  if (v === undefined) return DEFAULT_CATALOGUE_NULL_MODEL;
  if (!(NULL_MODELS as readonly string[]).includes(v)) {
    errors.push({ path: "nullModel", message: `nullModel must be one of ${NULL_MODELS.join(", ")}, got "${v}".` });
    return DEFAULT_CATALOGUE_NULL_MODEL;
  }
  return v;
}

/** `bbox=west,south,east,north` in degrees (longitudes −180…180, latitudes −90…90, south ≤ north). */
function parseBbox(v: string | undefined, errors: ErrorDetail[]): BoundingBox | undefined {
  if (v === undefined) return undefined;
  const parts = v.split(",").map((s) => Number(s.trim()));
  if (parts.length !== 4 || parts.some((n) => !Number.isFinite(n))) {
    errors.push({ path: "bbox", message: `bbox must be four numbers west,south,east,north in degrees, got "${v}".` });
    return undefined;
  }
  const [west, south, east, north] = parts;
  if ([west, east].some((x) => x < -180 || x > 180) || [south, north].some((y) => y < -90 || y > 90)) {
    errors.push({ path: "bbox", message: `bbox longitudes must lie in −180…180 and latitudes in −90…90, got "${v}".` });
    return undefined;
  }
  if (south > north) {
    errors.push({ path: "bbox", message: `bbox south (${south}) is north of its north (${north}): write west,south,east,north.` });
    return undefined;
  }
  return { west, south, east, north };
}

export function parseCatalogueQuery(raw: Record<string, unknown>): CatalogueQuery {
  const errors: ErrorDetail[] = [];
  for (const key of Object.keys(raw)) {
    if (!(CATALOGUE_PARAMS as readonly string[]).includes(key) && key !== "format") {
      errors.push({ path: key, message: `Unknown parameter "${key}". Known: ${CATALOGUE_PARAMS.join(", ")}.` });
    }
  }
  const number = (name: string, opts: { integer?: boolean; min?: number; max?: number } = {}): number | undefined => {
    const s = scalar(raw[name]);
    if (s === undefined) return undefined;
    const n = Number(s);
    if (!Number.isFinite(n) || (opts.integer && !Number.isInteger(n))) {
      errors.push({ path: name, message: `${name} must be ${opts.integer ? "an integer" : "a number"}, got "${s}".` });
      return undefined;
    }
    if ((opts.min !== undefined && n < opts.min) || (opts.max !== undefined && n > opts.max)) {
      errors.push({ path: name, message: `${name} must be between ${opts.min ?? "-∞"} and ${opts.max ?? "∞"}, got ${n}.` });
      return undefined;
    }
    return n;
  };
  const range = (prefix: string, opts: { integer?: boolean; min?: number; max?: number } = {}): Range => {
    const r: Range = { min: number(`${prefix}Min`, opts), max: number(`${prefix}Max`, opts) };
    if (r.min !== undefined && r.max !== undefined && r.min > r.max) {
      errors.push({ path: `${prefix}Min`, message: `${prefix}Min (${r.min}) is greater than ${prefix}Max (${r.max}): no network could match. Swap them or change one.` });
    }
    return r;
  };

  const weightedRaw = list(raw.weighted);
  const weighted = weightedRaw?.map((w) => {
    if (w === "true" || w === "1") return true;
    if (w === "false" || w === "0") return false;
    errors.push({ path: "weighted", message: `weighted must be true or false, got "${w}".` });
    return false;
  });
  const kind = list(raw.kind);
  for (const k of kind ?? []) {
    if (k !== "bipartite" && k !== "unipartite") errors.push({ path: "kind", message: `kind must be bipartite or unipartite, got "${k}".` });
  }
  const sortRaw = scalar(raw.sort);
  if (sortRaw !== undefined && !(SORT_KEYS as readonly string[]).includes(sortRaw)) {
    errors.push({ path: "sort", message: `sort must be one of ${SORT_KEYS.join(", ")}, got "${sortRaw}".` });
  }
  const orderRaw = scalar(raw.order);
  if (orderRaw !== undefined && orderRaw !== "asc" && orderRaw !== "desc") {
    errors.push({ path: "order", message: `order must be asc or desc, got "${orderRaw}".` });
  }
  const continent = list(raw.continent)?.map((c) => c.toUpperCase());
  for (const c of continent ?? []) {
    if (!CONTINENT_CODES.includes(c)) errors.push({ path: "continent", message: `continent must be one of ${CONTINENT_CODES.join(", ")}, got "${c}".` });
  }
  const bbox = parseBbox(scalar(raw.bbox), errors);
  const q = scalar(raw.q);
  if (q !== undefined && q.length > 200) errors.push({ path: "q", message: "q is longer than 200 characters." });

  const result: CatalogueQuery = {
    q,
    interactionType: list(raw.interactionType),
    kind,
    weighted,
    habitat: list(raw.habitat),
    country: list(raw.country)?.map((c) => c.toUpperCase()),
    licence: list(raw.licence),
    year: range("year", { integer: true, min: 1000, max: 3000 }),
    nodes: range("nodes", { integer: true, min: 0 }),
    connectance: range("connectance", { min: 0, max: 1 }),
    Q: range("q"),
    z: range("z"),
    p: range("p", { min: 0, max: 1 }),
    latitude: range("latitude", { min: -90, max: 90 }),
    elevation: range("elevation", { min: -500, max: 9000 }),
    continent,
    bbox,
    nullModel: nullModelParam(scalar(raw.nullModel), errors),
    sort: (sortRaw as SortKey | undefined) ?? (q ? "relevance" : "accession"),
    order: (orderRaw as "asc" | "desc" | undefined) ?? (sortRaw === undefined && q ? "desc" : "asc"),
    page: number("page", { integer: true, min: 1 }) ?? 1,
    pageSize: number("pageSize", { integer: true, min: 1, max: MAX_PAGE_SIZE }) ?? 25,
  };
  if (errors.length) throw ApiError.badRequest("Some catalogue parameters are not valid.", errors);
  return result;
}
