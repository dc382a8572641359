/**
 * validate(schema): the declarative checks the routes mount. Answers in the one error shape with every
 * field named (query and path by name, body by JSON pointer), coerced values reach the handler, an empty
 * query value counts as absent, and a path parameter that cannot be an id answers 404.
 */
import express from "express";
import request from "supertest";
import { describe, expect, it } from "vitest";
import { readQuery, validate, type ObjectSchema } from "../../../server/src/middlewares/validate";
import { errorHandler } from "../../../server/src/middlewares/error-handler";
import { userListSchema } from "../../../server/src/api/users/users.schemas";
import { createTokenSchema, revokeTokenSchema } from "../../../server/src/api/tokens/tokens.schemas";
import { applyBlocksSchema, networkChangesSchema, uploadFieldsSchema } from "../../../server/src/api/deposits/deposits.schemas";
import { batchStartSchema, settingsSchema } from "../../../server/src/api/pipeline/pipeline.schemas";
import { datasetSchema, networkFileSchema, withdrawSchema } from "../../../server/src/api/datasets/datasets.schemas";
import { catalogueSchema } from "../../../server/src/api/catalogue/catalogue.schemas";
import { networkRefItem, networkRefParams } from "../../../server/src/api/common.schemas";

const app = express();
app.use(express.json());
app.get("/users", validate(userListSchema), (req, res) => void res.json({ query: req.query }));
app.post("/tokens", validate(createTokenSchema), (req, res) => void res.json({ body: req.body }));
app.delete("/tokens/:id", validate(revokeTokenSchema), (req, res) => void res.json({ params: req.params }));
app.get("/datasets/:accession", validate(datasetSchema), (req, res) => void res.json({ params: req.params, query: req.query }));
app.get("/datasets/:accession/versions/:n/networks/:pos/file", validate(networkFileSchema), (req, res) => void res.json({ params: req.params }));
app.get("/networks/:accession/:version/:position", validate({ params: networkRefParams }), (req, res) => void res.json({ params: req.params }));
app.get("/refs", validate({ query: { type: "object", properties: { refs: { type: "array", items: networkRefItem } } } }), (req, res) => void res.json({ query: req.query }));
app.post("/datasets/:accession/withdraw", validate(withdrawSchema), (req, res) => void res.json({ body: req.body }));
const listSchema: ObjectSchema = {
  type: "object",
  properties: {
    kind: { type: "array", items: { type: "string", enum: ["bipartite", "unipartite"] } },
    weighted: { type: "array", items: { type: "boolean" } },
    code: { type: "array", items: { type: "string", "x-case": "upper" }, maxItems: 2 },
    min: { type: "number" },
    max: { type: "number" },
  },
  additionalProperties: false,
};
const inOrder = (q: Record<string, unknown>, failed: ReadonlySet<string>) =>
  typeof q.min === "number" && typeof q.max === "number" && !failed.has("min") && q.min > q.max ? [{ path: "min", message: "min is above max." }] : [];
app.get("/lists", validate({ query: listSchema, queryRules: inOrder }), (req, res) => void res.json({ query: req.query }));
app.put("/settings", validate(settingsSchema), (req, res) => void res.json({ body: req.body }));
app.post("/batches", validate(batchStartSchema), (req, res) => void res.json({ body: req.body }));
// multipart text fields arrive as text (as multer leaves them); sent here as a JSON object of strings
app.post("/fields", validate(uploadFieldsSchema), (req, res) => void res.json({ body: req.body }));
app.patch("/deposits/:id/networks/:networkId", validate(networkChangesSchema), (req, res) => void res.json({ body: req.body }));
app.post("/deposits/:id/networks/apply", validate(applyBlocksSchema), (req, res) => void res.json({ body: req.body }));
app.use(errorHandler);

describe("validate(schema)", () => {
  it("coerces the query to the schema's types, fills defaults and reads an empty value as absent", async () => {
    const res = await request(app).get("/users").query({ page: "3", role: "", email: "heath" });
    expect(res.status).toBe(200);
    expect(res.body.query).toEqual({ page: 3, pageSize: 25, email: "heath" });
  });

  it("names every refused query parameter with its rule", async () => {
    const res = await request(app).get("/users").query({ page: "1.5", pageSize: "1000", role: "overlord" });
    expect(res.status).toBe(400);
    expect(res.body.code).toBe("bad_request");
    expect(res.body.details).toEqual([
      { path: "role", message: "role must be one of depositor, curator, admin." },
      { path: "page", message: "page must be a whole number from 1 to 100000." },
      { path: "pageSize", message: "pageSize must be a whole number from 1 to 100." },
    ]);
    const one = await request(app).get("/users").query({ page: "0" });
    expect(one.body.message).toBe("page must be a whole number from 1 to 100000.");
  });

  it("refuses a body field by its JSON pointer, with the route's status", async () => {
    const missing = await request(app).post("/tokens").send({});
    expect(missing.status).toBe(422);
    expect(missing.body).toEqual({ code: "validation_failed", message: "name is required: it must be text of 1 to 80 characters, not only spaces.", details: [{ path: "/name", message: "name is required: it must be text of 1 to 80 characters, not only spaces." }] });
    const blank = await request(app).post("/tokens").send({ name: "   " });
    expect(blank.status).toBe(422);
    expect(blank.body.details).toEqual([{ path: "/name", message: "name must be text of 1 to 80 characters, not only spaces." }]);
    const long = await request(app).post("/tokens").send({ name: "x".repeat(81) });
    expect(long.body.details[0].path).toBe("/name");
    const ok = await request(app).post("/tokens").send({ name: "R scripts" });
    expect(ok.status).toBe(200);
    const list = await request(app).post("/tokens").set("content-type", "application/json").send("[1]");
    expect(list.status).toBe(400);
    expect(list.body.message).toBe("The request body must be a JSON object.");
  });

  it("answers 404 naming the thing for a path parameter that cannot be an id, and coerces a good one", async () => {
    for (const bad of ["abc", "0", "1.5", "9999999999"]) {
      const res = await request(app).delete(`/tokens/${bad}`);
      expect(res.status, bad).toBe(404);
      expect(res.body).toEqual({ code: "not_found", message: "No such token." });
    }
    const res = await request(app).delete("/tokens/12");
    expect(res.body.params).toEqual({ id: 12 });
  });

  it("answers a malformed address with a 404 that quotes it and says what a good one looks like", async () => {
    const acc = await request(app).get("/datasets/TB-42");
    expect(acc.status).toBe(404);
    expect(acc.body).toEqual({ code: "not_found", message: 'No such dataset "TB-42": accessions look like TB-000042.' });
    const pos = await request(app).get("/datasets/TB-000042/versions/1/networks/0/file");
    expect(pos.body.message).toBe('No such network "0": networks are numbered 1, 2, …');
    const ver = await request(app).get("/datasets/TB-000042/versions/v1/networks/1/file");
    expect(ver.body.message).toBe('No such version "v1": versions are numbered 1, 2, …');
    const ok = await request(app).get("/datasets/TB-000042/versions/2/networks/3/file");
    expect(ok.body.params).toEqual({ accession: "TB-000042", n: 2, pos: 3 });
  });

  it("a network reference in a list is refused exactly when its parts would be refused in a network's address (no version or network 0)", async () => {
    for (const [version, position] of [["v1", "1"], ["v0", "1"], ["v00", "2"], ["v1", "0"], ["v1", "000"], ["v10", "20"], ["v01", "01"], ["v1234567", "1"]]) {
      const address = await request(app).get(`/networks/TB-000042/${version}/${position}`);
      const list = await request(app).get("/refs").query({ refs: `TB-000042/${version}/${position}` });
      expect(list.status === 400, `${version}/${position}: address ${address.status}, list ${list.status}`).toBe(address.status === 404);
      if (list.status === 400) expect(list.body.details).toEqual([{ path: "refs", message: `refs: "TB-000042/${version}/${position}" must be a network reference such as TB-000042/v2/3.` }]);
    }
    expect((await request(app).get("/refs").query({ refs: "TB-000042/v0/1" })).status).toBe(400);
    expect((await request(app).get("/refs").query({ refs: "TB-000042/v2/3" })).body.query).toEqual({ refs: ["TB-000042/v2/3"] });
  });

  it("refuses a query version that is not a version number with a 400 naming it, and passes a good one as a number", async () => {
    const bad = await request(app).get("/datasets/TB-000042").query({ version: "latest" });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toEqual([{ path: "version", message: "version must be a whole number from 1 to 999999." }]);
    const ok = await request(app).get("/datasets/TB-000042").query({ version: "2" });
    expect(ok.body.query).toEqual({ version: 2 });
  });

  it("refuses a withdrawal without a reason (422, the field named)", async () => {
    for (const body of [{}, { reason: "  " }, { reason: 3 }]) {
      const res = await request(app).post("/datasets/TB-000042/withdraw").send(body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(res.body.message).toBe("A reason is required to withdraw a dataset: say why; it is shown on the tombstone page.");
      expect(res.body.details[0].path).toBe("/reason");
    }
  });

  it("reads lists comma-separated or repeated, true/false as 1/0, an empty list as empty, and upper-cases on request", async () => {
    const res = await request(app).get("/lists?kind=bipartite,%20unipartite&weighted=1&weighted=false&code=no,fi&min=2");
    expect(res.body.query).toEqual({ kind: ["bipartite", "unipartite"], weighted: [true, false], code: ["NO", "FI"], min: 2 });
    expect((await request(app).get("/lists?kind=")).body.query).toEqual({ kind: [] });
  });

  it("quotes a refused item of a list, names an unknown parameter and runs the rules across fields", async () => {
    const res = await request(app).get("/lists?kind=bipartite,tree&weighted=maybe&colour=red&code=a,b,c&min=5&max=1");
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([
      { path: "colour", message: 'Unknown parameter "colour". Known: kind, weighted, code, min, max.' },
      { path: "kind", message: 'kind: "tree" must be one of bipartite, unipartite.' },
      { path: "weighted", message: 'weighted: "maybe" must be true or false.' },
      { path: "code", message: "code must be a list of at most 2 values (comma-separated or repeated)." },
      { path: "min", message: "min is above max." },
    ]);
    // the same reading for a query-like object that arrives in a body
    expect(readQuery(listSchema, { kind: ["unipartite"], min: 1, max: "3" }, inOrder)).toEqual({ kind: ["unipartite"], min: 1, max: 3 });
    expect(() => readQuery(listSchema, { min: 4, max: 3 }, inOrder)).toThrow("min is above max.");
  });

  it("names each refused pipeline setting with its rule, nested ones by their whole pointer", async () => {
    const bad = await request(app).put("/settings").send({ restarts: 0, nullModels: ["curveball", "curveball"], colour: "red" });
    expect(bad.status).toBe(400);
    expect(bad.body.message).toBe("Some pipeline settings are not valid.");
    const models = "curveball, probabilistic, er, totals-connectance, patefield, weight-shuffle";
    expect(bad.body.details).toEqual([
      { path: "/colour", message: `colour is not a field of this request (fields: objective, restarts, nullModels, nullModel, nulls, seed, annealing).` },
      { path: "/restarts", message: "restarts must be a whole number from 1 to 1000." },
      { path: "/nullModels", message: `nullModels must be "standard" or a list of 1 to 6 different values from ${models}.` },
    ]);
    const ok = await request(app).put("/settings").send({ nullModels: ["er", "curveball"], seed: 7 });
    expect(ok.status).toBe(200);
    const batch = await request(app).post("/batches").send({ settings: { nulls: -1, shade: 1 }, force: "yes" });
    expect(batch.body.message).toBe("The batch request is not valid.");
    expect(batch.body.details).toEqual([
      { path: "/settings/shade", message: "settings.shade is not a field of settings (fields: objective, restarts, nullModels, nullModel, nulls, seed, annealing)." },
      { path: "/settings/nulls", message: "settings.nulls must be a whole number from 0 to 10000." },
      { path: "/force", message: "force must be true or false." },
    ]);
    const none = await request(app).post("/batches").send({});
    expect(none.body.body).toEqual({ force: false });
  });

  it("reads an upload's text fields like a query and refuses them like a body, JSON fields parsed and named to the leaf", async () => {
    const ok = await request(app).post("/fields").send({ kind: "unipartite", directed: "1", fileOptions: '{"web.xlsx": {"sheet": "Lowland"}}' });
    expect(ok.body.body).toEqual({ kind: "unipartite", directed: true, format: "auto", fileOptions: { "web.xlsx": { sheet: "Lowland" } } });
    expect((await request(app).post("/fields").send({})).body.body).toEqual({ kind: "bipartite", directed: false, format: "auto" });
    const leaf = await request(app).post("/fields").send({ fileOptions: '{"web.xlsx": {"missing": "maybe"}}' });
    expect(leaf.status).toBe(400);
    expect(leaf.body.details).toEqual([{ path: "/fileOptions/web.xlsx/missing", message: "fileOptions.web.xlsx.missing must be one of no-interaction, not-observed." }]);
    const notJson = await request(app).post("/fields").send({ fileOptions: "sheet=Lowland" });
    expect(notJson.body.message).toBe('fileOptions must be a JSON object keyed by file name, e.g. {"web.xlsx": {"sheet": "Lowland", "missing": "not-observed"}}.');
    const proto = await request(app).post("/fields").send({ fileOptions: '{"__proto__": {"sheet": "x"}}' });
    expect(proto.body.message).toMatch(/"__proto__" is not accepted/);
    const bipartite = await request(app).post("/fields").send({ directed: "true" });
    expect(bipartite.body.details).toEqual([{ path: "/directed", message: 'A bipartite network cannot be directed: only one-mode networks (kind "unipartite") can be.' }]);
  });

  it("refuses text that reads as an infinite number, for numbers and whole numbers alike", async () => {
    const query = catalogueSchema.query!;
    expect(() => readQuery(query, { page: "Infinity" })).toThrow("page must be a whole number of at least 1.");
    expect(() => readQuery(query, { nodesMin: "Infinity" })).toThrow("nodesMin must be a whole number of at least 0.");
    expect(() => readQuery(query, { qMin: "-Infinity" })).toThrow("qMin must be a number.");
    expect(() => readQuery(query, { zMax: "1e400" })).toThrow("zMax must be a number.");
    expect(readQuery(query, { page: "2", qMin: "-0.5", zMax: "1e3" })).toMatchObject({ page: 2, qMin: -0.5, zMax: 1000 });
  });

  it("refuses a change that changes nothing, and names a block that does not exist", async () => {
    const nothing = await request(app).patch("/deposits/4/networks/9").send({});
    expect(nothing.status).toBe(400);
    expect(nothing.body.message).toBe("Send at least one of the fields metadata, kind, directed, format, sheet, missing, blank.");
    const blocks = await request(app).post("/deposits/4/networks/apply").send({ from: 9, blocks: ["weather"] });
    expect(blocks.body.details).toEqual([{ path: "/blocks", message: 'blocks: "weather" must be one of locality, habitat, dates, sampling.' }]);
  });
});
