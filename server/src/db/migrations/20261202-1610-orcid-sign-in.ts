/**
 * Sign-in with ORCID: `orcid_verified_at` says the account's iD came from ORCID through OpenID Connect
 * (not typed by hand), and one ORCID iD verifies at most one account.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    ALTER TABLE users ADD COLUMN orcid_verified_at TIMESTAMPTZ;
    CREATE UNIQUE INDEX users_verified_orcid ON users (upper(orcid)) WHERE orcid_verified_at IS NOT NULL;
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`DROP INDEX IF EXISTS users_verified_orcid; ALTER TABLE users DROP COLUMN IF EXISTS orcid_verified_at;`);
};
