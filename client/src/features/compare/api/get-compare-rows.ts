/**
 * GET /api/v1/network-views/summaries?refs=… — light rows for the compare view, and the references that
 * cannot be plotted (malformed, unknown, withdrawn) with their reasons.
 */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { CompareRowsResponse } from "@shared/types/network-view";

export const compareKeys = {
  all: ["compare"] as const,
  rows: (refs: string[]) => [...compareKeys.all, "rows", refs] as const,
  collection: (code: string, revision: number | null) => [...compareKeys.all, "collection", code, revision ?? "current"] as const,
};

export const getCompareRowsQueryOptions = (refs: string[]) =>
  queryOptions({
    queryKey: compareKeys.rows(refs),
    queryFn: () => apiFetch<CompareRowsResponse>(`/network-views/summaries?refs=${encodeURIComponent(refs.join(","))}`),
    staleTime: 60_000,
  });

export function useCompareRows(refs: string[]) {
  // keep the previous chart while a changed selection loads, so removing a network does not blank the page
  return useQuery({ ...getCompareRowsQueryOptions(refs), enabled: refs.length > 0, placeholderData: keepPreviousData });
}
