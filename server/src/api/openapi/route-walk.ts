/**
 * Lists every route registered on an Express 5 router (nested routers included) as method + path, by
 * walking the router's layer stack, with the request schema a route mounts through validate(). Used by the
 * OpenAPI test to check the document covers the routes and describes their checks.
 */
import type { Router } from "express";
import type { RequestSchema } from "../../middlewares/validate";

interface LayerLike {
  rawPath?: string | string[];
  route?: { path: string | string[]; methods: Record<string, boolean>; stack?: Array<{ handle?: { requestSchema?: RequestSchema } }> };
  handle?: { stack?: LayerLike[] };
}

export interface RegisteredRoute {
  method: string;
  path: string;
  /** The request schema the route mounts with validate(), if any. */
  schema?: RequestSchema;
}

export function listRoutes(router: Router, prefix = ""): RegisteredRoute[] {
  const out: RegisteredRoute[] = [];
  for (const layer of (router as unknown as { stack: LayerLike[] }).stack) {
    if (layer.route) {
      const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
      for (const p of paths) {
        const schema = layer.route.stack?.map((l) => l.handle?.requestSchema).find(Boolean);
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

function join(a: string, b: string): string {
  const s = `${a}/${b}`.replace(/\/+/g, "/");
  return s.length > 1 ? s.replace(/\/$/, "") : s;
}
