/**
 * What a curator sees changed between a submission and the resubmission (and between a new version and the
 * published one), computed from snapshots taken at each submit; and the deposited file with its SHA-256.
 * The expected cell changes are counted by hand from the small matrices below.
 */
import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { sequelize } from "../../../../server/src/db/sequelize";
import { cellDiff, fieldChanges } from "../../../../server/src/api/reviews/reviews.diff";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";
import type { NetworkChange, SubmissionDiffResponse } from "@shared/types/review";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { startMailCatcher } from "../../support/stack";
import { davisCsv, decide, makeDraft, networkMeta, SMALL_MATRIX, studyMeta, submit } from "../../support/deposit-helpers";
import { binaryParser } from "../../support/unzip";

let catcher: MailCatcher;
let owner: SignedInAgent;
let curator: SignedInAgent;
let visitor: SignedInAgent;

// SMALL_MATRIX: Heather–bee A 1, Heather–fly C 2, Gorse–bee B 1, Gorse–fly C 1, Bilberry–bee A 3 (5 links).
// Corrected: Bilberry gone, Ling and moth D new, Heather–fly C 2 → 5, Gorse–moth D and Ling–moth D new.
const HEATH_CORRECTED = "plant,bee A,bee B,fly C,moth D\nHeather,1,0,5,0\nGorse,0,1,1,1\nLing,0,0,0,2\n";
const EXTRA = "plant,wasp E,wasp F\nHeather,1,1\nGorse,0,1\n";

const sha = (b: Buffer | string) => createHash("sha256").update(b).digest("hex");

async function diffOf(versionId: number): Promise<SubmissionDiffResponse> {
  const r = await curator.agent.get(`/api/v1/reviews/${versionId}/diff`);
  expect(r.status).toBe(200);
  return r.body as SubmissionDiffResponse;
}

async function upload(versionId: number, name: string, content: string): Promise<number> {
  const u = await owner.agent.post(`/api/v1/deposits/${versionId}/networks`).set("x-csrf-token", owner.csrf).field("kind", "bipartite").attach("files", Buffer.from(content), name);
  expect(u.status).toBe(201);
  const id = u.body.networks[0].id as number;
  expect((await owner.agent.patch(`/api/v1/deposits/${versionId}/networks/${id}`).set("x-csrf-token", owner.csrf).send({ metadata: networkMeta() })).status).toBe(200);
  return id;
}

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  catcher = await startMailCatcher();
  const app = createApp();
  owner = await agentFor(app, (await createUser({ displayName: "Rowan Hale" })).email);
  curator = await agentFor(app, (await createUser({ role: "curator" })).email);
  visitor = await agentFor(app);
});
afterAll(async () => {
  await catcher.close();
  await shutdownServerResources();
});

describe("submission diff", () => {
  let versionId = 0;
  let heathId = 0;
  let davisId = 0;

  it("a first submission has nothing to compare with", async () => {
    const d = await makeDraft(owner, [["heath.csv", SMALL_MATRIX], ["davis.csv", davisCsv()]]);
    versionId = d.versionId;
    [heathId, davisId] = d.networkIds;
    expect((await submit(owner, versionId)).status).toBe(200);
    expect(await diffOf(versionId)).toEqual({ rounds: 1, diff: null });
  });

  it("the curator downloads each deposited file byte for byte, with its SHA-256 in the Digest header", async () => {
    const f = await curator.agent.get(`/api/v1/deposits/${versionId}/networks/${heathId}/file`).buffer(true).parse(binaryParser);
    expect(f.status).toBe(200);
    expect((f.body as Buffer).toString("utf8")).toBe(SMALL_MATRIX);
    expect(f.headers["content-disposition"]).toContain("heath.csv");
    expect(f.headers.digest).toBe(`sha-256=${Buffer.from(sha(SMALL_MATRIX), "hex").toString("base64")}`);
    const review = await curator.agent.get(`/api/v1/reviews/${versionId}`);
    expect(review.body.networks.map((n: { sha256: string }) => n.sha256)).toEqual([sha(SMALL_MATRIX), sha(davisCsv())]);
  });

  it("after changes were requested, the resubmission is compared field by field and cell by cell", async () => {
    expect((await decide(curator, versionId, { decision: "request_changes", comment: "Correct the heath counts; the habitat of the events is wrong." })).status).toBe(200);
    const csrf = { "x-csrf-token": owner.csrf };
    expect((await owner.agent.put(`/api/v1/deposits/${versionId}/metadata`).set(csrf).send({ metadata: studyMeta({ title: "Flower visitors of the Verrin Hills heath, corrected", keywords: ["pollination", "heath", "moths"] }) })).status).toBe(200);
    expect((await owner.agent.patch(`/api/v1/deposits/${versionId}/networks/${davisId}`).set(csrf).send({ metadata: networkMeta({ habitat: "lowland heath" }) })).status).toBe(200);
    // the heath file is replaced: the old network removed, the corrected file uploaded under the same name
    expect((await owner.agent.delete(`/api/v1/deposits/${versionId}/networks/${heathId}`).set(csrf)).status).toBe(200);
    await upload(versionId, "heath.csv", HEATH_CORRECTED);
    await upload(versionId, "extra.csv", EXTRA);
    expect((await submit(owner, versionId)).status).toBe(200);
    // the replaced file left storage with its network; the earlier submission's parsed form stays comparable
    const left = await sequelize().query(`SELECT 1 FROM stored_files WHERE sha256 = :s`, { replacements: { s: sha(SMALL_MATRIX) }, type: QueryTypes.SELECT });
    expect(left).toHaveLength(0);

    const { rounds, diff } = await diffOf(versionId);
    expect(rounds).toBe(2);
    expect(diff!.base).toMatchObject({ kind: "submission", round: 1 });
    expect(diff!.current.round).toBe(2);
    expect(diff!.study).toEqual([
      { path: "title", before: "Flower visitors of the Verrin Hills heath", after: "Flower visitors of the Verrin Hills heath, corrected" },
      { path: "keywords", before: ["pollination", "heath"], after: ["pollination", "heath", "moths"] },
    ]);
    const byName = (n: NetworkChange) => (n.after ?? n.before)!.originalName;
    expect(diff!.networks.map((n) => [byName(n), n.status, n.before?.position ?? null, n.after?.position ?? null])).toEqual([
      ["davis.csv", "changed", 2, 1],
      ["heath.csv", "changed", 1, 2],
      ["extra.csv", "added", null, 3],
    ]);
    const davis = diff!.networks[0];
    expect(davis.fields).toEqual([{ path: "habitat", before: "upland heath", after: "lowland heath" }]);
    expect(davis.reading).toEqual([]);
    expect(davis.cells).toBeNull();

    const heath = diff!.networks[1];
    expect(heath.before).toMatchObject({ nRows: 3, nCols: 3, nLinks: 5, sha256: sha(SMALL_MATRIX) });
    expect(heath.after).toMatchObject({ nRows: 3, nCols: 4, nLinks: 6, sha256: sha(HEATH_CORRECTED) });
    expect(heath.reading).toEqual([{ path: "file", before: `heath.csv (SHA-256 ${sha(SMALL_MATRIX)})`, after: `heath.csv (SHA-256 ${sha(HEATH_CORRECTED)})` }]);
    expect(heath.cells).toMatchObject({
      rowsAdded: ["Ling"],
      rowsRemoved: ["Bilberry"],
      colsAdded: ["moth D"],
      colsRemoved: [],
      linksAdded: 2,
      linksRemoved: 1,
      weightsChanged: 1,
      linksUnchanged: 3,
      undirectedPairs: false,
    });
    expect(heath.cells!.examples).toEqual([
      { row: "Heather", col: "fly C", before: 2, after: 5 },
      { row: "Gorse", col: "moth D", before: null, after: 1 },
      { row: "Ling", col: "moth D", before: null, after: 2 },
      { row: "Bilberry", col: "bee A", before: 3, after: null },
    ]);
    expect(diff!.networks[2].after).toMatchObject({ nRows: 2, nCols: 2, nLinks: 3 });
  });

  it("a new version is compared with the published version it follows", async () => {
    const pub = await decide(curator, versionId, { decision: "publish" });
    expect(pub.status).toBe(200);
    const nv = await owner.agent.post(`/api/v1/datasets/${pub.body.accession}/versions`).set("x-csrf-token", owner.csrf).send({});
    expect(nv.status).toBe(201);
    const v2 = nv.body.versionId as number;
    const extra = (nv.body.networks as Array<{ id: number; originalName: string }>).find((n) => n.originalName === "extra.csv")!;
    expect((await owner.agent.delete(`/api/v1/deposits/${v2}/networks/${extra.id}`).set("x-csrf-token", owner.csrf)).status).toBe(200);
    expect((await submit(owner, v2)).status).toBe(200);
    const { rounds, diff } = await diffOf(v2);
    expect(rounds).toBe(1);
    expect(diff!.base).toMatchObject({ kind: "published-version", number: 1 });
    expect(diff!.study).toEqual([]);
    // the copied networks have new ids: they are matched by their files
    expect(diff!.networks.map((n) => [(n.after ?? n.before)!.originalName, n.status])).toEqual([
      ["davis.csv", "unchanged"],
      ["heath.csv", "unchanged"],
      ["extra.csv", "removed"],
    ]);
  });

  it("is for curators: 403 for the depositor, 401 signed out, 404 for an unknown submission", async () => {
    expect((await owner.agent.get(`/api/v1/reviews/${versionId}/diff`)).status).toBe(403);
    expect((await visitor.agent.get(`/api/v1/reviews/${versionId}/diff`)).status).toBe(401);
    expect((await curator.agent.get(`/api/v1/reviews/999999/diff`)).status).toBe(404);
  });
});

describe("diff pieces", () => {
  const canon = (rows: string[], ptr: number[], idx: number[], w: number[] | null = null) => ({ v: 1 as const, kind: "unipartite" as const, directed: false, weighted: w !== null, rows, cols: null, ptr, idx, w });

  it("an undirected one-mode network counts each link once", () => {
    // before a–b, b–c; after a–b, a–c (each stored both ways)
    const before = canon(["a", "b", "c"], [0, 1, 3, 4], [1, 0, 2, 1]);
    const after = canon(["a", "b", "c"], [0, 2, 3, 4], [1, 2, 0, 0]);
    expect(cellDiff(before, after)).toMatchObject({ linksAdded: 1, linksRemoved: 1, weightsChanged: 0, linksUnchanged: 1, undirectedPairs: true, rowsAdded: [], colsAdded: [] });
    expect(cellDiff(before, after).examples).toEqual([
      { row: "a", col: "c", before: null, after: 1 },
      { row: "b", col: "c", before: 1, after: null },
    ]);
  });

  it("fields: nested paths, list items by index, fields added and removed", () => {
    expect(fieldChanges(
      { title: "A", creators: [{ name: "Hale, Rowan" }], locality: { placeName: "Crook Heath", elevation: 300 } },
      { title: "A", creators: [{ name: "Hale, R." }, { name: "Brand, Tomas" }], locality: { placeName: "Crook Heath" }, habitat: "heath" },
    )).toEqual([
      { path: "creators[0].name", before: "Hale, Rowan", after: "Hale, R." },
      { path: "locality.elevation", before: 300, after: null },
      { path: "creators[1].name", before: null, after: "Brand, Tomas" },
      { path: "habitat", before: null, after: "heath" },
    ]);
  });
});
