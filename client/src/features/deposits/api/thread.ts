/** GET and POST /deposits/:id/comments — the submission's conversation, from the depositor's side. */
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { ThreadResponse } from "@shared/types/review";
import { depositKeys } from "./types";

export const getDepositThread = (id: number) => apiFetch<ThreadResponse>(`/deposits/${id}/comments`);
export const getDepositThreadQueryOptions = (id: number) => queryOptions({ queryKey: depositKeys.thread(id), queryFn: () => getDepositThread(id) });
export const useDepositThread = (id: number) => useQuery(getDepositThreadQueryOptions(id));

export const postDepositComment = (id: number, body: string) => apiFetch<ThreadResponse>(`/deposits/${id}/comments`, { method: "POST", json: { body } });
export function usePostDepositComment(id: number) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: string) => postDepositComment(id, body), onSuccess: (t) => qc.setQueryData(depositKeys.thread(id), t) });
}
