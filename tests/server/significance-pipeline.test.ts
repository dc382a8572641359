/**
 * Null-model settings through the pipeline: settings that cannot be computed for a published network are
 * refused when saved (422 naming each network and why), "recompute all" is previewed with the number of
 * networks and figures that will change, and a configuration error met by a job (a network published after
 * the settings were saved) fails the run once — never retried — while the network's last good figures stay
 * visible with a note of the failed attempt (its error only for curators and admins).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BatchPreview, PipelineSettings } from "../../shared/types/pipeline";
import { createApp } from "../../server/src/app";
import { sequelize } from "../../server/src/db/sequelize";
import { shutdownServerResources } from "../../server/src/index";
import { enqueueNetworkMetrics } from "../../server/src/jobs/enqueue";
import { getCurrentMetrics } from "../../server/src/jobs/metrics-read";
import { startMetricsWorker, stopMetricsWorker } from "../../server/src/jobs/metrics-worker";
import { setPipelineSettings } from "../../server/src/jobs/settings";
import { MetricRun } from "../../server/src/models";
import { resetDatabase } from "../setup/db";
import { agentFor, createUser, type SignedInAgent } from "./support/accounts";
import { clearQueue, publishMatrices, randomMatrix } from "./support/pipeline-fixtures";
import { waitFor } from "./support/wait";

const LIGHT: PipelineSettings = { objective: "auto", restarts: 2, nullModels: "standard", nulls: 4, seed: 5, annealing: "off" };
const app = createApp();
let admin: SignedInAgent;

beforeAll(async () => {
  process.env.TB_METRICS_RETRY_DELAY_SECONDS = "1";
  process.env.TB_METRICS_THREADS = "2";
  await resetDatabase();
  await clearQueue((sql) => sequelize().query(sql));
  await createUser({ role: "admin", email: "admin@significance.test" });
  admin = await agentFor(app, "admin@significance.test");
  await setPipelineSettings(LIGHT);
});
afterAll(async () => {
  await stopMetricsWorker();
  await shutdownServerResources();
});

describe("null-model settings in the pipeline", () => {
  let accession: string;
  let networkId: number;

  it("refuses settings that do not fit a published network: 422 naming the network and why; nothing saved", async () => {
    const pub = await publishMatrices([randomMatrix(5, 7, 9, 0.35)]);
    accession = pub.accession!;
    networkId = pub.networkIds[0];
    const put = await admin.agent.put("/api/v1/pipeline/settings").set("x-csrf-token", admin.csrf).send({ nullModels: ["patefield"] });
    expect(put.status).toBe(422);
    expect(put.body.details[0].message).toContain(`${accession}/v1/1`);
    expect(put.body.details[0].message).toMatch(/binary/);
    const batch = await admin.agent.post("/api/v1/pipeline/batches").set("x-csrf-token", admin.csrf).send({ settings: { nullModels: ["weight-shuffle", "er"] } });
    expect(batch.status).toBe(422);
    expect(batch.body.details[0].message).toMatch(/no weights to shuffle/);
    const shown = await admin.agent.get("/api/v1/pipeline/settings");
    expect(shown.body.settings.nullModels).toBe("standard");
    // Malformed lists are a 400 on the field.
    const bad = await admin.agent.put("/api/v1/pipeline/settings").set("x-csrf-token", admin.csrf).send({ nullModels: ["curveball", "curveball"] });
    expect(bad.status).toBe(400);
    expect(bad.body.details[0].path).toBe("/nullModels");
  });

  it("previews a recompute: networks to compute and figures that change", async () => {
    const res = await admin.agent.post("/api/v1/pipeline/batches/preview").set("x-csrf-token", admin.csrf).send({ settings: LIGHT });
    expect(res.status).toBe(200);
    const p = res.body as BatchPreview;
    expect(p).toMatchObject({ networks: 1, toCompute: 1, skipped: 0, figuresChange: 0, firstFigures: 1 });
  });

  it("a configuration error fails the run at once, and the last good figures stay visible with a note", async () => {
    await enqueueNetworkMetrics([networkId]);
    await startMetricsWorker({ pollingIntervalSeconds: 0.5 });
    const good = await waitFor(async () => {
      const m = (await getCurrentMetrics([networkId])).get(networkId)!;
      return m.status === "succeeded" && m;
    }, "the first figures");
    expect(good.nullModel).toBe("curveball");

    // Settings saved before this network existed would not fit it: the job meets a configuration error.
    await setPipelineSettings({ ...LIGHT, nullModels: ["patefield"] });
    await enqueueNetworkMetrics([networkId]);
    const failed = await waitFor(async () => {
      const r = await MetricRun.findOne({ where: { networkId, status: "failed" } });
      return r ?? false;
    }, "the refused run");
    expect(failed.errorKind).toBe("configuration");
    expect(failed.attempts).toBe(1); // not retried
    expect(failed.error).toMatch(/Patefield/);

    const pub = (await getCurrentMetrics([networkId])).get(networkId)!;
    expect(pub).toMatchObject({ status: "succeeded", runId: good.runId, Q: good.Q, z: good.z, currentSettings: false });
    expect(pub.newer).toMatchObject({ runId: failed.id, status: "failed", errorKind: "configuration" });
    expect(pub.newer!.error).toBeUndefined();
    const staff = (await getCurrentMetrics([networkId], { showErrors: true })).get(networkId)!;
    expect(staff.newer!.error).toMatch(/Patefield/);

    // The public API shows the same: the good figures, the failed attempt, no error text.
    const api = await admin.agent.get(`/api/v1/networks/${accession}/1/1/metrics`);
    expect(api.status).toBe(200);
    await setPipelineSettings(LIGHT);
  });
});
