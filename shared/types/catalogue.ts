/**
 * The catalogue's API shapes, shared by the server (server/src/api/catalogue) and the client: one row per
 * published network with its current metrics, and facet counts per filter value.
 */
/** Rows per page the catalogue offers (the API accepts any pageSize up to the largest). */
export const CATALOGUE_PAGE_SIZES = [25, 50, 100, 250] as const;

/**
 * The example in the catalogue's search field: it must find networks in the demo scenario (a test seeds
 * the scenario and searches for it).
 */
export const SEARCH_EXAMPLE = "Verrin heath";

export interface FacetValue {
  value: string;
  count: number;
  /** How to show the value when it is a code (continents: "EU" → "Europe"). */
  label?: string;
}
export interface RangeFacet {
  min: number | null;
  max: number | null;
}
export interface CatalogueFacets {
  interactionType: FacetValue[];
  kind: FacetValue[];
  weighted: FacetValue[];
  habitat: FacetValue[];
  country: FacetValue[];
  licence: FacetValue[];
  /** Continents derived from the country codes of the matches. */
  continent: FacetValue[];
  year: RangeFacet;
  nodes: RangeFacet;
  connectance: RangeFacet;
  Q: RangeFacet;
  /** z and p of the null model in `nullModel`. */
  z: RangeFacet;
  /** Matching networks per field marked not recorded (coordinates, elevation, dates, habitat, samplingEffort). */
  notRecorded: FacetValue[];
  p: RangeFacet;
  /** Public (generalised) latitude in degrees and elevation in metres among the matches. */
  latitude: RangeFacet;
  elevation: RangeFacet;
  /** The null model the z column and the z/p filters use. */
  nullModel: string;
  /** The null models with figures in the catalogue and how many networks have each. */
  nullModels: FacetValue[];
}

/** The public shape of a catalogue row. */
export interface CatalogueRow {
  ref: string;
  networkId: number;
  accession: string;
  version: number;
  position: number;
  name: string;
  title: string;
  licence: string;
  interactionType: string | null;
  kind: "bipartite" | "unipartite";
  directed: boolean;
  weighted: boolean;
  habitat: string | null;
  country: string | null;
  placeName: string | null;
  startYear: number | null;
  endYear: number | null;
  S: number;
  rows: number | null;
  cols: number | null;
  L: number;
  C: number | null;
  Q: number | null;
  modules: number | null;
  /** The null model of z, zSe, qRel, deltaQ, p (the one the query chose; the same for every row). */
  nullModel: string;
  z: number | null;
  zSe: number | null;
  qRel: number | null;
  deltaQ: number | null;
  p: number | null;
  /** p is the floor 1/(n + 1) of its n nulls: read "p ≤". */
  pAtFloor: boolean;
  nullN: number | null;
  /** The network's primary null model. */
  primaryNull: string | null;
  nodf: number | null;
  metricsStatus: "succeeded" | "none";
  /** False when the figures are the last good run of older settings (a newer computation failed or is pending). */
  currentSettings: boolean | null;
}

export interface CataloguePage {
  data: CatalogueRow[];
  meta: {
    total: number;
    page: number;
    pageSize: number;
    facets: CatalogueFacets;
    /**
     * How the search words matched: "words" (every word found as a whole word), "prefix" (no network had
     * them all as whole words, so they matched as word beginnings), null without a search.
     */
    searchMatch: "words" | "prefix" | null;
  };
}
