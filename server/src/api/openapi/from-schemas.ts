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

/** `{ parameters, requestBody }` of an operation whose route mounts validate(schema). */
export function operationInput(schema: RequestSchema): Json {
  const parameters = [...parametersOf(schema.params, "path"), ...parametersOf(schema.query, "query")];
  return {
    ...(parameters.length ? { parameters } : {}),
    ...(schema.body ? { requestBody: { required: true, content: { "application/json": { schema: schema.body } } } } : {}),
  };
}
