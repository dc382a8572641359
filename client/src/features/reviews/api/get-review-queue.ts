import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { ListResponse } from "@shared/types/api";
import { reviewKeys, type QueueItem } from "./types";

export interface QueueFilter {
  state: string;
  q: string;
}
export const getReviewQueue = (f: QueueFilter) => apiFetch<ListResponse<QueueItem>>(`/reviews?${new URLSearchParams({ state: f.state, q: f.q })}`);
export const getReviewQueueQueryOptions = (f: QueueFilter) => queryOptions({ queryKey: [...reviewKeys.queue(), f], queryFn: () => getReviewQueue(f) });
export const useReviewQueue = (f: QueueFilter) => useQuery(getReviewQueueQueryOptions(f));
