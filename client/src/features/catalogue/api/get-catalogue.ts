import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";

/** One catalogue row (server: server/src/api/catalogue/catalogue.service.ts CatalogueRow). */
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
}

export interface CataloguePage {
  data: CatalogueRow[];
  meta: { total: number; page: number; pageSize: number; facets: CatalogueFacets };
}

export const catalogueKeys = {
  all: ["catalogue"] as const,
  page: (search: string) => [...catalogueKeys.all, "page", search] as const,
};

/** `search` is the catalogue's URL query string (the API takes the same parameters). */
export function getCatalogue(search: string): Promise<CataloguePage> {
  return apiFetch(`/catalogue${search ? `?${search}` : ""}`);
}

export const getCatalogueQueryOptions = (search: string) =>
  queryOptions({ queryKey: catalogueKeys.page(search), queryFn: () => getCatalogue(search), placeholderData: keepPreviousData });

export function useCatalogue(search: string) {
  return useQuery(getCatalogueQueryOptions(search));
}
