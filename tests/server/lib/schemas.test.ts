/**
 * The metadata JSON Schemas: every example in schemas/examples/valid passes, every example in
 * schemas/examples/invalid fails with exactly the error its file name states
 * (`<schema>.<keyword>.<path.with.dots>.json`), with a human message at that JSON pointer. The browser's
 * validator (shared/validation/mini-validator.ts) must report the same (path, keyword) pairs as ajv.
 * The schemas are served at /schemas/<name>.schema.json with their versioned $id.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import request from "supertest";
import { afterAll, describe, expect, it } from "vitest";
import { createApp } from "../../../server/src/app";
import { SCHEMAS_DIR } from "../../../server/src/config/paths";
import { shutdownServerResources } from "../../../server/src/index";
import { rawSchemaErrors, schemaFindings, schemaJson, type SchemaName } from "../../../server/src/lib/schemas";
import { validateWithSchema, humanizeSchemaErrors, generaliseLocality, roundToGrid, networkCrossChecks } from "@shared/validation";

const dir = (kind: "valid" | "invalid") => join(SCHEMAS_DIR, "examples", kind);
const load = (kind: "valid" | "invalid", f: string) => JSON.parse(readFileSync(join(dir(kind), f), "utf8")) as unknown;
const schemaOf = (file: string): SchemaName => (file.startsWith("study") ? "study" : "network");
const pairs = (errs: Array<{ instancePath: string; keyword: string }>) => errs.map((e) => `${e.instancePath} ${e.keyword}`).sort();

afterAll(shutdownServerResources);

describe("schema examples", () => {
  const valid = readdirSync(dir("valid")).filter((f) => f.endsWith(".json"));
  const invalid = readdirSync(dir("invalid")).filter((f) => f.endsWith(".json"));

  it("has examples of both schemas", () => {
    expect(valid.filter((f) => f.startsWith("study")).length).toBeGreaterThanOrEqual(2);
    expect(valid.filter((f) => f.startsWith("network")).length).toBeGreaterThanOrEqual(2);
    expect(invalid.length).toBeGreaterThanOrEqual(20);
  });

  it.each(valid)("valid/%s passes ajv and the browser validator", (f) => {
    const data = load("valid", f);
    expect(rawSchemaErrors(schemaOf(f), data)).toEqual([]);
    expect(validateWithSchema(schemaJson(schemaOf(f)), data)).toEqual([]);
  });

  it.each(invalid)("invalid/%s fails with the error its name states", (f) => {
    const [schema, keyword, ...pathParts] = f.replace(/\.json$/, "").split(".");
    const pointer = "/" + pathParts.join("/");
    const data = load("invalid", f);
    const errors = rawSchemaErrors(schema as SchemaName, data);
    expect(errors.map((e) => e.keyword)).toEqual([keyword]);
    const human = schemaFindings(schema as SchemaName, data);
    expect(human).toHaveLength(1);
    expect(human[0].path).toBe(pointer);
    expect(human[0].message).toMatch(/^[A-Z].+\.$/);
    // The browser validator agrees with ajv.
    const mini = validateWithSchema(schemaJson(schema as SchemaName), data);
    expect(pairs(mini)).toEqual(pairs(errors));
    expect(humanizeSchemaErrors(mini)).toEqual(human);
  });

  it("the browser validator agrees with ajv on a record with many faults at once", () => {
    const bad = { title: 3, creators: [{ orcid: "x" }, "y"], licence: null, keywords: ["a", "a", ""], contactEmail: "no", extra: 1, publication: { doi: "10.1/x" } };
    expect(pairs(validateWithSchema(schemaJson("study"), bad))).toEqual(pairs(rawSchemaErrors("study", bad)));
    const net = { name: "", locality: { decimalLatitude: -91, decimalLongitude: 181, countryCode: "no", generalisation: 1 }, startDate: "2020-02-30", samplingEffort: { value: -1 } };
    expect(pairs(validateWithSchema(schemaJson("network"), net))).toEqual(pairs(rawSchemaErrors("network", net)));
  });

  it("messages name the field and say what is expected", () => {
    const f = schemaFindings("study", { ...(load("valid", "study-full.json") as object), creators: [{ name: "A", orcid: "123" }] });
    expect(f).toEqual([{ path: "/creators/0/orcid", message: "Creators 1, ORCID iD must be an ORCID iD of 16 characters with hyphens, e.g. 0000-0002-1825-0097." }]);
    const g = schemaFindings("network", { ...(load("valid", "network-bipartite.json") as object), startDate: "2019-02-29" });
    expect(g).toEqual([{ path: "/startDate", message: "Start date must be a real date written YYYY-MM-DD." }]);
  });
});

describe("cross-field rules", () => {
  // The metadata below leaves out coordinates, dates and habitat: their "given or not recorded" rule is
  // tested in tests/server/api/datasets/not-recorded.test.ts; here only the other rules.
  const OTHER = new Set(["/endDate", "/rowLevel", "/colLevel", "/directionMeaning"]);
  const paths = (meta: Record<string, unknown>, facts: Parameters<typeof networkCrossChecks>[1]) =>
    networkCrossChecks({ notRecorded: { dates: "not in the source" }, ...meta }, facts).map((e) => e.path).filter((p) => OTHER.has(p));
  it("flags an end date before the start date and missing level names", () => {
    expect(paths({ startDate: "2020-05-02", endDate: "2020-05-01", rowLevel: "plants", colLevel: "bees", notRecorded: {} }, { kind: "bipartite", directed: false })).toEqual(["/endDate"]);
    expect(paths({}, { kind: "bipartite", directed: false })).toEqual(["/rowLevel", "/colLevel"]);
    expect(paths({}, { kind: "unipartite", directed: true })).toEqual(["/directionMeaning"]);
    expect(paths({}, { kind: "unipartite", directed: false })).toEqual([]);
    expect(networkCrossChecks({ habitat: "heath", startDate: "2020-05-01", endDate: "2020-05-02", locality: { decimalLatitude: 1, decimalLongitude: 2, generalisation: "exact" } }, { kind: "unipartite", directed: false })).toEqual([]);
  });
});

describe("coordinate generalisation", () => {
  const loc = { placeName: "x", countryCode: "FI", decimalLatitude: 61.23456, decimalLongitude: -25.98765, coordinatePrecision: 0.00001, generalisation: "exact" as const };
  it("keeps exact coordinates when the depositor chose exact", () => {
    expect(generaliseLocality(loc)).toEqual(loc);
  });
  it("rounds to the chosen grid and sets coordinatePrecision to it", () => {
    expect(generaliseLocality({ ...loc, generalisation: "0.01" })).toMatchObject({ decimalLatitude: 61.23, decimalLongitude: -25.99, coordinatePrecision: 0.01 });
    expect(generaliseLocality({ ...loc, generalisation: "0.1" })).toMatchObject({ decimalLatitude: 61.2, decimalLongitude: -26, coordinatePrecision: 0.1 });
    expect(generaliseLocality({ ...loc, generalisation: "1" })).toMatchObject({ decimalLatitude: 61, decimalLongitude: -26, coordinatePrecision: 1 });
  });
  it("rounds to the nearest grid point without floating-point residue", () => {
    expect(roundToGrid(0.35, 0.1)).toBe(0.4);
    expect(roundToGrid(-0.04, 0.1)).toBe(0);
    expect(String(roundToGrid(12.345678, 0.01))).toBe("12.35");
    expect(roundToGrid(179.7, 1)).toBe(180);
  });
});

describe("schemas served at stable URLs", () => {
  const app = createApp();
  it.each(["study", "network"])("GET /schemas/%s.schema.json", async (name) => {
    const res = await request(app).get(`/schemas/${name}.schema.json`);
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/json/);
    const body = typeof res.body === "object" && Object.keys(res.body).length ? res.body : JSON.parse(res.text);
    expect(body.$id).toBe(`https://tanglebank.test/schemas/${name}/1.0.0`);
    expect(body.$schema).toBe("https://json-schema.org/draft/2020-12/schema");
    for (const [k, v] of Object.entries(body.properties as Record<string, { description?: string }>)) {
      expect(v.description, k).toMatch(/DataCite|Darwin Core|schema\.org|Tanglebank's own/);
    }
  });
});
