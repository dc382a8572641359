import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { ListResponse } from "@shared/types/api";
import type { BatchProgress } from "@shared/types/pipeline";
import { pipelineKeys } from "./keys";

export type BatchList = ListResponse<BatchProgress, { total: number; page: number; pageSize: number }>;
export const BATCH_PAGE_SIZE = 10;

export function getBatches(page: number): Promise<BatchList> {
  return apiFetch(`/pipeline/batches?page=${page}&pageSize=${BATCH_PAGE_SIZE}`);
}

export const getBatchesQueryOptions = (page: number, polling = false) =>
  queryOptions({
    queryKey: pipelineKeys.batchList(page),
    queryFn: () => getBatches(page),
    placeholderData: keepPreviousData,
    refetchInterval: polling ? 5000 : false,
  });

export function useBatches(page: number, polling = false) {
  return useQuery(getBatchesQueryOptions(page, polling));
}
