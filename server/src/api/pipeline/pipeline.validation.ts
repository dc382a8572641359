/** Request validation of the metrics pipeline routes. */
import type { PipelineSettings } from "@shared/types/pipeline";
import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { validateSettings } from "../../pipeline/settings";

const RUN_STATUSES = ["queued", "running", "succeeded", "failed", "superseded"];

export function parseSettings(body: unknown, base: PipelineSettings): PipelineSettings {
  const { settings, errors } = validateSettings(body, base);
  if (!settings) throw ApiError.badRequest("Some pipeline settings are not valid.", errors);
  return settings;
}

export function parseBatchStart(body: unknown, base: PipelineSettings): { settings: PipelineSettings; force: boolean } {
  if (body === undefined || body === null) return { settings: base, force: false };
  if (typeof body !== "object" || Array.isArray(body)) throw ApiError.badRequest("The request body must be a JSON object.");
  const o = body as Record<string, unknown>;
  const d: ErrorDetail[] = [];
  for (const k of Object.keys(o)) if (k !== "settings" && k !== "force") d.push({ path: `/${k}`, message: `unknown field "${k}"` });
  if (o.force !== undefined && typeof o.force !== "boolean") d.push({ path: "/force", message: "force must be true or false" });
  let settings = base;
  if (o.settings !== undefined) {
    const r = validateSettings(o.settings, base);
    if (r.settings) settings = r.settings;
    else d.push(...r.errors.map((e) => ({ ...e, path: `/settings${e.path === "/" ? "" : e.path}` })));
  }
  if (d.length) throw ApiError.badRequest("The batch request is not valid.", d);
  return { settings, force: o.force === true };
}

export function parseId(raw: unknown, what: string): number {
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1 || n > 2147483647) throw ApiError.notFound(`No such ${what}.`);
  return n;
}

function intParam(raw: unknown, name: string, fallback: number, min: number, max: number, d: ErrorDetail[]): number {
  if (raw === undefined || raw === "") return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < min || n > max) {
    d.push({ path: name, message: `${name} must be a whole number from ${min} to ${max}.` });
    return fallback;
  }
  return n;
}

export function parsePage(q: Record<string, unknown>): { page: number; pageSize: number } {
  const d: ErrorDetail[] = [];
  const out = { page: intParam(q.page, "page", 1, 1, 100000, d), pageSize: intParam(q.pageSize, "pageSize", 20, 1, 100, d) };
  if (d.length) throw ApiError.badRequest("Some query parameters are not valid.", d);
  return out;
}

export function parseRunQuery(q: Record<string, unknown>): { status?: string; batchId?: number; page: number; pageSize: number } {
  const d: ErrorDetail[] = [];
  const out: { status?: string; batchId?: number; page: number; pageSize: number } = {
    page: intParam(q.page, "page", 1, 1, 100000, d),
    pageSize: intParam(q.pageSize, "pageSize", 50, 1, 200, d),
  };
  if (q.status !== undefined && q.status !== "") {
    if (typeof q.status !== "string" || !RUN_STATUSES.includes(q.status)) d.push({ path: "status", message: `status must be one of ${RUN_STATUSES.join(", ")}.` });
    else out.status = q.status;
  }
  if (q.batchId !== undefined && q.batchId !== "") out.batchId = intParam(q.batchId, "batchId", 0, 1, 2147483647, d);
  if (d.length) throw ApiError.badRequest("Some query parameters are not valid.", d);
  return out;
}
