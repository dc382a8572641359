/**
 * The demo scenario seed goes through the deposit and review services: every state appears, accessions
 * start at TB-000001, one dataset has a version 2, the withdrawn one answers 410, node counts stay within
 * 10–400, and a second run does nothing.
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { setCurrentMailCatcher } from "../../../../server/src/lib/mail-catcher";
import { sequelize } from "../../../../server/src/db/sequelize";
import { seedDemoAccounts } from "../../../../server/src/db/seeders/demo-accounts";
import { seedDemoScenario } from "../../../../server/src/db/seeders/demo-scenario";
import { resetDatabase } from "../../../setup/db";
import { SEARCH_EXAMPLE } from "@shared/types/catalogue";
import { startMailCatcher } from "../../support/stack";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";

let catcher: MailCatcher;
let result: Awaited<ReturnType<typeof seedDemoScenario>>;

beforeAll(async () => {
  await resetDatabase();
  catcher = await startMailCatcher();
  await seedDemoAccounts();
  result = await seedDemoScenario();
});
afterAll(async () => {
  await catcher.close();
  setCurrentMailCatcher(undefined);
  await shutdownServerResources();
});

describe("demo scenario", () => {
  it("seeds 12 datasets in every state, through the services", async () => {
    expect(result).not.toBeNull();
    expect(result!.datasets).toBe(12);
    const [rows] = (await sequelize().query(`SELECT state, count(*)::int AS n FROM dataset_versions GROUP BY state ORDER BY state`)) as [Array<{ state: string; n: number }>, unknown];
    const by = Object.fromEntries(rows.map((r) => [r.state, r.n]));
    expect(by).toMatchObject({ draft: 1, submitted: 1, changes_requested: 1, withdrawn: 1 });
    expect(by.published).toBeGreaterThanOrEqual(8);
    const [acc] = (await sequelize().query(`SELECT accession FROM datasets WHERE accession IS NOT NULL ORDER BY accession`)) as [Array<{ accession: string }>, unknown];
    expect(acc[0].accession).toBe("TB-000001");
    expect(acc.map((a) => a.accession)).toEqual(acc.map((_, i) => `TB-${String(i + 1).padStart(6, "0")}`));
    const [v2] = (await sequelize().query(`SELECT count(*)::int AS n FROM dataset_versions WHERE number = 2 AND state = 'published'`)) as [Array<{ n: number }>, unknown];
    expect(v2[0].n).toBe(1);
    const [sizes] = (await sequelize().query(`SELECT min(n_nodes)::int AS lo, max(n_nodes)::int AS hi, count(*)::int AS n FROM networks`)) as [Array<{ lo: number; hi: number; n: number }>, unknown];
    expect(sizes[0].lo).toBeGreaterThanOrEqual(10);
    expect(sizes[0].hi).toBeLessThanOrEqual(400);
    const [audits] = (await sequelize().query(`SELECT count(*)::int AS n FROM audit_log WHERE action = 'review.publish'`)) as [Array<{ n: number }>, unknown];
    expect(audits[0].n).toBe(by.published + by.withdrawn); // every published or withdrawn version was published once
    // Curators were e-mailed about submissions.
    expect(catcher.messages.some((m) => m.subject.startsWith("New submission"))).toBe(true);
  });

  it("serves the published datasets and the tombstone through the read API", async () => {
    const app = createApp();
    const first = await request(app).get("/api/v1/datasets/TB-000001");
    expect(first.status).toBe(200);
    expect(first.body.networks.length).toBeGreaterThan(0);
    const [w] = (await sequelize().query(`SELECT d.accession FROM datasets d JOIN dataset_versions v ON v.dataset_id = d.id WHERE v.state = 'withdrawn'`)) as [Array<{ accession: string }>, unknown];
    const gone = await request(app).get(`/api/v1/datasets/${w[0].accession}`);
    expect(gone.status).toBe(410);
    expect(gone.body.reason).toMatch(/identifications/);
  });

  it("answers the catalogue search field's example with networks", async () => {
    const app = createApp();
    const res = await request(app).get("/api/v1/catalogue").query({ q: SEARCH_EXAMPLE });
    expect(res.status).toBe(200);
    expect(res.body.meta.total).toBeGreaterThan(0);
    // the matches really are about the example's words (here in their titles and places)
    const text = JSON.stringify(res.body.data).toLowerCase();
    for (const word of SEARCH_EXAMPLE.toLowerCase().split(/\s+/)) expect(text).toContain(word);
  });

  it("holds a public collection that keeps its withdrawn member with the tombstone", async () => {
    const app = createApp();
    const [codes] = (await sequelize().query(`SELECT code FROM collections`)) as [Array<{ code: string }>, unknown];
    expect(codes).toHaveLength(1);
    const res = await request(app).get(`/api/v1/collections/${codes[0].code}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ visibility: "public", savedFrom: { kind: "filter", filter: { interactionType: "host-parasitoid" } } });
    // every host–parasitoid network published in the scenario, counted in SQL
    const [n] = (await sequelize().query(
      `SELECT count(*)::int AS n FROM networks x JOIN dataset_versions v ON v.id = x.version_id
       WHERE v.state IN ('published', 'withdrawn') AND x.metadata->>'interactionType' = 'host-parasitoid'`,
    )) as [Array<{ n: number }>, unknown];
    expect(res.body.memberCount).toBe(n[0].n);
    expect(res.body.withdrawnCount).toBe(1);
    const gone = (res.body.members as Array<{ state: string; withdrawal: { reason: string } | null }>).filter((m) => m.state === "withdrawn");
    expect(gone[0].withdrawal!.reason).toMatch(/identifications/);
  });

  it("runs once: a second call seeds nothing", async () => {
    expect(await seedDemoScenario()).toBeNull();
  });
});
