import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { BatchProgress } from "@shared/types/pipeline";
import { pipelineKeys } from "./keys";

export function retryBatch(batchId: number): Promise<BatchProgress> {
  return apiFetch(`/pipeline/batches/${batchId}/retry`, { method: "POST", json: {} });
}

export function useRetryBatch() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: retryBatch,
    onSuccess: () => void qc.invalidateQueries({ queryKey: pipelineKeys.batches() }),
  });
}
