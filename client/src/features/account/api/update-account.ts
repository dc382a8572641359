import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { AccountProfile } from "@shared/types/auth";
import { accountKeys } from "./get-account";

export interface ProfilePatch {
  displayName?: string;
  affiliation?: string | null;
  orcid?: string | null;
}

export function updateAccount(patch: ProfilePatch): Promise<AccountProfile> {
  return apiFetch("/account", { method: "PATCH", json: patch });
}

/** Saves the profile; the session (header name) is refreshed too. */
export function useUpdateAccount() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateAccount,
    onSuccess: (profile) => {
      qc.setQueryData(accountKeys.profile(), profile);
      void qc.invalidateQueries({ queryKey: ["auth", "session"] });
    },
  });
}
