/**
 * How a network's stored file was read, beyond kind, direction and layout: the workbook sheet and what
 * cells without a number mean (`{ sheet?, missing?, blank? }`, the parser's options). Reading the file
 * again (another kind, or a correction) starts from these, so the depositor's answers are never lost.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`ALTER TABLE networks ADD COLUMN read_options JSONB NOT NULL DEFAULT '{}'::jsonb;`);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`ALTER TABLE networks DROP COLUMN IF EXISTS read_options;`);
};
