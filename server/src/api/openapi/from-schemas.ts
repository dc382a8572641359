/**
 * OpenAPI parameters and request bodies built from the request schemas the routes mount with validate()
 * (middlewares/validate.ts): the document describes exactly what the checks accept.
 */
import type { FieldSchema, ObjectSchema, RequestSchema } from "../../middlewares/validate";

type Json = Record<string, unknown>;

function parameter(name: string, where: "path" | "query", s: FieldSchema, required: boolean): Json {
  const { description, example, title: _title, form: _form, ...schema } = s;
  return { name, in: where, required, ...(description ? { description } : {}), schema, ...(example !== undefined ? { example } : {}) };
}

function parametersOf(o: ObjectSchema | undefined, where: "path" | "query"): Json[] {
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
