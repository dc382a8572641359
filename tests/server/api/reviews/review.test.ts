/**
 * Curation through the API against the real database and a real SMTP catcher: the review queue, decisions
 * and their refusals, e-mails with working links, optimistic locking, accession numbering under concurrent
 * publishing, metadata corrections, versions, withdrawal with its tombstone, and the public read API.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { sequelize } from "../../../../server/src/db/sequelize";
import { bundleMatrixCsv, MATRIX_CSV_FORMAT } from "../../../../server/src/api/bundles/bundles.stored-csv";
import { AuditLog, Dataset, DatasetVersion, Network, Review } from "../../../../server/src/models";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";
import type { SignedInAgent } from "../../support/accounts";
import { CURATION_URL as PUBLIC_URL, startCuration, type Curation } from "../../support/curation";
import { davisCsv, decide, makeDraft, networkMeta, SMALL_MATRIX, studyMeta, submit } from "../../support/deposit-helpers";

let curation: Curation;
let catcher: MailCatcher;
let owner: SignedInAgent;
let other: SignedInAgent;
let curatorA: SignedInAgent;
let curatorB: SignedInAgent;
let admin: SignedInAgent;
let visitor: SignedInAgent;
let ownerEmail: string;
let curatorAId: number;

async function submitted(files?: Array<[string, Buffer | string]>): Promise<number> {
  const { versionId } = await makeDraft(owner, files);
  const s = await submit(owner, versionId);
  if (s.status !== 200) throw new Error(`submit: ${s.status} ${JSON.stringify(s.body)}`);
  return versionId;
}

async function published(files?: Array<[string, Buffer | string]>): Promise<{ versionId: number; accession: string }> {
  const id = await submitted(files);
  const r = await decide(curatorA, id, { decision: "publish" });
  if (r.status !== 200) throw new Error(`publish: ${r.status} ${JSON.stringify(r.body)}`);
  return { versionId: id, accession: r.body.accession };
}

beforeAll(async () => {
  curation = await startCuration();
  ({ catcher } = curation);
  ({ owner, other, curatorA, curatorB, admin, visitor } = curation.agents);
  ownerEmail = curation.users.owner.email;
  curatorAId = curation.users.curatorA.id;
});
afterAll(() => curation.stop());

describe("review queue", () => {
  it("lists submissions oldest first, to curators only", async () => {
    const first = await submitted();
    const second = await submitted();
    const q = await curatorA.agent.get("/api/v1/reviews");
    expect(q.status).toBe(200);
    const ids = q.body.data.map((i: { versionId: number }) => i.versionId);
    expect(ids.indexOf(first)).toBeLessThan(ids.indexOf(second));
    expect(q.body.data[0]).toMatchObject({ title: studyMeta().title, depositor: "Rowan Hale", networkCount: 1, resubmission: false, ownDeposit: false });
    expect((await owner.agent.get("/api/v1/reviews")).status).toBe(403);
    expect((await visitor.agent.get("/api/v1/reviews")).status).toBe(401);
    expect((await admin.agent.get("/api/v1/reviews")).status).toBe(200);
    // clear the queue for later tests
    await decide(curatorA, first, { decision: "decline", comment: "Duplicate test submission." });
    await decide(curatorA, second, { decision: "decline", comment: "Duplicate test submission." });
  });

  it("the review page shows metadata, previews' data, findings and exact coordinates", async () => {
    const id = await submitted();
    const r = await curatorB.agent.get(`/api/v1/reviews/${id}`);
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ versionId: id, ownDeposit: false, problems: [], duplicates: [], depositor: { displayName: "Rowan Hale", email: ownerEmail } });
    expect(r.body.metadata.contactEmail).toBe(studyMeta().contactEmail);
    expect(r.body.networks[0].metadata.locality.decimalLatitude).toBe(54.43127);
    expect(r.body.history.map((h: { action: string }) => h.action)).toEqual(["deposit.create", "deposit.network.add", "deposit.network.update", "deposit.submit"]);
    expect((await owner.agent.get(`/api/v1/reviews/${id}`)).status).toBe(403);
    await decide(curatorA, id, { decision: "decline", comment: "Test cleanup." });
  });
});

describe("decisions", () => {
  it("request changes (comment required) → e-mail with a working link → depositor resubmits → publish", async () => {
    const id = await submitted();
    const noComment = await decide(curatorA, id, { decision: "request_changes", comment: "  " });
    expect(noComment.status).toBe(422);
    expect(noComment.body.details[0].path).toBe("/comment");

    const rc = await decide(curatorA, id, { decision: "request_changes", comment: "Please give the sampling effort." });
    expect(rc.status).toBe(200);
    expect(rc.body.version.state).toBe("changes_requested");
    const mail = await catcher.waitFor((m) => m.subject.startsWith("Changes requested") && m.to.includes(ownerEmail));
    expect(mail.text).toContain("Please give the sampling effort.");
    const link = `${PUBLIC_URL}/deposit/${id}`;
    expect(mail.links).toContain(link);
    // The link opens the client route of the deposit (the SPA answers it; the API behind it answers the owner).
    const page = await owner.agent.get(new URL(link).pathname);
    expect([200, 503]).toContain(page.status);
    expect((await owner.agent.get(`/api/v1/deposits/${id}`)).body.reviews[0]).toMatchObject({ decision: "request_changes", comment: "Please give the sampling effort.", curator: "Tomas Brand" });

    // Deciding again on a version that is not submitted is refused.
    expect((await decide(curatorB, id, { decision: "publish" })).status).toBe(409);

    // The depositor answers: edit and resubmit.
    const det = await owner.agent.get(`/api/v1/deposits/${id}`);
    const nid = det.body.networks[0].id;
    const ed = await owner.agent.patch(`/api/v1/deposits/${id}/networks/${nid}`).set("x-csrf-token", owner.csrf).send({ metadata: networkMeta({ samplingEffort: { value: 120, unit: "observation hours" } }) });
    expect(ed.status).toBe(200);
    const re = await submit(owner, id);
    expect(re.status).toBe(200);
    const curMail = await catcher.waitFor((m) => m.subject.startsWith("Resubmitted") && m.text.includes(`/review/${id}`));
    expect(curMail.links).toContain(`${PUBLIC_URL}/review/${id}`);
    const q = await curatorA.agent.get("/api/v1/reviews");
    expect(q.body.data.find((i: { versionId: number }) => i.versionId === id)).toMatchObject({ resubmission: true });

    const pub = await decide(curatorA, id, { decision: "publish" });
    expect(pub.status).toBe(200);
    expect(pub.body.version.state).toBe("published");
    expect(pub.body.accession).toMatch(/^TB-\d{6}$/);
    expect(pub.body.version.publishedAt).not.toBeNull();
    const pm = await catcher.waitFor((m) => m.subject.startsWith("Published") && m.to.includes(ownerEmail));
    expect(pm.links).toContain(`${PUBLIC_URL}/datasets/${pub.body.accession}`);

    const actions = (await AuditLog.findAll({ where: { entityType: "dataset_version", entityId: String(id) }, order: [["id", "ASC"]] })).map((a) => a.action);
    expect(actions).toEqual(["deposit.create", "deposit.network.add", "deposit.submit", "review.request_changes", "deposit.submit", "review.publish"]);
    // deposit.network.update rows are about the network entity
    expect(await AuditLog.count({ where: { entityType: "network", entityId: String(nid) } })).toBe(2);

    // Published versions are frozen.
    expect((await owner.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: studyMeta() })).status).toBe(409);
    expect((await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(SMALL_MATRIX), "x.csv")).status).toBe(409);
    // a published network stays as published (its study metadata may be corrected: see below)
    const pubNet = (await curatorA.agent.get(`/api/v1/reviews/${id}`)).body.networks[0].id;
    expect((await curatorA.agent.patch(`/api/v1/reviews/${id}/networks/${pubNet}`).set("x-csrf-token", curatorA.csrf).send({ metadata: networkMeta({ habitat: "changed" }) })).status).toBe(409);
    expect((await owner.agent.delete(`/api/v1/deposits/${id}`).set("x-csrf-token", owner.csrf)).status).toBe(409);
  });

  it("publishing stores each network's matrix CSV for bundles, the bytes written from its canonical form; submissions have none", async () => {
    const id = await submitted([["heath.csv", SMALL_MATRIX], ["davis.csv", davisCsv()]]);
    const stored = () =>
      sequelize().query<{ position: number; canonical: unknown; matrix_csv: string | null; matrix_csv_format: number | null }>(
        `SELECT position, canonical, matrix_csv, matrix_csv_format FROM networks WHERE version_id = :id ORDER BY position`,
        { replacements: { id }, type: QueryTypes.SELECT },
      );
    expect((await stored()).map((r) => r.matrix_csv)).toEqual([null, null]);
    expect((await decide(curatorA, id, { decision: "publish" })).status).toBe(200);
    const rows = await stored();
    expect(rows).toHaveLength(2);
    for (const r of rows) {
      expect(r.matrix_csv_format).toBe(MATRIX_CSV_FORMAT);
      expect(r.matrix_csv).toBe(bundleMatrixCsv(r.canonical).toString("utf8"));
    }
    // the first file as deposited, with the corner cell named "node"
    expect(rows[0].matrix_csv).toBe("node,bee A,bee B,fly C\nHeather,1,0,2\nGorse,0,1,1\nBilberry,3,0,0\n");
  });

  it("decline needs a reason and e-mails the depositor", async () => {
    const id = await submitted();
    expect((await decide(curatorA, id, { decision: "decline" })).status).toBe(422);
    expect((await decide(curatorA, id, { decision: "maybe" })).status).toBe(400);
    const d = await decide(curatorA, id, { decision: "decline", comment: "Not interaction data." });
    expect(d.status).toBe(200);
    expect(d.body.version.state).toBe("declined");
    expect(d.body.accession).toBeNull();
    const m = await catcher.waitFor((x) => x.subject.startsWith("Not accepted") && x.text.includes("Not interaction data."));
    expect(m.links).toContain(`${PUBLIC_URL}/my-deposits`);
    expect((await owner.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: studyMeta() })).status).toBe(409);
  });

  it("refuses depositors (403) and a curator deciding on their own deposit (403)", async () => {
    const id = await submitted();
    expect((await decide(owner, id, { decision: "publish" })).status).toBe(403);
    expect((await decide(other, id, { decision: "publish" })).status).toBe(403);
    const c = await curatorA.agent.post("/api/v1/deposits").set("x-csrf-token", curatorA.csrf).send({ metadata: studyMeta() });
    const cid = c.body.versionId;
    await curatorA.agent.post(`/api/v1/deposits/${cid}/networks`).set("x-csrf-token", curatorA.csrf).attach("files", Buffer.from(SMALL_MATRIX), "c.csv");
    const det = await curatorA.agent.get(`/api/v1/deposits/${cid}`);
    await curatorA.agent.patch(`/api/v1/deposits/${cid}/networks/${det.body.networks[0].id}`).set("x-csrf-token", curatorA.csrf).send({ metadata: networkMeta() });
    expect((await submit(curatorA, cid)).status).toBe(200);
    const own = await decide(curatorA, cid, { decision: "publish" });
    expect(own.status).toBe(403);
    expect(own.body.message).toMatch(/own deposit/);
    expect((await curatorA.agent.get("/api/v1/reviews")).body.data.find((i: { versionId: number }) => i.versionId === cid)).toMatchObject({ ownDeposit: true });
    // nor correct it while another curator reviews it (the depositor's edits are frozen once submitted)
    const lockBefore = (await DatasetVersion.findByPk(cid))!.lockVersion;
    const ownCorr = await curatorA.agent.put(`/api/v1/reviews/${cid}/metadata`).set("x-csrf-token", curatorA.csrf).send({ metadata: studyMeta({ title: "Changed under review" }) });
    expect(ownCorr.status).toBe(403);
    const ownNet = await curatorA.agent.patch(`/api/v1/reviews/${cid}/networks/${det.body.networks[0].id}`).set("x-csrf-token", curatorA.csrf).send({ metadata: networkMeta({ habitat: "changed" }) });
    expect(ownNet.status).toBe(403);
    const after = (await DatasetVersion.findByPk(cid))!;
    expect(after.lockVersion).toBe(lockBefore);
    expect(after.metadata.title).toBe(studyMeta().title);
    await decide(curatorB, cid, { decision: "decline", comment: "Test cleanup." });
    await decide(curatorB, id, { decision: "decline", comment: "Test cleanup." });
  });

  it("two curators deciding at once: one wins, the other gets 409 with a clear message", async () => {
    const id = await submitted();
    const lock = (await curatorA.agent.get(`/api/v1/reviews/${id}`)).body.lockVersion;
    const [a, b] = await Promise.all([
      decide(curatorA, id, { decision: "publish", lockVersion: lock }),
      decide(curatorB, id, { decision: "request_changes", comment: "Fix the dates.", lockVersion: lock }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    expect(loser.body.message).toMatch(/Another curator decided/);
    expect(await Review.count({ where: { versionId: id } })).toBe(1);
  });

  it("a decision on a stale view (the curator saw an older lock version) is refused", async () => {
    const id = await submitted();
    const lock = (await curatorA.agent.get(`/api/v1/reviews/${id}`)).body.lockVersion;
    const corr = await curatorB.agent.put(`/api/v1/reviews/${id}/metadata`).set("x-csrf-token", curatorB.csrf).send({ metadata: studyMeta({ title: "Flower visitors of the Verrin Hills heath (corrected)" }), lockVersion: lock });
    expect(corr.status).toBe(200);
    const stale = await decide(curatorA, id, { decision: "publish", lockVersion: lock });
    expect(stale.status).toBe(409);
    const audit = await AuditLog.findOne({ where: { action: "review.metadata.correct", entityId: String(id) } });
    expect(audit?.details).toMatchObject({ before: { title: studyMeta().title }, after: { title: "Flower visitors of the Verrin Hills heath (corrected)" } });
    const nid = corr.body.networks[0].id;
    const nc = await curatorB.agent.patch(`/api/v1/reviews/${id}/networks/${nid}`).set("x-csrf-token", curatorB.csrf).send({ metadata: networkMeta({ habitat: "dry heath" }) });
    expect(nc.status).toBe(200);
    expect(nc.body.networks[0].metadata.habitat).toBe("dry heath");
    const na = await AuditLog.findOne({ where: { action: "review.network.correct", entityId: String(nid) } });
    expect(na?.details).toMatchObject({ before: { habitat: "upland heath" }, after: { habitat: "dry heath" } });
    expect((await owner.agent.put(`/api/v1/reviews/${id}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: studyMeta() })).status).toBe(403);
    await decide(curatorA, id, { decision: "decline", comment: "Test cleanup." });
  });

  it("corrections and decisions check their body: a lock number that is not a whole number, metadata that is not an object or an unknown field is refused (400) and nothing changes", async () => {
    const id = await submitted();
    const before = (await DatasetVersion.findByPk(id))!;
    const put = (body: object) => curatorB.agent.put(`/api/v1/reviews/${id}/metadata`).set("x-csrf-token", curatorB.csrf).send(body);
    const textLock = await put({ metadata: studyMeta({ title: "Never saved" }), lockVersion: String(before.lockVersion) });
    expect(textLock.status).toBe(400);
    expect(textLock.body.details.map((d: { path: string }) => d.path)).toEqual(["/lockVersion"]);
    expect((await put({ metadata: studyMeta({ title: "Never saved" }), lockVersion: -1 })).status).toBe(400);
    const noMeta = await put({ lockVersion: before.lockVersion });
    expect(noMeta.status).toBe(400);
    expect(noMeta.body.details.map((d: { path: string }) => d.path)).toEqual(["/metadata"]);
    const nid = (await curatorB.agent.get(`/api/v1/reviews/${id}`)).body.networks[0].id;
    const net = await curatorB.agent.patch(`/api/v1/reviews/${id}/networks/${nid}`).set("x-csrf-token", curatorB.csrf).send({ metadata: networkMeta({ habitat: "never saved" }), habitat: "never saved" });
    expect(net.status).toBe(400);
    expect(net.body.details.map((d: { path: string }) => d.path)).toEqual(["/habitat"]);
    expect((await curatorB.agent.patch(`/api/v1/reviews/${id}/networks/${nid}`).set("x-csrf-token", curatorB.csrf).send({ metadata: "dry heath" })).status).toBe(400);
    const extra = await decide(curatorA, id, { decision: "publish", note: "looks fine" });
    expect(extra.status).toBe(400);
    expect(extra.body.details.map((d: { path: string }) => d.path)).toEqual(["/note"]);
    const after = (await DatasetVersion.findByPk(id))!;
    expect(after.lockVersion).toBe(before.lockVersion);
    expect(after.state).toBe(before.state);
    expect(after.metadata.title).toBe(studyMeta().title);
    expect((await Network.findByPk(nid))!.metadata.habitat).toBe(networkMeta().habitat);
    await decide(curatorA, id, { decision: "decline", comment: "Test cleanup." });
  });

  it("refuses to publish metadata that a correction made invalid, listing the problems; publishes once corrected", async () => {
    const id = await submitted();
    const before = (await curatorA.agent.get(`/api/v1/reviews/${id}`)).body;
    const nid = before.networks[0].id;
    const { licence: _licence, ...noLicence } = studyMeta();
    void _licence;
    const loc = networkMeta().locality as Record<string, unknown>;
    const { generalisation: _g, ...locNoGeneralisation } = loc;
    void _g;
    expect((await curatorB.agent.put(`/api/v1/reviews/${id}/metadata`).set("x-csrf-token", curatorB.csrf).send({ metadata: noLicence })).status).toBe(200);
    expect((await curatorB.agent.patch(`/api/v1/reviews/${id}/networks/${nid}`).set("x-csrf-token", curatorB.csrf).send({ metadata: networkMeta({ locality: locNoGeneralisation }) })).status).toBe(200);
    const refused = await decide(curatorA, id, { decision: "publish" });
    expect(refused.status).toBe(422);
    const paths = (refused.body.details as Array<{ path: string }>).map((d) => d.path);
    expect(paths.some((p) => p.startsWith("/study") && p.includes("licence"))).toBe(true);
    expect(paths.some((p) => p.startsWith("/networks/1") && p.includes("locality"))).toBe(true);
    const v = await DatasetVersion.findByPk(id);
    expect(v!.state).toBe("submitted");
    expect((await Dataset.findByPk(v!.datasetId))!.accession).toBeNull();
    expect(await Review.count({ where: { versionId: id } })).toBe(0);
    expect((await curatorB.agent.put(`/api/v1/reviews/${id}/metadata`).set("x-csrf-token", curatorB.csrf).send({ metadata: studyMeta() })).status).toBe(200);
    expect((await curatorB.agent.patch(`/api/v1/reviews/${id}/networks/${nid}`).set("x-csrf-token", curatorB.csrf).send({ metadata: networkMeta() })).status).toBe(200);
    const ok = await decide(curatorA, id, { decision: "publish" });
    expect(ok.status).toBe(200);
    expect(ok.body.version.state).toBe("published");
  });

  it("a curator corrects a published version's study metadata: the public read follows, audited; licence and completeness are kept", async () => {
    const { versionId, accession } = await published();
    const lock = (await curatorB.agent.get(`/api/v1/reviews/${versionId}`)).body.lockVersion;
    const title = "Flower visitors of the Verrin Hills heath, 2019";
    const put = (who: SignedInAgent, metadata: unknown) => who.agent.put(`/api/v1/reviews/${versionId}/metadata`).set("x-csrf-token", who.csrf).send({ metadata });
    // the depositor cannot; another curator can
    expect((await put(owner, studyMeta({ title }))).status).toBe(403);
    const fixed = await curatorB.agent.put(`/api/v1/reviews/${versionId}/metadata`).set("x-csrf-token", curatorB.csrf).send({ metadata: studyMeta({ title }), lockVersion: lock });
    expect(fixed.status).toBe(200);
    const pub = await visitor.agent.get(`/api/v1/datasets/${accession}`);
    expect(pub.body.metadata.title).toBe(title);
    expect(pub.body.version.state).toBe("published");
    const audit = await AuditLog.findOne({ where: { action: "dataset.metadata.correct", entityId: String(versionId) } });
    expect(audit?.details).toMatchObject({ before: { title: studyMeta().title }, after: { title } });
    // the licence the data were given out under stays
    const licence = await put(curatorB, studyMeta({ title, licence: studyMeta().licence === "CC0-1.0" ? "CC-BY-4.0" : "CC0-1.0" }));
    expect(licence.status).toBe(422);
    expect(licence.body.details.map((d: { path: string }) => d.path)).toEqual(["/licence"]);
    // published metadata stays complete: an emptied title is refused and nothing changes
    const empty = await put(curatorB, studyMeta({ title: "" }));
    expect(empty.status).toBe(422);
    expect(empty.body.details.some((d: { path: string }) => d.path.startsWith("/study/title"))).toBe(true);
    expect((await DatasetVersion.findByPk(versionId))!.metadata.title).toBe(title);
  });

  it("gives unique, sequential accessions when several datasets are published at once; never reassigns", async () => {
    const ids = [];
    for (let i = 0; i < 5; i++) ids.push(await submitted());
    const res = await Promise.all(ids.map((id, i) => decide(i % 2 ? curatorA : curatorB, id, { decision: "publish" })));
    expect(res.map((r) => r.status)).toEqual([200, 200, 200, 200, 200]);
    const acc = res.map((r) => r.body.accession as string);
    expect(new Set(acc).size).toBe(5);
    const nums = acc.map((a) => Number(a.slice(3))).sort((x, y) => x - y);
    expect(nums[4] - nums[0]).toBe(4);
    const [{ n }] = (await sequelize().query(`SELECT count(DISTINCT accession)::int AS n FROM datasets WHERE accession IS NOT NULL`))[0] as Array<{ n: number }>;
    expect(n).toBe(await Dataset.count({ where: { accession: { [(await import("sequelize")).Op.ne]: null } } }));
  });
});

describe("public read API, versions and withdrawal", () => {
  it("serves the latest published version without the contact e-mail and with generalised coordinates", async () => {
    const { accession, versionId } = await published([["davis.csv", davisCsv()]]);
    const pub = await visitor.agent.get(`/api/v1/datasets/${accession}`);
    expect(pub.status).toBe(200);
    expect(pub.body).toMatchObject({ accession, version: { number: 1, state: "published", networkCount: 1 }, latestPublishedVersion: 1, owner: { displayName: "Rowan Hale" }, withdrawal: null });
    expect(pub.body.metadata.contactEmail).toBeUndefined();
    expect(pub.body.metadata.title).toBe(studyMeta().title);
    const loc = pub.body.networks[0].metadata.locality;
    // generalisation "0.1": 54.43127, -2.98714 → 54.4, -3.0 with precision 0.1
    expect(loc).toMatchObject({ decimalLatitude: 54.4, decimalLongitude: -3, coordinatePrecision: 0.1 });
    expect(pub.body.networks[0]).toMatchObject({ ref: `${accession}/v1/1`, nRows: 18, nCols: 14, nLinks: 89 });
    expect(pub.body.networks[0].metrics).toMatchObject({ status: expect.any(String) });
    expect(pub.body.versions.map((v: { number: number }) => v.number)).toEqual([1]);
    const mine = await owner.agent.get(`/api/v1/datasets/${accession}`);
    expect(mine.body.metadata.contactEmail).toBe(studyMeta().contactEmail);
    expect(mine.body.networks[0].metadata.locality.decimalLatitude).toBe(54.43127);
    const file = await visitor.agent.get(`/api/v1/datasets/${accession}/versions/1/networks/1/file`);
    expect(file.status).toBe(200);
    expect(Buffer.from(file.text)).toEqual(davisCsv());
    expect(file.headers["content-disposition"]).toContain("davis.csv");
    expect((await visitor.agent.get(`/api/v1/datasets/${accession}/versions/1/networks/2/file`)).status).toBe(404);
    expect((await visitor.agent.get(`/api/v1/datasets/TB-999999`)).status).toBe(404);
    expect((await visitor.agent.get(`/api/v1/datasets/nonsense`)).status).toBe(404);
    expect((await visitor.agent.get(`/api/v1/deposits/${versionId}`)).status).toBe(401);
    expect((await other.agent.get(`/api/v1/deposits/${versionId}`)).status).toBe(404);
  });

  it("new versions: v2 copied from v1 (files shared), one open draft at a time, published under the same accession", async () => {
    const { accession, versionId: v1 } = await published([["davis.csv", davisCsv()], ["heath.csv", SMALL_MATRIX]]);
    expect((await other.agent.post(`/api/v1/datasets/${accession}/versions`).set("x-csrf-token", other.csrf).send({})).status).toBe(404);
    const nv = await owner.agent.post(`/api/v1/datasets/${accession}/versions`).set("x-csrf-token", owner.csrf).send({});
    expect(nv.status).toBe(201);
    expect(nv.body.version).toMatchObject({ number: 2, state: "draft" });
    expect(nv.body.networks.map((n: { originalName: string }) => n.originalName)).toEqual(["davis.csv", "heath.csv"]);
    const v2 = nv.body.versionId;
    const oldNets = await Network.findAll({ where: { versionId: v1 }, order: [["position", "ASC"]] });
    const newNets = await Network.findAll({ where: { versionId: v2 }, order: [["position", "ASC"]] });
    expect(newNets.map((n) => n.fileId)).toEqual(oldNets.map((n) => n.fileId));
    expect(newNets.map((n) => n.id)).not.toEqual(oldNets.map((n) => n.id));
    expect((await owner.agent.post(`/api/v1/datasets/${accession}/versions`).set("x-csrf-token", owner.csrf).send({})).status).toBe(409);
    // the public does not see the draft v2
    expect((await visitor.agent.get(`/api/v1/datasets/${accession}`)).body.versions.map((v: { number: number }) => v.number)).toEqual([1]);

    await owner.agent.put(`/api/v1/deposits/${v2}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: studyMeta({ title: "Flower visitors of the Verrin Hills heath, revised" }) });
    await owner.agent.delete(`/api/v1/deposits/${v2}/networks/${newNets[1].id}`).set("x-csrf-token", owner.csrf);
    expect((await submit(owner, v2)).status).toBe(200);
    const pub = await decide(curatorA, v2, { decision: "publish" });
    expect(pub.status).toBe(200);
    expect(pub.body.accession).toBe(accession);

    const latest = await visitor.agent.get(`/api/v1/datasets/${accession}`);
    expect(latest.body).toMatchObject({ version: { number: 2, networkCount: 1 }, latestPublishedVersion: 2, metadata: { title: "Flower visitors of the Verrin Hills heath, revised" } });
    expect(latest.body.versions.map((v: { number: number; state: string; networkCount: number }) => `${v.number}:${v.state}:${v.networkCount}`)).toEqual(["1:published:2", "2:published:1"]);
    const old = await visitor.agent.get(`/api/v1/datasets/${accession}?version=1`);
    expect(old.body).toMatchObject({ version: { number: 1, networkCount: 2 }, latestPublishedVersion: 2, metadata: { title: studyMeta().title } });
    expect((await visitor.agent.get(`/api/v1/datasets/${accession}/versions/1`)).body.version.number).toBe(1);
    expect((await visitor.agent.get(`/api/v1/datasets/${accession}/versions/3`)).status).toBe(404);
    // The v1 file is still downloadable (the file row is shared, not deleted with the v2 network).
    expect((await visitor.agent.get(`/api/v1/datasets/${accession}/versions/1/networks/2/file`)).status).toBe(200);
    const a = await AuditLog.findOne({ where: { action: "version.create", entityId: String(v2) } });
    expect(a?.details).toMatchObject({ number: 2, copiedFrom: 1 });
  });

  it("flags a submitted file whose SHA-256 is already published in another dataset", async () => {
    const { accession } = await published([["davis.csv", davisCsv()]]);
    const id = await submitted([["same-bytes.csv", davisCsv()]]);
    const r = await curatorA.agent.get(`/api/v1/reviews/${id}`);
    expect(r.body.duplicates[0].publishedAs).toContain(`${accession}/v1/1`);
    await decide(curatorA, id, { decision: "decline", comment: "Already published." });
  });

  it("withdrawal: curators only, reason required, 410 tombstone with accession, citation and reason", async () => {
    const { accession, versionId } = await published();
    expect((await owner.agent.post(`/api/v1/datasets/${accession}/withdraw`).set("x-csrf-token", owner.csrf).send({ reason: "x" })).status).toBe(403);
    expect((await curatorA.agent.post(`/api/v1/datasets/${accession}/withdraw`).set("x-csrf-token", curatorA.csrf).send({})).status).toBe(422);
    const w = await curatorA.agent.post(`/api/v1/datasets/${accession}/withdraw`).set("x-csrf-token", curatorA.csrf).send({ reason: "The depositor found a transcription error." });
    expect(w.status).toBe(200);
    const g = await visitor.agent.get(`/api/v1/datasets/${accession}`);
    expect(g.status).toBe(410);
    expect(g.body).toMatchObject({ accession, reason: "The depositor found a transcription error.", withdrawnAt: expect.any(String) });
    expect(g.body.citation).toContain(accession);
    expect(g.body.citation).toContain("Hale");
    expect((await visitor.agent.get(`/api/v1/datasets/${accession}/versions/1/networks/1/file`)).status).toBe(410);
    expect((await DatasetVersion.findByPk(versionId))?.state).toBe("withdrawn");
    expect((await curatorA.agent.post(`/api/v1/datasets/${accession}/withdraw`).set("x-csrf-token", curatorA.csrf).send({ reason: "again" })).status).toBe(409);
    const m = await catcher.waitFor((x) => x.subject.startsWith(`Withdrawn: ${accession}`));
    expect(m.links).toContain(`${PUBLIC_URL}/datasets/${accession}`);
    const a = await AuditLog.findOne({ where: { action: "dataset.withdraw" } });
    expect(a).toMatchObject({ actorId: curatorAId });
    // the accession is never reused
    const next = await published();
    expect(next.accession).not.toBe(accession);
  });
});
