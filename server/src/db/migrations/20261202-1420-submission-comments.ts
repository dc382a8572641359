/**
 * The conversation on a submission between its depositor and the curators: one thread per version.
 * `side` is the part the author spoke for (the version's owner is always the depositor side, even when a
 * curator); `round` is the submission the comment followed (0 before the first, which cannot happen through
 * the API: comments open once a version is submitted).
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    CREATE TABLE submission_comments (
      id          SERIAL PRIMARY KEY,
      version_id  INTEGER NOT NULL REFERENCES dataset_versions(id) ON DELETE CASCADE,
      author_id   INTEGER REFERENCES users(id) ON DELETE SET NULL,
      side        TEXT NOT NULL CHECK (side IN ('depositor', 'curator')),
      body        TEXT NOT NULL CHECK (length(body) BETWEEN 1 AND 10000),
      round       INTEGER NOT NULL DEFAULT 0,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX submission_comments_version ON submission_comments (version_id, created_at);
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`DROP TABLE IF EXISTS submission_comments;`);
};
