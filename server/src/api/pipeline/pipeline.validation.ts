/** Request validation of the metrics pipeline routes. */
import type { PipelineSettings } from "@shared/types/pipeline";
import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { validateSettings } from "../../pipeline/settings";

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
