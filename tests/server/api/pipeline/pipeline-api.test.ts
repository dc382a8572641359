/**
 * The metrics pipeline through its HTTP API, with the real publishing service: a curator publishes a
 * submitted deposit → the dataset page (GET /api/v1/datasets/:accession) shows its networks queued or
 * running, then their metrics; an admin edits the settings, starts a batch, follows its progress, sees the
 * failure of a network the engine cannot read, retries it; a second batch skips networks whose result
 * exists; the batch history and a network's run history keep every run.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BatchProgress, PipelineSettings } from "@shared/types/pipeline";
import type { DatasetDetail } from "@shared/types/dataset";
import { createApp } from "../../../../server/src/app";
import { sequelize } from "../../../../server/src/db/sequelize";
import { shutdownServerResources } from "../../../../server/src/index";
import { startMetricsWorker, stopMetricsWorker } from "../../../../server/src/pipeline/metrics-worker";
import { MetricRun, Network } from "../../../../server/src/models";
import { resetDatabase } from "../../../setup/db";
import { waitFor } from "../../support/wait";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { clearQueue, createNetwork, matrixCsv, publishMatrices, randomMatrix } from "../../support/pipeline-fixtures";
import { startMailCatcher } from "../../support/stack";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";

const LIGHT: PipelineSettings = { objective: "auto", restarts: 2, nullModels: "standard", nulls: 4, seed: 5, annealing: "off" };
const app = createApp();
let admin: SignedInAgent;
let curator: SignedInAgent;
let catcher: MailCatcher;


beforeAll(async () => {
  process.env.TB_METRICS_RETRY_DELAY_SECONDS = "1";
  process.env.TB_METRICS_THREADS = "2";
  await resetDatabase();
  await clearQueue((sql) => sequelize().query(sql));
  catcher = await startMailCatcher();
  await createUser({ role: "admin", email: "admin@pipeline.test" });
  await createUser({ role: "curator", email: "curator@pipeline.test" });
  admin = await agentFor(app, "admin@pipeline.test");
  curator = await agentFor(app, "curator@pipeline.test");
});
afterAll(async () => {
  await stopMetricsWorker();
  await catcher?.close();
  await shutdownServerResources();
});

describe("metrics pipeline API", () => {
  it("shows and validates the settings (defaults: 20 restarts, 100 nulls, seed 1)", async () => {
    const res = await admin.agent.get("/api/v1/pipeline/settings");
    expect(res.status).toBe(200);
    expect(res.body.settings).toEqual({ objective: "auto", restarts: 20, nullModels: "standard", nulls: 100, seed: 1, annealing: "auto" });
    expect(res.body.settingsHash).toMatch(/^[0-9a-f]{64}$/);
    const bad = await admin.agent.put("/api/v1/pipeline/settings").set("x-csrf-token", admin.csrf).send({ restarts: 0, nullModel: "shuffle", colour: "red" });
    expect(bad.status).toBe(400);
    expect(bad.body.details.map((d: { path: string }) => d.path).sort()).toEqual(["/colour", "/nullModel", "/restarts"]);
    const ok = await admin.agent.put("/api/v1/pipeline/settings").set("x-csrf-token", admin.csrf).send(LIGHT);
    expect(ok.status).toBe(200);
    expect(ok.body.settings).toEqual(LIGHT);
    expect(ok.body.settingsHash).not.toBe(res.body.settingsHash);
  });

  it("publishing queues the networks; the dataset page shows queued/running, then the metrics", async () => {
    const { versionId, networkIds } = await publishMatrices([randomMatrix(31, 8, 10, 0.3), randomMatrix(32, 9, 7, 0.3)], { state: "submitted" });
    const pub = await curator.agent.post(`/api/v1/reviews/${versionId}/decision`).set("x-csrf-token", curator.csrf).send({ decision: "publish" });
    expect(pub.status).toBe(200);
    const runs = await MetricRun.findAll({ where: { networkId: networkIds } });
    expect(runs).toHaveLength(2);
    const [{ accession }] = (await sequelize().query(
      `SELECT d.accession FROM datasets d JOIN dataset_versions v ON v.dataset_id = d.id WHERE v.id = :versionId`,
      { replacements: { versionId } },
    ))[0] as Array<{ accession: string }>;
    const before = await admin.agent.get(`/api/v1/datasets/${accession}`);
    expect(before.status).toBe(200);
    for (const n of (before.body as DatasetDetail).networks) expect(["queued", "running", "succeeded"]).toContain(n.metrics?.status);

    await startMetricsWorker({ pollingIntervalSeconds: 0.5 });
    const detail = await waitFor(async () => {
      const r = await admin.agent.get(`/api/v1/datasets/${accession}`);
      const d = r.body as DatasetDetail;
      return d.networks.every((n) => n.metrics?.status === "succeeded") && d;
    }, "metrics on the dataset page");
    for (const n of detail.networks) {
      expect(n.metrics).toMatchObject({ objective: "barber", nullModel: "curveball", nullN: 4, algorithm: { seed: 5 } });
      expect(typeof n.metrics!.Q).toBe("number");
      expect(n.metrics!.modules).toBeGreaterThanOrEqual(1);
    }
  });

  it("runs a batch with progress, records a failure, retries it, and keeps the history", async () => {
    const { versionId } = await publishMatrices([randomMatrix(41, 6, 9, 0.35)]);
    const broken = await createNetwork(versionId, 2, matrixCsv([[1, 0], [0, 1]]), { format: "not a network" });
    const settings = { ...LIGHT, seed: 6 };
    const start = await admin.agent.post("/api/v1/pipeline/batches").set("x-csrf-token", admin.csrf).send({ settings });
    expect(start.status).toBe(201);
    const b = start.body as BatchProgress;
    expect(b).toMatchObject({ status: "running", total: 4, skipped: 0, settings });
    expect((await admin.agent.get("/api/v1/pipeline/settings")).body.settings).toEqual(settings);

    const finished = await waitFor(async () => {
      const r = await admin.agent.get(`/api/v1/pipeline/batches/${b.id}`);
      return r.body.status === "finished" && (r.body as BatchProgress);
    }, "the batch to finish", 60_000);
    expect(finished).toMatchObject({ total: 4, done: 3, failed: 1, running: 0, queued: 0, etaSeconds: 0 });
    expect(finished.ratePerMinute).toBeGreaterThan(0);

    const failures = await admin.agent.get(`/api/v1/pipeline/batches/${b.id}/failures`);
    expect(failures.status).toBe(200);
    expect(failures.body.data).toHaveLength(1);
    expect(failures.body.data[0]).toMatchObject({ networkId: broken, networkName: "Network 2" });
    expect(failures.body.data[0].error).toMatch(/\S/);

    const retry = await admin.agent.post(`/api/v1/pipeline/batches/${b.id}/retry`).set("x-csrf-token", admin.csrf).send({});
    expect(retry.status).toBe(200);
    expect(retry.body.failed + retry.body.queued + retry.body.running).toBe(1);
    const again = await waitFor(async () => {
      const r = await admin.agent.get(`/api/v1/pipeline/batches/${b.id}`);
      return r.body.status === "finished" && (r.body as BatchProgress);
    }, "the retried batch to finish", 60_000);
    expect(again).toMatchObject({ done: 3, failed: 1 });

    // A second batch with the same settings skips the networks that have their result; the failed one is queued again.
    const second = await admin.agent.post("/api/v1/pipeline/batches").set("x-csrf-token", admin.csrf).send({});
    expect(second.status).toBe(201);
    expect(second.body).toMatchObject({ total: 1, skipped: 3 });
    await waitFor(async () => (await admin.agent.get(`/api/v1/pipeline/batches/${second.body.id}`)).body.status === "finished", "the second batch");

    const history = await admin.agent.get("/api/v1/pipeline/batches");
    expect(history.body.data.map((x: BatchProgress) => x.id)).toEqual([second.body.id, b.id]);
    expect(history.body.meta.total).toBe(2);
    const current = await admin.agent.get("/api/v1/pipeline/batches/current");
    expect(current.body.batch.id).toBe(second.body.id);

    // Every network published earlier has two runs now (publishing's settings and the batch's); both kept.
    const someNet = (await Network.findOne({ order: [["id", "ASC"]] }))!;
    const net = await admin.agent.get(`/api/v1/pipeline/networks/${someNet.id}`);
    expect(net.status).toBe(200);
    expect(net.body.runs.map((r: { status: string }) => r.status)).toEqual(["succeeded", "succeeded"]);
    expect(net.body.current).toMatchObject({ status: "succeeded", algorithm: { seed: 6 } });
    const failedRuns = await admin.agent.get("/api/v1/pipeline/runs?status=failed");
    expect(failedRuns.body.data.every((r: { status: string }) => r.status === "failed")).toBe(true);
    expect((await admin.agent.get("/api/v1/pipeline/runs?status=bogus")).status).toBe(400);
    expect((await admin.agent.get("/api/v1/pipeline/batches/999999")).status).toBe(404);
  });
});
