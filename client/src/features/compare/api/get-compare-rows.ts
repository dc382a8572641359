/** GET /api/v1/network-views/summaries?refs=… — light rows for the compare view. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { NetworkCompareRow } from "../../../../../shared/types/network-view";

export const compareKeys = {
  all: ["compare"] as const,
  rows: (refs: string[]) => [...compareKeys.all, "rows", refs] as const,
};

export const getCompareRowsQueryOptions = (refs: string[]) =>
  queryOptions({
    queryKey: compareKeys.rows(refs),
    queryFn: () => apiFetch<{ data: NetworkCompareRow[] }>(`/network-views/summaries?refs=${encodeURIComponent(refs.join(","))}`).then((r) => r.data),
    staleTime: 60_000,
  });

export function useCompareRows(refs: string[]) {
  return useQuery({ ...getCompareRowsQueryOptions(refs), enabled: refs.length > 0 });
}
