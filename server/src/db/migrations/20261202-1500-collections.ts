/**
 * Collections: a named, citable set of networks saved by a signed-in user (a meta-analysis's exact set).
 * Each has a code `TBC-` + six digits from its own sequence (never reused) and a revision number that
 * rises with every change of its members. Members are networks of exact dataset versions; a removed
 * member keeps its row with the revision that removed it, so the members of any earlier revision can be
 * listed again (a citation names its revision). Withdrawn networks stay members: their version keeps its
 * tombstone.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    CREATE SEQUENCE collection_seq START 1;
    CREATE TABLE collections (
      id           SERIAL PRIMARY KEY,
      code         TEXT NOT NULL UNIQUE CHECK (code ~ '^TBC-[0-9]{6}$'),
      owner_id     INTEGER NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      name         TEXT NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      description  TEXT NOT NULL DEFAULT '',
      visibility   TEXT NOT NULL DEFAULT 'private' CHECK (visibility IN ('public', 'private')),
      revision     INTEGER NOT NULL DEFAULT 1 CHECK (revision >= 1),
      saved_from   JSONB,
      created_at   TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at   TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX collections_owner ON collections (owner_id, created_at);
    CREATE TABLE collection_members (
      id                SERIAL PRIMARY KEY,
      collection_id     INTEGER NOT NULL REFERENCES collections(id) ON DELETE CASCADE,
      network_id        INTEGER NOT NULL REFERENCES networks(id),
      position          INTEGER NOT NULL,
      added_revision    INTEGER NOT NULL,
      removed_revision  INTEGER CHECK (removed_revision IS NULL OR removed_revision > added_revision),
      added_at          TIMESTAMPTZ NOT NULL DEFAULT now(),
      removed_at        TIMESTAMPTZ,
      created_at        TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at        TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    -- a network is a current member at most once
    CREATE UNIQUE INDEX collection_members_current ON collection_members (collection_id, network_id) WHERE removed_revision IS NULL;
    CREATE INDEX collection_members_network ON collection_members (network_id);
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    DROP TABLE IF EXISTS collection_members, collections;
    DROP SEQUENCE IF EXISTS collection_seq;
  `);
};
