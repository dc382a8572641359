/**
 * A small JSON Schema (draft 2020-12) validator for the subset of keywords our metadata schemas use, with
 * ajv-compatible error objects. Why not ajv in the browser: ajv compiles schemas to functions with
 * `new Function`, which our Content-Security-Policy (`script-src 'self'`, no 'unsafe-eval') forbids. The
 * server validates with ajv (server/src/lib/schemas.ts); tests/server/lib/schemas.test.ts checks that this
 * validator reports the same (path, keyword) pairs as ajv on every example file.
 *
 * Keywords: type, enum, required, properties, additionalProperties (false or a schema), items, minItems,
 * maxItems, uniqueItems, minLength, maxLength (Unicode code points, like ajv), pattern (unicode flag),
 * format (email, date: ajv-formats' "full" rules), minimum, maximum, exclusiveMinimum, exclusiveMaximum.
 * Any other keyword in a schema throws, so the schemas cannot silently outgrow this validator.
 */
import type { SchemaError } from "./messages";

export interface JsonSchema {
  [key: string]: unknown;
}

const KNOWN = new Set([
  "$schema", "$id", "title", "description", "type", "enum", "required", "properties", "additionalProperties",
  "items", "minItems", "maxItems", "uniqueItems", "minLength", "maxLength", "pattern", "format", "minimum",
  "maximum", "exclusiveMinimum", "exclusiveMaximum", "examples", "default",
]);

// ajv-formats, mode "full" (the default of addFormats).
const EMAIL = /^[a-z0-9!#$%&'*+/=?^_`{|}~-]+(?:\.[a-z0-9!#$%&'*+/=?^_`{|}~-]+)*@(?:[a-z0-9](?:[a-z0-9-]*[a-z0-9])?\.)+[a-z0-9](?:[a-z0-9-]*[a-z0-9])?$/i;
const DATE = /^(\d\d\d\d)-(\d\d)-(\d\d)$/;
const DAYS = [0, 31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function isDate(s: string): boolean {
  const m = DATE.exec(s);
  if (!m) return false;
  const y = +m[1];
  const mo = +m[2];
  const d = +m[3];
  const leap = y % 4 === 0 && (y % 100 !== 0 || y % 400 === 0);
  return mo >= 1 && mo <= 12 && d >= 1 && d <= (mo === 2 && leap ? 29 : DAYS[mo]);
}

function jsonType(x: unknown): string {
  if (x === null) return "null";
  if (Array.isArray(x)) return "array";
  if (typeof x === "number") return Number.isInteger(x) ? "integer" : "number";
  return typeof x;
}

function typeMatches(x: unknown, t: string): boolean {
  const jt = jsonType(x);
  if (t === "number") return (jt === "number" || jt === "integer") && Number.isFinite(x as number);
  return jt === t;
}

function codePoints(s: string): number {
  let n = 0;
  for (const _ of s) n++;
  return n;
}

function deepEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== typeof b || a === null || b === null || typeof a !== "object") return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a)) {
    const bb = b as unknown[];
    return a.length === bb.length && a.every((v, i) => deepEqual(v, bb[i]));
  }
  const ka = Object.keys(a as object);
  const kb = Object.keys(b as object);
  return ka.length === kb.length && ka.every((k) => deepEqual((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}

function esc(s: string): string {
  return s.replace(/~/g, "~0").replace(/\//g, "~1");
}

function walk(schema: JsonSchema, data: unknown, path: string, out: SchemaError[]): void {
  for (const k of Object.keys(schema)) if (!KNOWN.has(k)) throw new Error(`mini-validator: unsupported keyword "${k}" at ${path || "/"}`);
  const err = (keyword: string, params: Record<string, unknown>, at = path) => out.push({ instancePath: at, keyword, params });

  if (typeof schema.type === "string" && !typeMatches(data, schema.type)) err("type", { type: schema.type });
  if (Array.isArray(schema.enum) && !schema.enum.some((v) => deepEqual(v, data))) err("enum", { allowedValues: schema.enum });

  if (typeof data === "string") {
    const len = codePoints(data);
    if (typeof schema.minLength === "number" && len < schema.minLength) err("minLength", { limit: schema.minLength });
    if (typeof schema.maxLength === "number" && len > schema.maxLength) err("maxLength", { limit: schema.maxLength });
    if (typeof schema.pattern === "string" && !new RegExp(schema.pattern, "u").test(data)) err("pattern", { pattern: schema.pattern });
    if (schema.format === "email" && !EMAIL.test(data)) err("format", { format: "email" });
    if (schema.format === "date" && !isDate(data)) err("format", { format: "date" });
  }
  if (typeof data === "number" && Number.isFinite(data)) {
    if (typeof schema.maximum === "number" && data > schema.maximum) err("maximum", { comparison: "<=", limit: schema.maximum });
    if (typeof schema.minimum === "number" && data < schema.minimum) err("minimum", { comparison: ">=", limit: schema.minimum });
    if (typeof schema.exclusiveMaximum === "number" && data >= schema.exclusiveMaximum) err("exclusiveMaximum", { comparison: "<", limit: schema.exclusiveMaximum });
    if (typeof schema.exclusiveMinimum === "number" && data <= schema.exclusiveMinimum) err("exclusiveMinimum", { comparison: ">", limit: schema.exclusiveMinimum });
  }
  if (Array.isArray(data)) {
    if (typeof schema.maxItems === "number" && data.length > schema.maxItems) err("maxItems", { limit: schema.maxItems });
    if (typeof schema.minItems === "number" && data.length < schema.minItems) err("minItems", { limit: schema.minItems });
    if (schema.items && typeof schema.items === "object") data.forEach((item, i) => walk(schema.items as JsonSchema, item, `${path}/${i}`, out));
    if (schema.uniqueItems === true) {
      // ajv's order: scan from the end, report the first repeat found as { i, j } with j the later index.
      for (let i = data.length - 1; i > 0; i--) {
        let found = -1;
        for (let k = i - 1; k >= 0; k--) if (deepEqual(data[i], data[k])) { found = k; break; }
        if (found >= 0) { err("uniqueItems", { i: found, j: i }); break; }
      }
    }
  }
  if (data !== null && typeof data === "object" && !Array.isArray(data)) {
    const obj = data as Record<string, unknown>;
    if (Array.isArray(schema.required)) for (const r of schema.required as string[]) if (!(r in obj) || obj[r] === undefined) err("required", { missingProperty: r });
    const props = (schema.properties ?? {}) as Record<string, JsonSchema>;
    if (schema.additionalProperties === false) {
      for (const k of Object.keys(obj)) if (!(k in props)) err("additionalProperties", { additionalProperty: k });
    }
    for (const [k, sub] of Object.entries(props)) if (k in obj && obj[k] !== undefined) walk(sub, obj[k], `${path}/${esc(k)}`, out);
  }
}

/** Validates `data` against `schema`; returns every error (like ajv with allErrors). */
export function validateWithSchema(schema: JsonSchema, data: unknown): SchemaError[] {
  const out: SchemaError[] = [];
  walk(schema, data, "", out);
  return out;
}
