/**
 * Each published network keeps its matrix as the CSV a bundle holds (text ready to copy into the zip), so
 * a bundle of a thousand networks copies stored bytes instead of parsing and rewriting every matrix.
 * `matrix_csv_format` says which writer made the bytes: bundles use them only when it is the current
 * one, and rows of another format are written again (server/src/api/bundles/bundles.stored-csv.ts).
 * NULL for drafts, for networks over the size limit (written from the canonical form at bundle time) and
 * until filled. Never changes once written: published versions are frozen.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    ALTER TABLE networks ADD COLUMN matrix_csv TEXT;
    ALTER TABLE networks ADD COLUMN matrix_csv_format SMALLINT;
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`ALTER TABLE networks DROP COLUMN IF EXISTS matrix_csv, DROP COLUMN IF EXISTS matrix_csv_format;`);
};
