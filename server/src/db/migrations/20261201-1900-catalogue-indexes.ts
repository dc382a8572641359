/**
 * Indexes for the public catalogue and bundles: the latest published version of each dataset, the latest
 * successful metric run of each network, and a cheap "has anything changed?" check (max timestamps).
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    CREATE INDEX IF NOT EXISTS dataset_versions_published_latest
      ON dataset_versions (dataset_id, number DESC) WHERE state = 'published';
    CREATE INDEX IF NOT EXISTS dataset_versions_changed
      ON dataset_versions (updated_at) WHERE state IN ('published', 'withdrawn');
    CREATE INDEX IF NOT EXISTS networks_version_position ON networks (version_id, position);
    CREATE INDEX IF NOT EXISTS metric_runs_succeeded_latest
      ON metric_runs (network_id, finished_at DESC, id DESC) WHERE status = 'succeeded';
    CREATE INDEX IF NOT EXISTS metric_runs_changed ON metric_runs (updated_at);
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    DROP INDEX IF EXISTS dataset_versions_published_latest, dataset_versions_changed, networks_version_position,
      metric_runs_succeeded_latest, metric_runs_changed;
  `);
};
