import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";

export type { CatalogueFacets, CataloguePage, CatalogueRow, FacetValue, RangeFacet } from "@shared/types/catalogue";
import type { CataloguePage } from "@shared/types/catalogue";

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
