import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiFetch, setCsrfToken } from "../../../lib/api-client";
import type { OrcidPending, SessionUser } from "@shared/types/auth";
import { authKeys } from "./get-session";

/** The ORCID iD verified a moment ago that has no account yet. */
export const getOrcidPendingQueryOptions = () => queryOptions({ queryKey: [...authKeys.all, "orcid-pending"], queryFn: () => apiFetch<OrcidPending>("/auth/orcid/pending"), retry: false });

export function useOrcidPending() {
  return useQuery(getOrcidPendingQueryOptions());
}

export function signUpWithOrcid(input: { email: string; displayName: string }): Promise<{ user: SessionUser; csrfToken: string; message: string }> {
  return apiFetch("/auth/orcid/sign-up", { method: "POST", json: input });
}

export function useSignUpWithOrcid() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signUpWithOrcid,
    onSuccess: (r) => {
      setCsrfToken(r.csrfToken);
      // awaited, so that the Account page's signed-in check reads the new session, not the signed-out one
      return qc.invalidateQueries({ queryKey: authKeys.session() });
    },
  });
}
