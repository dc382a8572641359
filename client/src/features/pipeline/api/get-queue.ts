import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { QueueProgress } from "@shared/types/pipeline";
import { PROGRESS_POLL_MS, QUEUE_IDLE_POLL_MS, pipelineKeys } from "./keys";

export function getQueue(): Promise<QueueProgress> {
  return apiFetch("/pipeline/queue");
}

/**
 * Metric runs of the current settings by phase; polled every 2 s while anything waits or runs (or while the
 * page knows a batch is running, so the overall counts follow it).
 */
export const getQueueQueryOptions = (batchRunning = false) =>
  queryOptions({
    queryKey: pipelineKeys.queue(),
    queryFn: getQueue,
    refetchInterval: (q) => (batchRunning || q.state.data?.active ? PROGRESS_POLL_MS : QUEUE_IDLE_POLL_MS),
  });

export function useQueue(batchRunning = false) {
  return useQuery(getQueueQueryOptions(batchRunning));
}
