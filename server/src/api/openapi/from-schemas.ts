/**
 * OpenAPI parameters and request bodies built from the request schemas the routes mount with validate()
 * (middlewares/validate.ts): the document describes exactly what the checks accept.
 */
import type { FieldSchema, ObjectSchema, RequestSchema } from "../../middlewares/validate";

type Json = Record<string, unknown>;

/** The schema without the checks' own wording keys (x-rule, x-hint, x-case), which are not OpenAPI. */
function plain(s: FieldSchema): Json {
  const out: Json = {};
  for (const [k, v] of Object.entries(s)) {
    if (k.startsWith("x-")) continue;
    out[k] = k === "items" && v && typeof v === "object" ? plain(v as FieldSchema) : k === "prefixItems" && Array.isArray(v) ? v.map((x: FieldSchema) => plain(x)) : v;
  }
  return out;
}

function parameter(name: string, where: "path" | "query", s: FieldSchema, required: boolean): Json {
  const { description, example, title: _title, form: _form, ...schema } = s;
  // a list is written comma-separated (form style, not exploded); repeating the parameter works too (said in the description)
  const list = schema.type === "array" ? { style: "form", explode: false } : {};
  return { name, in: where, required, ...(description ? { description } : {}), ...list, schema: plain(schema), ...(example !== undefined ? { example } : {}) };
}

/** Parameters of an object schema read from the query or the path (also for routes that read a query-like object themselves). */
export function parametersOf(o: ObjectSchema | undefined, where: "path" | "query"): Json[] {
  if (!o) return [];
  return Object.entries(o.properties).map(([name, s]) => parameter(name, where, s, where === "path" || (o.required ?? []).includes(name)));
}

/**
 * The `multipart/form-data` body of an upload route: its file part (one or more files) and its text
 * fields (`schema.fields`); a field that is JSON text (`x-json`) is said to be application/json.
 */
export function multipartBody(schema: RequestSchema): Json {
  const properties: Json = {};
  const required: string[] = [];
  const encoding: Json = {};
  if (schema.filePart) {
    properties[schema.filePart.name] = { type: "array", items: { type: "string", contentMediaType: "application/octet-stream" }, minItems: 1, description: schema.filePart.description };
    required.push(schema.filePart.name);
  }
  for (const [name, s] of Object.entries(schema.fields?.properties ?? {})) {
    properties[name] = plain(s);
    if (s["x-json"] === true) encoding[name] = { contentType: "application/json" };
  }
  required.push(...(schema.fields?.required ?? []));
  const body: Json = { type: "object", properties, ...(required.length ? { required } : {}), ...(schema.fields?.additionalProperties === false ? { additionalProperties: false } : {}) };
  return { schema: body, ...(Object.keys(encoding).length ? { encoding } : {}) };
}

/** `{ parameters, requestBody }` of an operation whose route mounts validate(schema) (an upload route's body is multipart). */
export function operationInput(schema: RequestSchema): Json {
  const parameters = [...parametersOf(schema.params, "path"), ...parametersOf(schema.query, "query")];
  const content = schema.body ? { "application/json": { schema: schema.body } } : schema.fields || schema.filePart ? { "multipart/form-data": multipartBody(schema) } : undefined;
  return {
    ...(parameters.length ? { parameters } : {}),
    ...(content ? { requestBody: { required: true, content } } : {}),
  };
}
