/**
 * The metrics worker: takes "network-metrics" jobs from the queue and computes one metric run each.
 *
 * A job, for run R of network N with settings S (hash H):
 *   1. R already finished (succeeded, superseded or failed) → nothing to do (a duplicate or retried job).
 *      A success for (N, H) exists and R is not forced → R is marked superseded without computing.
 *   2. R → running (attempts + 1).
 *   3. Observed phase (one task on the thread pool): the analysis without nulls; Q, modules, NODF and
 *      provenance are written to R at once, so pages show the observed figures while nulls are computed.
 *      A retried job reuses stored observed results (they depend only on network, settings and seed).
 *      The "observed" job ends here and queues the run's "nulls" job at a lower priority, so all queued
 *      networks get their observed figures before null replicates are computed for any of them.
 *   4. Null phase: replicates 0..n−1 in chunks over the pool's threads; results equal a single-threaded run.
 *   5. One transaction: R locked; if still running, a forced R marks the older success superseded, and R
 *      becomes succeeded with the full analysis (partition, null Qs, roles) and its headline columns. The
 *      unique index "one success per (network, settings hash)" makes a duplicate success impossible.
 * A job that throws is retried by the queue (RETRY_LIMIT); on its last attempt the run is marked failed with
 * the error (`error_kind` "computation"), and the batch goes on. A configuration error (a null model or
 * objective that does not fit the network, invalid stored settings) fails the run at once with
 * `error_kind` "configuration": the same input would fail the same way on every retry. Either way the
 * network's last successful figures stay visible (metrics-read.ts). A worker killed mid-job leaves R "running"
 * with its worker id and a heartbeat that stops: the sweeper (every TB_METRICS_SWEEP_SECONDS) fails the job
 * back to the queue once the heartbeat is TB_METRICS_WORKER_STALE_SECONDS old, and another worker retries
 * it (job expiry after TB_METRICS_JOB_EXPIRE_SECONDS stays as the last resort); the sweeper also re-sends
 * runs whose job disappeared, failing a run for good after MAX_ATTEMPTS starts.
 *
 * Edge-less networks: the engine's answer (Q null with its reason, no significance test) is stored as a
 * success: it is the network's correct result, not a failure of the pipeline.
 */
import { randomBytes } from "node:crypto";
import { hostname } from "node:os";
import { QueryTypes } from "sequelize";
import type PgBoss from "pg-boss";
import type { AnalysisResult } from "@shared/network/analyze";
import type { PipelineSettings } from "@shared/types/pipeline";
import { jobSettings } from "../config/env";
import { sequelize } from "../db/sequelize";
import { logger } from "../lib/logger";
import { chunkReplicates, combineAnalysis, ConfigurationError, type NullReplicatesByModel, type ObservedResult } from "./compute";
import { writeNullFigures } from "./null-figures";
import { enqueueNetworkMetrics } from "./enqueue";
import { closePool, poolThreads, runNulls, runObserved } from "./pool";
import { getBoss, METRICS_QUEUE, registerLocalWorker, RETRY_LIMIT, sendRunJobs, stopQueue, type MetricsJobData, type MetricsPhase } from "./queue";
import { validateSettings } from "./settings";
import { notifyFiguresIfDone } from "./figures-mail";

/**
 * Job starts of one run (both phases, retries, and starts lost with killed workers) before the sweeper
 * fails it for good.
 */
export const MAX_ATTEMPTS = 2 * (RETRY_LIMIT + 1) + 2;

/** This process as a metrics worker: the runs it computes carry this id and its heartbeats. */
export const WORKER_ID = `${hostname()}:${process.pid}:${randomBytes(3).toString("hex")}`;

interface RunState {
  id: number;
  network_id: number;
  batch_id: number | null;
  settings: PipelineSettings;
  settings_hash: string;
  status: string;
  force: boolean;
  attempts: number;
  started_at: Date | null;
  results: { phase?: string; observed?: ObservedResult } | null;
}

async function loadRun(runId: number): Promise<RunState | undefined> {
  const [row] = await sequelize().query<RunState>(
    `SELECT id, network_id, batch_id, settings, settings_hash, status, force, attempts, started_at, results
       FROM metric_runs WHERE id = :runId`,
    { replacements: { runId }, type: QueryTypes.SELECT },
  );
  return row;
}

/** Marks the batch finished when none of its runs is waiting or running. */
export async function finishBatchIfDone(batchId: number | null): Promise<void> {
  if (!batchId) return;
  await sequelize().query(
    `UPDATE metric_batches b SET status = 'finished', finished_at = now(), updated_at = now()
      WHERE b.id = :batchId AND b.status = 'running'
        AND NOT EXISTS (SELECT 1 FROM metric_runs r WHERE r.batch_id = b.id AND r.status IN ('queued', 'running'))`,
    { replacements: { batchId } },
  );
}

export async function markRunFailed(runId: number, message: string, kind: "configuration" | "computation" = "computation"): Promise<void> {
  const [rows] = (await sequelize().query(
    `UPDATE metric_runs SET status = 'failed', worker_id = NULL, error = :message, error_kind = :kind, finished_at = now(),
            duration_ms = CASE WHEN started_at IS NULL THEN NULL ELSE (EXTRACT(EPOCH FROM (now() - started_at)) * 1000)::int END,
            updated_at = now()
      WHERE id = :runId AND status IN ('queued', 'running') RETURNING batch_id`,
    { replacements: { runId, message: message.slice(0, 4000), kind } },
  )) as [Array<{ batch_id: number | null }>, unknown];
  if (rows[0]) {
    await finishBatchIfDone(rows[0].batch_id);
    await notifyFiguresIfDone(runId);
  }
}

function errorMessage(err: unknown): string {
  if (err instanceof Error) return `${err.name}: ${err.message}`;
  return String(err);
}

/**
 * Computes one run (steps 1–5 above). With phase "observed", stops after step 3 and queues the run's
 * "nulls" job (lower priority) when null replicates remain. Throws when the computation fails.
 */
export async function processRun(runId: number, phase: MetricsPhase = "nulls"): Promise<void> {
  const run = await loadRun(runId);
  if (!run || !["queued", "running"].includes(run.status)) return;
  const hash = run.settings_hash.trim();
  if (!run.force) {
    const [other] = await sequelize().query<{ id: number }>(
      `SELECT id FROM metric_runs WHERE network_id = :net AND settings_hash = :hash AND status = 'succeeded'`,
      { replacements: { net: run.network_id, hash }, type: QueryTypes.SELECT },
    );
    if (other) {
      await sequelize().query(
        `UPDATE metric_runs SET status = 'superseded', worker_id = NULL, error = :note, finished_at = now(), updated_at = now()
          WHERE id = :runId AND status IN ('queued', 'running')`,
        { replacements: { runId, note: `not computed: run ${other.id} already holds the result for these settings` } },
      );
      await finishBatchIfDone(run.batch_id);
      return;
    }
  }
  const { settings } = validateSettings(run.settings);
  if (!settings) throw new ConfigurationError(`run ${runId} has invalid settings`);

  const [started] = (await sequelize().query(
    `UPDATE metric_runs SET status = 'running', attempts = attempts + 1, started_at = COALESCE(started_at, now()),
            error = NULL, worker_id = :me, heartbeat_at = now(), updated_at = now()
      WHERE id = :runId AND status IN ('queued', 'running') RETURNING attempts, started_at`,
    { replacements: { runId, me: WORKER_ID } },
  )) as [Array<{ attempts: number; started_at: Date }>, unknown];
  if (!started) return;
  const t0 = Date.now();

  const [net] = await sequelize().query<{ canonical: unknown }>(`SELECT canonical FROM networks WHERE id = :id`, {
    replacements: { id: run.network_id },
    type: QueryTypes.SELECT,
  });
  if (!net) throw new Error(`network ${run.network_id} no longer exists`);

  let observed = run.results?.phase === "observed" ? run.results.observed : undefined;
  if (!observed) {
    observed = await runObserved({ canonical: net.canonical, settings });
    const a = observed.analysis;
    await sequelize().query(
      `UPDATE metric_runs SET results = CAST(:results AS jsonb), objective = :objective, q = :q, modules = :modules,
              nodf = :nodf, algorithm_name = :algName, algorithm_version = :algVersion, seed = :seed, updated_at = now()
        WHERE id = :runId AND status = 'running'`,
      {
        replacements: {
          runId,
          results: JSON.stringify({ phase: "observed", observed }),
          objective: a.modularity.objective,
          q: a.modularity.Q,
          modules: a.modularity.modules,
          nodf: a.nodf,
          algName: a.algorithm.name,
          algVersion: a.algorithm.version,
          seed: a.algorithm.seed,
        },
      },
    );
  }

  const needsNulls = settings.nulls > 0 && observed.analysis.modularity.Q !== null;
  if (phase === "observed" && needsNulls) {
    await sendRunJobs([{ id: run.id, networkId: run.network_id, settingsHash: hash, phase: "nulls" }]);
    return;
  }
  const replicates: NullReplicatesByModel = {};
  if (needsNulls) {
    // Every null model of the network, each with its own replicates; about four chunks per thread and
    // model: short tasks keep every thread busy until the end of the job.
    const chunks = chunkReplicates(settings.nulls, poolThreads() * 4);
    const objective = observed.analysis.modularity.objective;
    await Promise.all(
      observed.nullChoice.models.map(async (model) => {
        const parts = await Promise.all(chunks.map((reps) => runNulls({ canonical: net.canonical, settings, model, objective, replicates: reps })));
        replicates[model] = parts.flat();
      }),
    );
  }
  const analysis = combineAnalysis(observed, settings.nulls, replicates, Date.now() - t0);
  await writeSuccess(run, hash, analysis, replicates);
}

async function writeSuccess(run: RunState, hash: string, analysis: AnalysisResult, replicates: NullReplicatesByModel): Promise<void> {
  // Null Q values per model (the histograms of the network view); the primary's also as `nullQs`.
  const nullQsByModel: Record<string, number[]> = {};
  for (const [model, reps] of Object.entries(replicates)) nullQsByModel[model] = (reps ?? []).flatMap((r) => (r ? [r.q] : []));
  const primaryModel = analysis.nullModels?.primary;
  const nullQs = primaryModel ? (nullQsByModel[primaryModel] ?? []) : [];
  const n = analysis.null ?? null;
  try {
    await sequelize().transaction(async (transaction) => {
      const [locked] = await sequelize().query<{ status: string }>(`SELECT status FROM metric_runs WHERE id = :id FOR UPDATE`, {
        replacements: { id: run.id },
        type: QueryTypes.SELECT,
        transaction,
      });
      if (!locked || locked.status !== "running") return; // finished elsewhere meanwhile
      if (run.force) {
        await sequelize().query(
          `UPDATE metric_runs SET status = 'superseded', updated_at = now()
            WHERE network_id = :net AND settings_hash = :hash AND status = 'succeeded' AND id <> :id`,
          { replacements: { net: run.network_id, hash, id: run.id }, transaction },
        );
      }
      await sequelize().query(
        `UPDATE metric_runs SET status = 'succeeded', worker_id = NULL, finished_at = now(),
                duration_ms = (EXTRACT(EPOCH FROM (now() - started_at)) * 1000)::int,
                results = CAST(:results AS jsonb), objective = :objective, q = :q, modules = :modules, nodf = :nodf,
                null_model = :nullModel, null_mean = :nullMean, null_sd = :nullSd, z = :z, q_rel = :qRel, p = :p,
                algorithm_name = :algName, algorithm_version = :algVersion, seed = :seed, error = NULL, updated_at = now()
          WHERE id = :id`,
        {
          replacements: {
            id: run.id,
            results: JSON.stringify({ phase: "complete", analysis, nullQs, nullQsByModel }),
            nullModel: n?.model ?? null,
            objective: analysis.modularity.objective,
            q: analysis.modularity.Q,
            modules: analysis.modularity.modules,
            nodf: analysis.nodf,
            nullMean: n?.mean ?? null,
            nullSd: n?.sd ?? null,
            z: n?.z ?? null,
            qRel: n?.qRel ?? null,
            p: n?.p ?? null,
            algName: analysis.algorithm.name,
            algVersion: analysis.algorithm.version,
            seed: analysis.algorithm.seed,
          },
          transaction,
        },
      );
      await writeNullFigures(run.id, analysis, transaction);
    });
  } catch (err) {
    // Another run of the same network and settings succeeded first (unique index): keep that one.
    if ((err as { name?: string }).name === "SequelizeUniqueConstraintError") {
      await sequelize().query(
        `UPDATE metric_runs SET status = 'superseded', worker_id = NULL, error = 'another run with these settings succeeded first',
                finished_at = now(), updated_at = now() WHERE id = :id AND status = 'running'`,
        { replacements: { id: run.id } },
      );
    } else throw err;
  }
  await finishBatchIfDone(run.batch_id);
  await notifyFiguresIfDone(run.id);
}

/** The pg-boss handler: one job at a time; failure on the last attempt is recorded, not thrown. */
export async function handleJob(job: PgBoss.JobWithMetadata<MetricsJobData>): Promise<void> {
  const runId = Number(job.data?.runId);
  if (!Number.isInteger(runId)) return;
  try {
    await computeJob(job, runId);
  } finally {
    // Between its jobs (observed done, nulls waiting) a run belongs to no worker: nothing to watch.
    await sequelize()
      .query(`UPDATE metric_runs SET worker_id = NULL WHERE id = :runId AND worker_id = :me`, { replacements: { runId, me: WORKER_ID } })
      .catch((err: unknown) => logger.warn({ runId, err: errorMessage(err) }, "metrics run: could not clear its worker"));
  }
}

async function computeJob(job: PgBoss.JobWithMetadata<MetricsJobData>, runId: number): Promise<void> {
  try {
    await processRun(runId, job.data.phase === "observed" ? "observed" : "nulls");
  } catch (err) {
    // Interrupted by this process stopping: the queue retries the job elsewhere or at the next start.
    if (stopping) throw err;
    const message = errorMessage(err);
    if (err instanceof ConfigurationError) {
      logger.warn({ runId, err: message }, "metrics run refused: configuration error (not retried)");
      await markRunFailed(runId, err.message, "configuration");
      return;
    }
    const run = await loadRun(runId);
    const lastAttempt = job.retryCount >= job.retryLimit || (run?.attempts ?? 0) >= MAX_ATTEMPTS;
    logger.warn({ runId, attempt: job.retryCount + 1, lastAttempt, err: message }, "metrics job failed");
    if (lastAttempt) await markRunFailed(runId, message);
    else throw err;
  }
}

/**
 * Published networks that never had a metric run (e.g. published while the hand-over failed, or inserted
 * by a script): queued with the current settings.
 */
export async function queueNeverComputed(): Promise<number> {
  const rows = await sequelize().query<{ id: number }>(
    `SELECT n.id FROM networks n JOIN dataset_versions v ON v.id = n.version_id
      WHERE v.state = 'published' AND NOT EXISTS (SELECT 1 FROM metric_runs r WHERE r.network_id = n.id)
      ORDER BY n.id LIMIT 10000`,
    { type: QueryTypes.SELECT },
  );
  if (rows.length) await enqueueNetworkMetrics(rows.map((r) => r.id));
  return rows.length;
}

/**
 * Runs whose worker died: running, held by a worker whose last heartbeat is older than
 * TB_METRICS_WORKER_STALE_SECONDS (a live worker beats every TB_METRICS_HEARTBEAT_SECONDS, from its main
 * thread, while the computation runs on its threads). Their active jobs are failed back to the queue, which
 * retries them at once on any worker (or, retries used up, the orphan sweep below re-sends the run). A run
 * is released from its dead worker, so it is taken back once, not at every sweep.
 */
export async function reclaimDeadWorkerRuns(): Promise<{ reclaimed: number; jobs: number }> {
  const stale = jobSettings().metricsWorkerStaleSeconds;
  const runs = await sequelize().query<{ id: number; worker_id: string }>(
    `WITH dead AS (
       SELECT id, worker_id FROM metric_runs
        WHERE status = 'running' AND worker_id IS NOT NULL AND heartbeat_at < now() - make_interval(secs => :stale)
        FOR UPDATE SKIP LOCKED)
     UPDATE metric_runs r SET worker_id = NULL, updated_at = now() FROM dead WHERE r.id = dead.id
     RETURNING r.id, dead.worker_id`,
    { replacements: { stale }, type: QueryTypes.SELECT },
  );
  if (!runs.length) return { reclaimed: 0, jobs: 0 };
  const jobs = await sequelize().query<{ id: string }>(
    `SELECT id FROM pgboss.job WHERE name = :queue AND state = 'active' AND (data->>'runId')::int IN (:ids)`,
    { replacements: { queue: METRICS_QUEUE, ids: runs.map((r) => r.id) }, type: QueryTypes.SELECT },
  );
  if (jobs.length) {
    const boss = await getBoss();
    for (const j of jobs) await boss.fail(METRICS_QUEUE, j.id, { reason: `worker stopped: no heartbeat for ${stale} s` });
  }
  logger.warn({ runs: runs.map((r) => ({ runId: r.id, worker: r.worker_id })), jobs: jobs.length }, "metrics sweeper: took back the runs of a dead worker");
  return { reclaimed: runs.length, jobs: jobs.length };
}

/**
 * Runs that should have a job but have none (never sent, or lost with a killed worker after the queue gave
 * up): re-sent, or failed for good after MAX_ATTEMPTS starts. Then published networks never computed.
 */
export async function sweepOrphanRuns(): Promise<{ resent: number; failed: number; queued: number }> {
  const orphans = await sequelize().query<{ id: number; network_id: number; settings_hash: string; attempts: number; observed: boolean }>(
    `SELECT r.id, r.network_id, r.settings_hash, r.attempts, (r.results->>'phase' = 'observed') IS TRUE AS observed FROM metric_runs r
      WHERE r.status IN ('queued', 'running')
        AND NOT EXISTS (SELECT 1 FROM pgboss.job j WHERE j.name = :queue AND j.state IN ('created', 'retry', 'active')
                          AND (j.data->>'runId')::int = r.id)
      ORDER BY r.id`,
    { replacements: { queue: METRICS_QUEUE }, type: QueryTypes.SELECT },
  );
  let failed = 0;
  const resend: Array<{ id: number; networkId: number; settingsHash: string; phase: MetricsPhase }> = [];
  for (const r of orphans) {
    if (r.attempts >= MAX_ATTEMPTS) {
      await markRunFailed(r.id, `the job was started ${r.attempts} times and never finished (worker stopped or timed out)`);
      failed++;
    } else resend.push({ id: r.id, networkId: r.network_id, settingsHash: r.settings_hash, phase: r.observed ? "nulls" : "observed" });
  }
  await sendRunJobs(resend);
  const queued = await queueNeverComputed();
  return { resent: resend.length, failed, queued };
}

let workerIds: string[] = [];
let stopping = false;
let sweepTimer: NodeJS.Timeout | undefined;
let heartbeatTimer: NodeJS.Timeout | undefined;

/** Beats for every run this process computes (reclaimDeadWorkerRuns watches for beats that stop). */
export async function heartbeat(): Promise<number> {
  const [, meta] = (await sequelize().query(`UPDATE metric_runs SET heartbeat_at = now() WHERE worker_id = :me AND status = 'running'`, { replacements: { me: WORKER_ID } })) as [unknown, { rowCount?: number }];
  return meta?.rowCount ?? 0;
}

/**
 * Starts working the queue in this process: `concurrency` jobs at a time (default 2: while one job runs its
 * single-threaded observed phase, another one's null replicates keep the other threads busy).
 */
export async function startMetricsWorker(opts: { concurrency?: number; pollingIntervalSeconds?: number } = {}): Promise<void> {
  stopping = false;
  const boss = await getBoss();
  const concurrency = opts.concurrency ?? jobSettings().metricsConcurrency;
  const pollingIntervalSeconds = opts.pollingIntervalSeconds ?? jobSettings().metricsPollSeconds;
  for (let i = 0; i < concurrency; i++) {
    let id = "";
    id = await boss.work<MetricsJobData>(METRICS_QUEUE, { batchSize: 1, includeMetadata: true, pollingIntervalSeconds }, async (jobs) => {
      for (const job of jobs) await handleJob(job);
      // Fetch the next job at once rather than after the polling interval.
      if (id) boss.notifyWorker(id);
    });
    registerLocalWorker(id);
    workerIds.push(id);
  }
  const settings = jobSettings();
  heartbeatTimer = setInterval(() => void heartbeat().catch((err: unknown) => logger.warn({ err: errorMessage(err) }, "metrics heartbeat failed")), settings.metricsHeartbeatSeconds * 1000);
  heartbeatTimer.unref();
  const sweep = () =>
    reclaimDeadWorkerRuns()
      .then(() => sweepOrphanRuns())
      .then(
        (r) => r.resent + r.failed + r.queued > 0 && logger.info(r, "metrics sweeper"),
        (err: unknown) => logger.warn({ err }, "metrics sweeper failed"),
      );
  await sweep();
  sweepTimer = setInterval(() => void sweep(), settings.metricsSweepSeconds * 1000);
  sweepTimer.unref();
}

/**
 * Stops taking jobs, lets running ones finish (up to `timeoutMs`), then closes the queue and the pool. Jobs
 * still running then are failed back to the queue by pg-boss (state "retry"): another worker, or this one
 * at its next start, continues them, reusing the observed phase already stored.
 */
export async function stopMetricsWorker(opts: { timeoutMs?: number } = {}): Promise<void> {
  stopping = true;
  if (sweepTimer) clearInterval(sweepTimer);
  sweepTimer = undefined;
  if (heartbeatTimer) clearInterval(heartbeatTimer);
  heartbeatTimer = undefined;
  workerIds = [];
  await stopQueue({ graceful: true, timeoutMs: opts.timeoutMs ?? 30_000 });
  await closePool();
}
