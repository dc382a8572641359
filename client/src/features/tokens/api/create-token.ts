import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import { tokensKeys, type ApiTokenView } from "./get-tokens";

export function createToken(input: { name: string }): Promise<{ token: ApiTokenView; secret: string }> {
  return apiFetch("/tokens", { method: "POST", json: input });
}

export function useCreateToken() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createToken, onSuccess: () => void qc.invalidateQueries({ queryKey: tokensKeys.all }) });
}
