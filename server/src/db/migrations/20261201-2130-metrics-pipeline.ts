/**
 * Metrics pipeline: a run can be "superseded" (a forced recompute with the same settings succeeded after
 * it; the older figures are kept for the record, and only one success per network and settings remains),
 * a run records whether it was forced (recompute even though a result with the same settings exists), and a batch records how many networks it left out because their result already existed.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    ALTER TABLE metric_runs DROP CONSTRAINT IF EXISTS metric_runs_status_check;
    ALTER TABLE metric_runs ADD CONSTRAINT metric_runs_status_check
      CHECK (status IN ('queued', 'running', 'succeeded', 'failed', 'superseded'));
    ALTER TABLE metric_batches ADD COLUMN skipped INTEGER NOT NULL DEFAULT 0;
    ALTER TABLE metric_runs ADD COLUMN force BOOLEAN NOT NULL DEFAULT false;
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    UPDATE metric_runs SET status = 'failed', error = 'superseded' WHERE status = 'superseded';
    ALTER TABLE metric_runs DROP CONSTRAINT IF EXISTS metric_runs_status_check;
    ALTER TABLE metric_runs ADD CONSTRAINT metric_runs_status_check
      CHECK (status IN ('queued', 'running', 'succeeded', 'failed'));
    ALTER TABLE metric_batches DROP COLUMN skipped;
    ALTER TABLE metric_runs DROP COLUMN force;
  `);
};
