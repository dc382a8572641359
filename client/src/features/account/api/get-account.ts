import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { AccountProfile } from "@shared/types/auth";

export const accountKeys = {
  all: ["account"] as const,
  profile: () => [...accountKeys.all, "profile"] as const,
};

export function getAccount(): Promise<AccountProfile> {
  return apiFetch("/account");
}

export const getAccountQueryOptions = () => queryOptions({ queryKey: accountKeys.profile(), queryFn: getAccount });

export function useAccount() {
  return useQuery(getAccountQueryOptions());
}
