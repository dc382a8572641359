import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { BatchProgress } from "@shared/types/pipeline";
import { PROGRESS_POLL_MS, pipelineKeys } from "./keys";

export function getCurrentBatch(): Promise<{ batch: BatchProgress | null }> {
  return apiFetch("/pipeline/batches/current");
}

/** The running batch (else the latest), polled while it runs. */
export const getCurrentBatchQueryOptions = () =>
  queryOptions({
    queryKey: pipelineKeys.currentBatch(),
    queryFn: getCurrentBatch,
    refetchInterval: (q) => (q.state.data?.batch?.status === "running" ? PROGRESS_POLL_MS : false),
  });

export function useCurrentBatch() {
  return useQuery(getCurrentBatchQueryOptions());
}
