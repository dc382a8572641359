import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { ListResponse } from "../../../../../shared/types/api";
import { reviewKeys, type QueueItem } from "./types";

export const getReviewQueue = () => apiFetch<ListResponse<QueueItem>>("/reviews");
export const getReviewQueueQueryOptions = () => queryOptions({ queryKey: reviewKeys.queue(), queryFn: getReviewQueue });
export const useReviewQueue = () => useQuery(getReviewQueueQueryOptions());
