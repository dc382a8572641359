import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";

export interface OpenApiParameter {
  name: string;
  in: "path" | "query";
  required?: boolean;
  description?: string;
  schema?: { type?: string | string[]; enum?: string[] };
  example?: unknown;
}
export interface OpenApiOperation {
  tags?: string[];
  operationId: string;
  summary?: string;
  description?: string;
  parameters?: OpenApiParameter[];
  requestBody?: unknown;
  responses: Record<string, { description: string }>;
  security?: Array<Record<string, string[]>>;
}
export interface OpenApiDocument {
  openapi: string;
  info: { title: string; version: string; summary?: string; description?: string };
  servers: Array<{ url: string }>;
  tags: Array<{ name: string; description?: string }>;
  paths: Record<string, Record<string, OpenApiOperation>>;
}

export const openApiKeys = { doc: ["openapi"] as const };

export function getOpenApi(): Promise<OpenApiDocument> {
  return apiFetch("/openapi.json");
}

export const getOpenApiQueryOptions = () => queryOptions({ queryKey: openApiKeys.doc, queryFn: getOpenApi, staleTime: 5 * 60_000 });

export function useOpenApi() {
  return useQuery(getOpenApiQueryOptions());
}
