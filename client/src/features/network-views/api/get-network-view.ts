import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { NetworkView } from "@shared/types/network-view";

export const networkViewKeys = {
  all: ["network-views"] as const,
  details: () => [...networkViewKeys.all, "detail"] as const,
  detail: (accession: string, version: number, position: number) => [...networkViewKeys.details(), accession, version, position] as const,
};

export function networkViewPath(accession: string, version: number, position: number): string {
  return `/network-views/${encodeURIComponent(accession)}/v${version}/${position}`;
}

export function getNetworkView(accession: string, version: number, position: number): Promise<NetworkView> {
  return apiFetch<NetworkView>(networkViewPath(accession, version, position));
}

export const getNetworkViewQueryOptions = (accession: string, version: number, position: number) =>
  queryOptions({
    queryKey: networkViewKeys.detail(accession, version, position),
    queryFn: () => getNetworkView(accession, version, position),
    staleTime: 5 * 60_000,
    retry: (n, err) => n < 2 && !(err && typeof err === "object" && "status" in err && [404, 410].includes((err as { status: number }).status)),
  });

export function useNetworkView(accession: string, version: number, position: number) {
  return useQuery(getNetworkViewQueryOptions(accession, version, position));
}
