import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import { authKeys } from "./get-session";

export function verifyEmail(token: string): Promise<{ user: { email: string; emailVerified: true }; message: string }> {
  return apiFetch("/auth/verify-email", { method: "POST", json: { token } });
}

/**
 * Confirming is a one-time POST; it is a query keyed by the token so that the page's request runs once
 * however often the component mounts (the second POST would find the link used).
 */
export const verifyEmailQueryOptions = (token: string) =>
  queryOptions({ queryKey: [...authKeys.all, "verify-email", token], queryFn: () => verifyEmail(token), retry: false, staleTime: Infinity, gcTime: Infinity });

export function useVerifyEmail(token: string) {
  return useQuery({ ...verifyEmailQueryOptions(token), enabled: token.length > 0 });
}
