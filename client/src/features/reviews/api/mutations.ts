/** POST /reviews/:id/decision, PUT /reviews/:id/metadata, PATCH /reviews/:id/networks/:nid. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import { reviewKeys, type ReviewDetail } from "./types";

export type Decision = "publish" | "request_changes" | "decline";

export const decide = (id: number, body: { decision: Decision; comment: string; lockVersion: number }) => apiFetch<ReviewDetail>(`/reviews/${id}/decision`, { method: "POST", json: body });
export const correctStudy = (id: number, metadata: unknown, lockVersion: number) => apiFetch<ReviewDetail>(`/reviews/${id}/metadata`, { method: "PUT", json: { metadata, lockVersion } });
export const correctNetwork = (id: number, networkId: number, metadata: unknown) => apiFetch<ReviewDetail>(`/reviews/${id}/networks/${networkId}`, { method: "PATCH", json: { metadata } });

export function useReviewMutation<A>(fn: (a: A) => Promise<ReviewDetail>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (d) => {
      qc.setQueryData(reviewKeys.detail(d.versionId), d);
      void qc.invalidateQueries({ queryKey: reviewKeys.queue() });
    },
  });
}

/** POST /datasets/:accession/withdraw (curator or admin; reason required). */
export const withdrawDataset = (accession: string, reason: string) =>
  apiFetch<{ accession: string; reason: string; withdrawnAt: string }>(`/datasets/${encodeURIComponent(accession)}/withdraw`, { method: "POST", json: { reason } });

export function useWithdrawDataset(versionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (a: { accession: string; reason: string }) => withdrawDataset(a.accession, a.reason),
    onSuccess: () => void qc.invalidateQueries({ queryKey: reviewKeys.detail(versionId) }),
  });
}
