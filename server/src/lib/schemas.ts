/**
 * The one ajv instance of the server (JSON Schema draft 2020-12, ajv-formats, all errors) and the
 * validators of our metadata schemas (schemas/*.schema.json, also served at /schemas/<name>.schema.json).
 * Errors come back as one human message per field with a JSON-pointer path (shared/validation/messages.ts).
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { Ajv2020 } from "ajv/dist/2020.js";
import addFormatsModule from "ajv-formats";
import type { ErrorObject, ValidateFunction } from "ajv";
import { humanizeSchemaErrors, networkCrossChecks, type FieldError, type NetworkFacts } from "@shared/validation";
import { SCHEMAS_DIR } from "../config/paths";

export type SchemaName = "study" | "network";

const addFormats = (addFormatsModule as unknown as { default?: typeof addFormatsModule }).default ?? addFormatsModule;

let ajv: Ajv2020 | undefined;
const validators = new Map<SchemaName, ValidateFunction>();
const rawSchemas = new Map<SchemaName, Record<string, unknown>>();

export function schemaJson(name: SchemaName): Record<string, unknown> {
  let s = rawSchemas.get(name);
  if (!s) {
    s = JSON.parse(readFileSync(join(SCHEMAS_DIR, `${name}.schema.json`), "utf8")) as Record<string, unknown>;
    rawSchemas.set(name, s);
  }
  return s;
}

export function getAjv(): Ajv2020 {
  if (!ajv) {
    ajv = new Ajv2020({ allErrors: true, strict: true });
    addFormats(ajv);
  }
  return ajv;
}

function validator(name: SchemaName): ValidateFunction {
  let v = validators.get(name);
  if (!v) {
    v = getAjv().compile(schemaJson(name));
    validators.set(name, v);
  }
  return v;
}

/** ajv's raw errors (for tests comparing validators). */
export function rawSchemaErrors(name: SchemaName, data: unknown): ErrorObject[] {
  const v = validator(name);
  return v(data) ? [] : [...(v.errors ?? [])];
}

/** Human messages, one per field problem, with JSON-pointer paths; [] when valid. */
export function schemaFindings(name: SchemaName, data: unknown): FieldError[] {
  return humanizeSchemaErrors(rawSchemaErrors(name, data));
}

export function studyFindings(meta: unknown): FieldError[] {
  return schemaFindings("study", meta);
}

/** Schema findings plus the cross-field rules that depend on the parsed network. */
export function networkFindings(meta: unknown, facts: NetworkFacts): FieldError[] {
  const out = schemaFindings("network", meta);
  if (meta && typeof meta === "object" && !Array.isArray(meta)) {
    const seen = new Set(out.map((f) => f.path));
    for (const f of networkCrossChecks(meta as Record<string, unknown>, facts)) if (!seen.has(f.path)) out.push(f);
  }
  return out;
}
