/**
 * Null-model settings through the pipeline: settings that cannot be computed for a published network are
 * refused when saved (422 naming each network and why), "recompute all" is previewed with the number of
 * networks and figures that will change, and a configuration error met by a job (a network published after
 * the settings were saved) fails the run once — never retried — while the network's last good figures stay
 * visible with a note of the failed attempt (its error only for curators and admins).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BatchPreview, PipelineSettings } from "@shared/types/pipeline";
import { createApp } from "../../../server/src/app";
import { sequelize } from "../../../server/src/db/sequelize";
import { shutdownServerResources } from "../../../server/src/index";
import { enqueueNetworkMetrics } from "../../../server/src/pipeline/enqueue";
import { getCurrentMetrics } from "../../../server/src/pipeline/metrics-read";
import { startMetricsWorker, stopMetricsWorker } from "../../../server/src/pipeline/metrics-worker";
import { setPipelineSettings } from "../../../server/src/pipeline/settings";
import { MetricRun } from "../../../server/src/models";
import { resetDatabase } from "../../setup/db";
import request from "supertest";
import { catalogueStore } from "../../../server/src/api/catalogue/catalogue.store";
import { binaryParser, unzip } from "../support/unzip";
import { agentFor, createUser, type SignedInAgent } from "../support/accounts";
import { clearQueue, publishMatrices, randomMatrix } from "../support/pipeline-fixtures";
import { waitFor } from "../support/wait";

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

    // Every read path keeps the good figures: the public API, the catalogue (marked as older settings),
    // the network view (with the failed attempt in its run history), the bundle's metrics.csv.
    const api = await request(app).get(`/api/v1/networks/${accession}/v1/1/metrics`);
    expect(api.status).toBe(200);
    expect(api.body.metrics).toMatchObject({ Q: good.Q, nullModel: "curveball", newer: { status: "failed" } });
    expect(JSON.stringify(api.body)).not.toMatch(/Patefield's null model needs|does not fit this network/);
    catalogueStore.invalidate();
    const cat = await request(app).get("/api/v1/catalogue").query({ q: "", nodesMin: 0 });
    const row = cat.body.data.find((r: { ref: string }) => r.ref === `${accession}/v1/1`);
    expect(row).toMatchObject({ Q: good.Q, z: good.z, nullModel: "curveball", currentSettings: false });
    const view = await request(app).get(`/api/v1/network-views/${accession}/1/1`);
    expect(view.body.metrics.Q).toBe(good.Q);
    expect(view.body.runHistory.map((h: { status: string }) => h.status)).toEqual(["failed", "succeeded"]);
    expect(view.body.runHistory[0].error).toBeUndefined();
    const zip = await request(app).get("/api/v1/bundles").query({ refs: `${accession}/v1/1` }).buffer(true).parse(binaryParser);
    const metricsCsv = (await unzip(zip.body as Buffer)).get("metrics.csv")!;
    expect(metricsCsv).toContain(String(good.Q));
    await setPipelineSettings(LIGHT);
  });
});

describe("the catalogue's z column uses one null model at a time", () => {
  it("every row's z is the chosen model's; a network without that model has no z; unknown models are refused", async () => {
    catalogueStore.invalidate();
    const pub = await publishMatrices([randomMatrix(9, 6, 8, 0.4)]);
    const id = pub.networkIds[0];
    await enqueueNetworkMetrics([id]);
    const m = await waitFor(async () => {
      const x = (await getCurrentMetrics([id])).get(id)!;
      return x.status === "succeeded" && x.currentSettings && x;
    }, "the standard set");
    catalogueStore.invalidate();
    const ref = `${pub.accession}/v1/1`;
    for (const model of ["curveball", "probabilistic", "er"]) {
      const res = await request(app).get("/api/v1/catalogue").query({ nullModel: model, pageSize: 200 });
      expect(res.status).toBe(200);
      expect(res.body.meta.facets.nullModel).toBe(model);
      for (const r of res.body.data) expect(r.nullModel).toBe(model);
      const row = res.body.data.find((r: { ref: string }) => r.ref === ref);
      const fig = m.nulls!.find((f) => f.model === model)!;
      expect([row.z, row.p, row.qRel]).toEqual([fig.z, fig.p, fig.qRel]);
    }
    const none = await request(app).get("/api/v1/catalogue").query({ nullModel: "totals-connectance", zMin: -1000 });
    expect(none.body.meta.total).toBe(0);
    const bad = await request(app).get("/api/v1/catalogue").query({ nullModel: "auto" });
    expect(bad.status).toBe(400);
    expect(bad.body.details[0].path).toBe("nullModel");
  });
});
