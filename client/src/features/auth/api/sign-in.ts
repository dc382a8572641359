import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch, setCsrfToken } from "../../../lib/api-client";
import type { SessionInfo, SessionUser } from "@shared/types/auth";
import { authKeys } from "./get-session";

export interface SignInInput {
  email: string;
  password: string;
}

export function signIn(input: SignInInput): Promise<{ user: SessionUser; csrfToken: string }> {
  return apiFetch("/auth/sign-in", { method: "POST", json: input });
}

/** Signs in; the server gives a new session id and CSRF token, and cached data of the visitor is dropped. */
export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (res) => {
      setCsrfToken(res.csrfToken);
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      qc.setQueryData<SessionInfo>(authKeys.session(), { user: res.user, csrfToken: res.csrfToken });
    },
  });
}
