/**
 * Single networks by reference: JSON (with public coordinates and current metrics), CSV as matrix and
 * edge list (parsed back by the engine and compared with the stored network), metrics, and access
 * (withdrawn → 410, drafts 404 for visitors).
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { Network } from "../../../../server/src/models";
import { deserializeNetwork, networkToMatrixCsv, parseNetworkText, serializeNetwork } from "@shared/network/index";
import { resetDatabase } from "../../../setup/db";
import { publishDataset, type PublishedFixture } from "../../support/catalogue-fixtures";

const app = createApp();
let pub: PublishedFixture;
let gone: PublishedFixture;

beforeAll(async () => {
  await resetDatabase();
  pub = await publishDataset({
    networks: [
      { seed: 11, rows: 5, cols: 7, weighted: true, meta: { locality: { placeName: "Verrin Hills", countryCode: "NO", decimalLatitude: 60.12345, decimalLongitude: 10.98765, generalisation: "0.1" } }, metrics: { q: 0.42, z: 2.2, qRel: 0.5, p: 0.01 } },
      { seed: 12, rows: 6, kind: "unipartite" },
    ],
  });
  gone = await publishDataset({ state: "withdrawn", networks: [{ seed: 13 }] });
});
afterAll(shutdownServerResources);

describe("network by reference", () => {
  it("keeps formula-like labels exact, and writes them with a leading apostrophe when asked for the spreadsheet-safe form", async () => {
    const fx = await publishDataset({ networks: [{ seed: 21, rows: 3, cols: 4, rowLabels: ["=HYPERLINK(1)", "@SUM(A1)", "Bombus"] }] });
    const exact = await request(app).get(`/api/v1/networks/${fx.accession}/v1/1/data.csv`);
    expect(exact.text.split("\n").slice(1, 3).map((l) => l.split(",")[0])).toEqual(["=HYPERLINK(1)", "@SUM(A1)"]);
    const safe = await request(app).get(`/api/v1/networks/${fx.accession}/v1/1/data.csv`).query({ spreadsheetSafe: "true" });
    expect(safe.status).toBe(200);
    const safeRows = safe.text.split("\n").slice(1, 4).map((l) => l.split(","));
    expect(safeRows.map((r) => r[0])).toEqual(["'=HYPERLINK(1)", "'@SUM(A1)", "Bombus"]);
    // only the labels change: the cells are those of the exact file
    expect(safeRows.map((r) => r.slice(1))).toEqual(exact.text.split("\n").slice(1, 4).map((l) => l.split(",").slice(1)));
    const edges = await request(app).get(`/api/v1/networks/${fx.accession}/v1/1/data.csv`).query({ layout: "edgelist", spreadsheetSafe: "true" });
    expect(edges.text).not.toMatch(/(^|\n)[=@]/);
    const bad = await request(app).get(`/api/v1/networks/${fx.accession}/v1/1/data.csv`).query({ spreadsheetSafe: "yes" });
    expect(bad.status).toBe(400);
    expect(bad.body.details[0]).toMatchObject({ path: "spreadsheetSafe" });
  });

  it("answers JSON with public coordinates, counts and current metrics; ?include=data adds the links", async () => {
    const res = await request(app).get(`/api/v1/networks/${pub.accession}/v1/1`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ ref: `${pub.accession}/v1/1`, kind: "bipartite", weighted: true, rows: 5, cols: 7 });
    expect(res.body.metadata.locality).toMatchObject({ decimalLatitude: 60.1, decimalLongitude: 11 });
    expect(res.body.metrics).toMatchObject({ status: "succeeded", Q: 0.42, z: 2.2 });
    expect(res.body.data).toBeUndefined();
    const withData = await request(app).get(`/api/v1/networks/${pub.accession}/v1/1`).query({ include: "data" });
    const n = await Network.findByPk(pub.networkIds[0]);
    expect(withData.body.data.links.length).toBe(n!.nLinks);
    const sum = (withData.body.data.links as Array<[string, string, number]>).reduce((s, l) => s + l[2], 0);
    expect(sum).toBeCloseTo(n!.totalWeight, 10);
  });

  it("serves CSV (matrix and edge list) that parses back to the stored network", async () => {
    const stored = await Network.findByPk(pub.networkIds[1], { attributes: { include: ["canonical"] } });
    const matrix = await request(app).get(`/api/v1/networks/${pub.accession}/v1/2/data.csv`);
    expect(matrix.status).toBe(200);
    expect(matrix.headers["content-type"]).toMatch(/text\/csv/);
    const parsed = parseNetworkText(matrix.text, { fileName: "m.csv", kind: "unipartite", directed: true });
    expect(serializeNetwork(parsed.network)).toEqual(serializeNetwork(deserializeNetwork(stored!.canonical)));
    const same = await request(app).get(`/api/v1/networks/${pub.accession}/v1/2`).query({ format: "csv" });
    expect(same.text).toBe(matrix.text);
    const edges = await request(app).get(`/api/v1/networks/${pub.accession}/v1/1/data.csv`).query({ layout: "edgelist" });
    expect(edges.text.split("\n")[0]).toBe("source,target,weight");
    const bad = await request(app).get(`/api/v1/networks/${pub.accession}/v1/1/data.csv`).query({ layout: "spiral" });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toEqual([{ path: "layout", message: "layout must be one of matrix, edgelist." }]);
    const format = await request(app).get(`/api/v1/networks/${pub.accession}/v1/1`).query({ format: "xml" });
    expect(format.status).toBe(400);
    expect(format.body.message).toBe("format must be one of json, csv.");
    const address = await request(app).get(`/api/v1/networks/${pub.accession}/version-1/1/metrics`);
    expect(address.status).toBe(404);
    expect(address.body.message).toBe('No such version "version-1": versions are written v1, v2, …');
  });

  it("streams a large matrix in pieces: the engine's bytes exactly", async () => {
    const big = await publishDataset({ networks: [{ seed: 21, rows: 700, cols: 900, density: 0.01, weighted: true }] });
    const stored = await Network.findByPk(big.networkIds[0], { attributes: { include: ["canonical"] } });
    const res = await request(app).get(`/api/v1/networks/${big.accession}/v1/1/data.csv`).buffer(true);
    expect(res.status).toBe(200);
    const expected = networkToMatrixCsv(deserializeNetwork(stored!.canonical));
    expect(Number(res.headers["content-length"])).toBe(Buffer.byteLength(expected)); // known before the first piece
    expect(expected.length).toBeGreaterThan(1024 * 1024); // more than one piece
    expect(res.text === expected).toBe(true);
  });

  it("serves the metrics alone", async () => {
    const res = await request(app).get(`/api/v1/networks/${pub.accession}/v1/1/metrics`);
    expect(res.body).toMatchObject({ ref: `${pub.accession}/v1/1`, metrics: { Q: 0.42, qRel: 0.5, p: 0.01 } });
  });

  it("withdrawn → 410 with the tombstone as the body, on every read path; unknown → 404", async () => {
    for (const path of ["", "/data.csv", "/data.json", "/metrics", "?format=csv"]) {
      const res = await request(app).get(`/api/v1/networks/${gone.accession}/v1/1${path}`);
      expect(res.status, path).toBe(410);
      expect(res.body, path).toMatchObject({ code: "withdrawn", accession: gone.accession, version: 1, reason: expect.any(String), citation: expect.stringContaining(gone.accession), withdrawnAt: expect.any(String) });
    }
    for (const path of [`/api/v1/datasets/${gone.accession}`, `/api/v1/datasets/${gone.accession}/versions/1`, `/api/v1/datasets/${gone.accession}/versions/1/networks/1/file`, `/api/v1/network-views/${gone.accession}/1/1`]) {
      const res = await request(app).get(path);
      expect(res.status, path).toBe(410);
      expect(res.body, path).toMatchObject({ code: "withdrawn", accession: gone.accession, version: 1, citation: expect.stringContaining(gone.accession) });
    }
    expect((await request(app).get(`/api/v1/networks/${pub.accession}/v1/9`)).status).toBe(404);
    expect((await request(app).get(`/api/v1/networks/TB-999999/v1/1`)).status).toBe(404);
  });
});
