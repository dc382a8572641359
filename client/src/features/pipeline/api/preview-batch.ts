import { useMutation } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { BatchPreview, PipelineSettings } from "@shared/types/pipeline";

/** What a batch with these settings would do (how many networks, how many figures change), before it starts. */
export function previewBatch(input: { settings: PipelineSettings; force: boolean }): Promise<BatchPreview> {
  return apiFetch("/pipeline/batches/preview", { method: "POST", json: input });
}

export function usePreviewBatch() {
  return useMutation({ mutationFn: previewBatch });
}
