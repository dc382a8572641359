/**
 * GET /api/v1/pipeline/queue: metric runs of the current settings counted by phase, for work outside
 * batches (networks queued by publishing) and overall. Rows are written directly in each state the worker
 * leaves them in (queued; running; observed figures stored with null replicates pending; succeeded;
 * failed), so the expected counts are known exactly; no worker runs in this file.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import type { QueueProgress } from "@shared/types/pipeline";
import { createApp } from "../../../server/src/app";
import { sequelize } from "../../../server/src/db/sequelize";
import { shutdownServerResources } from "../../../server/src/index";
import { getPipelineSettings, settingsHash } from "../../../server/src/pipeline/settings";
import { resetDatabase } from "../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../support/accounts";
import { clearQueue, publishMatrices, randomMatrix } from "../support/pipeline-fixtures";
import request from "supertest";

const app = createApp();
let admin: SignedInAgent;
let curator: SignedInAgent;
let hash: string;
let networks: number[] = [];
let batchId: number;

type State = "queued" | "running" | "observed" | "succeeded" | "failed" | "superseded";

/** Inserts a metric run of network `networkId` in the given state; `ageSeconds` moves its times back. */
async function insertRun(networkId: number, state: State, opts: { batchId?: number | null; hash?: string; ageSeconds?: number; durationSeconds?: number } = {}) {
  const status = state === "observed" ? "running" : state;
  const results = state === "observed" ? { phase: "observed", observed: {} } : state === "succeeded" ? { phase: "complete" } : null;
  const finished = ["succeeded", "failed", "superseded"].includes(state);
  const age = opts.ageSeconds ?? 0;
  const settings = await getPipelineSettings();
  await sequelize().query(
    `INSERT INTO metric_runs (network_id, batch_id, settings, settings_hash, status, results, attempts, created_at, started_at, finished_at, updated_at)
     VALUES (:networkId, :batchId, CAST(:settings AS jsonb), :hash, :status, CAST(:results AS jsonb), 1,
             now() - make_interval(secs => :age),
             CASE WHEN :status = 'queued' THEN NULL ELSE now() - make_interval(secs => :age) END,
             CASE WHEN :finished THEN now() - make_interval(secs => :age) + make_interval(secs => :duration) ELSE NULL END,
             now())`,
    {
      replacements: {
        networkId,
        batchId: opts.batchId ?? null,
        settings: JSON.stringify(settings),
        hash: opts.hash ?? hash,
        status,
        results: results ? JSON.stringify(results) : null,
        age,
        finished,
        duration: opts.durationSeconds ?? 0,
      },
    },
  );
}

async function queue(): Promise<QueueProgress> {
  const res = await admin.agent.get("/api/v1/pipeline/queue");
  expect(res.status).toBe(200);
  return res.body as QueueProgress;
}

beforeAll(async () => {
  await resetDatabase();
  await clearQueue((sql) => sequelize().query(sql));
  await createUser({ role: "admin", email: "admin@queue.test" });
  await createUser({ role: "curator", email: "curator@queue.test" });
  admin = await agentFor(app, "admin@queue.test");
  curator = await agentFor(app, "curator@queue.test");
  hash = settingsHash(await getPipelineSettings());
  const matrices = Array.from({ length: 16 }, (_, i) => randomMatrix(300 + i, 5, 4, 0.4));
  networks = (await publishMatrices(matrices)).networkIds;
  const [batch] = await sequelize().query<{ id: number }>(
    `INSERT INTO metric_batches (settings, settings_hash, status, total, force, created_at, updated_at)
     VALUES (CAST(:settings AS jsonb), :hash, 'running', 3, false, now(), now()) RETURNING id`,
    { replacements: { settings: JSON.stringify(await getPipelineSettings()), hash }, type: QueryTypes.SELECT },
  );
  batchId = batch.id;
});
afterAll(async () => {
  await shutdownServerResources();
});

describe("GET /api/v1/pipeline/queue", () => {
  it("is for admins only (401 for visitors, 403 for curators)", async () => {
    expect((await request(app).get("/api/v1/pipeline/queue")).status).toBe(401);
    expect((await curator.agent.get("/api/v1/pipeline/queue")).status).toBe(403);
  });

  it("says there is nothing to do before any run exists", async () => {
    const q = await queue();
    expect(q.settingsHash).toBe(hash);
    expect(q.active).toBe(false);
    expect(q.unbatched).toMatchObject({ queued: 0, running: 0, nullsPending: 0, done: 0, failed: 0, total: 0, observedDone: 0, since: null, ratePerMinute: null, etaSeconds: 0 });
    expect(q.overall.total).toBe(0);
  });

  it("counts unbatched and overall runs of the current settings by phase, with rate and time left", async () => {
    const [n0, n1, n2, n3, n4, n5, n6, n7, n8, n9, n10, n11, n12] = networks;
    // An earlier wave, finished an hour ago: in the overall counts, not in the current wave.
    await insertRun(n0, "succeeded", { ageSeconds: 3600, durationSeconds: 10 });
    // The current wave (created 2 minutes ago): 2 waiting, 1 computing observed figures, 3 with observed
    // figures waiting for null replicates, 2 finished (one of them found already computed), 1 failed.
    await insertRun(n1, "queued", { ageSeconds: 120 });
    await insertRun(n2, "queued", { ageSeconds: 120 });
    await insertRun(n3, "running", { ageSeconds: 120 });
    await insertRun(n4, "observed", { ageSeconds: 120 });
    await insertRun(n5, "observed", { ageSeconds: 120 });
    await insertRun(n6, "observed", { ageSeconds: 120 });
    await insertRun(n7, "succeeded", { ageSeconds: 120, durationSeconds: 60 });
    await insertRun(n8, "superseded", { ageSeconds: 120, durationSeconds: 60 });
    await insertRun(n9, "failed", { ageSeconds: 120, durationSeconds: 90 });
    // Runs of a batch: overall only.
    await insertRun(n10, "queued", { batchId });
    await insertRun(n11, "observed", { batchId });
    await insertRun(n12, "succeeded", { batchId, durationSeconds: 0 });
    // A run of other settings: not counted anywhere.
    await insertRun(networks[13], "queued", { hash: "f".repeat(64) });

    const q = await queue();
    expect(q.active).toBe(true);
    const u = q.unbatched;
    expect({ queued: u.queued, running: u.running, nullsPending: u.nullsPending, done: u.done, failed: u.failed, total: u.total, observedDone: u.observedDone }).toEqual({
      queued: 2,
      running: 1,
      nullsPending: 3,
      done: 2,
      failed: 1,
      total: 9,
      observedDone: 5,
    });
    expect(Date.now() - Date.parse(u.since!)).toBeGreaterThan(110_000);
    expect(Date.now() - Date.parse(u.since!)).toBeLessThan(200_000);
    // 3 runs finished within the wave's ~2 minutes → about 1.5 per minute; 6 left → about 4 minutes.
    expect(u.ratePerMinute).toBeGreaterThan(1.3);
    expect(u.ratePerMinute).toBeLessThan(1.6);
    expect(u.etaSeconds).toBeGreaterThan(220);
    expect(u.etaSeconds).toBeLessThan(280);
    expect(q.overall).toEqual({ queued: 3, running: 1, nullsPending: 4, done: 4, failed: 1, total: 13, observedDone: 8 });
  });

  it("starts a new wave once all earlier unbatched work had finished, and is idle when nothing waits", async () => {
    await sequelize().query(`DELETE FROM metric_runs WHERE batch_id IS NOT NULL OR settings_hash <> :hash`, { replacements: { hash } });
    await sequelize().query(
      `UPDATE metric_runs SET status = 'succeeded', results = '{"phase":"complete"}', finished_at = now() - interval '30 seconds'
        WHERE status IN ('queued', 'running') AND settings_hash = :hash`,
      { replacements: { hash } },
    );
    let q = await queue();
    expect(q.active).toBe(false);
    expect(q.unbatched).toMatchObject({ queued: 0, running: 0, nullsPending: 0, done: 8, failed: 1, total: 9, observedDone: 8, etaSeconds: 0 });
    // Published after every earlier run finished: a new wave of its own.
    await insertRun(networks[14], "queued");
    await insertRun(networks[15], "observed");
    q = await queue();
    expect(q.active).toBe(true);
    expect(q.unbatched).toMatchObject({ queued: 1, running: 0, nullsPending: 1, done: 0, failed: 0, total: 2, observedDone: 1, ratePerMinute: null, etaSeconds: null });
    expect(q.overall).toMatchObject({ queued: 1, nullsPending: 1, done: 9, failed: 1, total: 12 });
  });
});
