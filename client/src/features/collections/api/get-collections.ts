import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { CollectionDetail, CollectionSummary } from "@shared/types/collection";

export const collectionKeys = {
  all: ["collections"] as const,
  mine: () => [...collectionKeys.all, "mine"] as const,
  details: () => [...collectionKeys.all, "detail"] as const,
  detail: (code: string, revision?: number) => [...collectionKeys.details(), code, revision ?? "current"] as const,
};

export function getMyCollections(): Promise<{ data: CollectionSummary[] }> {
  return apiFetch("/collections");
}

export function getCollection(code: string, revision?: number): Promise<CollectionDetail> {
  return apiFetch(`/collections/${encodeURIComponent(code)}${revision ? `?revision=${revision}` : ""}`);
}

export const getMyCollectionsQueryOptions = () => queryOptions({ queryKey: collectionKeys.mine(), queryFn: getMyCollections });
export const getCollectionQueryOptions = (code: string, revision?: number) =>
  queryOptions({ queryKey: collectionKeys.detail(code, revision), queryFn: () => getCollection(code, revision), retry: false });

export function useMyCollections(enabled = true) {
  return useQuery({ ...getMyCollectionsQueryOptions(), enabled });
}

export function useCollection(code: string, revision?: number) {
  return useQuery(getCollectionQueryOptions(code, revision));
}
