/**
 * Declarative request validation: a route mounts `validate(schema)` with JSON Schemas of its path
 * parameters, query and body (kept per resource in `<resource>.schemas.ts`); the OpenAPI document builds
 * the same route's parameters and request body from those schemas (api/openapi/from-schemas.ts), so the
 * checks and their description cannot drift apart.
 *
 * - Path parameters and the query are read as text and coerced to the schema's types (ajv coerceTypes);
 *   an empty query value counts as absent; defaults are filled in. The handler reads the coerced values
 *   from `req.params` and `req.query`.
 * - Problems answer with the project's one error shape, every field named in `details` (query and
 *   parameters by name, the body by JSON pointer): 400 by default (`bodyStatus` may say 422 for a body
 *   whose fields are refused); a path parameter that cannot be an id answers 404 "No such <title>."
 *   (there is no such thing to find), as a missing record would, saying what a good one looks like when
 *   the parameter's schema has a `form`.
 */
import type { RequestHandler } from "express";
import { Ajv2020 } from "ajv/dist/2020.js";
import type { ErrorObject, ValidateFunction } from "ajv";
import { ApiError, type ErrorDetail } from "../lib/api-error";

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
  [key: string]: unknown;
}

export interface ObjectSchema {
  type: "object";
  properties: Record<string, FieldSchema>;
  required?: string[];
  additionalProperties?: boolean;
  description?: string;
}

export interface RequestSchema {
  params?: ObjectSchema;
  query?: ObjectSchema;
  body?: ObjectSchema;
  /** Status of a refused body (default 400). */
  bodyStatus?: 400 | 422;
  /** The message of a refused body (default: the first problem's). */
  bodyMessage?: string;
}

// Its own instance: coercion and defaults rewrite the data, which the metadata validators (lib/schemas.ts) must never do.
const textAjv = new Ajv2020({ allErrors: true, coerceTypes: true, useDefaults: true, strict: false });
const bodyAjv = new Ajv2020({ allErrors: true, useDefaults: true, strict: false });

function words(list: readonly unknown[]): string {
  return list.map((x) => String(x)).join(", ");
}

/** The rule of one field as a sentence's end ("must be a whole number from 1 to 100."). */
export function describeRule(s: FieldSchema): string {
  if (Array.isArray(s.type)) {
    const nullable = s.type.includes("null");
    const one = describeRule({ ...s, type: s.type.find((t) => t !== "null") as FieldSchema["type"] });
    return nullable ? `${one.slice(0, -1)} (or null).` : one;
  }
  if (s.enum) return `must be one of ${words(s.enum)}.`;
  const range = s.minimum !== undefined && s.maximum !== undefined ? ` from ${s.minimum} to ${s.maximum}` : s.minimum !== undefined ? ` of at least ${s.minimum}` : s.maximum !== undefined ? ` of at most ${s.maximum}` : "";
  switch (s.type) {
    case "integer":
      return `must be a whole number${range}.`;
    case "number":
      return `must be a number${range}.`;
    case "boolean":
      return "must be true or false.";
    case "string": {
      const len = s.minLength && s.maxLength ? ` of ${s.minLength} to ${s.maxLength} characters` : s.maxLength ? ` of at most ${s.maxLength} characters` : s.minLength ? ` of at least ${s.minLength} character${s.minLength === 1 ? "" : "s"}` : "";
      return `must be text${len}${s.pattern === "\\S" ? ", not only spaces" : ""}.`;
    }
    default:
      return `must be ${s.type ?? "given"}.`;
  }
}

function detailsOf(errors: ErrorObject[], schema: ObjectSchema, where: "params" | "query" | "body"): ErrorDetail[] {
  const out = new Map<string, ErrorDetail>();
  for (const e of errors) {
    let field: string;
    let message: string;
    if (e.keyword === "required") {
      field = (e.params as { missingProperty: string }).missingProperty;
      message = `${field} is required: it ${describeRule(schema.properties[field] ?? {})}`;
    } else if (e.keyword === "additionalProperties") {
      field = (e.params as { additionalProperty: string }).additionalProperty;
      message = `${field} is not a field of this request (fields: ${words(Object.keys(schema.properties))}).`;
    } else {
      field = e.instancePath.split("/")[1] ?? "";
      const s = schema.properties[field];
      message = s ? `${field} ${describeRule(s)}` : `${field || "The request"}: ${e.message ?? "not valid"}.`;
    }
    const path = where === "body" ? `/${field}` : field;
    if (!out.has(path)) out.set(path, { path, message });
  }
  return [...out.values()];
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

/** The middleware: checks (and coerces) params, query and body against `schema` before the handler runs. */
export function validate(schema: RequestSchema): RequestHandler {
  const params = schema.params && compile(textAjv, schema.params);
  const query = schema.query && compile(textAjv, schema.query);
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
    if (query && schema.query) {
      const q: Record<string, unknown> = {};
      for (const [k, v] of Object.entries(req.query as Record<string, unknown>)) if (v !== "") q[k] = v;
      if (!query(q)) {
        const d = detailsOf(query.errors ?? [], schema.query, "query");
        throw ApiError.badRequest(d.length === 1 ? d[0].message : "Some query parameters are not valid.", d);
      }
      Object.defineProperty(req, "query", { value: q, writable: true, configurable: true, enumerable: true });
    }
    if (body && schema.body) {
      const b: unknown = req.body ?? {};
      if (!b || typeof b !== "object" || Array.isArray(b)) throw ApiError.badRequest("The request body must be a JSON object.", [{ path: "/", message: "The request body must be a JSON object." }]);
      if (!body(b)) {
        const d = detailsOf(body.errors ?? [], schema.body, "body");
        const message = schema.bodyMessage ?? (d.length === 1 ? d[0].message : "Some fields need attention.");
        throw new ApiError(schema.bodyStatus ?? 400, schema.bodyStatus === 422 ? "validation_failed" : "bad_request", message, d);
      }
      req.body = b;
    }
    next();
  };
  // read by the route walk (api/openapi/route-walk.ts): the test checks the document against these schemas
  return Object.assign(mw, { requestSchema: schema });
}
