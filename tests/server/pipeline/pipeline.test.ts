/**
 * The metrics pipeline end to end, with the queue (pg-boss) and the worker-thread pool in this process:
 * publishing hands networks over → runs are queued → the worker computes them → current metrics appear,
 * equal to the engine's single-threaded analyzeNetwork for the same settings; a settings change makes a
 * new run and keeps the old; a network that makes the engine throw is recorded as failed while the rest
 * of the batch completes.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { analyzeNetwork, deserializeNetwork } from "@shared/network/index";
import type { PipelineSettings } from "@shared/types/pipeline";
import { sequelize } from "../../../server/src/db/sequelize";
import { closeSequelize } from "../../../server/src/db/sequelize";
import { enqueueNetworkMetrics } from "../../../server/src/pipeline/enqueue";
import { getCurrentMetrics } from "../../../server/src/pipeline/metrics-read";
import { startMetricsWorker, stopMetricsWorker, sweepOrphanRuns } from "../../../server/src/pipeline/metrics-worker";
import { createQueuedRuns } from "../../../server/src/pipeline/runs";
import { sendRunJobs } from "../../../server/src/pipeline/queue";
import { setPipelineSettings, settingsHash } from "../../../server/src/pipeline/settings";
import { MetricBatch, MetricRun, Network } from "../../../server/src/models";
import { resetDatabase } from "../../setup/db";
import { waitFor } from "../support/wait";
import { clearQueue, createNetwork, matrixCsv, publishMatrices, randomMatrix } from "../support/pipeline-fixtures";

const LIGHT: PipelineSettings = { objective: "auto", restarts: 3, nullModels: "standard", nulls: 6, seed: 7, annealing: "auto" };


beforeAll(async () => {
  process.env.TB_METRICS_RETRY_DELAY_SECONDS = "1";
  process.env.TB_METRICS_THREADS = "2";
  await resetDatabase();
  await clearQueue((sql) => sequelize().query(sql));
  await setPipelineSettings(LIGHT);
  await startMetricsWorker({ pollingIntervalSeconds: 0.5 });
});
afterAll(async () => {
  await stopMetricsWorker();
  await closeSequelize();
});

describe("metrics pipeline", () => {
  it("publishing queues metrics; the worker computes exactly the engine's single-threaded analysis", async () => {
    const { networkIds } = await publishMatrices([randomMatrix(3, 9, 12, 0.3), randomMatrix(4, 14, 10, 0.25)]);
    await sequelize().transaction(async (transaction) => {
      await enqueueNetworkMetrics(networkIds, { transaction });
      // Inside the publishing transaction the runs already exist (status queued).
      const [rows] = (await sequelize().query(`SELECT count(*)::int AS n FROM metric_runs WHERE status = 'queued'`, { transaction })) as [Array<{ n: number }>, unknown];
      expect(rows[0].n).toBe(2);
    });
    const metrics = await waitFor(async () => {
      const m = await getCurrentMetrics(networkIds);
      return [...m.values()].every((x) => x.status === "succeeded") && m;
    }, "both networks' metrics");
    for (const id of networkIds) {
      const net = await Network.findByPk(id, { attributes: { include: ["canonical"] } });
      const single = analyzeNetwork(deserializeNetwork(net!.canonical), { restarts: 3, nulls: 6, seed: 7, annealing: "auto" });
      const m = metrics.get(id)!;
      expect(m.Q).toBe(single.modularity.Q);
      expect(m.modules).toBe(single.modularity.modules);
      expect(m.objective).toBe("barber");
      expect(m.nullMean).toBe(single.null!.mean);
      expect(m.nullSd).toBe(single.null!.sd);
      expect(m.z).toBe(single.null!.z);
      expect(m.p).toBe(single.null!.p);
      expect(m.nodf).toBe(single.nodf);
      // Binary bipartite data: fixed degrees (primary), probabilistic degrees and Erdős–Rényi, stored apart.
      expect(m.nullModel).toBe("curveball");
      expect(m.nullN).toBe(6);
      expect(m.nulls!.map((f) => [f.model, f.primary])).toEqual([["curveball", true], ["probabilistic", false], ["er", false]]);
      for (const f of m.nulls!) {
        const ref = single.nulls!.find((x) => x.model === f.model)!;
        expect([f.z, f.p, f.qRel, f.deltaQ, f.pAtFloor]).toEqual([ref.z, ref.p, ref.qRel, ref.deltaQ, ref.pAtFloor]);
      }
      expect(m.algorithm).toMatchObject({ name: single.algorithm.name, version: single.algorithm.version, seed: 7 });
      expect(m.durationMs).toBeGreaterThanOrEqual(0);
      const run = await MetricRun.findByPk(m.runId!);
      const stored = (run!.results as { analysis: typeof single }).analysis;
      expect({ ...stored, elapsedMs: 0 }).toEqual({ ...single, elapsedMs: 0 });
      // One start of the observed job and one of the nulls job.
      expect(run!.attempts).toBe(2);
    }
    // Publishing again (e.g. a repeated hand-over) does not recompute an existing result.
    await enqueueNetworkMetrics(networkIds);
    expect(await MetricRun.count()).toBe(2);
  });

  it("a failing hand-over never breaks the publishing transaction", async () => {
    const { networkIds } = await publishMatrices([randomMatrix(81, 6, 7, 0.4)]);
    const before = await MetricRun.count();
    await sequelize().transaction(async (transaction) => {
      // 999999 is no network: the foreign key fails inside the hand-over's savepoint…
      await enqueueNetworkMetrics([networkIds[0], 999999], { transaction });
      // …and the publishing transaction is still usable and commits.
      await sequelize().query(`UPDATE dataset_versions SET lock_version = lock_version + 1`, { transaction });
    });
    expect(await MetricRun.count()).toBe(before);
    // The network is not lost: the sweeper queues published networks that never had a run.
    await sweepOrphanRuns();
    await waitFor(async () => (await MetricRun.count({ where: { networkId: networkIds[0], status: "succeeded" } })) === 1, "the swept network");
  });

  it("computes the observed figures of every queued network before any null replicates", async () => {
    await setPipelineSettings({ ...LIGHT, nulls: 40 });
    const { networkIds } = await publishMatrices([3, 4, 5, 6, 7].map((k) => randomMatrix(60 + k, 8 + k, 9, 0.3)));
    await enqueueNetworkMetrics(networkIds);
    const runs = await waitFor(async () => {
      const rs = await MetricRun.findAll({ where: { networkId: networkIds } });
      return rs.some((r) => r.status === "succeeded") && rs;
    }, "the first network to finish");
    // When the first network has its null figures, all five show their observed Q already.
    expect(runs.filter((r) => r.q !== null)).toHaveLength(5);
    await waitFor(async () => (await MetricRun.count({ where: { networkId: networkIds, status: "succeeded" } })) === 5, "all five");
    await setPipelineSettings(LIGHT);
  });

  it("the sweeper queues published networks that never had a run, and re-sends runs whose job is missing", async () => {
    const { networkIds } = await publishMatrices([randomMatrix(71, 7, 8, 0.35), randomMatrix(72, 8, 7, 0.35)]);
    // A run row without a job (as if the process died between the commit and the send).
    const [orphan] = (await createQueuedRuns([networkIds[1]], { settings: LIGHT })).created;
    const swept = await sweepOrphanRuns();
    expect(swept).toMatchObject({ resent: 1, queued: 1 });
    await waitFor(async () => (await MetricRun.count({ where: { networkId: networkIds, status: "succeeded" } })) === 2, "both networks");
    expect((await MetricRun.findByPk(orphan.id))!.status).toBe("succeeded");
    expect(await MetricRun.count({ where: { networkId: networkIds } })).toBe(2);
  });

  it("a settings change computes a new run and keeps the old one", async () => {
    const { networkIds } = await publishMatrices([randomMatrix(11, 8, 8, 0.35)]);
    const [id] = networkIds;
    await enqueueNetworkMetrics([id]);
    const first = await waitFor(async () => {
      const m = (await getCurrentMetrics([id])).get(id)!;
      return m.status === "succeeded" && m;
    }, "first run");
    const changed = { ...LIGHT, seed: 8, nulls: 4 };
    await setPipelineSettings(changed);
    // The last good figures stay visible, marked as coming from older settings.
    expect((await getCurrentMetrics([id])).get(id)!).toMatchObject({ status: "succeeded", runId: first.runId, currentSettings: false });
    await enqueueNetworkMetrics([id]);
    const second = await waitFor(async () => {
      const m = (await getCurrentMetrics([id])).get(id)!;
      return m.status === "succeeded" && m.currentSettings && m;
    }, "second run");
    expect(second.runId).not.toBe(first.runId);
    expect(second.settingsHash).toBe(settingsHash(changed));
    expect(second.nullN).toBe(4);
    const runs = await MetricRun.findAll({ where: { networkId: id }, order: [["id", "ASC"]] });
    expect(runs.map((r) => r.status)).toEqual(["succeeded", "succeeded"]);
    expect(runs[0].settingsHash).toBe(first.settingsHash);
    await setPipelineSettings(LIGHT);
    expect((await getCurrentMetrics([id])).get(id)!.runId).toBe(first.runId);
  });

  it("a network that makes the engine throw is recorded as failed; the rest of the batch completes", async () => {
    const { networkIds } = await publishMatrices([randomMatrix(21, 7, 9, 0.3), randomMatrix(22, 10, 6, 0.3)]);
    const versionId = (await Network.findByPk(networkIds[0]))!.versionId;
    const broken = await createNetwork(versionId, 3, matrixCsv([[1, 0], [0, 1]]), { format: "not a network" });
    const all = [...networkIds, broken];
    const batch = await MetricBatch.create({ settings: { ...LIGHT }, settingsHash: settingsHash(LIGHT), total: all.length });
    const res = await createQueuedRuns(all, { settings: LIGHT, batchId: batch.id });
    expect(res.created).toHaveLength(3);
    await sendRunJobs(res.created);
    await waitFor(async () => (await batch.reload()).status === "finished", "the batch to finish", 60_000);
    const runs = await MetricRun.findAll({ where: { batchId: batch.id } });
    const byNet = new Map(runs.map((r) => [r.networkId, r]));
    expect(byNet.get(networkIds[0])!.status).toBe("succeeded");
    expect(byNet.get(networkIds[1])!.status).toBe("succeeded");
    const failed = byNet.get(broken)!;
    expect(failed.status).toBe("failed");
    expect(failed.error).toMatch(/\S/);
    expect(failed.attempts).toBeGreaterThanOrEqual(1);
    const current = (await getCurrentMetrics([broken], { showErrors: true })).get(broken)!;
    expect(current).toMatchObject({ status: "failed" });
    expect(current.error).toBe(failed.error);
    // The public sees that it failed, not the raw error.
    expect((await getCurrentMetrics([broken])).get(broken)!.error).toBe("the computation failed");
  });
});
