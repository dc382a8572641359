import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { Role, UserSummary } from "@shared/types/auth";
import type { ListResponse } from "@shared/types/api";

export interface UserFilters {
  role?: Role;
  email?: string;
  page: number;
  pageSize: number;
}

export const usersKeys = {
  all: ["users"] as const,
  lists: () => [...usersKeys.all, "list"] as const,
  list: (f: UserFilters) => [...usersKeys.lists(), f] as const,
};

export type UserList = ListResponse<UserSummary, { total: number; page: number; pageSize: number }>;

export function getUsers(f: UserFilters): Promise<UserList> {
  const q = new URLSearchParams({ page: String(f.page), pageSize: String(f.pageSize) });
  if (f.role) q.set("role", f.role);
  if (f.email) q.set("email", f.email);
  return apiFetch(`/users?${q}`);
}

export const getUsersQueryOptions = (f: UserFilters) => queryOptions({ queryKey: usersKeys.list(f), queryFn: () => getUsers(f), placeholderData: keepPreviousData });

export function useUsers(f: UserFilters) {
  return useQuery(getUsersQueryOptions(f));
}
