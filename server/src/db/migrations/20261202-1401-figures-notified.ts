/**
 * When the depositor was told that the figures of a published version are ready (or that some failed), so
 * the message goes once per version however many workers finish its runs.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`ALTER TABLE dataset_versions ADD COLUMN figures_notified_at TIMESTAMPTZ;`);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`ALTER TABLE dataset_versions DROP COLUMN IF EXISTS figures_notified_at;`);
};
