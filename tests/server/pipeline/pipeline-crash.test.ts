/**
 * Crash safety of the metrics pipeline: a worker PROCESS (the `npm run worker` entry, server/src/worker.ts)
 * is killed with SIGKILL in the middle of a job; its heartbeat stops, the second worker process's sweeper
 * takes the job back (long before the job would expire: the expiry stays at its hour) and retries it; the
 * run completes exactly once (one successful metric_runs row).
 */
import { spawn, type ChildProcess } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { PipelineSettings } from "@shared/types/pipeline";
import { closeSequelize, sequelize } from "../../../server/src/db/sequelize";
import { enqueueNetworkMetrics } from "../../../server/src/pipeline/enqueue";
import { stopQueue } from "../../../server/src/pipeline/queue";
import { setPipelineSettings } from "../../../server/src/pipeline/settings";
import { MetricRun } from "../../../server/src/models";
import { resetDatabase } from "../../setup/db";
import { waitFor as waitUntil } from "../support/wait";
import { clearQueue, publishMatrices, randomMatrix } from "../support/pipeline-fixtures";

// Enough work for the job to be caught mid-way (a few seconds on two threads), small enough for a test.
const SETTINGS: PipelineSettings = { objective: "auto", restarts: 4, nullModels: ["er"], nulls: 60, seed: 3, annealing: "off" };
const JOB_ENV = {
  TB_METRICS_JOB_EXPIRE_SECONDS: "3600",
  TB_METRICS_HEARTBEAT_SECONDS: "1",
  TB_METRICS_WORKER_STALE_SECONDS: "3",
  TB_METRICS_SWEEP_SECONDS: "1",
  TB_METRICS_MAINTENANCE_SECONDS: "1",
  TB_METRICS_RETRY_DELAY_SECONDS: "1",
  TB_METRICS_POLL_SECONDS: "0.5",
};
const children: ChildProcess[] = [];

function startWorkerProcess(): ChildProcess {
  const child = spawn(process.execPath, ["--import", "tsx", "server/src/worker.ts"], {
    env: { ...process.env, ...JOB_ENV, TB_METRICS_THREADS: "2", LOG_LEVEL: "silent" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stderr?.on("data", (d: Buffer) => process.stderr.write(`[worker ${child.pid}] ${d}`));
  children.push(child);
  return child;
}

const waitFor = <T>(probe: () => Promise<T | undefined | false>, what: string) => waitUntil(probe, what, 90_000, 100);

beforeAll(async () => {
  Object.assign(process.env, JOB_ENV);
  await resetDatabase();
  await clearQueue((sql) => sequelize().query(sql));
  await setPipelineSettings(SETTINGS);
});
afterAll(async () => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill("SIGKILL");
  await stopQueue({ graceful: false });
  await closeSequelize();
});

describe("a worker process killed mid-job", () => {
  it("leaves the job to another worker, which completes it exactly once", { timeout: 150_000 }, async () => {
    const { networkIds } = await publishMatrices([randomMatrix(5, 70, 90, 0.08)]);
    await enqueueNetworkMetrics(networkIds);
    const first = startWorkerProcess();
    // Mid-job: the observed figures are written and the nulls job has started (second job start).
    const run = await waitFor(async () => {
      const r = await MetricRun.findOne({ where: { networkId: networkIds[0] } });
      return r && r.status === "running" && r.q !== null && r.attempts >= 2 ? r : undefined;
    }, "the first worker to be mid-job");
    first.kill("SIGKILL");
    await new Promise((r) => first.once("exit", r));
    expect((await run.reload()).status).toBe("running");
    const [held] = (await sequelize().query(`SELECT worker_id FROM metric_runs WHERE id = ${run.id}`)) as [Array<{ worker_id: string | null }>, unknown];
    expect(held[0].worker_id).toContain(`:${first.pid}:`); // the dead worker still holds it

    startWorkerProcess();
    await waitFor(async () => (await run.reload()).status === "succeeded", "the retried job to finish");
    const rows = await MetricRun.findAll({ where: { networkId: networkIds[0] } });
    expect(rows).toHaveLength(1);
    expect(rows[0].status).toBe("succeeded");
    // observed job, the killed nulls job, its retry
    expect(rows[0].attempts).toBeGreaterThanOrEqual(3);
    const results = rows[0].results as { analysis: { null: { n: number } }; nullQs: number[] };
    expect(results.analysis.null.n).toBe(60);
    expect(results.nullQs).toHaveLength(60);
    expect(rows[0].z).not.toBeNull();
    const [after] = (await sequelize().query(`SELECT worker_id FROM metric_runs WHERE id = ${run.id}`)) as [Array<{ worker_id: string | null }>, unknown];
    expect(after[0].worker_id).toBeNull();
  });
});
