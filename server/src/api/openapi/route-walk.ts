/**
 * Lists every route registered on an Express 5 router (nested routers included) as method + path, by
 * walking the router's layer stack, with the request schema a route mounts through validate(). Used by the
 * OpenAPI test to check the document covers the routes and describes their checks.
 */
import type { Router } from "express";
import type { ObjectSchema, RequestSchema } from "../../middlewares/validate";

interface LayerLike {
  rawPath?: string | string[];
  route?: { path: string | string[]; methods: Record<string, boolean>; stack?: Array<{ handle?: { requestSchema?: RequestSchema } }> };
  handle?: { stack?: LayerLike[] };
}

export interface RegisteredRoute {
  method: string;
  path: string;
  /** The request schema the route mounts with validate(), if any (several validate() calls merged: mergeSchemas). */
  schema?: RequestSchema;
}

export function listRoutes(router: Router, prefix = ""): RegisteredRoute[] {
  const out: RegisteredRoute[] = [];
  for (const layer of (router as unknown as { stack: LayerLike[] }).stack) {
    if (layer.route) {
      const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
      for (const p of paths) {
        const schemas = (layer.route.stack ?? []).flatMap((l) => (l.handle?.requestSchema ? [l.handle.requestSchema] : []));
        const schema = schemas.length ? mergeSchemas(schemas) : undefined;
        for (const [m, on] of Object.entries(layer.route.methods)) {
          if (on && m !== "_all") out.push({ method: m, path: join(prefix, p), ...(schema ? { schema } : {}) });
        }
      }
    } else if (layer.handle?.stack && typeof layer.rawPath === "string") {
      out.push(...listRoutes(layer.handle as unknown as Router, join(prefix, layer.rawPath)));
    }
  }
  return out;
}

/** Two object schemas that check the same part of a request, as one: every field, every required one. */
function mergeObjects(a: ObjectSchema | undefined, b: ObjectSchema | undefined): ObjectSchema | undefined {
  if (!a || !b) return a ?? b;
  const required = [...new Set([...(a.required ?? []), ...(b.required ?? [])])];
  const closed = a.additionalProperties === false || b.additionalProperties === false;
  const minProperties = Math.max(a.minProperties ?? 0, b.minProperties ?? 0);
  return {
    ...a,
    properties: { ...a.properties, ...b.properties },
    ...(required.length ? { required } : {}),
    ...(closed ? { additionalProperties: false } : {}),
    ...(minProperties ? { minProperties } : {}),
  };
}

/**
 * The request schemas of a route that mounts validate() more than once (a link's token, then the new
 * password; the deposit's id, then the upload's form fields) as one: what the route as a whole reads.
 */
export function mergeSchemas(schemas: RequestSchema[]): RequestSchema {
  return schemas.reduce((a, b) => ({
    ...b,
    ...a,
    params: mergeObjects(a.params, b.params),
    query: mergeObjects(a.query, b.query),
    body: mergeObjects(a.body, b.body),
    fields: mergeObjects(a.fields, b.fields),
    filePart: a.filePart ?? b.filePart,
  }));
}

function join(a: string, b: string): string {
  const s = `${a}/${b}`.replace(/\/+/g, "/");
  return s.length > 1 ? s.replace(/\/$/, "") : s;
}
