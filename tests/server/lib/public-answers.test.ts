/**
 * Kept public answers (server/src/lib/public-answers.ts): the dataset JSON, the network view and a
 * network's metrics are built once and sent again while their dataset's stamp is unchanged, and every
 * committed change a reader could see shows at the next request: a new run, a withdrawal, a DOI, a verified
 * ORCID iD, new pipeline settings, a curator's metadata correction. Owners and curators are never served a
 * kept public answer. Network data: Davis Southern Women (Davis, Gardner & Gardner 1941; tests/fixtures).
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../server/src/app";
import { shutdownServerResources } from "../../../server/src/index";
import { sequelize } from "../../../server/src/db/sequelize";
import { AnswerCache, datasetStamp, publicAnswers } from "../../../server/src/lib/public-answers";
import { setPipelineSettings } from "../../../server/src/pipeline/settings";
import { resetDatabase } from "../../setup/db";
import { agentFor } from "../support/accounts";
import { createFixtureDataset, fixtureUser, DAVIS_CSV, FIXTURE_PASSWORD, FIXTURE_SETTINGS, STUDY } from "../support/published-fixture";

const app = createApp();
let fx: Awaited<ReturnType<typeof createFixtureDataset>>;
const ACC = "TB-000021";
const paths = [`/api/v1/datasets/${ACC}`, `/api/v1/network-views/${ACC}/v1/1`, `/api/v1/networks/${ACC}/v1/1/metrics`];

beforeAll(async () => {
  await resetDatabase();
  publicAnswers.clear();
  fx = await createFixtureDataset({ accession: ACC, networks: [{ text: DAVIS_CSV, fileName: "davis.csv", metadata: { locality: { placeName: "Verrin Hills", countryCode: "NO", decimalLatitude: 61.23456, decimalLongitude: 8.98765, generalisation: "0.1" } } }] });
});
afterAll(shutdownServerResources);

const sql = (q: string, replacements: Record<string, unknown> = {}) => sequelize().query(q, { replacements });

describe("kept public answers", () => {
  it("answer the second request from memory with the same body, and 304 for a matching If-None-Match", async () => {
    for (const path of paths) {
      const first = await request(app).get(path);
      expect(first.status, path).toBe(200);
      const hits = publicAnswers.hits;
      const second = await request(app).get(path);
      expect(publicAnswers.hits, path).toBe(hits + 1);
      expect(second.text, path).toBe(first.text);
      expect(second.headers["content-type"], path).toMatch(/^application\/json/);
      expect(second.headers.etag, path).toBe(first.headers.etag);
      const again = await request(app).get(path).set("If-None-Match", second.headers.etag);
      expect(again.status, path).toBe(304);
    }
  });

  it("a new run of the network shows at once in all three answers", async () => {
    const before = await Promise.all(paths.map((p) => request(app).get(p)));
    await sql(`INSERT INTO metric_runs (network_id, settings, settings_hash, status) SELECT network_id, settings, settings_hash, 'queued' FROM metric_runs WHERE network_id = :id LIMIT 1`, { id: fx.networks[0].id });
    const [detail, view, metrics] = await Promise.all(paths.map((p) => request(app).get(p)));
    expect(detail.body.networks[0].metrics.newer?.status).toBe("queued");
    expect(view.body.runHistory).toHaveLength(before[1].body.runHistory.length + 1);
    expect(metrics.body.metrics.newer?.status).toBe("queued");
  });

  it("a registered DOI, a verified ORCID iD, new pipeline settings and a metadata correction show at once", async () => {
    await request(app).get(paths[0]);
    await sql(`INSERT INTO dataset_dois (doi, dataset_id, version_id, state) VALUES ('10.5555/tb.keep.1', :d, :v, 'registered')`, { d: fx.dataset.id, v: fx.version.id });
    expect((await request(app).get(paths[0])).body.dois.version?.doi).toBe("10.5555/tb.keep.1");

    const orcid = STUDY.creators[0].orcid!;
    expect((await request(app).get(paths[0])).body.verifiedOrcids).toEqual([]);
    const creator = await fixtureUser("depositor", "Rowan Hale"); // a co-author's own account, not the owner's
    await sql(`UPDATE users SET orcid = :orcid, orcid_verified_at = now() WHERE id = :id`, { orcid, id: creator.id });
    expect((await request(app).get(paths[0])).body.verifiedOrcids).toEqual([orcid]);

    expect((await request(app).get(paths[2])).body.metrics.currentSettings).toBe(true);
    await setPipelineSettings({ ...FIXTURE_SETTINGS, seed: FIXTURE_SETTINGS.seed + 1 });
    expect((await request(app).get(paths[2])).body.metrics.currentSettings).toBe(false);
    await setPipelineSettings(FIXTURE_SETTINGS);

    await sql(`UPDATE dataset_versions SET metadata = jsonb_set(metadata, '{title}', '"Corrected title"') WHERE id = :id`, { id: fx.version.id });
    expect((await request(app).get(paths[0])).body.metadata.title).toBe("Corrected title");
    expect((await request(app).get(paths[1])).body.datasetTitle).toBe("Corrected title");
  });

  it("the owner never gets the kept public answer (exact coordinates, contact e-mail), and the public never the owner's", async () => {
    const pub = await request(app).get(paths[0]);
    expect(pub.body.metadata.contactEmail).toBeUndefined();
    expect(pub.body.networks[0].metadata.locality.decimalLatitude).toBe(61.2);
    const owner = await agentFor(app, fx.owner.email, FIXTURE_PASSWORD);
    const own = await owner.agent.get(paths[0]);
    expect(own.body.metadata.contactEmail).toBe(STUDY.contactEmail);
    expect(own.body.networks[0].metadata.locality.decimalLatitude).toBe(61.23456);
    const after = await request(app).get(paths[0]);
    expect(after.body.metadata.contactEmail).toBeUndefined();
    expect(after.body.networks[0].metadata.locality.decimalLatitude).toBe(61.2);
  });

  it("a withdrawal answers 410 at once on all three routes, and an unknown accession 404", async () => {
    for (const p of paths) expect((await request(app).get(p)).status, p).toBe(200);
    await sql(`UPDATE dataset_versions SET state = 'withdrawn', withdrawn_at = now(), withdrawal_reason = 'Duplicate.' WHERE id = :id`, { id: fx.version.id });
    for (const p of paths) expect((await request(app).get(p)).status, p).toBe(410);
    expect((await request(app).get("/api/v1/datasets/TB-000999")).status).toBe(404);
    expect(await datasetStamp("TB-000999")).toBeNull();
  });
});

describe("AnswerCache bounds", () => {
  it("drops the least recently used answers past its entry and byte limits, and keeps no answer over the entry limit", () => {
    const c = new AnswerCache(2, 100, 40);
    c.set("a", "1", "x".repeat(10));
    c.set("b", "1", "y".repeat(10));
    expect(c.get("a", "1")).toBeDefined(); // a is now the most recent
    c.set("c", "1", "z".repeat(10));
    expect(c.get("b", "1")).toBeUndefined();
    expect(c.get("a", "1")).toBeDefined();
    expect(c.get("a", "2")).toBeUndefined(); // another stamp is a miss
    c.set("big", "1", "w".repeat(50));
    expect(c.get("big", "1")).toBeUndefined();
    expect(c.size.entries).toBe(2);
    expect(c.size.bytes).toBe(24);
  });
});
