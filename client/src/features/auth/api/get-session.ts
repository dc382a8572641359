import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch, setCsrfToken } from "../../../lib/api-client";
import type { SessionInfo } from "@shared/types/auth";

export const authKeys = {
  all: ["auth"] as const,
  session: () => [...authKeys.all, "session"] as const,
};

export async function getSession(): Promise<SessionInfo> {
  const s = await apiFetch<SessionInfo>("/auth/session");
  setCsrfToken(s.csrfToken);
  return s;
}

export const getSessionQueryOptions = () => queryOptions({ queryKey: authKeys.session(), queryFn: getSession, staleTime: 60_000 });

export function useSession() {
  return useQuery(getSessionQueryOptions());
}
