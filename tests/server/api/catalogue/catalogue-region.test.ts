/**
 * Where: the catalogue's latitude and elevation bands, continents (derived from the country code by the
 * countries-list package) and an area (bbox, also across the antimeridian), each checked against counts
 * computed independently in SQL over the networks' metadata; the coverage map and bundles take the same
 * parameters; bad values are 400s naming the parameter. Places and sites are invented; coordinates are
 * stored exact here so that the public coordinates equal the stored ones.
 */
import request from "supertest";
import { QueryTypes } from "sequelize";
import { continents, countries } from "countries-list";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { sequelize } from "../../../../server/src/db/sequelize";
import { catalogueStore } from "../../../../server/src/api/catalogue/catalogue.store";
import { resetDatabase } from "../../../setup/db";
import { baseNetworkMeta, publishDataset } from "../../support/catalogue-fixtures";

const app = createApp();

// [country, latitude, longitude, elevation]
const SITES: Array<[string, number, number, number]> = [
  ["NO", 60.1, 10.9, 300],
  ["FI", 61.2, 25.9, 120],
  ["GB", 54.4, -2.99, 450],
  ["BR", -15.8, -47.9, 1100],
  ["KE", -0.5, 36.9, 1900],
  ["NZ", -41.3, 174.8, 20],
  ["FJ", -17.7, 178.0, 5],
  ["TO", -21.1, -175.2, 2],
  ["RU", 55.7, 37.6, 150],
];

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  await publishDataset({
    study: { title: "Sites around the world" },
    networks: SITES.map(([cc, lat, lon, elev], k) => ({
      seed: k + 1,
      meta: { name: `Site ${cc}`, locality: { placeName: `Site ${cc}`, countryCode: cc, decimalLatitude: lat, decimalLongitude: lon, elevation: elev, generalisation: "exact" } },
    })),
  });
  // coordinates not recorded: never inside a band or an area
  const noCoords = baseNetworkMeta({ name: "Unplaced", notRecorded: { coordinates: "Lost field notes." } });
  noCoords.locality = { placeName: "Unknown", countryCode: "NO" } as never;
  await publishDataset({ study: { title: "Unplaced survey" }, networks: [{ seed: 50, meta: noCoords }] });
  // withdrawn: never counted
  await publishDataset({
    state: "withdrawn",
    study: { title: "Withdrawn Nordic survey" },
    networks: [{ seed: 60, meta: { locality: { placeName: "Gone", countryCode: "NO", decimalLatitude: 60.5, decimalLongitude: 11, elevation: 310, generalisation: "exact" } } }],
  });
});
afterAll(shutdownServerResources);

const BASE = `
  FROM networks n
  JOIN dataset_versions v ON v.id = n.version_id AND v.state = 'published'
  JOIN datasets d ON d.id = v.dataset_id AND d.accession IS NOT NULL`;
const LAT = `(n.metadata #>> '{locality,decimalLatitude}')::float8`;
const LON = `(n.metadata #>> '{locality,decimalLongitude}')::float8`;
const ELEV = `(n.metadata #>> '{locality,elevation}')::float8`;

async function sqlCount(where: string, params: Record<string, unknown> = {}): Promise<number> {
  const [row] = await sequelize().query<{ c: string }>(`SELECT count(*) AS c ${BASE} WHERE ${where}`, { replacements: params, type: QueryTypes.SELECT });
  return Number(row.c);
}

async function total(query: Record<string, string | number>): Promise<number> {
  const res = await request(app).get("/api/v1/catalogue").query(query);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.meta.total as number;
}

describe("region filters against independent SQL counts", () => {
  it("filters by a latitude band and an elevation band", async () => {
    for (const [lo, hi] of [
      [50, 70],
      [-30, 0],
      [-90, -40],
      [54.4, 54.4],
    ]) {
      expect(await total({ latitudeMin: lo, latitudeMax: hi })).toBe(await sqlCount(`${LAT} BETWEEN :lo AND :hi`, { lo, hi }));
    }
    expect(await total({ latitudeMin: 50, latitudeMax: 70 })).toBe(4); // NO, FI, GB, RU; not the withdrawn one nor the unplaced one
    expect(await total({ latitudeMin: 0 })).toBe(await sqlCount(`${LAT} >= 0`));
    for (const [lo, hi] of [
      [0, 200],
      [100, 1000],
      [1000, 3000],
    ]) {
      expect(await total({ elevationMin: lo, elevationMax: hi })).toBe(await sqlCount(`${ELEV} BETWEEN :lo AND :hi`, { lo, hi }));
    }
    expect(await total({ latitudeMin: 50, elevationMax: 200 })).toBe(await sqlCount(`${LAT} >= 50 AND ${ELEV} <= 200`));
  });

  it("filters by an area, also one crossing the antimeridian", async () => {
    const boxes: Array<[number, number, number, number]> = [
      [-10, 50, 30, 70],
      [-60, -30, 40, 5],
      [170, -30, -170, -10], // west > east: across 180°
      [-180, -90, 180, 90],
    ];
    for (const [w, s, e, n] of boxes) {
      const lonWhere = w > e ? `(${LON} >= :w OR ${LON} <= :e)` : `${LON} BETWEEN :w AND :e`;
      const expected = await sqlCount(`${LAT} BETWEEN :s AND :n AND ${lonWhere}`, { w, s, e, n });
      expect(await total({ bbox: `${w},${s},${e},${n}` }), `bbox ${w},${s},${e},${n}`).toBe(expected);
    }
    expect(await total({ bbox: "170,-30,-170,-10" })).toBe(2); // FJ and TO
    // the coverage map answers the same filter
    const map = await request(app).get("/api/v1/network-views/map").query({ bbox: "-10,50,30,70" });
    expect(map.status).toBe(200);
    expect(map.body.data.map((r: { name: string }) => r.name).sort()).toEqual(["Site FI", "Site GB", "Site NO"]);
    // and so does a bundle of everything matching
    const visitor = request.agent(app);
    const { csrfToken } = (await visitor.get("/api/v1/auth/session")).body as { csrfToken: string };
    const est = await visitor.post("/api/v1/bundles/estimate").set("x-csrf-token", csrfToken).send({ filter: { bbox: "-10,50,30,70" } });
    expect(est.status).toBe(200);
    expect(est.body.count).toBe(3);
  });

  it("filters by continent, derived from the country code by the countries-list dataset", async () => {
    const rows = await sequelize().query<{ cc: string }>(`SELECT n.metadata #>> '{locality,countryCode}' AS cc ${BASE}`, { type: QueryTypes.SELECT });
    const continentOf = (cc: string) => (countries as Record<string, { continent: string }>)[cc].continent;
    for (const code of Object.keys(continents)) {
      const expected = rows.filter((r) => continentOf(r.cc) === code).length;
      expect(await total({ continent: code }), code).toBe(expected);
    }
    expect(await total({ continent: "EU" })).toBe(4); // NO, FI, GB and the unplaced Norwegian one (RU is filed under Asia)
    expect(await total({ continent: "eu,oc" })).toBe(4 + 3);
    const res = await request(app).get("/api/v1/catalogue").query({ continent: "OC" });
    const facet = res.body.meta.facets.continent as Array<{ value: string; count: number; label: string }>;
    expect(facet.find((f) => f.value === "EU")).toEqual({ value: "EU", count: 4, label: "Europe" });
    expect(facet.find((f) => f.value === "OC")).toEqual({ value: "OC", count: 3, label: "Oceania" });
    expect(res.body.meta.facets.latitude).toEqual({ min: -41.3, max: -17.7 });
  });

  it("refuses bad region parameters, naming each", async () => {
    const res = await request(app).get("/api/v1/catalogue").query({ continent: "Atlantis", latitudeMin: 95, elevationMin: 900, elevationMax: 100, bbox: "1,2,3" });
    expect(res.status).toBe(400);
    expect((res.body.details as Array<{ path: string }>).map((d) => d.path).sort()).toEqual(["bbox", "continent", "elevationMin", "latitudeMin"]);
    const flipped = await request(app).get("/api/v1/catalogue").query({ bbox: "0,60,10,50" });
    expect(flipped.status).toBe(400);
    expect(flipped.body.details[0].message).toMatch(/south \(60\) is north of its north \(50\)/);
    const outside = await request(app).get("/api/v1/catalogue").query({ bbox: "-200,0,10,10" });
    expect(outside.status).toBe(400);
    expect(outside.body.details).toEqual([{ path: "bbox", message: "bbox must be four numbers west,south,east,north in degrees (longitudes −180…180, latitudes −90…90)." }]);
    expect((res.body.details as Array<{ path: string; message: string }>).find((d) => d.path === "continent")?.message).toBe('continent: "ATLANTIS" must be one of AF, AN, AS, EU, NA, OC, SA.');
  });
});
