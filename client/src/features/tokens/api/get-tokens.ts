import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { ApiTokenView } from "@shared/types/auth";

export type { ApiTokenView };

export const tokensKeys = {
  all: ["api-tokens"] as const,
  list: () => [...tokensKeys.all, "list"] as const,
};

export function getTokens(): Promise<{ data: ApiTokenView[] }> {
  return apiFetch("/tokens");
}

export const getTokensQueryOptions = () => queryOptions({ queryKey: tokensKeys.list(), queryFn: getTokens });

export function useTokens() {
  return useQuery(getTokensQueryOptions());
}
