import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";

export interface BundleEstimate {
  count: number;
  /** Uncompressed size of the bundle's files (the zip is smaller). */
  estimatedBytes: number;
  limit: number;
  overLimit: boolean;
  /** References of the selection that cannot be bundled (withdrawn, or not published), left out of count. */
  unavailable: Array<{ ref: string; reason: "withdrawn" | "not_published"; message: string }>;
}

export type BundleSelection = ({ refs: string[] } | { filter: Record<string, string> }) & { include?: string };

export const bundleKeys = {
  all: ["bundles"] as const,
  estimate: (s: BundleSelection) => [...bundleKeys.all, "estimate", s] as const,
};

export function estimateBundle(selection: BundleSelection): Promise<BundleEstimate> {
  return apiFetch("/bundles/estimate", { method: "POST", json: selection });
}

export const getBundleEstimateQueryOptions = (s: BundleSelection) => queryOptions({ queryKey: bundleKeys.estimate(s), queryFn: () => estimateBundle(s), staleTime: 30_000 });

export function useBundleEstimate(s: BundleSelection, enabled: boolean) {
  return useQuery({ ...getBundleEstimateQueryOptions(s), enabled });
}
