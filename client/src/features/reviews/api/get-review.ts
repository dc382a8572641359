import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { reviewKeys, type ReviewDetail } from "./types";

export const getReview = (id: number) => apiFetch<ReviewDetail>(`/reviews/${id}`);
export const getReviewQueryOptions = (id: number) => queryOptions({ queryKey: reviewKeys.detail(id), queryFn: () => getReview(id) });
export const useReview = (id: number) => useQuery(getReviewQueryOptions(id));

/** The parsed network for the preview picture (GET /deposits/:id/networks/:nid/canonical, curators may read). */
export const getReviewCanonical = (versionId: number, networkId: number) => apiFetch<CanonicalNetworkJson>(`/deposits/${versionId}/networks/${networkId}/canonical`);
export const useReviewCanonical = (versionId: number, networkId: number) =>
  useQuery({ queryKey: reviewKeys.canonical(versionId, networkId), queryFn: () => getReviewCanonical(versionId, networkId), staleTime: Infinity });
