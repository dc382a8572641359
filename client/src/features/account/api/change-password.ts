import { useMutation } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";

export function changePassword(input: { currentPassword: string; newPassword: string }): Promise<void> {
  return apiFetch("/account/password", { method: "PUT", json: input });
}

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
