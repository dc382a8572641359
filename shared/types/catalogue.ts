/**
 * The catalogue's API shapes, shared by the server (server/src/api/catalogue) and the client: one row per
 * published network with its current metrics, and facet counts per filter value.
 */
export interface FacetValue {
  value: string;
  count: number;
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
  year: RangeFacet;
  nodes: RangeFacet;
  connectance: RangeFacet;
  Q: RangeFacet;
  z: RangeFacet;
  /** Matching networks per field marked not recorded (coordinates, elevation, dates, habitat, samplingEffort). */
  notRecorded: FacetValue[];
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
  z: number | null;
  qRel: number | null;
  p: number | null;
  nodf: number | null;
  metricsStatus: "succeeded" | "none";
}

export interface CataloguePage {
  data: CatalogueRow[];
  meta: { total: number; page: number; pageSize: number; facets: CatalogueFacets };
}
