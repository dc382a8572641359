import { useMutation } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";

export function requestPasswordReset(email: string): Promise<{ message: string }> {
  return apiFetch("/auth/password-reset", { method: "POST", json: { email } });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
