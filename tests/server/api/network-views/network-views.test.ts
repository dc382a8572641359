/**
 * /api/v1/network-views: the network view's data, partition downloads, compare rows, curator history,
 * and who may see what (published: anyone; drafts: owner and curators, else 404; withdrawn: 410 tombstone).
 * Network data: Davis Southern Women (Davis, Gardner & Gardner 1941; tests/fixtures/README.md).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import type { Express } from "express";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetDatabase } from "../../../setup/db";
import { createFixtureDataset, fixtureUser, FIXTURE_PASSWORD, DAVIS_CSV } from "../../support/published-fixture";
import { deserializeNetwork, modularity } from "@shared/network/index";
import type { NetworkView } from "@shared/types/network-view";

let app: Express;
let pub: Awaited<ReturnType<typeof createFixtureDataset>>;
let draft: Awaited<ReturnType<typeof createFixtureDataset>>;
let curatorEmail: string;
let strangerEmail: string;

async function signedIn(email: string) {
  const agent = request.agent(app);
  const s = await agent.get("/api/v1/auth/session");
  const res = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", s.body.csrfToken).send({ email, password: FIXTURE_PASSWORD });
  expect(res.status).toBe(200);
  return agent;
}

beforeAll(async () => {
  await resetDatabase();
  app = createApp();
  pub = await createFixtureDataset({ accession: "TB-000001" });
  draft = await createFixtureDataset({ accession: null, state: "draft" });
  await createFixtureDataset({ accession: "TB-000003", state: "withdrawn", withdrawalReason: "Duplicate of TB-000001." });
  curatorEmail = (await fixtureUser("curator", "Curator Brand")).email;
  strangerEmail = (await fixtureUser("depositor")).email;
});
afterAll(async () => {
  await shutdownServerResources();
});

describe("GET /api/v1/network-views/:accession/:version/:position", () => {
  it("returns the cells, the partition by row and column, the module table, null Q values and roles of a published network", async () => {
    const res = await request(app).get("/api/v1/network-views/TB-000001/v1/1");
    expect(res.status).toBe(200);
    const v = res.body as NetworkView;
    expect(v.ref).toBe("TB-000001/v1/1");
    expect(v.kind).toBe("bipartite");
    // Davis: 18 women × 14 events, 89 links (Davis, Gardner & Gardner 1941)
    expect(v.rowLabels).toHaveLength(18);
    expect(v.colLabels).toHaveLength(14);
    expect(v.nLinks).toBe(89);
    expect(v.cells.ptr).toHaveLength(19);
    expect(v.cells.idx).toHaveLength(89);
    expect(v.metrics.status).toBe("succeeded");
    expect(v.metrics.objective).toBe("barber");
    expect(v.rowModules).toHaveLength(18);
    expect(v.colModules).toHaveLength(14);
    // The partition the view returns reproduces the stored Q when re-evaluated by the engine
    const net = deserializeNetwork({ v: 1, kind: v.kind, directed: v.directed, weighted: v.weighted, rows: v.rowLabels, cols: v.colLabels, ptr: v.cells.ptr, idx: v.cells.idx, w: v.cells.w });
    const q = modularity(net, Int32Array.from([...v.rowModules!, ...v.colModules!]), "barber");
    expect(q).toBeCloseTo(v.metrics.Q!, 10);
    // module table: nodes and inside links add up
    const sumRows = v.modules.reduce((s, m) => s + m.rows, 0);
    const sumCols = v.modules.reduce((s, m) => s + (m.cols ?? 0), 0);
    expect([sumRows, sumCols]).toEqual([18, 14]);
    let inside = 0;
    for (let i = 0; i < 18; i++) for (let p = v.cells.ptr[i]; p < v.cells.ptr[i + 1]; p++) if (v.rowModules![i] === v.colModules![v.cells.idx[p]]) inside++;
    expect(v.modules.reduce((s, m) => s + m.linksInside, 0)).toBe(inside);
    expect(v.modules).toHaveLength(v.metrics.modules!);
    // nulls and roles
    expect(v.nullQs).toHaveLength(30);
    expect(v.metrics.nullN).toBe(30);
    expect(v.roles).toHaveLength(32);
    expect(v.roleThresholds).toEqual({ z: 2.5, p: 0.62 });
    expect(v.provenance.algorithm?.seed).toBe(7);
    expect(v.provenance.file.sha256).toMatch(/^[0-9a-f]{64}$/);
    // coordinates leave the server generalised to the 0.1° grid the depositor chose
    expect(v.metadata.locality.decimalLatitude).toBe(61.2);
    expect(v.metadata.locality.decimalLongitude).toBe(9);
  });

  it("accepts the version as 1 or v1 and says 404 for a missing network, version or accession", async () => {
    expect((await request(app).get("/api/v1/network-views/TB-000001/1/1")).status).toBe(200);
    expect((await request(app).get("/api/v1/network-views/TB-000001/v1/2")).status).toBe(404);
    expect((await request(app).get("/api/v1/network-views/TB-000001/v9/1")).status).toBe(404);
    expect((await request(app).get("/api/v1/network-views/TB-999999/v1/1")).status).toBe(404);
    const bad = await request(app).get("/api/v1/network-views/XX-1/v1/1");
    expect(bad.status).toBe(404);
    expect(bad.body.message).toMatch(/TB-000042/);
    const version = await request(app).get("/api/v1/network-views/TB-000001/v0/1/partition.csv");
    expect(version.status).toBe(404);
    expect(version.body.message).toBe('No such version "v0": versions are written v1, v2, …');
    const position = await request(app).get("/api/v1/network-views/TB-000001/v1/first");
    expect(position.status).toBe(404);
    expect(position.body.message).toBe('No such network "first": networks are numbered 1, 2, …');
  });

  it("answers 410 with the tombstone for a withdrawn version", async () => {
    const res = await request(app).get("/api/v1/network-views/TB-000003/v1/1");
    expect(res.status).toBe(410);
    expect(res.body.accession).toBe("TB-000003");
    expect(res.body.reason).toBe("Duplicate of TB-000001.");
    expect(res.body.citation).toContain("TB-000003");
    expect(res.body.withdrawnAt).toBe("2025-05-01T09:00:00.000Z");
  });

  it("hides a draft from visitors and other depositors (404) and shows it to its owner and to curators", async () => {
    // a draft of a new version of a published dataset (drafts before first publication have no accession)
    const v2 = await createFixtureDataset({ dataset: pub.dataset, owner: pub.owner, number: 2, state: "draft", networks: [{ text: DAVIS_CSV, metrics: false }] });
    expect(v2.version.number).toBe(2);
    expect((await request(app).get("/api/v1/network-views/TB-000001/v2/1")).status).toBe(404);
    expect((await (await signedIn(strangerEmail)).get("/api/v1/network-views/TB-000001/v2/1")).status).toBe(404);
    const own = await (await signedIn(pub.owner.email)).get("/api/v1/network-views/TB-000001/v2/1");
    expect(own.status).toBe(200);
    expect(own.body.versionState).toBe("draft");
    expect(own.body.metrics.status).toBe("none");
    expect(own.body.rowModules).toBeNull();
    const cur = await (await signedIn(curatorEmail)).get("/api/v1/network-views/TB-000001/v2/1");
    expect(cur.status).toBe(200);
    expect(cur.body.latestPublishedVersion).toBe(1);
    expect(draft.accession).toBeNull();
  });
});

describe("partition downloads", () => {
  it("serves the partition as CSV with one row per node and as JSON with the run's provenance", async () => {
    const view = (await request(app).get("/api/v1/network-views/TB-000001/v1/1")).body as NetworkView;
    const csv = await request(app).get("/api/v1/network-views/TB-000001/v1/1/partition.csv");
    expect(csv.status).toBe(200);
    expect(csv.headers["content-type"]).toMatch(/text\/csv/);
    expect(csv.headers["content-disposition"]).toContain("TB-000001_v1_1_partition.csv");
    const lines = csv.text.trim().split(/\r\n/);
    expect(lines[0]).toBe("node,level,module");
    expect(lines).toHaveLength(1 + 18 + 14);
    expect(lines[1]).toBe(`${view.rowLabels[0]},row,${view.rowModules![0]}`);
    expect(lines[19]).toBe(`${view.colLabels[0]},column,${view.colModules![0]}`);

    const json = await request(app).get("/api/v1/network-views/TB-000001/v1/1/partition.json");
    expect(json.status).toBe(200);
    expect(json.body.rows).toHaveLength(18);
    expect(json.body.columns).toHaveLength(14);
    expect(json.body.Q).toBeCloseTo(view.metrics.Q!, 12);
    expect(json.body.algorithm.seed).toBe(7);
  });

  it("says 404 when the network has no metrics yet", async () => {
    const q = await createFixtureDataset({ accession: "TB-000010", networks: [{ text: DAVIS_CSV, metrics: "queued" }] });
    const v = await request(app).get(`/api/v1/network-views/${q.accession}/v1/1`);
    expect(v.body.metrics.status).toBe("queued");
    const res = await request(app).get(`/api/v1/network-views/${q.accession}/v1/1/partition.csv`);
    expect(res.status).toBe(404);
    expect(res.body.message).toMatch(/no partition yet.*queued/);
  });
});

describe("GET /api/v1/network-views/summaries", () => {
  it("returns one row per requested published network with its metrics", async () => {
    const res = await request(app).get("/api/v1/network-views/summaries").query({ refs: "TB-000001/v1/1,TB-000010/v1/1" });
    expect(res.status).toBe(200);
    expect(res.body.data.map((r: { ref: string }) => r.ref)).toEqual(["TB-000001/v1/1", "TB-000010/v1/1"]);
    expect(res.body.data[0].interactionType).toBe("pollination");
    expect(res.body.data[0].metrics.status).toBe("succeeded");
    expect(res.body.data[0].connectance).toBeCloseTo(89 / (18 * 14), 10);
  });

  it("plots the rest when references are malformed, unknown, hidden drafts or withdrawn, naming each with its reason", async () => {
    const res = await request(app)
      .get("/api/v1/network-views/summaries")
      .query({ refs: "TB-000001/v1/1,nonsense,TB-000001/v1/7,TB-999999/v1/1,TB-000001/v2/1,TB-000003/v1/1,TB-000010/v1/1" });
    expect(res.status).toBe(200);
    expect(res.body.data.map((r: { ref: string }) => r.ref)).toEqual(["TB-000001/v1/1", "TB-000010/v1/1"]);
    expect(res.body.meta.requested).toBe(7);
    const un = res.body.meta.unavailable as Array<{ ref: string; reason: string; message: string; tombstone?: { reason: string; citation: string } }>;
    expect(un.map((u) => [u.ref, u.reason])).toEqual([
      ["nonsense", "malformed"],
      ["TB-000001/v1/7", "unknown"],
      ["TB-999999/v1/1", "unknown"],
      ["TB-000001/v2/1", "unknown"], // the draft v2 made above: hidden from visitors
      ["TB-000003/v1/1", "withdrawn"],
    ]);
    expect(un[1].message).toContain("has no network 7");
    expect(un[4].tombstone).toMatchObject({ accession: "TB-000003", version: 1 });
    expect(un[4].tombstone!.citation).toContain("TB-000003");
    // only bad references: still 200, nothing plotted, every one named
    const none = await request(app).get("/api/v1/network-views/summaries").query({ refs: "TB-000003/v1/1" });
    expect(none.status).toBe(200);
    expect(none.body.data).toEqual([]);
    expect(none.body.meta.unavailable).toHaveLength(1);
    // no refs at all, or too many, is still a bad request
    const missing = await request(app).get("/api/v1/network-views/summaries");
    expect(missing.status).toBe(400);
    expect(missing.body.details).toEqual([{ path: "refs", message: "refs is required: it must be a list of 1 to 60 network references such as TB-000042/v2/3 (comma-separated or repeated)." }]);
    const many = Array.from({ length: 61 }, (_, i) => `TB-000001/v1/${i + 1}`).join(",");
    const tooMany = await request(app).get("/api/v1/network-views/summaries").query({ refs: many });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.details).toEqual([{ path: "refs", message: "refs must be a list of 1 to 60 network references such as TB-000042/v2/3 (comma-separated or repeated)." }]);
  });
});

describe("GET /api/v1/network-views/map", () => {
  it("places every catalogue network matching the catalogue's filters, with generalised coordinates", async () => {
    const all = await request(app).get("/api/v1/network-views/map");
    expect(all.status).toBe(200);
    const refs = all.body.data.map((r: { ref: string }) => r.ref).sort();
    // published: TB-000001 (v1) and TB-000010; the withdrawn TB-000003 and the draft never appear
    expect(refs).toEqual(["TB-000001/v1/1", "TB-000010/v1/1"]);
    expect(all.body.meta).toEqual({ total: 2, placed: 2 });
    expect(all.body.data[0]).toMatchObject({ latitude: 61.2, longitude: 9, countryCode: "NO", interactionType: "pollination" });
    const none = await request(app).get("/api/v1/network-views/map").query({ interactionType: "seed-dispersal" });
    expect(none.body.data).toEqual([]);
    const bad = await request(app).get("/api/v1/network-views/map").query({ colour: "red" });
    expect(bad.status).toBe(400);
    expect(bad.body.details[0]).toMatchObject({ path: "colour", message: expect.stringMatching(/^Unknown parameter "colour"\. Known: q, interactionType, /) });
    const ranges = await request(app).get("/api/v1/network-views/map").query({ yearMin: 2020, yearMax: 2010 });
    expect(ranges.status).toBe(400);
    expect(ranges.body.details).toEqual([{ path: "yearMin", message: "yearMin (2020) is greater than yearMax (2010): no network could match. Swap them or change one." }]);
    const norway = await request(app).get("/api/v1/network-views/map").query({ country: "no" });
    expect(norway.body.data.map((r: { countryCode: string }) => r.countryCode)).toContain("NO");
  });
});

describe("GET /api/v1/network-views/history/:accession", () => {
  it("lists the audit log for curators only", async () => {
    expect((await request(app).get("/api/v1/network-views/history/TB-000001")).status).toBe(401);
    expect((await (await signedIn(strangerEmail)).get("/api/v1/network-views/history/TB-000001")).status).toBe(403);
    const res = await (await signedIn(curatorEmail)).get("/api/v1/network-views/history/TB-000001");
    expect(res.status).toBe(200);
    expect(res.body.data.length).toBeGreaterThanOrEqual(1);
    expect(res.body.data[0]).toMatchObject({ action: "version.submitted", actor: { displayName: "Rowan Hale" } });
    const bad = await (await signedIn(curatorEmail)).get("/api/v1/network-views/history/TB-1");
    expect(bad.status).toBe(404);
    expect(bad.body.message).toBe('No such dataset "TB-1": accessions look like TB-000042.');
  });
});
