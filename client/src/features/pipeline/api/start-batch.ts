import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { BatchProgress, PipelineSettings } from "@shared/types/pipeline";
import { pipelineKeys } from "./keys";

export function startBatch(input: { settings: PipelineSettings; force: boolean }): Promise<BatchProgress> {
  return apiFetch("/pipeline/batches", { method: "POST", json: input });
}

export function useStartBatch() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: startBatch,
    onSuccess: (batch) => {
      qc.setQueryData(pipelineKeys.currentBatch(), { batch });
      void qc.invalidateQueries({ queryKey: pipelineKeys.batches() });
      void qc.invalidateQueries({ queryKey: pipelineKeys.settings() });
    },
  });
}
