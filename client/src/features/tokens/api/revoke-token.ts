import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import { tokensKeys, type ApiTokenView } from "./get-tokens";

export function revokeToken(id: number): Promise<{ token: ApiTokenView }> {
  return apiFetch(`/tokens/${id}`, { method: "DELETE" });
}

export function useRevokeToken() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: revokeToken, onSuccess: () => void qc.invalidateQueries({ queryKey: tokensKeys.all }) });
}
