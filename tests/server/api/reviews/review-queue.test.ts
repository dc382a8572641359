/**
 * The review queue by state and search, and the review page of a published version showing the metrics
 * pipeline's state now: against the real database.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { sequelize } from "../../../../server/src/db/sequelize";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { startMailCatcher } from "../../support/stack";
import { decide, makeDraft, studyMeta, submit } from "../../support/deposit-helpers";

let catcher: MailCatcher;
let owner: SignedInAgent;
let curator: SignedInAgent;
let visitor: SignedInAgent;
const ids: Record<string, number> = {};
let publishedAccession = "";
let withdrawnAccession = "";

async function titled(title: string): Promise<number> {
  const { versionId } = await makeDraft(owner);
  const m = await owner.agent.put(`/api/v1/deposits/${versionId}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: studyMeta({ title }) });
  if (m.status !== 200) throw new Error(`metadata: ${m.status}`);
  const s = await submit(owner, versionId);
  if (s.status !== 200) throw new Error(`submit: ${s.status} ${JSON.stringify(s.body)}`);
  return versionId;
}

async function queue(params: Record<string, string>) {
  return curator.agent.get("/api/v1/reviews").query(params);
}
const titles = (body: { data: Array<{ title: string }> }) => body.data.map((i) => i.title).sort();

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  catcher = await startMailCatcher();
  const app = createApp();
  const o = await createUser({ displayName: "Ilse Marrow" });
  owner = await agentFor(app, o.email);
  curator = await agentFor(app, (await createUser({ role: "curator", displayName: "Tomas Brand" })).email);
  visitor = await agentFor(app);

  ids.waiting = await titled("Moth visitors of Askel Fen");
  ids.changes = await titled("Seed dispersers of the Orrin valley");
  expect((await decide(curator, ids.changes, { decision: "request_changes", comment: "Give the dates." })).status).toBe(200);
  ids.declined = await titled("Hoverflies 100% of visits");
  expect((await decide(curator, ids.declined, { decision: "decline", comment: "Not interaction data." })).status).toBe(200);
  ids.published = await titled("Bumblebees of Crook Heath");
  const p = await decide(curator, ids.published, { decision: "publish" });
  expect(p.status).toBe(200);
  publishedAccession = p.body.accession;
  ids.withdrawn = await titled("Parasitoids of Tallow Wood");
  const w = await decide(curator, ids.withdrawn, { decision: "publish" });
  withdrawnAccession = w.body.accession;
  const wd = await curator.agent.post(`/api/v1/datasets/${withdrawnAccession}/withdraw`).set("x-csrf-token", curator.csrf).send({ reason: "A transcription error in the host names." });
  expect(wd.status).toBe(200);
});
afterAll(async () => {
  await catcher.close();
  await shutdownServerResources();
});

describe("review queue by state", () => {
  it("lists the submissions waiting for a decision by default, and each other state on request", async () => {
    expect(titles((await queue({})).body)).toEqual(["Moth visitors of Askel Fen"]);
    expect(titles((await queue({ state: "submitted" })).body)).toEqual(["Moth visitors of Askel Fen"]);
    expect(titles((await queue({ state: "changes_requested" })).body)).toEqual(["Seed dispersers of the Orrin valley"]);
    expect(titles((await queue({ state: "declined" })).body)).toEqual(["Hoverflies 100% of visits"]);
    const pub = await queue({ state: "published" });
    expect(pub.body.data).toEqual([expect.objectContaining({ versionId: ids.published, state: "published", accession: publishedAccession, depositor: "Ilse Marrow", networkCount: 1 })]);
    expect(pub.body.meta.total).toBe(1);
    expect((await queue({ state: "withdrawn" })).body.data).toEqual([expect.objectContaining({ versionId: ids.withdrawn, state: "withdrawn", accession: withdrawnAccession })]);
  });

  it("refuses an unknown state with 400 naming the allowed ones", async () => {
    const r = await queue({ state: "draft" });
    expect(r.status).toBe(400);
    expect(r.body.details).toEqual([{ path: "state", message: "state must be one of submitted, changes_requested, published, declined, withdrawn." }]);
  });

  it("is for curators only", async () => {
    expect((await owner.agent.get("/api/v1/reviews").query({ state: "published" })).status).toBe(403);
    expect((await visitor.agent.get("/api/v1/reviews").query({ state: "published" })).status).toBe(401);
  });
});

describe("review queue search", () => {
  it("finds a title by any part of it, case-insensitively, within the chosen state", async () => {
    expect(titles((await queue({ state: "published", q: "crook" })).body)).toEqual(["Bumblebees of Crook Heath"]);
    expect(titles((await queue({ state: "submitted", q: "crook" })).body)).toEqual([]);
    expect(titles((await queue({ state: "changes_requested", q: "ORRIN" })).body)).toEqual(["Seed dispersers of the Orrin valley"]);
  });

  it("finds the depositor's name and the accession", async () => {
    expect(titles((await queue({ state: "submitted", q: "marrow" })).body)).toEqual(["Moth visitors of Askel Fen"]);
    expect(titles((await queue({ state: "published", q: "Someone Else" })).body)).toEqual([]);
    expect(titles((await queue({ state: "withdrawn", q: withdrawnAccession.toLowerCase() })).body)).toEqual(["Parasitoids of Tallow Wood"]);
    expect(titles((await queue({ state: "published", q: withdrawnAccession })).body)).toEqual([]);
  });

  it("reads % and _ literally, not as wildcards", async () => {
    expect(titles((await queue({ state: "declined", q: "100%" })).body)).toEqual(["Hoverflies 100% of visits"]);
    expect(titles((await queue({ state: "declined", q: "1_0" })).body)).toEqual([]);
    expect(titles((await queue({ state: "submitted", q: "%" })).body)).toEqual([]);
  });
});

describe("the review page of a published version", () => {
  it("shows the figures' state now: queued at publication, succeeded once the pipeline finished", async () => {
    const before = await curator.agent.get(`/api/v1/reviews/${ids.published}`);
    expect(before.status).toBe(200);
    expect(before.body.version.state).toBe("published");
    expect(before.body.networks.map((n: { metrics: { status: string } | null }) => n.metrics?.status)).toEqual(["queued"]);
    await sequelize().query(
      `UPDATE metric_runs SET status = 'succeeded', started_at = now(), finished_at = now()
        WHERE network_id IN (SELECT id FROM networks WHERE version_id = :v)`,
      { replacements: { v: ids.published } },
    );
    const after = await curator.agent.get(`/api/v1/reviews/${ids.published}`);
    expect(after.body.networks.map((n: { metrics: { status: string } | null }) => n.metrics?.status)).toEqual(["succeeded"]);
  });

  it("a withdrawn version's review page carries the withdrawal and its reason", async () => {
    const r = await curator.agent.get(`/api/v1/reviews/${ids.withdrawn}`);
    expect(r.body.version.state).toBe("withdrawn");
    expect(r.body.withdrawal).toMatchObject({ reason: "A transcription error in the host names." });
  });
});
