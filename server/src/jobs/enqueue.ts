/**
 * The hand-over from publishing to the metrics pipeline: queue one metrics job per network. Called inside
 * or right after the publishing transaction. The pipeline (jobs/metrics-*.ts) owns the implementation.
 */
import type { Transaction } from "sequelize";

export interface EnqueueOptions {
  transaction?: Transaction;
  /** Recompute even when a successful run with the same settings exists. */
  force?: boolean;
}

/** Queues metrics for these networks. Must never make publishing fail. */
export async function enqueueNetworkMetrics(networkIds: number[], _opts: EnqueueOptions = {}): Promise<void> {
  // Replaced by the metrics pipeline's queue (pg-boss); until then there is nothing to queue into.
  void networkIds;
}
