/**
 * The catalogue's query (GET /api/v1/catalogue, also /networks): its filters, sorting and paging as one
 * JSON Schema, mounted by the routes (validate) and described by the OpenAPI document. The same filter
 * fields are read from a bundle's or a collection's `filter` (readCatalogueFilter) and mounted by the
 * coverage map (coverage-map.schemas.ts), so every way into the catalogue checks the same rules.
 *
 * Lists (interactionType, kind, …) are given comma-separated or repeated; `weighted` takes true/false (or
 * 1/0); country and continent codes are read in any case. A range whose minimum is above its maximum, and
 * an area whose south edge is north of its north edge, are refused (they could match nothing).
 */
import { NULL_MODELS } from "@shared/network/null-models/index";
import { CATALOGUE_PAGE_SIZES } from "@shared/types/catalogue";
import { CONTINENT_CODES } from "../../lib/continents";
import type { ErrorDetail } from "../../lib/api-error";
import { readQuery, type FieldSchema, type ObjectSchema, type QueryRules, type RequestSchema } from "../../middlewares/validate";

/**
 * The null model of the catalogue's z column and z/p filters when the reader names none: fixed degrees
 * (curveball), the primary null of every kind of data, so every network with metrics has it.
 */
export const DEFAULT_CATALOGUE_NULL_MODEL = "curveball";

export const SORT_KEYS = ["accession", "title", "type", "S", "C", "Q", "z", "year", "relevance"] as const;
export type SortKey = (typeof SORT_KEYS)[number];

export const MAX_PAGE_SIZE = CATALOGUE_PAGE_SIZES[CATALOGUE_PAGE_SIZES.length - 1];

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

/** The catalogue's query as the service reads it. */
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

function list(description: string, items: FieldSchema, example?: string[]): FieldSchema {
  return { type: "array", items, description: `${description} (comma-separated or repeated)`, ...(example ? { example } : {}) };
}

/** The two ends of a range: `<name>Min` and `<name>Max`. */
function range(name: string, min: string, max: string, s: FieldSchema, example?: number): Record<string, FieldSchema> {
  return { [`${name}Min`]: { ...s, description: min, ...(example !== undefined ? { example } : {}) }, [`${name}Max`]: { ...s, description: max } };
}

/** The ranges: query prefix → the CatalogueQuery key it fills. */
const RANGES = { year: "year", nodes: "nodes", connectance: "connectance", q: "Q", z: "z", p: "p", latitude: "latitude", elevation: "elevation" } as const;

const degrees = (min: number, max: number): FieldSchema => ({ type: "number", minimum: min, maximum: max });

/** The filter fields: what a bundle's or a collection's `filter` and the coverage map take. */
export const CATALOGUE_FILTER_FIELDS: Record<string, FieldSchema> = {
  q: {
    type: "string",
    maxLength: 200,
    description:
      "Full-text search over titles, descriptions, keywords, creators, localities and node names (every word must match: as whole words when some networks have them all, else as word beginnings; `meta.searchMatch` says which)",
    example: "Verrin",
  },
  interactionType: list("Interaction type(s): pollination, seed-dispersal, host-parasitoid, predator-prey, herbivory, other", { type: "string" }, ["pollination"]),
  kind: list("bipartite or unipartite", { type: "string", enum: ["bipartite", "unipartite"] }),
  weighted: list("true (weighted) or false (binary)", { type: "boolean" }),
  habitat: list("Habitat(s), as written in the metadata", { type: "string" }),
  country: list("Country code(s), ISO 3166-1 alpha-2", { type: "string", "x-case": "upper" }, ["NO"]),
  licence: list("Licence(s): CC0-1.0, CC-BY-4.0", { type: "string" }),
  continent: list("Continent code(s) AF, AN, AS, EU, NA, OC, SA, derived from the country code (countries-list: one continent per country)", { type: "string", enum: CONTINENT_CODES, "x-case": "upper" }, ["EU"]),
  ...range("year", "Sampling years overlap [yearMin, yearMax]", "See yearMin", { type: "integer", minimum: 1000, maximum: 3000 }, 2019),
  ...range("nodes", "At least this many nodes (S)", "At most this many nodes (S)", { type: "integer", minimum: 0 }),
  ...range("connectance", "Connectance at least", "Connectance at most", degrees(0, 1)),
  ...range("q", "Modularity Q at least (networks without metrics are left out)", "Modularity Q at most", { type: "number" }),
  ...range("z", "z against the null model in nullModel at least (networks without that model's z are left out)", "z at most (against nullModel)", { type: "number" }),
  ...range("p", "p against the null model in nullModel at least", "p against the null model in nullModel at most (e.g. 0.05)", degrees(0, 1)),
  ...range("latitude", "Public (generalised) latitude at least, degrees (south negative); networks without coordinates are left out", "Public latitude at most, degrees", degrees(-90, 90), 50),
  ...range("elevation", "Elevation at least, metres", "Elevation at most, metres", degrees(-500, 9000)),
  bbox: {
    type: "array",
    prefixItems: [degrees(-180, 180), degrees(-90, 90), degrees(-180, 180), degrees(-90, 90)],
    minItems: 4,
    maxItems: 4,
    "x-rule": "must be four numbers west,south,east,north in degrees (longitudes −180…180, latitudes −90…90).",
    description: "An area: west,south,east,north in degrees on the public (generalised) coordinates, edges included; west greater than east crosses the antimeridian",
    example: [-10, 50, 30, 70],
  },
  nullModel: {
    type: "string",
    enum: [...NULL_MODELS],
    default: DEFAULT_CATALOGUE_NULL_MODEL,
    description: "The null model of the z, Q_rel and p columns and of the z/p filters and z sort: one model for all rows, never a mix. Default curveball (fixed degrees), the primary null of every kind of data.",
  },
};

const SORT_FIELDS: Record<string, FieldSchema> = {
  sort: { type: "string", enum: [...SORT_KEYS], description: "Sort key (z: against nullModel); default relevance with q, else accession" },
  order: { type: "string", enum: ["asc", "desc"], description: "asc or desc (missing values always last); default desc when sorting by relevance, else asc" },
};

/** Rules across fields: a range's ends in order, an area's south edge south of its north edge. */
export const catalogueRules: QueryRules = (v, failed) => {
  const out: ErrorDetail[] = [];
  for (const name of Object.keys(RANGES)) {
    const [lo, hi] = [`${name}Min`, `${name}Max`];
    const [min, max] = [v[lo], v[hi]];
    if (typeof min === "number" && typeof max === "number" && !failed.has(lo) && !failed.has(hi) && min > max) {
      out.push({ path: lo, message: `${lo} (${min}) is greater than ${hi} (${max}): no network could match. Swap them or change one.` });
    }
  }
  const b = v.bbox;
  if (Array.isArray(b) && b.length === 4 && !failed.has("bbox") && (b[1] as number) > (b[3] as number)) {
    out.push({ path: "bbox", message: `bbox south (${String(b[1])}) is north of its north (${String(b[3])}): write west,south,east,north.` });
  }
  return out;
};

/** Filters with their sort order: a bundle's or a collection's `filter` (the bundle lists the networks in that order). */
export const catalogueFilterQuery: ObjectSchema = { type: "object", properties: { ...CATALOGUE_FILTER_FIELDS, ...SORT_FIELDS }, additionalProperties: false };

export const catalogueSchema: RequestSchema = {
  query: {
    type: "object",
    properties: {
      ...CATALOGUE_FILTER_FIELDS,
      ...SORT_FIELDS,
      page: { type: "integer", minimum: 1, default: 1, description: "Page number, from 1" },
      pageSize: { type: "integer", minimum: 1, maximum: MAX_PAGE_SIZE, default: 25, description: `Rows per page (at most ${MAX_PAGE_SIZE})` },
      format: { type: "string", enum: ["json"], description: "json, the only form of a list (one network's data is also CSV: /networks/{accession}/{version}/{position}?format=csv)" },
    },
    additionalProperties: false,
  },
  queryRules: catalogueRules,
};

/** The query validate() left (coerced, defaults filled in) as the service reads it. */
export function toCatalogueQuery(v: Record<string, unknown>): CatalogueQuery {
  const some = <T>(x: unknown): T[] | undefined => (Array.isArray(x) && x.length ? (x as T[]) : undefined);
  const num = (x: unknown) => (typeof x === "number" ? x : undefined);
  const ranges = Object.fromEntries(Object.entries(RANGES).map(([name, key]) => [key, { min: num(v[`${name}Min`]), max: num(v[`${name}Max`]) }])) as Record<(typeof RANGES)[keyof typeof RANGES], Range>;
  const q = v.q as string | undefined;
  const sort = v.sort as SortKey | undefined;
  const bbox = some<number>(v.bbox);
  return {
    q,
    interactionType: some(v.interactionType),
    kind: some(v.kind),
    weighted: some(v.weighted),
    habitat: some(v.habitat),
    country: some(v.country),
    licence: some(v.licence),
    continent: some(v.continent),
    ...ranges,
    ...(bbox ? { bbox: { west: bbox[0], south: bbox[1], east: bbox[2], north: bbox[3] } } : {}),
    nullModel: (v.nullModel as string | undefined) ?? DEFAULT_CATALOGUE_NULL_MODEL,
    sort: sort ?? (q ? "relevance" : "accession"),
    order: (v.order as "asc" | "desc" | undefined) ?? (sort === undefined && q ? "desc" : "asc"),
    page: (v.page as number | undefined) ?? 1,
    pageSize: (v.pageSize as number | undefined) ?? 25,
  };
}

/** A bundle's or a collection's filter (query parameters, or a JSON object at `pointer` in a body), checked by the same schema. */
export function readCatalogueFilter(raw: Record<string, unknown>, pointer?: string): CatalogueQuery {
  return toCatalogueQuery(readQuery(catalogueFilterQuery, raw, catalogueRules, pointer));
}
