/**
 * DOIs of published datasets: one "concept" DOI per dataset (always resolving to the latest version) and
 * one per published version. A row is written in the publishing transaction (state `pending`); the DOI
 * job registers it with DataCite after the commit (`registered`). `requested_at` moves whenever the
 * metadata DataCite should hold changes (a publication, a new version, a withdrawal); the job records in
 * `synced_at` the request it has sent, and `sent_hash` the SHA-256 of the attributes DataCite holds, so a
 * retried job sends nothing twice. DOIs are never deleted: a withdrawn version's DOI keeps resolving to
 * its tombstone page.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    CREATE TABLE dataset_dois (
      id SERIAL PRIMARY KEY,
      doi TEXT NOT NULL,
      dataset_id INTEGER NOT NULL REFERENCES datasets(id),
      version_id INTEGER REFERENCES dataset_versions(id),
      state TEXT NOT NULL DEFAULT 'pending' CHECK (state IN ('pending', 'registered')),
      requested_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      synced_at TIMESTAMPTZ,
      sent_hash TEXT,
      registered_at TIMESTAMPTZ,
      attempts INTEGER NOT NULL DEFAULT 0,
      last_error TEXT,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX dataset_dois_doi ON dataset_dois (lower(doi));
    CREATE UNIQUE INDEX dataset_dois_concept ON dataset_dois (dataset_id) WHERE version_id IS NULL;
    CREATE UNIQUE INDEX dataset_dois_version ON dataset_dois (version_id) WHERE version_id IS NOT NULL;
    CREATE INDEX dataset_dois_unsynced ON dataset_dois (dataset_id) WHERE synced_at IS NULL OR synced_at < requested_at;
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`DROP TABLE IF EXISTS dataset_dois;`);
};
