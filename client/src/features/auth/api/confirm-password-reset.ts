import { useMutation } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";

export function confirmPasswordReset(input: { token: string; password: string }): Promise<{ message: string }> {
  return apiFetch("/auth/password-reset/confirm", { method: "POST", json: input });
}

export function useConfirmPasswordReset() {
  return useMutation({ mutationFn: confirmPasswordReset });
}
