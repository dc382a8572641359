/**
 * The initial schema: accounts and sessions, audit log, datasets with versions and networks, stored
 * files (bytes kept in PostgreSQL so that an upload is one transaction: no orphan files), reviews, and the
 * metrics pipeline's batches and runs.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    CREATE TYPE user_role AS ENUM ('depositor', 'curator', 'admin');
    CREATE TABLE users (
      id              SERIAL PRIMARY KEY,
      email           TEXT NOT NULL,
      password_hash   TEXT NOT NULL,
      display_name    TEXT NOT NULL,
      affiliation     TEXT,
      orcid           TEXT,
      role            user_role NOT NULL DEFAULT 'depositor',
      email_verified_at TIMESTAMPTZ,
      created_at      TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at      TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX users_email_lower ON users (lower(email));

    -- One-time links sent by e-mail (address verification, password reset); only a hash is stored.
    CREATE TABLE user_tokens (
      id          SERIAL PRIMARY KEY,
      user_id     INTEGER NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      purpose     TEXT NOT NULL CHECK (purpose IN ('verify-email', 'reset-password')),
      token_hash  TEXT NOT NULL UNIQUE,
      expires_at  TIMESTAMPTZ NOT NULL,
      used_at     TIMESTAMPTZ,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    -- Personal API tokens (Bearer); only a hash is stored.
    CREATE TABLE api_tokens (
      id            SERIAL PRIMARY KEY,
      user_id       INTEGER NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      name          TEXT NOT NULL,
      token_hash    TEXT NOT NULL UNIQUE,
      token_prefix  TEXT NOT NULL,
      last_used_at  TIMESTAMPTZ,
      revoked_at    TIMESTAMPTZ,
      created_at    TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at    TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    -- express-session store (connect-pg-simple's layout).
    CREATE TABLE session (
      sid    VARCHAR NOT NULL PRIMARY KEY,
      sess   JSON NOT NULL,
      expire TIMESTAMP(6) NOT NULL
    );
    CREATE INDEX session_expire ON session (expire);

    -- Accession numbers are never reused: they come from a sequence, assigned at first publication.
    CREATE SEQUENCE accession_seq START 1;

    CREATE TABLE datasets (
      id          SERIAL PRIMARY KEY,
      owner_id    INTEGER NOT NULL REFERENCES users(id),
      accession   TEXT UNIQUE CHECK (accession ~ '^TB-[0-9]{6}$'),
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    CREATE TYPE version_state AS ENUM ('draft', 'submitted', 'changes_requested', 'published', 'declined', 'withdrawn');
    CREATE TABLE dataset_versions (
      id                SERIAL PRIMARY KEY,
      dataset_id        INTEGER NOT NULL REFERENCES datasets(id) ON DELETE CASCADE,
      number            INTEGER NOT NULL CHECK (number >= 1),
      state             version_state NOT NULL DEFAULT 'draft',
      metadata          JSONB NOT NULL DEFAULT '{}'::jsonb,
      submitted_at      TIMESTAMPTZ,
      published_at      TIMESTAMPTZ,
      withdrawn_at      TIMESTAMPTZ,
      withdrawal_reason TEXT,
      lock_version      INTEGER NOT NULL DEFAULT 0,
      created_at        TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at        TIMESTAMPTZ NOT NULL DEFAULT now(),
      UNIQUE (dataset_id, number)
    );
    CREATE INDEX dataset_versions_state ON dataset_versions (state);

    -- Uploaded files, byte for byte, content-addressed by SHA-256 (shared between versions).
    CREATE TABLE stored_files (
      id          SERIAL PRIMARY KEY,
      sha256      CHAR(64) NOT NULL UNIQUE,
      size        BIGINT NOT NULL,
      bytes       BYTEA NOT NULL,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    CREATE TYPE network_kind AS ENUM ('bipartite', 'unipartite');
    CREATE TABLE networks (
      id              SERIAL PRIMARY KEY,
      version_id      INTEGER NOT NULL REFERENCES dataset_versions(id) ON DELETE CASCADE,
      position        INTEGER NOT NULL CHECK (position >= 1),
      file_id         INTEGER NOT NULL REFERENCES stored_files(id),
      original_name   TEXT NOT NULL,
      format          TEXT NOT NULL CHECK (format IN ('matrix', 'edgelist')),
      kind            network_kind NOT NULL,
      directed        BOOLEAN NOT NULL DEFAULT false,
      weighted        BOOLEAN NOT NULL DEFAULT false,
      metadata        JSONB NOT NULL DEFAULT '{}'::jsonb,
      canonical       JSONB NOT NULL,
      n_nodes         INTEGER NOT NULL,
      n_rows          INTEGER,
      n_cols          INTEGER,
      n_links         INTEGER NOT NULL,
      total_weight    DOUBLE PRECISION NOT NULL,
      connectance     DOUBLE PRECISION,
      parse_warnings  JSONB NOT NULL DEFAULT '[]'::jsonb,
      created_at      TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at      TIMESTAMPTZ NOT NULL DEFAULT now(),
      UNIQUE (version_id, position)
    );
    CREATE INDEX networks_file ON networks (file_id);

    CREATE TYPE review_decision AS ENUM ('publish', 'request_changes', 'decline');
    CREATE TABLE reviews (
      id          SERIAL PRIMARY KEY,
      version_id  INTEGER NOT NULL REFERENCES dataset_versions(id) ON DELETE CASCADE,
      curator_id  INTEGER NOT NULL REFERENCES users(id),
      decision    review_decision NOT NULL,
      comment     TEXT,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    -- Every state change and curator edit (who, what, on which entity, details).
    CREATE TABLE audit_log (
      id          BIGSERIAL PRIMARY KEY,
      actor_id    INTEGER REFERENCES users(id),
      action      TEXT NOT NULL,
      entity_type TEXT NOT NULL,
      entity_id   TEXT NOT NULL,
      dataset_id  INTEGER REFERENCES datasets(id) ON DELETE CASCADE,
      details     JSONB NOT NULL DEFAULT '{}'::jsonb,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX audit_log_dataset ON audit_log (dataset_id, created_at);
    CREATE INDEX audit_log_entity ON audit_log (entity_type, entity_id);

    -- Metrics pipeline: settings are hashed; one batch = one job per network.
    CREATE TABLE metric_batches (
      id             SERIAL PRIMARY KEY,
      settings       JSONB NOT NULL,
      settings_hash  CHAR(64) NOT NULL,
      status         TEXT NOT NULL DEFAULT 'running' CHECK (status IN ('running', 'finished', 'cancelled')),
      total          INTEGER NOT NULL DEFAULT 0,
      force          BOOLEAN NOT NULL DEFAULT false,
      started_by     INTEGER REFERENCES users(id),
      finished_at    TIMESTAMPTZ,
      created_at     TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at     TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    CREATE TABLE metric_runs (
      id                 SERIAL PRIMARY KEY,
      network_id         INTEGER NOT NULL REFERENCES networks(id) ON DELETE CASCADE,
      batch_id           INTEGER REFERENCES metric_batches(id) ON DELETE SET NULL,
      settings           JSONB NOT NULL,
      settings_hash      CHAR(64) NOT NULL,
      status             TEXT NOT NULL CHECK (status IN ('queued', 'running', 'succeeded', 'failed')),
      algorithm_name     TEXT,
      algorithm_version  TEXT,
      seed               BIGINT,
      attempts           INTEGER NOT NULL DEFAULT 0,
      started_at         TIMESTAMPTZ,
      finished_at        TIMESTAMPTZ,
      duration_ms        INTEGER,
      error              TEXT,
      results            JSONB,
      -- copies of headline results for fast catalogue filters and sorting
      objective          TEXT,
      q                  DOUBLE PRECISION,
      modules            INTEGER,
      null_mean          DOUBLE PRECISION,
      null_sd            DOUBLE PRECISION,
      z                  DOUBLE PRECISION,
      q_rel              DOUBLE PRECISION,
      p                  DOUBLE PRECISION,
      nodf               DOUBLE PRECISION,
      created_at         TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at         TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX metric_runs_network ON metric_runs (network_id, settings_hash, status);
    CREATE UNIQUE INDEX metric_runs_one_success ON metric_runs (network_id, settings_hash) WHERE status = 'succeeded';
    CREATE INDEX metric_runs_batch ON metric_runs (batch_id, status);

    -- Small key/value settings (e.g. the current pipeline settings).
    CREATE TABLE app_settings (
      key         TEXT PRIMARY KEY,
      value       JSONB NOT NULL,
      updated_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    DROP TABLE IF EXISTS app_settings, metric_runs, metric_batches, audit_log, reviews, networks, stored_files,
      dataset_versions, datasets, session, api_tokens, user_tokens, users CASCADE;
    DROP SEQUENCE IF EXISTS accession_seq;
    DROP TYPE IF EXISTS review_decision, network_kind, version_state, user_role;
  `);
};
