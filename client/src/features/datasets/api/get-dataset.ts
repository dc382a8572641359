/**
 * GET /api/v1/datasets/:accession (latest published) and /api/v1/datasets/:accession/versions/:n.
 * A withdrawn version answers 410 with its tombstone, which this fetcher returns as data (the page shows it).
 */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { ApiClientError } from "../../../lib/api-client";
import type { DatasetDetail } from "@shared/types/dataset";
import type { Tombstone } from "@shared/types/network-view";

/** The body of every 410 answer of the read API (a withdrawn version). */
export type DatasetTombstone = Tombstone;

export type DatasetAnswer = { kind: "dataset"; dataset: DatasetDetail } | { kind: "withdrawn"; tombstone: DatasetTombstone };

export const datasetKeys = {
  all: ["datasets"] as const,
  details: () => [...datasetKeys.all, "detail"] as const,
  detail: (accession: string, version: number | null) => [...datasetKeys.details(), accession, version ?? "latest"] as const,
  history: (accession: string) => [...datasetKeys.all, "history", accession] as const,
};

export async function getDataset(accession: string, version: number | null): Promise<DatasetAnswer> {
  const path = version === null ? `/datasets/${encodeURIComponent(accession)}` : `/datasets/${encodeURIComponent(accession)}/versions/${version}`;
  const res = await fetch(`/api/v1${path}`, { headers: { accept: "application/json" }, credentials: "same-origin" });
  if (res.status === 410) return { kind: "withdrawn", tombstone: (await res.json()) as DatasetTombstone };
  if (!res.ok) {
    const body = (await res.json().catch(() => ({}))) as { code?: string; message?: string };
    throw new ApiClientError(res.status, body.code ?? "http_error", body.message ?? `Request failed with status ${res.status}`);
  }
  return { kind: "dataset", dataset: (await res.json()) as DatasetDetail };
}

export const getDatasetQueryOptions = (accession: string, version: number | null) =>
  queryOptions({
    queryKey: datasetKeys.detail(accession, version),
    queryFn: () => getDataset(accession, version),
    staleTime: 60_000,
    retry: (n, err) => n < 2 && !(err instanceof ApiClientError && err.status < 500),
  });

export function useDataset(accession: string, version: number | null) {
  return useQuery(getDatasetQueryOptions(accession, version));
}

