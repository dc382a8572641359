import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { depositKeys } from "./types";

export const getNetworkCanonical = (versionId: number, networkId: number) => apiFetch<CanonicalNetworkJson>(`/deposits/${versionId}/networks/${networkId}/canonical`);
export const getNetworkCanonicalQueryOptions = (versionId: number, networkId: number) =>
  queryOptions({ queryKey: depositKeys.canonical(versionId, networkId), queryFn: () => getNetworkCanonical(versionId, networkId), staleTime: Infinity });
export const useNetworkCanonical = (versionId: number, networkId: number) => useQuery(getNetworkCanonicalQueryOptions(versionId, networkId));
