/** GET /api/v1/network-views/history/:accession — the audit history (curators only). */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { AuditEntry } from "@shared/types/network-view";
import { datasetKeys } from "./get-dataset";

export const getDatasetHistoryQueryOptions = (accession: string) =>
  queryOptions({
    queryKey: datasetKeys.history(accession),
    queryFn: () => apiFetch<{ data: AuditEntry[] }>(`/network-views/history/${encodeURIComponent(accession)}`).then((r) => r.data),
  });

export function useDatasetHistory(accession: string, enabled: boolean) {
  return useQuery({ ...getDatasetHistoryQueryOptions(accession), enabled });
}
