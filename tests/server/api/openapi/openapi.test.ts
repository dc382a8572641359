/**
 * The OpenAPI document: valid 3.1 shape, and it describes every route registered in the Express router
 * (walking the router's layer stack) except the web client's own resources, and nothing that does not exist.
 */
import request from "supertest";
import { afterAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { apiRouter } from "../../../../server/src/api";
import { isInternal, toOpenApiPath } from "../../../../server/src/api/openapi/openapi.document";
import { listRoutes } from "../../../../server/src/api/openapi/route-walk";
import { operationInput } from "../../../../server/src/api/openapi/from-schemas";

const app = createApp();
afterAll(shutdownServerResources);

describe("OpenAPI document", () => {
  it("is served as OpenAPI 3.1 with every operation answering something documented", async () => {
    const res = await request(app).get("/api/v1/openapi.json");
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe("3.1.0");
    expect(res.body.info.title).toBe("Tanglebank API");
    const ops = new Set<string>();
    for (const [path, item] of Object.entries(res.body.paths as Record<string, Record<string, { operationId: string; responses: object }>>)) {
      for (const [method, op] of Object.entries(item)) {
        expect(op.operationId, `${method} ${path}`).toBeTruthy();
        expect(ops.has(op.operationId)).toBe(false);
        ops.add(op.operationId);
        expect(Object.keys(op.responses).length).toBeGreaterThan(0);
      }
    }
    // every $ref resolves
    const text = JSON.stringify(res.body);
    for (const m of text.matchAll(/"\$ref":"#\/components\/schemas\/([A-Za-z]+)"/g)) expect(res.body.components.schemas[m[1]], m[1]).toBeDefined();
  });

  it("lists every public route registered in the Express router, and only those", async () => {
    const doc = (await request(app).get("/api/v1/openapi.json")).body as { paths: Record<string, Record<string, unknown>> };
    const registered = listRoutes(apiRouter());
    expect(registered.length).toBeGreaterThan(20);
    const missing: string[] = [];
    for (const r of registered) {
      if (isInternal(r.path)) continue;
      const p = toOpenApiPath(r.path);
      if (!doc.paths[p]?.[r.method]) missing.push(`${r.method.toUpperCase()} ${p}`);
    }
    expect(missing).toEqual([]);
    const registeredSet = new Set(registered.map((r) => `${r.method} ${toOpenApiPath(r.path)}`));
    const stale: string[] = [];
    for (const [p, item] of Object.entries(doc.paths)) for (const m of Object.keys(item)) if (!registeredSet.has(`${m} ${p}`)) stale.push(`${m.toUpperCase()} ${p}`);
    expect(stale).toEqual([]);
    // a route that mounts validate(schema) is documented from that schema: every parameter and the body
    type Op = { parameters?: Array<{ name: string; in: string; schema: object }>; requestBody?: { content: Record<string, { schema: object }> } };
    const ops = doc.paths as unknown as Record<string, Record<string, Op>>;
    let checked = 0;
    for (const r of registered) {
      if (isInternal(r.path) || !r.schema) continue;
      const op = ops[toOpenApiPath(r.path)][r.method];
      for (const [where, o] of [["path", r.schema.params], ["query", r.schema.query]] as const) {
        for (const [name, s] of Object.entries(o?.properties ?? {})) {
          const p = op.parameters?.find((x) => x.name === name && x.in === where);
          expect(p, `${r.method} ${r.path} ${where} ${name}`).toBeDefined();
          expect(p!.schema).toMatchObject({ type: s.type });
        }
      }
      if (r.schema.body) expect(op.requestBody?.content["application/json"].schema, `${r.method} ${r.path} body`).toEqual(r.schema.body);
      if (r.schema.fields) expect(Object.keys((op.requestBody?.content["multipart/form-data"].schema as { properties: object }).properties), `${r.method} ${r.path} form`).toEqual(expect.arrayContaining(Object.keys(r.schema.fields.properties)));
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(2);
    // the catalogue, bundles, networks and tokens routes are really there
    for (const must of ["get /catalogue", "get /bundles", "post /bundles/estimate", "get /networks/{accession}/{version}/{position}/data.csv", "delete /tokens/{id}", "get /health", "get /auth/session"]) {
      expect(registeredSet.has(must), must).toBe(true);
    }
  });

  it("a route that validates twice is described by both schemas, and an upload route's body is multipart: its files and every form field", () => {
    const registered = listRoutes(apiRouter());
    const route = (method: string, path: string) => registered.find((r) => r.method === method && r.path === path)!.schema!;
    const confirm = route("post", "/auth/password-reset/confirm");
    expect(Object.keys(confirm.body!.properties).sort()).toEqual(["password", "token"]);
    expect([...confirm.body!.required!].sort()).toEqual(["password", "token"]);
    const upload = operationInput(route("post", "/deposits/:id/networks")) as {
      parameters: Array<{ name: string; in: string }>;
      requestBody: { content: Record<string, { schema: { properties: Record<string, { type: string; default?: unknown }>; required: string[] }; encoding?: Record<string, { contentType: string }> }> };
    };
    expect(upload.parameters.map((p) => `${p.in} ${p.name}`)).toEqual(["path id"]);
    const form = upload.requestBody.content["multipart/form-data"];
    expect(Object.keys(upload.requestBody.content)).toEqual(["multipart/form-data"]);
    expect(form.schema.required).toEqual(["files"]);
    expect(form.schema.properties.files.type).toBe("array");
    expect(form.schema.properties).toMatchObject({ kind: { type: "string", default: "bipartite" }, directed: { type: "boolean", default: false }, format: { default: "auto" }, fileOptions: { type: "object" } });
    expect(form.encoding).toEqual({ fileOptions: { contentType: "application/json" } });
  });
});
