import { useMutation } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";

/** Asks for a new confirmation link (for the signed-in account, or for `email`). Always 202. */
export function resendVerification(email?: string): Promise<{ message: string }> {
  return apiFetch("/auth/verification-email", { method: "POST", json: email ? { email } : {} });
}

export function useResendVerification() {
  return useMutation({ mutationFn: resendVerification });
}
