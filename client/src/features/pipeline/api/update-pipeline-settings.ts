import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { PipelineSettings, PipelineSettingsResponse } from "@shared/types/pipeline";
import { pipelineKeys } from "./keys";

export function updatePipelineSettings(settings: PipelineSettings): Promise<PipelineSettingsResponse> {
  return apiFetch("/pipeline/settings", { method: "PUT", json: settings });
}

export function useUpdatePipelineSettings() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updatePipelineSettings,
    onSuccess: (data) => qc.setQueryData(pipelineKeys.settings(), data),
  });
}
