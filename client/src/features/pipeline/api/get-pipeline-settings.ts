import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { PipelineSettingsResponse } from "@shared/types/pipeline";
import { pipelineKeys } from "./keys";

export function getPipelineSettings(): Promise<PipelineSettingsResponse> {
  return apiFetch("/pipeline/settings");
}

export const getPipelineSettingsQueryOptions = () => queryOptions({ queryKey: pipelineKeys.settings(), queryFn: getPipelineSettings });

export function usePipelineSettings() {
  return useQuery(getPipelineSettingsQueryOptions());
}
