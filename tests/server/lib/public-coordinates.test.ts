/**
 * One public rule for coordinates everywhere: a published locality whose generalisation is missing or
 * unknown (metadata saved before validation, or by hand) is treated as the cautious 0.1° grid by every
 * public answer: dataset API, network JSON, network view, coverage map, JSON-LD and bundles' networks.csv
 * agree (the bundle states the grid applied), and none carries the exact coordinates; the elevation is
 * rounded with them (100 m on the 0.1° grid, 500 m on the 1° grid). The owner still sees the exact values.
 */
import request from "supertest";
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../server/src/app";
import { CLIENT_DIST } from "../../../server/src/config/paths";
import { shutdownServerResources } from "../../../server/src/index";
import { resetRateLimits } from "../../../server/src/middlewares/rate-limit";
import { catalogueStore } from "../../../server/src/api/catalogue/catalogue.store";
import { datasetHtmlRenderer } from "../../../server/src/api/datasets/datasets.html";
import type { Locality } from "@shared/types/dataset";
import { resetDatabase } from "../../setup/db";
import { unzip } from "../support/unzip";
import { agentFor, createUser } from "../support/accounts";
import { createFixtureDataset, DAVIS_CSV } from "../support/published-fixture";

const app = createApp();
const EXACT_LAT = 61.23456;
const EXACT_LON = 8.98765;
const EXACT_ELEVATION = 1437;
const shell = existsSync(join(CLIENT_DIST, "index.html")) ? readFileSync(join(CLIENT_DIST, "index.html"), "utf8") : readFileSync(join(process.cwd(), "client", "index.html"), "utf8");
let ownerEmail = "";

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  await resetRateLimits();
  const owner = await createUser({ email: "owner@coords.test" });
  ownerEmail = owner.email;
  const noGeneralisation = { placeName: "Verrin Hills", countryCode: "NO", decimalLatitude: EXACT_LAT, decimalLongitude: EXACT_LON, elevation: EXACT_ELEVATION } as unknown as Locality;
  const unknownGeneralisation = { ...noGeneralisation, generalisation: "0.5" } as unknown as Locality;
  await createFixtureDataset({ accession: "TB-000011", owner, networks: [{ text: DAVIS_CSV, metrics: false, metadata: { locality: noGeneralisation } }] });
  await createFixtureDataset({ accession: "TB-000012", owner, networks: [{ text: DAVIS_CSV, metrics: false, metadata: { locality: unknownGeneralisation } }] });
  await createFixtureDataset({ accession: "TB-000013", owner, networks: [{ text: DAVIS_CSV, metrics: false, metadata: { locality: { ...noGeneralisation, generalisation: "1" } } }] });
  await createFixtureDataset({ accession: "TB-000014", owner, networks: [{ text: DAVIS_CSV, metrics: false, metadata: { locality: { ...noGeneralisation, generalisation: "exact" } } }] });
});
afterAll(shutdownServerResources);

function expectCautious(lat: unknown, lon: unknown, where: string, elevation?: unknown) {
  expect(lat, where).toBe(61.2);
  expect(lon, where).toBe(9);
  if (elevation !== undefined) expect(elevation, `${where}: elevation`).toBe(1400);
}

describe("public coordinates without a known generalisation", () => {
  it.each(["TB-000011", "TB-000012"])("%s: every public answer rounds to 0.1° and none carries the exact values", async (acc) => {
    const detail = await request(app).get(`/api/v1/datasets/${acc}`);
    expect(detail.status).toBe(200);
    const loc = detail.body.networks[0].metadata.locality;
    expectCautious(loc.decimalLatitude, loc.decimalLongitude, "dataset API", loc.elevation);
    expect(loc.generalisation).toBe("0.1");

    const net = await request(app).get(`/api/v1/networks/${acc}/v1/1`);
    expect(net.status).toBe(200);
    expectCautious(net.body.metadata.locality.decimalLatitude, net.body.metadata.locality.decimalLongitude, "network JSON", net.body.metadata.locality.elevation);

    const view = await request(app).get(`/api/v1/network-views/${acc}/v1/1`);
    expect(view.status).toBe(200);
    expectCautious(view.body.metadata.locality.decimalLatitude, view.body.metadata.locality.decimalLongitude, "network view", view.body.metadata.locality.elevation);
    // the catalogue's elevation band filters the public value: no bisection of filters finds the exact one
    const refsIn = async (q: string) => ((await request(app).get(`/api/v1/catalogue?pageSize=100&${q}`)).body.data as Array<{ ref: string }>).map((r) => r.ref);
    expect(await refsIn("elevationMin=1400&elevationMax=1400"), "catalogue").toContain(`${acc}/v1/1`);
    expect(await refsIn("elevationMin=1430&elevationMax=1440"), "catalogue").not.toContain(`${acc}/v1/1`);

    const map = await request(app).get(`/api/v1/network-views/map`);
    const point = (map.body.data as Array<{ ref: string; latitude: number; longitude: number }>).find((p) => p.ref === `${acc}/v1/1`);
    expectCautious(point?.latitude, point?.longitude, "map");

    const html = (await datasetHtmlRenderer(`/datasets/${acc}`, shell))!;
    for (const body of [JSON.stringify(detail.body), JSON.stringify(net.body), JSON.stringify(view.body), JSON.stringify(point), html]) {
      expect(body).not.toContain(String(EXACT_LAT));
      expect(body).not.toContain(String(EXACT_LON));
      expect(body).not.toContain(String(EXACT_ELEVATION));
    }
  });

  it("elevation follows the grid: 500 m on a 1° grid, exact when the coordinates are exact", async () => {
    const coarse = await request(app).get(`/api/v1/datasets/TB-000013`);
    expect(coarse.body.networks[0].metadata.locality).toMatchObject({ decimalLatitude: 61, decimalLongitude: 9, elevation: 1500, generalisation: "1" });
    const exact = await request(app).get(`/api/v1/datasets/TB-000014`);
    expect(exact.body.networks[0].metadata.locality).toMatchObject({ decimalLatitude: EXACT_LAT, elevation: EXACT_ELEVATION, generalisation: "exact" });
  });

  it("bundles' networks.csv states the rounded coordinates and the 0.1 grid it applied", async () => {
    const res = await request(app)
      .get("/api/v1/bundles?refs=TB-000011/v1/1,TB-000012/v1/1")
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on("data", (c: Buffer) => chunks.push(c));
        r.on("end", () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    const files = await unzip(res.body as Buffer);
    const csv = files.get("networks.csv")!;
    const [header, ...rows] = csv.trim().split("\n").map((l) => l.split(","));
    const col = (name: string) => header.indexOf(name);
    expect(rows).toHaveLength(2);
    for (const r of rows) {
      expectCautious(Number(r[col("decimal_latitude")]), Number(r[col("decimal_longitude")]), "networks.csv", Number(r[col("elevation")]));
      expect(r[col("coordinate_generalisation")]).toBe("0.1");
    }
    for (const text of files.values()) {
      expect(text).not.toContain(String(EXACT_LAT));
      expect(text).not.toContain(String(EXACT_LON));
      expect(text).not.toContain(String(EXACT_ELEVATION));
    }
  });

  it("the owner still sees the exact coordinates", async () => {
    const owner = await agentFor(app, ownerEmail);
    const res = await owner.agent.get("/api/v1/datasets/TB-000011");
    expect(res.body.networks[0].metadata.locality.decimalLatitude).toBe(EXACT_LAT);
    expect(res.body.networks[0].metadata.locality.elevation).toBe(EXACT_ELEVATION);
    // an answer that differs per viewer must not be kept by shared caches
    for (const path of ["/api/v1/datasets/TB-000011", "/api/v1/datasets/TB-000011/versions/1"]) {
      const r = await owner.agent.get(path);
      expect(r.headers["cache-control"], path).toBe("private, no-cache");
      expect(r.headers.vary, path).toMatch(/Cookie/);
      expect(r.headers.vary, path).toMatch(/Authorization/);
    }
  });
});

