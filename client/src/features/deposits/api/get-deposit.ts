import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import { depositKeys, type DepositDetail } from "./types";

export const getDeposit = (id: number) => apiFetch<DepositDetail>(`/deposits/${id}`);
export const getDepositQueryOptions = (id: number) => queryOptions({ queryKey: depositKeys.detail(id), queryFn: () => getDeposit(id) });
export const useDeposit = (id: number | null) => useQuery({ ...getDepositQueryOptions(id ?? 0), enabled: id !== null });
