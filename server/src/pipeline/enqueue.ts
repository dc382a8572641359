/**
 * The hand-over from publishing to the metrics pipeline: queue one metrics job per network with the
 * current pipeline settings. Called inside the publishing transaction: the queued metric_runs rows are
 * written in a savepoint of that transaction (so the network shows "queued" as soon as it is published),
 * and the jobs are sent after the commit. Nothing here can make publishing fail: errors are logged, and a
 * queued run whose job was never sent is picked up by the worker's sweeper (metrics-worker.ts).
 */
import type { Transaction } from "sequelize";
import { sequelize } from "../db/sequelize";
import { logger } from "../lib/logger";
import { sendRunJobs } from "./queue";
import { createQueuedRuns, type QueuedRun } from "./runs";
import { getPipelineSettings } from "./settings";

export interface EnqueueOptions {
  transaction?: Transaction;
  /** Recompute even when a successful run with the same settings exists. */
  force?: boolean;
}

function sendLater(runs: QueuedRun[]) {
  sendRunJobs(runs).catch((err: unknown) =>
    logger.warn({ err }, "metrics jobs not sent now; the worker's sweeper will send them"),
  );
}

/** Queues metrics for these networks. Never throws. */
export async function enqueueNetworkMetrics(networkIds: number[], opts: EnqueueOptions = {}): Promise<void> {
  if (!networkIds.length) return;
  try {
    const { transaction, force } = opts;
    // A savepoint inside the caller's transaction: a failure here rolls back only our rows.
    const runs = await sequelize().transaction({ transaction }, async (t) => {
      const settings = await getPipelineSettings(t);
      const res = await createQueuedRuns(networkIds, { settings, force, transaction: t });
      return res.created;
    });
    if (transaction) transaction.afterCommit(() => sendLater(runs));
    else sendLater(runs);
  } catch (err) {
    logger.error({ err, networkIds }, "could not queue metrics for published networks");
  }
}
