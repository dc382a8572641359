/**
 * Helpers for integration tests: a clean database per test file.
 */
import { sequelize } from "../../server/src/db/sequelize";
import { initModels } from "../../server/src/models";

/** Empties every application table in the public schema (keeps the migration record), restarting ids. */
export async function resetDatabase(): Promise<void> {
  initModels();
  const [rows] = (await sequelize().query(
    `SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename NOT IN ('SequelizeMeta', 'sequelize_meta')`,
  )) as [Array<{ tablename: string }>, unknown];
  if (rows.length) {
    await sequelize().query(`TRUNCATE ${rows.map((r) => `"${r.tablename}"`).join(", ")} RESTART IDENTITY CASCADE`);
  }
  await sequelize().query(`ALTER SEQUENCE accession_seq RESTART WITH 1`);
}
