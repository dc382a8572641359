/**
 * Drops the PostgreSQL extensions hstore and pg_trgm, which earlier versions created on every start
 * although no column, index or query uses them (no HSTORE column, no trigram index or similarity
 * operator: search is lunr's, in the server). A fresh database never gets them.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`DROP EXTENSION IF EXISTS pg_trgm; DROP EXTENSION IF EXISTS hstore;`);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`CREATE EXTENSION IF NOT EXISTS hstore; CREATE EXTENSION IF NOT EXISTS pg_trgm;`);
};
