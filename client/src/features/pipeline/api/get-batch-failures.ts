import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { RunFailure } from "@shared/types/pipeline";
import { PROGRESS_POLL_MS, pipelineKeys } from "./keys";

export function getBatchFailures(batchId: number): Promise<{ data: RunFailure[]; meta: { total: number } }> {
  return apiFetch(`/pipeline/batches/${batchId}/failures`);
}

export const getBatchFailuresQueryOptions = (batchId: number, polling: boolean) =>
  queryOptions({
    queryKey: pipelineKeys.failures(batchId),
    queryFn: () => getBatchFailures(batchId),
    refetchInterval: polling ? PROGRESS_POLL_MS : false,
  });

export function useBatchFailures(batchId: number, polling: boolean) {
  return useQuery(getBatchFailuresQueryOptions(batchId, polling));
}
