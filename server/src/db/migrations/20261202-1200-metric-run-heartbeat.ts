/**
 * Liveness of metrics workers: the run a worker computes names it (`worker_id`) and carries its last
 * heartbeat (`heartbeat_at`), so the sweeper can tell a dead worker's run from a slow one and take its job
 * back within a minute or two instead of waiting for the job to expire (metrics-worker.ts).
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    ALTER TABLE metric_runs ADD COLUMN worker_id text, ADD COLUMN heartbeat_at timestamptz;
    CREATE INDEX metric_runs_worker_alive ON metric_runs (heartbeat_at) WHERE status = 'running' AND worker_id IS NOT NULL;`);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`DROP INDEX IF EXISTS metric_runs_worker_alive; ALTER TABLE metric_runs DROP COLUMN IF EXISTS heartbeat_at, DROP COLUMN IF EXISTS worker_id;`);
};
