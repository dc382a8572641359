/** GET /api/v1/network-views/map?<catalogue filters> — every matching network with public coordinates. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { MapPointRow } from "@shared/types/network-view";

export const coverageKeys = {
  all: ["coverage-map"] as const,
  points: (query: string) => [...coverageKeys.all, "points", query] as const,
};

export const getMapPointsQueryOptions = (query: string) =>
  queryOptions({
    queryKey: coverageKeys.points(query),
    queryFn: () => apiFetch<{ data: MapPointRow[]; meta: { total: number; placed: number } }>(`/network-views/map${query ? `?${query}` : ""}`),
    staleTime: 60_000,
  });

export function useMapPoints(query: string) {
  return useQuery(getMapPointsQueryOptions(query));
}
