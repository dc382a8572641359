/**
 * Collections through the API against the database: saved from references or a filter (frozen to exact
 * versions), private ones hidden from everyone but their owner, members added and removed in new
 * revisions while earlier revisions stay listable, a member withdrawn later shown with its tombstone,
 * only the owner may change one, and a bundle of a collection holds its published members.
 * Data are invented (catalogue fixtures).
 */
import request from "supertest";
import { QueryTypes } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parse as parseCsv } from "csv-parse/sync";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { sequelize } from "../../../../server/src/db/sequelize";
import { catalogueStore } from "../../../../server/src/api/catalogue/catalogue.store";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { publishDataset, type PublishedFixture } from "../../support/catalogue-fixtures";
import { binaryParser, unzip } from "../../support/unzip";

const app = createApp();
let owner: SignedInAgent;
let other: SignedInAgent;
let heath: PublishedFixture;
let coast: PublishedFixture;
const ref = (f: PublishedFixture, pos: number) => `${f.accession}/v1/${pos}`;

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  const [a, b] = await Promise.all([createUser({ displayName: "Rowan Hale" }), createUser()]);
  owner = await agentFor(app, a.email);
  other = await agentFor(app, b.email);
  heath = await publishDataset({ study: { title: "Heath visitors" }, networks: [{ seed: 1 }, { seed: 2 }, { seed: 3 }] });
  coast = await publishDataset({ study: { title: "Coastal dispersal" }, networks: [{ seed: 4, meta: { interactionType: "seed-dispersal" } }] });
});
afterAll(shutdownServerResources);

async function create(body: Record<string, unknown>, who = owner) {
  return who.agent.post("/api/v1/collections").set("x-csrf-token", who.csrf).send(body);
}

describe("collections", () => {
  it("saves the selection as a private collection with a stable code; only its owner sees it", async () => {
    const res = await create({ name: "  Heath webs  for 2026 ", description: "The set of our meta-analysis.", refs: [ref(heath, 2), ref(heath, 1)] });
    expect(res.status).toBe(201);
    expect(res.body.code).toMatch(/^TBC-\d{6}$/);
    expect(res.body).toMatchObject({ name: "Heath webs for 2026", visibility: "private", revision: 1, memberCount: 2, withdrawnCount: 0, isOwner: true, savedFrom: { kind: "selection" } });
    expect(res.body.members.map((m: { ref: string }) => m.ref)).toEqual([ref(heath, 2), ref(heath, 1)]);
    const code = res.body.code as string;
    expect((await owner.agent.get(`/api/v1/collections/${code}`)).status).toBe(200);
    expect((await other.agent.get(`/api/v1/collections/${code}`)).status).toBe(404);
    expect((await request(app).get(`/api/v1/collections/${code}`)).status).toBe(404);
    const mine = await owner.agent.get("/api/v1/collections");
    expect(mine.body.data.map((c: { code: string }) => c.code)).toContain(code);
    expect((await other.agent.get("/api/v1/collections")).body.data).toEqual([]);
    // the database holds exactly these members, as exact network rows
    const rows = await sequelize().query<{ network_id: number }>(
      `SELECT m.network_id FROM collection_members m JOIN collections c ON c.id = m.collection_id WHERE c.code = :code ORDER BY m.position`,
      { replacements: { code }, type: QueryTypes.SELECT },
    );
    expect(rows.map((r) => r.network_id)).toEqual([heath.networkIds[1], heath.networkIds[0]]);
  });

  it("refuses a collection without a name, without networks, or with networks that are not published", async () => {
    const noName = await create({ name: " ", refs: [ref(heath, 1)] });
    expect(noName.status).toBe(400);
    expect(noName.body.message).toBe("The collection has problems.");
    expect(noName.body.details).toEqual([{ path: "/name", message: "name must be text of 1 to 200 characters, not only spaces." }]);
    const badRef = await create({ name: "x", refs: [ref(heath, 1), "TB-1/v1"] });
    expect(badRef.status).toBe(400);
    expect(badRef.body.details).toEqual([{ path: "/refs", message: 'refs: "TB-1/v1" must be a network reference such as TB-000042/v2/3.' }]);
    const unknown = await create({ name: "x", refs: [ref(heath, 1), "TB-999999/v1/1"] });
    expect(unknown.status).toBe(422);
    expect(unknown.body.details).toEqual([{ path: "refs", message: "TB-999999/v1/1 is not a published network." }]);
    const neither = await create({ name: "x" });
    expect(neither.status).toBe(400);
    expect(neither.body.message).toBe("Save either refs (the selected networks) or filter (everything matching a catalogue filter).");
    const badFilter = await create({ name: "x", filter: { contry: "NO" } });
    expect(badFilter.status).toBe(400);
    expect(badFilter.body.details[0]).toMatchObject({ path: "/filter/contry", message: expect.stringMatching(/^Unknown parameter "contry"/) });
    const visitor = await agentFor(app);
    expect((await visitor.agent.post("/api/v1/collections").set("x-csrf-token", visitor.csrf).send({ name: "x", refs: [ref(heath, 1)] })).status).toBe(401);
  });

  it("adds and removes members in new revisions; an earlier revision is still listed as it was; only the owner may change it", async () => {
    const code = (await create({ name: "Growing set", visibility: "public", refs: [ref(heath, 1)] })).body.code as string;
    const added = await owner.agent.post(`/api/v1/collections/${code}/members`).set("x-csrf-token", owner.csrf).send({ refs: [ref(coast, 1), ref(heath, 1)] });
    expect(added.status).toBe(200);
    expect(added.body.revision).toBe(2);
    expect(added.body.members.map((m: { ref: string }) => m.ref)).toEqual([ref(heath, 1), ref(coast, 1)]);
    const removed = await owner.agent.delete(`/api/v1/collections/${code}/members/${ref(heath, 1)}`).set("x-csrf-token", owner.csrf);
    expect(removed.status).toBe(200);
    expect(removed.body.revision).toBe(3);
    expect(removed.body.members.map((m: { ref: string }) => m.ref)).toEqual([ref(coast, 1)]);
    // anyone may read a public collection at any revision
    const r1 = await request(app).get(`/api/v1/collections/${code}`).query({ revision: 1 });
    expect(r1.body.shownRevision).toBe(1);
    expect(r1.body.members.map((m: { ref: string }) => m.ref)).toEqual([ref(heath, 1)]);
    expect(r1.body.isOwner).toBe(false);
    const r2 = await request(app).get(`/api/v1/collections/${code}`).query({ revision: 2 });
    expect(r2.body.members).toHaveLength(2);
    expect((await request(app).get(`/api/v1/collections/${code}`).query({ revision: 9 })).status).toBe(404);
    const badRevision = await request(app).get(`/api/v1/collections/${code}`).query({ revision: "first" });
    expect(badRevision.status).toBe(400);
    expect(badRevision.body.details).toEqual([{ path: "revision", message: "revision must be a whole number from 1 to 2147483647." }]);
    expect((await request(app).get("/api/v1/collections/TBC-12")).body).toEqual({ code: "not_found", message: 'No such collection "TBC-12": collection codes look like TBC-000001.' });
    // others cannot change it
    expect((await other.agent.patch(`/api/v1/collections/${code}`).set("x-csrf-token", other.csrf).send({ name: "Mine now" })).status).toBe(403);
    expect((await other.agent.post(`/api/v1/collections/${code}/members`).set("x-csrf-token", other.csrf).send({ refs: [ref(heath, 2)] })).status).toBe(403);
    const visitor = await agentFor(app);
    expect((await visitor.agent.delete(`/api/v1/collections/${code}`).set("x-csrf-token", visitor.csrf)).status).toBe(401);
    const renamed = await owner.agent.patch(`/api/v1/collections/${code}`).set("x-csrf-token", owner.csrf).send({ name: "Renamed", visibility: "private" });
    expect(renamed.body).toMatchObject({ name: "Renamed", visibility: "private", revision: 3 });
    expect((await request(app).get(`/api/v1/collections/${code}`)).status).toBe(404);
  });

  it("keeps a member that is withdrawn later, with its tombstone; its bundle holds the published members and says which were left out", async () => {
    const late = await publishDataset({ study: { title: "Later withdrawn" }, networks: [{ seed: 9 }] });
    const code = (await create({ name: "With a withdrawn member", visibility: "public", refs: [ref(late, 1), ref(heath, 3)] })).body.code as string;
    await sequelize().query(`UPDATE dataset_versions SET state = 'withdrawn', withdrawn_at = now(), withdrawal_reason = 'Duplicated transects.' WHERE id = :id`, {
      replacements: { id: late.versionId },
    });
    const got = await request(app).get(`/api/v1/collections/${code}`);
    expect(got.body.memberCount).toBe(2);
    expect(got.body.withdrawnCount).toBe(1);
    const gone = got.body.members.find((m: { ref: string }) => m.ref === ref(late, 1));
    expect(gone).toMatchObject({ state: "withdrawn", withdrawal: { reason: "Duplicated transects." }, datasetTitle: "Later withdrawn" });
    // a withdrawn network cannot be added again
    const re = await owner.agent.post(`/api/v1/collections/${code}/members`).set("x-csrf-token", owner.csrf).send({ refs: [ref(late, 1)] });
    expect(re.status).toBe(422);

    const zip = await request(app)
      .get("/api/v1/bundles")
      .query({ collection: code })
      .buffer(true)
      .parse(binaryParser);
    expect(zip.status).toBe(200);
    const files = await unzip(zip.body as Buffer);
    const metrics = parseCsv(files.get("metrics.csv")!, { columns: true }) as Array<Record<string, string>>;
    expect(metrics.map((m) => m.network_ref)).toEqual([ref(heath, 3)]);
    expect(files.get("README.txt")).toContain(`collection ${code} revision 1`);
    expect(files.get("README.txt")).toContain(`1 withdrawn member left out (${ref(late, 1)})`);
  });

  it("saves everything matching a filter, frozen to the versions it matched", async () => {
    const res = await create({ name: "Dispersal", filter: { interactionType: "seed-dispersal" } });
    expect(res.status).toBe(201);
    expect(res.body.savedFrom).toEqual({ kind: "filter", filter: { interactionType: "seed-dispersal" } });
    expect(res.body.members.map((m: { ref: string }) => m.ref)).toEqual([ref(coast, 1)]);
    // a network published later that matches the filter does not join it
    await publishDataset({ study: { title: "New dispersal" }, networks: [{ seed: 12, meta: { interactionType: "seed-dispersal" } }] });
    const again = await owner.agent.get(`/api/v1/collections/${res.body.code}`);
    expect(again.body.members).toHaveLength(1);
    const del = await owner.agent.delete(`/api/v1/collections/${res.body.code}`).set("x-csrf-token", owner.csrf);
    expect(del.status).toBe(204);
    expect((await owner.agent.get(`/api/v1/collections/${res.body.code}`)).status).toBe(404);
  });
});
