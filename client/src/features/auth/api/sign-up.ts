import { useMutation } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { SessionUser } from "@shared/types/auth";

export interface SignUpInput {
  email: string;
  displayName: string;
  password: string;
}

export function signUp(input: SignUpInput): Promise<{ user: SessionUser; message: string }> {
  return apiFetch("/auth/sign-up", { method: "POST", json: input });
}

export function useSignUp() {
  return useMutation({ mutationFn: signUp });
}
