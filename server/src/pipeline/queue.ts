/**
 * The metrics job queue: pg-boss in the application's database (schema "pgboss"). One queue,
 * "network-metrics", with the "stately" policy: per singleton key (network id + settings hash) at most one
 * job waits and one runs. A job carries only its metric_runs id; the run row holds network, settings and
 * state, so a job is idempotent and the sweeper (metrics-worker.ts) can re-send a run whose job was lost.
 *
 * Dead workers: the job of a worker that stopped (killed, machine lost) is taken back by the sweeper once
 * the run's heartbeat is TB_METRICS_WORKER_STALE_SECONDS old (metrics-worker.ts reclaimDeadWorkerRuns) and
 * retried on another worker, up to RETRY_LIMIT times. As a last resort a job not finished after
 * TB_METRICS_JOB_EXPIRE_SECONDS (default 3600) is expired by pg-boss's maintenance (every
 * TB_METRICS_MAINTENANCE_SECONDS, default 60) and retried too.
 */
import PgBoss from "pg-boss";
import { config, jobSettings } from "../config/env";
import { logger } from "../lib/logger";

export const METRICS_QUEUE = "network-metrics";
export const RETRY_LIMIT = 2;

/**
 * "observed": compute the observed figures, write them, then queue the "nulls" job of the same run.
 * "nulls": compute the null replicates (and the observed figures first, if missing) and finish the run.
 * Observed jobs have the higher priority, so every queued network shows S, L, C and Q before any null
 * replicates are computed (a newcomer's first `npm start` shows the observed figures within a minute).
 */
export type MetricsPhase = "observed" | "nulls";
export interface MetricsJobData {
  runId: number;
  phase?: MetricsPhase;
}

export const PHASE_PRIORITY: Record<MetricsPhase, number> = { observed: 10, nulls: 0 };

export function jobOptions() {
  const s = jobSettings();
  return {
    retryLimit: RETRY_LIMIT,
    retryDelay: s.metricsRetryDelaySeconds,
    expireInSeconds: s.metricsJobExpireSeconds,
  };
}

let boss: PgBoss | undefined;
/** Ids of the workers of this process (metrics-worker.ts), woken up when this process sends jobs. */
const localWorkers = new Set<string>();

export function registerLocalWorker(id: string): void {
  localWorkers.add(id);
}

/**
 * Wakes this process's workers so they fetch at once instead of at their next poll (pg-boss waits the
 * polling interval between fetches, even after a short job).
 */
export function notifyLocalWorkers(): void {
  if (!boss) return;
  for (const id of localWorkers) boss.notifyWorker(id);
}
let starting: Promise<PgBoss> | undefined;

/** The process's pg-boss instance, started (schema created) on first use. */
export function getBoss(): Promise<PgBoss> {
  if (boss) return Promise.resolve(boss);
  starting ??= (async () => {
    const b = new PgBoss({
      connectionString: config().databaseUrl,
      max: 4,
      schedule: false,
      maintenanceIntervalSeconds: jobSettings().metricsMaintenanceSeconds,
    });
    b.on("error", (err) => logger.error({ err }, "metrics queue error"));
    await b.start();
    await b.createQueue(METRICS_QUEUE, { name: METRICS_QUEUE, policy: "stately", ...jobOptions() });
    boss = b;
    return b;
  })();
  const p = starting;
  p.catch(() => {
    if (starting === p) starting = undefined;
  });
  return p;
}

export function singletonKey(networkId: number, hash: string): string {
  return `${networkId}:${hash.trim()}`;
}

/** Sends one job per run (duplicates of a waiting job with the same key are dropped by the queue). */
export async function sendRunJobs(runs: Array<{ id: number; networkId: number; settingsHash: string; phase?: MetricsPhase }>): Promise<void> {
  if (!runs.length) return;
  const b = await getBoss();
  const opts = jobOptions();
  for (const r of runs) {
    const phase = r.phase ?? "observed";
    await b.send(METRICS_QUEUE, { runId: r.id, phase } satisfies MetricsJobData, {
      ...opts,
      priority: PHASE_PRIORITY[phase],
      singletonKey: singletonKey(r.networkId, r.settingsHash),
    });
  }
  notifyLocalWorkers();
}

/** Stops the queue (waits up to `timeoutMs` for running handlers when graceful). */
export async function stopQueue(opts: { graceful?: boolean; timeoutMs?: number } = {}): Promise<void> {
  const b = boss ?? (starting ? await starting.catch(() => undefined) : undefined);
  boss = undefined;
  localWorkers.clear();
  starting = undefined;
  if (b) await b.stop({ graceful: opts.graceful ?? true, timeout: opts.timeoutMs ?? 30_000, wait: true });
}
