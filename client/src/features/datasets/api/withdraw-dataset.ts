/** POST /api/v1/datasets/:accession/withdraw (curators and admins): the dataset leaves the catalogue; its tombstone stays. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import { datasetKeys } from "./get-dataset";

export const withdrawDataset = (accession: string, reason: string) =>
  apiFetch<{ accession: string; reason: string; withdrawnAt: string }>(`/datasets/${encodeURIComponent(accession)}/withdraw`, { method: "POST", json: { reason } });

export function useWithdrawDataset() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (a: { accession: string; reason: string }) => withdrawDataset(a.accession, a.reason),
    onSuccess: () => void qc.invalidateQueries({ queryKey: datasetKeys.all }),
  });
}
