import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { ListResponse } from "@shared/types/api";
import { depositKeys, type DepositListItem } from "./types";

export const getMyDeposits = () => apiFetch<ListResponse<DepositListItem>>("/deposits");
export const getMyDepositsQueryOptions = () => queryOptions({ queryKey: depositKeys.lists(), queryFn: getMyDeposits });
export const useMyDeposits = () => useQuery(getMyDepositsQueryOptions());
