import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { Role, UserSummary } from "@shared/types/auth";
import { usersKeys } from "./get-users";

export function changeUserRole(input: { id: number; role: Role }): Promise<UserSummary> {
  return apiFetch(`/users/${input.id}/role`, { method: "PATCH", json: { role: input.role } });
}

export function useChangeUserRole() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: changeUserRole,
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: usersKeys.lists() });
      void qc.invalidateQueries({ queryKey: ["auth", "session"] });
    },
  });
}
