import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { QueueProgress } from "../../../../../shared/types/pipeline";
import { PROGRESS_POLL_MS, QUEUE_IDLE_POLL_MS, pipelineKeys } from "./keys";

export function getQueue(): Promise<QueueProgress> {
  return apiFetch("/pipeline/queue");
}

/** Metric runs of the current settings by phase; polled every 2 s while anything waits or runs. */
export const getQueueQueryOptions = () =>
  queryOptions({
    queryKey: pipelineKeys.queue(),
    queryFn: getQueue,
    refetchInterval: (q) => (q.state.data?.active ? PROGRESS_POLL_MS : QUEUE_IDLE_POLL_MS),
  });

export function useQueue() {
  return useQuery(getQueueQueryOptions());
}
