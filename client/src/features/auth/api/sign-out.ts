import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch, setCsrfToken } from "../../../lib/api-client";
import { authKeys, getSession } from "./get-session";

export function signOut(): Promise<void> {
  return apiFetch("/auth/sign-out", { method: "POST", json: {} });
}

/** Ends the session, forgets every cached query and fetches a fresh visitor session. */
export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: async () => {
      setCsrfToken(null);
      qc.clear();
      await qc.fetchQuery({ queryKey: authKeys.session(), queryFn: getSession });
    },
  });
}
