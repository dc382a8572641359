/**
 * The catalogue API: every filter and some combinations against counts computed independently in SQL
 * over the raw tables, facet counts, sorting, pagination, full-text search (node names, localities,
 * creators) and keeping current on publish and withdrawal (direct refresh, LISTEN/NOTIFY, lazy check).
 * Invented data (tests/server/support/catalogue-fixtures.ts).
 */
import request from "supertest";
import { QueryTypes } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { sequelize } from "../../../../server/src/db/sequelize";
import { catalogueStore } from "../../../../server/src/api/catalogue/catalogue.store";
import { notifyCatalogueChanged, startCatalogueListener, stopCatalogueListener } from "../../../../server/src/api/catalogue/catalogue.events";
import { DatasetVersion } from "../../../../server/src/models";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { resetDatabase } from "../../../setup/db";
import { publishDataset, addRun, type FixtureNetwork } from "../../support/catalogue-fixtures";

const app = createApp();

const TYPES = ["pollination", "seed-dispersal", "host-parasitoid"] as const;
const COUNTRIES = ["NO", "SE", "FI", "EE"];
const HABITATS = ["meadow", "forest", "heath"];

let withdrawnNodeLabel = "";
let supersededAccession = "";

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  // 12 datasets × 1–3 networks with varied metadata and metrics
  for (let d = 0; d < 12; d++) {
    const networks: FixtureNetwork[] = [];
    for (let k = 0; k < 1 + (d % 3); k++) {
      const i = d * 3 + k;
      networks.push({
        rows: 3 + (i % 7),
        cols: 4 + (i % 5),
        kind: i % 5 === 4 ? "unipartite" : "bipartite",
        weighted: i % 4 === 1,
        seed: 100 + i,
        density: 0.2 + (i % 4) * 0.15,
        rowLabels: Array.from({ length: 3 + (i % 7) }, (_, r) => `Flora${i}_${r}`),
        meta: {
          name: `Transect ${i}`,
          interactionType: TYPES[i % 3],
          habitat: HABITATS[i % 3 === 0 ? 0 : (i % 2) + 1],
          locality: { placeName: i === 7 ? "Lake Osk basin" : "Tallow Coast", countryCode: COUNTRIES[i % 4], decimalLatitude: 59 + i / 10, decimalLongitude: 10 + i / 7, generalisation: "0.1" },
          startDate: `${2015 + (i % 8)}-05-01`,
          endDate: `${2015 + (i % 8) + (i % 2)}-08-31`,
        },
        metrics: i % 6 === 5 ? null : { q: 0.2 + (i % 9) * 0.05, z: i % 7 === 3 ? null : -1 + (i % 8), qRel: 0.1 * (i % 5) },
      });
    }
    await publishDataset({
      study: { title: `Study ${d} of invented meadows`, licence: d % 3 === 0 ? "CC0-1.0" : "CC-BY-4.0", creators: [{ name: d === 4 ? "Ines Okafor" : "Rowan Hale" }] },
      networks,
    });
  }
  // A dataset with two published versions: only v2's networks are listed
  const v1 = await publishDataset({ study: { title: "Versioned heath study" }, networks: [{ seed: 5, metrics: { q: 0.3, z: 2 } }] });
  supersededAccession = v1.accession;
  await publishDataset({ dataset: { id: v1.datasetId, accession: v1.accession }, number: 2, study: { title: "Versioned heath study" }, networks: [{ seed: 6, metrics: { q: 0.31, z: 2.1 } }, { seed: 8, metrics: { q: 0.32, z: 2.2 } }] });
  // A withdrawn dataset and a draft: never listed
  withdrawnNodeLabel = "Withdrawnia_alpina";
  await publishDataset({ state: "withdrawn", study: { title: "Withdrawn study" }, networks: [{ seed: 9, rowLabels: [withdrawnNodeLabel, "b", "c", "d"], metrics: { q: 0.5, z: 3 } }] });
  const draft = await publishDataset({ state: "draft", study: { title: "Draft study" }, networks: [{ seed: 10, metrics: { q: 0.5, z: 3 } }] });
  await sequelize().query(`UPDATE datasets SET accession = NULL WHERE id = :id`, { replacements: { id: draft.datasetId } });
  // An older run with other settings must not be the one shown
  const [{ id: someNetwork }] = await sequelize().query<{ id: number }>(`SELECT id FROM networks ORDER BY id LIMIT 1`, { type: QueryTypes.SELECT });
  await addRun(someNetwork, { q: 0.99, z: 99, settingsHash: "f".repeat(64) });
});

afterAll(async () => {
  await stopCatalogueListener();
  await shutdownServerResources();
});

/** SQL over the raw tables: networks of the latest published version of each dataset, with the run of the current hash. */
const BASE = `
  FROM networks n
  JOIN dataset_versions v ON v.id = n.version_id AND v.state = 'published'
  JOIN datasets d ON d.id = v.dataset_id AND d.accession IS NOT NULL
  LEFT JOIN metric_runs r ON r.network_id = n.id AND r.status = 'succeeded' AND r.settings_hash <> repeat('f', 64)
  WHERE v.number = (SELECT max(number) FROM dataset_versions x WHERE x.dataset_id = v.dataset_id AND x.state = 'published')`;

async function sqlCount(where = "true", params: Record<string, unknown> = {}): Promise<number> {
  const [row] = await sequelize().query<{ c: string }>(`SELECT count(*) AS c ${BASE} AND (${where})`, { replacements: params, type: QueryTypes.SELECT });
  return Number(row.c);
}

async function get(query: Record<string, string | number>) {
  const res = await request(app).get("/api/v1/catalogue").query(query);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { data: Array<Record<string, unknown>>; meta: { total: number; page: number; pageSize: number; facets: Record<string, unknown>; searchMatch: string | null } };
}

describe("catalogue filters against independent SQL counts", () => {
  it("lists one row per network of the latest published version; withdrawn, drafts and superseded versions are absent", async () => {
    const body = await get({ pageSize: 200 });
    expect(body.meta.total).toBe(await sqlCount());
    expect(body.meta.total).toBe(26); // 12 datasets of 1+2+3 networks ×4 = 24, plus 2 of the versioned dataset
    const refs = body.data.map((r) => r.ref as string);
    expect(refs).toContain(`${supersededAccession}/v2/1`);
    expect(refs).toContain(`${supersededAccession}/v2/2`);
    expect(refs).not.toContain(`${supersededAccession}/v1/1`);
    expect(body.data.some((r) => r.title === "Withdrawn study" || r.title === "Draft study")).toBe(false);
    // the run of other settings (Q 0.99) is never the one shown
    expect(body.data.some((r) => r.Q === 0.99)).toBe(false);
  });

  const cases: Array<[string, Record<string, string | number>, string, Record<string, unknown>?]> = [
    ["interactionType", { interactionType: "pollination" }, `n.metadata->>'interactionType' = 'pollination'`],
    ["interactionType (two values)", { interactionType: "pollination,host-parasitoid" }, `n.metadata->>'interactionType' IN ('pollination','host-parasitoid')`],
    ["kind", { kind: "unipartite" }, `n.kind = 'unipartite'`],
    ["weighted", { weighted: "true" }, `n.weighted`],
    ["habitat", { habitat: "forest" }, `n.metadata->>'habitat' = 'forest'`],
    ["country", { country: "se" }, `n.metadata#>>'{locality,countryCode}' = 'SE'`],
    ["licence", { licence: "CC0-1.0" }, `v.metadata->>'licence' = 'CC0-1.0'`],
    ["year range (overlap of sampling years)", { yearMin: 2018, yearMax: 2019 }, `substr(n.metadata->>'startDate',1,4)::int <= 2019 AND substr(n.metadata->>'endDate',1,4)::int >= 2018`],
    ["node-count range", { nodesMin: 10, nodesMax: 13 }, `n.n_nodes BETWEEN 10 AND 13`],
    ["connectance range", { connectanceMin: 0.4, connectanceMax: 0.7 }, `n.connectance BETWEEN 0.4 AND 0.7`],
    ["Q range", { qMin: 0.3, qMax: 0.45 }, `r.q BETWEEN 0.3 AND 0.45`],
    ["z range", { zMin: 1.5 }, `r.z >= 1.5`],
    [
      "combination: type + country + nodes + Q",
      { interactionType: "seed-dispersal,pollination", country: "NO,FI", nodesMin: 8, qMin: 0.25 },
      `n.metadata->>'interactionType' IN ('seed-dispersal','pollination') AND n.metadata#>>'{locality,countryCode}' IN ('NO','FI') AND n.n_nodes >= 8 AND r.q >= 0.25`,
    ],
    ["combination: kind + weighted + licence + z", { kind: "bipartite", weighted: "false", licence: "CC-BY-4.0", zMax: 4 }, `n.kind = 'bipartite' AND NOT n.weighted AND v.metadata->>'licence' = 'CC-BY-4.0' AND r.z <= 4`],
  ];
  for (const [name, query, where] of cases) {
    it(`filter: ${name}`, async () => {
      const expected = await sqlCount(where);
      const body = await get({ ...query, pageSize: 200 });
      expect(expected).toBeGreaterThan(0);
      expect(body.meta.total).toBe(expected);
      expect(body.data.length).toBe(expected);
    });
  }

  it("facet counts: each value counted with every other filter applied", async () => {
    const body = await get({ country: "NO", interactionType: "pollination" });
    const facets = body.meta.facets as Record<string, Array<{ value: string; count: number }>>;
    // interactionType facet: country filter only
    for (const t of TYPES) {
      const expected = await sqlCount(`n.metadata#>>'{locality,countryCode}' = 'NO' AND n.metadata->>'interactionType' = :t`, { t });
      expect(facets.interactionType.find((f) => f.value === t)?.count ?? 0).toBe(expected);
    }
    // country facet: interaction type filter only
    for (const c of COUNTRIES) {
      const expected = await sqlCount(`n.metadata->>'interactionType' = 'pollination' AND n.metadata#>>'{locality,countryCode}' = :c`, { c });
      expect(facets.country.find((f) => f.value === c)?.count ?? 0).toBe(expected);
    }
    // kind facet: both filters
    const bip = await sqlCount(`n.metadata->>'interactionType' = 'pollination' AND n.metadata#>>'{locality,countryCode}' = 'NO' AND n.kind = 'bipartite'`);
    expect(facets.kind.find((f) => f.value === "bipartite")?.count ?? 0).toBe(bip);
    // range facets: min/max among matching rows
    const [mm] = await sequelize().query<{ lo: number; hi: number }>(
      `SELECT min(n.n_nodes) AS lo, max(n.n_nodes) AS hi ${BASE} AND n.metadata->>'interactionType' = 'pollination' AND n.metadata#>>'{locality,countryCode}' = 'NO'`,
      { type: QueryTypes.SELECT },
    );
    expect(body.meta.facets.nodes).toEqual({ min: mm.lo, max: mm.hi });
  });
});

describe("sorting and pagination", () => {
  it("sorts by S descending and by Q ascending with missing values last", async () => {
    const byS = (await get({ sort: "S", order: "desc", pageSize: 200 })).data.map((r) => r.S as number);
    expect(byS).toEqual([...byS].sort((a, b) => b - a));
    const byQ = (await get({ sort: "Q", order: "asc", pageSize: 200 })).data.map((r) => r.Q as number | null);
    const firstNull = byQ.indexOf(null);
    expect(firstNull).toBeGreaterThan(0);
    expect(byQ.slice(firstNull).every((q) => q === null)).toBe(true);
    const present = byQ.slice(0, firstNull) as number[];
    expect(present).toEqual([...present].sort((a, b) => a - b));
    const titles = (await get({ sort: "title", pageSize: 200 })).data.map((r) => (r.title as string).toLowerCase());
    expect(titles).toEqual([...titles].sort());
  });

  it("a page's rows are those of the full ordering, for every sort key and direction (pages are picked without sorting every match)", async () => {
    const total = (await get({ pageSize: 1 })).meta.total;
    expect(total).toBeGreaterThan(16);
    for (const sort of ["accession", "title", "type", "S", "C", "Q", "z", "year"]) {
      for (const order of ["asc", "desc"]) {
        const full = (await get({ sort, order, pageSize: 200 })).data.map((r) => r.ref);
        expect(full).toHaveLength(total);
        // one row per page, on the pages where fewer than an eighth of the matches are needed
        for (let page = 1; page * 8 < total; page++) {
          const one = await get({ sort, order, page, pageSize: 1 });
          expect(one.data.map((r) => r.ref), `${sort} ${order} page ${page}`).toEqual([full[page - 1]]);
        }
      }
    }
  });

  it("pages cover every row exactly once", async () => {
    const all = await get({ pageSize: 200 });
    const seen: string[] = [];
    for (let page = 1; page <= Math.ceil(all.meta.total / 7); page++) {
      const p = await get({ page, pageSize: 7 });
      expect(p.meta.page).toBe(page);
      seen.push(...p.data.map((r) => r.ref as string));
    }
    expect(seen).toEqual(all.data.map((r) => r.ref));
  });

  it("rejects bad parameters naming each one", async () => {
    const res = await request(app).get("/api/v1/catalogue").query({ nodesMin: "many", sort: "colour", connectanceMax: 2, frobnicate: 1 });
    expect(res.status).toBe(400);
    const paths = (res.body.details as Array<{ path: string }>).map((d) => d.path).sort();
    expect(paths).toEqual(["connectanceMax", "frobnicate", "nodesMin", "sort"]);
    const message = (path: string) => (res.body.details as Array<{ path: string; message: string }>).find((d) => d.path === path)?.message;
    expect(message("nodesMin")).toBe("nodesMin must be a whole number of at least 0.");
    expect(message("connectanceMax")).toBe("connectanceMax must be a number from 0 to 1.");
    expect(message("sort")).toBe("sort must be one of accession, title, type, S, C, Q, z, year, relevance.");
    expect(message("frobnicate")).toMatch(/^Unknown parameter "frobnicate"\. Known: q, interactionType, kind, /);
    // lists: comma-separated or repeated, each refused item quoted
    const list = await request(app).get("/api/v1/catalogue?kind=bipartite&kind=tree&weighted=true,maybe");
    expect(list.body.details).toEqual([
      { path: "kind", message: 'kind: "tree" must be one of bipartite, unipartite.' },
      { path: "weighted", message: 'weighted: "maybe" must be true or false.' },
    ]);
  });

  it("refuses an inverted range instead of answering 0 rows, naming the parameter", async () => {
    const res = await request(app).get("/api/v1/catalogue").query({ connectanceMin: 0.5, connectanceMax: 0.1 });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([{ path: "connectanceMin", message: expect.stringMatching(/connectanceMin \(0\.5\) is greater than connectanceMax \(0\.1\): no network could match/) }]);
    // equal ends are a valid (narrow) range
    expect((await request(app).get("/api/v1/catalogue").query({ connectanceMin: 0.1, connectanceMax: 0.1 })).status).toBe(200);
  });

  it("pages 250 rows at a time at most", async () => {
    expect((await request(app).get("/api/v1/catalogue").query({ pageSize: 250 })).status).toBe(200);
    const res = await request(app).get("/api/v1/catalogue").query({ pageSize: 251 });
    expect(res.status).toBe(400);
    expect(res.body.details[0]).toMatchObject({ path: "pageSize" });
  });

  it("answers the same at /api/v1/networks", async () => {
    const a = await get({ country: "FI" });
    const b = await request(app).get("/api/v1/networks").query({ country: "FI" });
    expect(b.body.meta.total).toBe(a.meta.total);
  });
});

describe("full-text search", () => {
  it("finds a network by a node name", async () => {
    const body = await get({ q: "Flora13_2" });
    expect(body.data.map((r) => r.name)).toEqual(["Transect 13"]);
    // prefix of a node name
    const prefix = await get({ q: "flora13", pageSize: 200 });
    expect(prefix.data.map((r) => r.name)).toContain("Transect 13");
  });

  it("finds a network by its locality and by a creator, combined with filters", async () => {
    const body = await get({ q: "Lake Osk" });
    expect(body.data.map((r) => r.name)).toEqual(["Transect 7"]);
    const creator = await get({ q: "Okafor", pageSize: 200 });
    expect(creator.meta.total).toBe(await sqlCount(`v.metadata#>>'{creators,0,name}' = 'Ines Okafor'`));
    const combined = await get({ q: "Okafor", kind: "bipartite", pageSize: 200 });
    expect(combined.meta.total).toBe(await sqlCount(`v.metadata#>>'{creators,0,name}' = 'Ines Okafor' AND n.kind = 'bipartite'`));
  });

  it("matches whole words first, and word beginnings only when no network has every word whole (and says so)", async () => {
    const fx = await publishDataset({
      study: { title: "Whole-word check" },
      networks: [
        { seed: 81, rowLabels: ["Bombus_a", "b5", "c5", "d5"], metrics: { q: 0.4, z: 1 } },
        { seed: 82, rowLabels: ["Bombusia_b", "b6", "c6", "d6"], metrics: { q: 0.4, z: 1 } },
      ],
    });
    await catalogueStore.refreshDataset(fx.datasetId);
    // "bombus" is a whole word in the first network only: the second ("bombusia") is not brought in
    const whole = await get({ q: "Bombus" });
    expect(whole.data.map((r) => r.ref)).toEqual([`${fx.accession}/v1/1`]);
    expect(whole.meta.searchMatch).toBe("words");
    // no network has the whole word "bomb": both match as word beginnings, and the page is told
    const prefix = await get({ q: "bomb", sort: "accession" });
    expect(prefix.data.map((r) => r.ref).sort()).toEqual([`${fx.accession}/v1/1`, `${fx.accession}/v1/2`]);
    expect(prefix.meta.searchMatch).toBe("prefix");
    // every word must be whole for the whole-word result; one word that is only a beginning makes it a prefix search
    expect((await get({ q: "bombus whole-wo" })).meta.searchMatch).toBe("prefix");
    expect((await get({})).meta.searchMatch).toBeNull();
    await DatasetVersion.update({ state: "withdrawn", withdrawnAt: new Date() }, { where: { id: fx.versionId } });
    await catalogueStore.removeDataset(fx.datasetId);
  });

  it("never finds withdrawn networks", async () => {
    expect((await get({ q: withdrawnNodeLabel })).meta.total).toBe(0);
  });
});

describe("keeping current", () => {
  it("shows a newly published dataset after refreshDataset, and drops it on withdrawal", async () => {
    await get({});
    const fx = await publishDataset({ study: { title: "Freshly published moor" }, networks: [{ seed: 77, rowLabels: ["Calluna_fresh", "b2", "c2", "d2"], metrics: { q: 0.4, z: 1 } }] });
    await catalogueStore.refreshDataset(fx.datasetId);
    expect((await get({ q: "Calluna_fresh" })).data.map((r) => r.ref)).toEqual([`${fx.accession}/v1/1`]);
    await DatasetVersion.update({ state: "withdrawn", withdrawnAt: new Date() }, { where: { id: fx.versionId } });
    await catalogueStore.removeDataset(fx.datasetId);
    expect((await get({ q: "Calluna_fresh" })).meta.total).toBe(0);
    expect((await get({ pageSize: 200 })).data.some((r) => r.ref === `${fx.accession}/v1/1`)).toBe(false);
  });

  it("another process's publication arrives through LISTEN/NOTIFY", async () => {
    await startCatalogueListener();
    catalogueStore.checkIntervalMs = 60_000; // only the notification can bring it in
    await get({});
    const fx = await publishDataset({ study: { title: "Notified fen" }, networks: [{ seed: 78, rowLabels: ["Menyanthes_notified", "b3", "c3", "d3"], metrics: { q: 0.4, z: 1 } }] });
    await sequelize().transaction(async (t) => notifyCatalogueChanged(fx.datasetId, t));
    let found = 0;
    for (let i = 0; i < 50 && !found; i++) {
      await new Promise((r) => setTimeout(r, 100));
      found = (await get({ q: "Menyanthes_notified" })).meta.total;
    }
    expect(found).toBe(1);
  });

  it("notices changes without any notification (lazy fingerprint check), including new metrics", async () => {
    catalogueStore.checkIntervalMs = 0;
    const fx = await publishDataset({ study: { title: "Silent bog" }, networks: [{ seed: 79, rowLabels: ["Sphagnum_silent", "b4", "c4", "d4"], metrics: null }] });
    const first = await get({ q: "Sphagnum_silent" });
    expect(first.data.map((r) => r.ref)).toEqual([`${fx.accession}/v1/1`]);
    expect(first.data[0].Q).toBeNull();
    await addRun(fx.networkIds[0], { q: 0.444, z: 2.5 });
    const second = await get({ q: "Sphagnum_silent" });
    expect(second.data[0].Q).toBe(0.444);
    await DatasetVersion.update({ state: "withdrawn", withdrawnAt: new Date() }, { where: { id: fx.versionId } });
    expect((await get({ q: "Sphagnum_silent" })).meta.total).toBe(0);
  });
});

describe("rate limit on the public API", () => {
  it("answers 429 with RateLimit headers past the per-IP limit", async () => {
    const { resetConfig } = await import("../../../../server/src/config/env");
    process.env.TB_API_RATE_LIMIT = "3";
    resetConfig();
    await resetRateLimits();
    try {
      const codes: number[] = [];
      let last: request.Response | undefined;
      for (let i = 0; i < 4; i++) {
        last = await request(app).get("/api/v1/catalogue");
        codes.push(last.status);
      }
      expect(codes).toEqual([200, 200, 200, 429]);
      expect(last!.headers["ratelimit-policy"]).toMatch(/q=3/);
      expect(last!.headers["ratelimit"]).toMatch(/r=0/);
      expect(last!.body.code).toBe("rate_limited");
    } finally {
      delete process.env.TB_API_RATE_LIMIT;
      resetConfig();
      await resetRateLimits();
    }
  });
});
