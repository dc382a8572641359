/**
 * What each submission of a version held, so curators see what changed between a submission and the
 * resubmission. `submission_snapshots` has one row per submit of a version (round 1, 2, …): the study
 * metadata and, per network, its file (SHA-256), how it was read, its counts, metadata and the SHA-256 of
 * its canonical form. The canonical forms themselves go to `canonical_snapshots`, keyed by that hash, so a
 * network unchanged between rounds is stored once. Files are referred to by hash only: removing a network
 * (and its orphaned file) never breaks an earlier snapshot.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    CREATE TABLE canonical_snapshots (
      sha256      CHAR(64) PRIMARY KEY,
      canonical   JSONB NOT NULL,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE TABLE submission_snapshots (
      id            SERIAL PRIMARY KEY,
      version_id    INTEGER NOT NULL REFERENCES dataset_versions(id) ON DELETE CASCADE,
      round         INTEGER NOT NULL CHECK (round >= 1),
      submitted_at  TIMESTAMPTZ NOT NULL,
      submitted_by  INTEGER REFERENCES users(id) ON DELETE SET NULL,
      metadata      JSONB NOT NULL,
      networks      JSONB NOT NULL,
      created_at    TIMESTAMPTZ NOT NULL DEFAULT now(),
      UNIQUE (version_id, round)
    );
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`DROP TABLE IF EXISTS submission_snapshots, canonical_snapshots;`);
};
