/** GET and POST /deposits/:id/comments — the submission's conversation, from the curator's side. */
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { ThreadResponse } from "@shared/types/review";
import { reviewKeys } from "./types";

export const getReviewThread = (id: number) => apiFetch<ThreadResponse>(`/deposits/${id}/comments`);
export const getReviewThreadQueryOptions = (id: number) => queryOptions({ queryKey: reviewKeys.thread(id), queryFn: () => getReviewThread(id) });
export const useReviewThread = (id: number) => useQuery(getReviewThreadQueryOptions(id));

export const postReviewComment = (id: number, body: string) => apiFetch<ThreadResponse>(`/deposits/${id}/comments`, { method: "POST", json: { body } });
export function usePostReviewComment(id: number) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: string) => postReviewComment(id, body), onSuccess: (t) => qc.setQueryData(reviewKeys.thread(id), t) });
}
