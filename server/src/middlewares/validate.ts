/**
 * Declarative request validation: a route mounts `validate(schema)` with JSON Schemas of its path
 * parameters, query and body (kept per resource in `<resource>.schemas.ts`); the OpenAPI document builds
 * the same route's parameters and request body from those schemas (api/openapi/from-schemas.ts), so the
 * checks and their description cannot drift apart.
 *
 * - Path parameters and the query are read as text and coerced to the schema's types (ajv coerceTypes);
 *   a query value is trimmed and an empty one counts as absent; a repeated parameter counts once (its last
 *   value) unless the field is a list (`type: "array"`): a list is given comma-separated or repeated, or
 *   both (`kind=bipartite,unipartite`, `kind=bipartite&kind=unipartite`), and `kind=` is an empty list.
 *   true/false may be written 1/0; `"x-case": "upper"` upper-cases the text first; defaults are filled
 *   in. The handler reads the coerced values from `req.params` and `req.query`.
 * - Rules across fields that JSON Schema cannot say (a range's minimum above its maximum) are the
 *   schema's `queryRules`: their problems are reported with the schema's, in the same shape.
 * - Problems answer with the project's one error shape, every field named in `details` (query and
 *   parameters by name, the body by JSON pointer): 400 by default (`bodyStatus` may say 422 for a body
 *   whose fields are refused); a path parameter that cannot be an id answers 404 "No such <title>."
 *   (there is no such thing to find), as a missing record would, saying what a good one looks like when
 *   the parameter's schema has a `form`. A field's `x-rule` replaces the generic wording of its rule; a
 *   refused item of a list is quoted; a nested field of a body is named by its whole path
 *   (`/settings/nulls`, "settings.nulls must be …").
 * - readQuery() applies the same reading to query-like objects that arrive some other way (a catalogue
 *   filter inside a JSON body), so they are checked by the same schema.
 */
import type { RequestHandler } from "express";
import { Ajv2020 } from "ajv/dist/2020.js";
import type { ErrorObject, ValidateFunction } from "ajv";
import { ApiError, type ErrorDetail } from "../lib/api-error";
import { checkBodyValue } from "./body";

export interface FieldSchema {
  type?: "string" | "integer" | "number" | "boolean" | "object" | "array" | Array<string>;
  /** What the field is, for people (the OpenAPI description; a path parameter's `title` names the thing in a 404). */
  description?: string;
  title?: string;
  /** A path parameter's form in words, for its 404 ("accessions look like TB-000042"): "No such dataset "x": accessions look like TB-000042." */
  form?: string;
  enum?: readonly unknown[];
  minimum?: number;
  maximum?: number;
  minLength?: number;
  maxLength?: number;
  pattern?: string;
  default?: unknown;
  example?: unknown;
  /** Lists (`type: "array"`): the items' schema (or each position's, `prefixItems`) and how many. */
  items?: FieldSchema;
  prefixItems?: FieldSchema[];
  minItems?: number;
  maxItems?: number;
  /** Query text only: "upper" upper-cases the value (each item of a list) before it is checked. */
  "x-case"?: "upper";
  /** The rule as a sentence's end, when the generic wording (describeRule) would not say it well. */
  "x-rule"?: string;
  /**
   * Whole messages in the user's words, for forms that show them beside the field: `x-message` when the
   * value is refused, `x-required` when it is missing or blank text (instead of "<field> must be …").
   */
  "x-message"?: string;
  "x-required"?: string;
  [key: string]: unknown;
}

/** Rules across query fields that JSON Schema cannot say; `failed` holds the fields already refused. */
export type QueryRules = (query: Record<string, unknown>, failed: ReadonlySet<string>) => ErrorDetail[];

export interface ObjectSchema {
  type: "object";
  properties: Record<string, FieldSchema>;
  required?: string[];
  additionalProperties?: boolean;
  /** At least this many fields (a change that changes nothing is refused, naming the fields). */
  minProperties?: number;
  description?: string;
}

export interface RequestSchema {
  params?: ObjectSchema;
  query?: ObjectSchema;
  queryRules?: QueryRules;
  body?: ObjectSchema;
  /** Status of a refused body (default 400). */
  bodyStatus?: 400 | 422;
  /** The message of a refused body (default: the first problem's). */
  bodyMessage?: string;
  /** The code of a refused body (default bad_request, or validation_failed with 422). */
  bodyCode?: string;
  /**
   * The text fields of a multipart body, checked where the route mounts validate() after the upload
   * middleware: read from text like the query (trimmed, empty = absent, true/false as 1/0; a field with
   * `"x-json": true` is JSON text, parsed first), refused like a body (JSON pointers, `bodyStatus`,
   * `bodyMessage`).
   */
  fields?: ObjectSchema;
  /**
   * The file part of a multipart body, which the upload middleware before validate() reads (its field name
   * and what it holds): not checked here, it describes the route's request body in the OpenAPI document.
   */
  filePart?: { name: string; description: string };
  /** Rules across the fields of a body (or of `fields`) that JSON Schema cannot say well, reported with the schema's problems. */
  bodyRules?: QueryRules;
}

// Its own instance: coercion and defaults rewrite the data, which the metadata validators (lib/schemas.ts) must never do.
// strictNumbers: NaN is not a number (cased() reads text such as "Infinity" or "1e400" as NaN, so it is refused).
const textAjv = new Ajv2020({ allErrors: true, coerceTypes: true, useDefaults: true, strict: false, strictNumbers: true });
const bodyAjv = new Ajv2020({ allErrors: true, useDefaults: true, strict: false });

function words(list: readonly unknown[]): string {
  return list.map((x) => String(x)).join(", ");
}

/** The rule of one field as a sentence's end ("must be a whole number from 1 to 100."). */
export function describeRule(s: FieldSchema, inText = false): string {
  if (s["x-rule"]) return s["x-rule"];
  if (Array.isArray(s.type)) {
    const nullable = s.type.includes("null");
    const one = describeRule({ ...s, type: s.type.find((t) => t !== "null") as FieldSchema["type"] });
    return nullable ? `${one.slice(0, -1)} (or null).` : one;
  }
  const alternatives = (s.anyOf ?? s.oneOf) as FieldSchema[] | undefined;
  if (alternatives) return `must be ${alternatives.map((x) => describeRule(x, inText).replace(/^must be /, "").replace(/\.$/, "")).join(" or ")}.`;
  if (s.const !== undefined) return `must be ${JSON.stringify(s.const)}.`;
  if (s.enum) return `must be one of ${words(s.enum)}.`;
  const range = s.minimum !== undefined && s.maximum !== undefined ? ` from ${s.minimum} to ${s.maximum}` : s.minimum !== undefined ? ` of at least ${s.minimum}` : s.maximum !== undefined ? ` of at most ${s.maximum}` : "";
  switch (s.type) {
    case "integer":
      return `must be a whole number${range}.`;
    case "number":
      return `must be a number${range}.`;
    case "boolean":
      return "must be true or false.";
    case "array": {
      const n = s.minItems !== undefined && s.minItems === s.maxItems ? `of ${s.minItems} ` : s.minItems && s.maxItems ? `of ${s.minItems} to ${s.maxItems} ` : s.maxItems ? `of at most ${s.maxItems} ` : s.minItems ? `of at least ${s.minItems} ` : "";
      const it = s.items ?? {};
      const what = it.enum ? `values from ${words(it.enum)}` : (it.title ?? (it.type === "integer" ? "whole numbers" : it.type === "number" ? "numbers" : it.type === "boolean" ? "true or false values" : "values"));
      return `must be a list ${n}${s.uniqueItems ? "different " : ""}${what}${inText ? " (comma-separated or repeated)" : ""}.`;
    }
    case "string": {
      const len = s.minLength && s.maxLength ? ` of ${s.minLength} to ${s.maxLength} characters` : s.maxLength ? ` of at most ${s.maxLength} characters` : s.minLength ? ` of at least ${s.minLength} character${s.minLength === 1 ? "" : "s"}` : "";
      return `must be text${len}${s.pattern === "\\S" ? ", not only spaces" : ""}.`;
    }
    case "object":
      return s.properties ? `must be an object with the fields ${words(Object.keys(s.properties as object))}.` : "must be an object.";
    default:
      return `must be ${s.type ?? "given"}.`;
  }
}

const propsOf = (s: FieldSchema | ObjectSchema | undefined) => (s?.properties ?? {}) as Record<string, FieldSchema>;

/**
 * The field an error is about: the instance path walked down through the schema's properties as far as
 * they go (a nested field of a body is named by its whole path; an error inside one of several
 * alternatives is about the whole field).
 */
function fieldAt(root: ObjectSchema, pointer: string): { segs: string[]; schema?: FieldSchema } {
  const segs: string[] = [];
  let cur: FieldSchema | ObjectSchema = root;
  for (const seg of pointer.split("/").slice(1)) {
    const extra: unknown = (cur as FieldSchema).additionalProperties;
    const next: FieldSchema | undefined = propsOf(cur)[seg] ?? (extra && typeof extra === "object" ? (extra as FieldSchema) : undefined);
    if (!next) break;
    segs.push(seg);
    cur = next;
  }
  return { segs, schema: segs.length ? (cur as FieldSchema) : undefined };
}

function valueAt(data: Record<string, unknown>, segs: string[]): unknown {
  let cur: unknown = data;
  for (const seg of segs) cur = cur && typeof cur === "object" ? (cur as Record<string, unknown>)[seg] : undefined;
  return cur;
}

function detailsOf(errors: ErrorObject[], schema: ObjectSchema, where: "params" | "query" | "body" | "fields", data: Record<string, unknown>): ErrorDetail[] {
  const out = new Map<string, ErrorDetail>();
  const inText = where === "params" || where === "query";
  const pointer = !inText;
  for (const e of errors) {
    const at = fieldAt(schema, e.instancePath);
    const parent: FieldSchema | ObjectSchema = at.schema ?? schema;
    let segs: string[];
    let message: string;
    if (e.keyword === "required") {
      segs = [...at.segs, (e.params as { missingProperty: string }).missingProperty];
      const s = propsOf(parent)[segs[segs.length - 1]] ?? {};
      message = s["x-required"] ?? `${segs.join(".")} is required: it ${describeRule(s, inText)}`;
    } else if (e.keyword === "additionalProperties") {
      segs = [...at.segs, (e.params as { additionalProperty: string }).additionalProperty];
      const known = words(Object.keys(propsOf(parent)));
      const field = segs.join(".");
      message = at.segs.length ? `${field} is not a field of ${at.segs.join(".")} (fields: ${known}).` : pointer ? `${field} is not a field of this request (fields: ${known}).` : `Unknown parameter "${field}". Known: ${known}.`;
    } else if (e.keyword === "minProperties" && !at.segs.length) {
      segs = [];
      message = `Send at least one of the fields ${words(Object.keys(schema.properties))}.`;
    } else {
      segs = at.segs;
      const field = segs.join(".");
      const s = at.schema;
      const index = e.instancePath.split("/")[segs.length + 1];
      const item = s?.type === "array" && index !== undefined && !s["x-rule"] ? (s.items ?? s.prefixItems?.[Number(index)]) : undefined;
      const list = item ? valueAt(data, segs) : undefined;
      const value = Array.isArray(list) ? list[Number(index)] : undefined;
      const blank = s?.["x-required"] !== undefined && typeof valueAt(data, segs) === "string" && !(valueAt(data, segs) as string).trim();
      message = (blank ? s?.["x-required"] : s?.["x-message"]) ?? (item ? `${field}: ${JSON.stringify(value)} ${describeRule(item, inText)}` : s ? `${field} ${describeRule(s, inText)}` : `${field || "The request"}: ${e.message ?? "not valid"}.`);
    }
    const path = pointer ? `/${segs.join("/")}` : segs.join(".");
    if (!out.has(path)) out.set(path, { path, message });
  }
  return [...out.values()];
}

function cased(s: FieldSchema | undefined, x: unknown): unknown {
  if (typeof x !== "string" || !s) return x;
  if (s["x-case"] === "upper") return x.toUpperCase();
  if (s.type === "boolean" && (x === "1" || x === "0")) return x === "1";
  // ajv would coerce "Infinity" (or "1e400") to Infinity and let it pass as a number, even a whole one
  if ((s.type === "number" || s.type === "integer") && Math.abs(Number(x)) === Infinity) return NaN;
  return x;
}

/** Query text as the schema reads it: trimmed, empty = absent, lists split on commas, a repeated scalar's last value. */
function fromText(schema: ObjectSchema, raw: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(raw)) {
    const s = schema.properties[k];
    if (s?.type === "array") {
      const list = (Array.isArray(v) ? v : [v])
        .flatMap((x) => (x === undefined || x === null ? [] : typeof x === "string" ? x.split(",") : [x]))
        .map((x) => (typeof x === "string" ? x.trim() : x))
        .filter((x) => x !== "");
      out[k] = list.map((x, i) => cased(s.items ?? s.prefixItems?.[i], x));
      continue;
    }
    const x = Array.isArray(v) && s && v.length ? v[v.length - 1] : v;
    const t = typeof x === "string" ? x.trim() : x;
    if (t === "" || t === undefined) continue;
    out[k] = cased(s, t);
  }
  return out;
}

const compiled = new WeakMap<ObjectSchema, ValidateFunction>();
function compile(ajv: Ajv2020, s: ObjectSchema): ValidateFunction {
  let v = compiled.get(s);
  if (!v) {
    v = ajv.compile(s);
    compiled.set(s, v);
  }
  return v;
}

/**
 * A query-like object read and checked as validate() reads `req.query` (coerced values, defaults filled
 * in), or a 400 naming every refused field (by its JSON pointer under `pointer` when it came in a body).
 */
export function readQuery(schema: ObjectSchema, raw: Record<string, unknown>, rules?: QueryRules, pointer?: string): Record<string, unknown> {
  const check = compile(textAjv, schema);
  const q = fromText(schema, raw);
  const d = check(q) ? [] : detailsOf(check.errors ?? [], schema, "query", q);
  if (rules) d.push(...rules(q, new Set(d.map((x) => x.path ?? ""))));
  // inside a JSON body (`pointer`, e.g. /filter) each problem's path is its JSON pointer
  const details = pointer ? d.map((x) => ({ ...x, path: `${pointer}/${x.path ?? ""}` })) : d;
  if (d.length) throw ApiError.badRequest(d.length === 1 ? d[0].message : pointer ? "Some fields need attention." : "Some query parameters are not valid.", details);
  return q;
}

/** Multipart text fields as `schema.fields` reads them (see RequestSchema.fields), or the refusal. */
function readFields(schema: RequestSchema, fields: ObjectSchema, raw: Record<string, unknown>): Record<string, unknown> {
  const f = fromText(fields, raw);
  for (const [k, v] of Object.entries(f)) {
    if (fields.properties[k]?.["x-json"] !== true || typeof v !== "string") continue;
    try {
      f[k] = JSON.parse(v) as unknown;
    } catch {
      continue; // left as text: refused as not the schema's type
    }
    checkBodyValue(f[k]); // depth, prototype keys, NUL characters: as in a JSON body
  }
  const check = compile(textAjv, fields);
  const d = check(f) ? [] : detailsOf(check.errors ?? [], fields, "fields", f);
  refuseBody(schema, f, d);
  return f;
}

/** Adds the body rules' problems to `d` and throws the refusal when there are any. */
function refuseBody(schema: RequestSchema, data: Record<string, unknown>, d: ErrorDetail[]): void {
  if (schema.bodyRules) d.push(...schema.bodyRules(data, new Set(d.map((x) => x.path ?? ""))));
  if (!d.length) return;
  const message = schema.bodyMessage ?? (d.length === 1 ? d[0].message : "Some fields need attention.");
  throw new ApiError(schema.bodyStatus ?? 400, schema.bodyCode ?? (schema.bodyStatus === 422 ? "validation_failed" : "bad_request"), message, d);
}

/** The middleware: checks (and coerces) params, query and body against `schema` before the handler runs. */
export function validate(schema: RequestSchema): RequestHandler {
  const params = schema.params && compile(textAjv, schema.params);
  const body = schema.body && compile(bodyAjv, schema.body);
  const mw: RequestHandler = (req, _res, next) => {
    if (params && schema.params) {
      const p: Record<string, unknown> = { ...req.params };
      if (!params(p)) {
        const field = (params.errors ?? []).map((e) => e.instancePath.split("/")[1]).find(Boolean);
        const s = field ? schema.params.properties[field] : undefined;
        const what = s?.title || field || "resource";
        const raw = field ? String(req.params[field] ?? "") : "";
        const quoted = `"${raw.length > 40 ? `${raw.slice(0, 40)}…` : raw}"`;
        throw ApiError.notFound(s?.form ? `No such ${what} ${quoted}: ${s.form}${/[.…]$/.test(s.form) ? "" : "."}` : `No such ${what}.`);
      }
      Object.defineProperty(req, "params", { value: p, writable: true, configurable: true, enumerable: true });
    }
    if (schema.query) {
      const q = readQuery(schema.query, req.query as Record<string, unknown>, schema.queryRules);
      Object.defineProperty(req, "query", { value: q, writable: true, configurable: true, enumerable: true });
    }
    if (schema.fields) req.body = readFields(schema, schema.fields, (req.body ?? {}) as Record<string, unknown>);
    if (body && schema.body) {
      const b: unknown = req.body ?? {};
      if (!b || typeof b !== "object" || Array.isArray(b)) throw ApiError.badRequest("The request body must be a JSON object.", [{ path: "/", message: "The request body must be a JSON object." }]);
      refuseBody(schema, b as Record<string, unknown>, body(b) ? [] : detailsOf(body.errors ?? [], schema.body, "body", b as Record<string, unknown>));
      req.body = b;
    }
    next();
  };
  // read by the route walk (api/openapi/route-walk.ts): the test checks the document against these schemas
  return Object.assign(mw, { requestSchema: schema });
}
