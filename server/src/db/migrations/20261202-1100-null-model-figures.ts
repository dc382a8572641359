/**
 * Significance figures per null model: every run stores the figures of each null model it computed in
 * `metric_run_nulls` (one row per run and model, the primary flagged), and the run names its primary null
 * in `null_model` (its z, q_rel and p columns are the primary's). A failed run records whether it failed
 * on its configuration (a null model that does not fit the network: never retried) or on the computation.
 * Runs computed before null-model sets are backfilled from their stored analysis (one model each, named
 * in the analysis itself).
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    ALTER TABLE metric_runs ADD COLUMN null_model TEXT;
    ALTER TABLE metric_runs ADD COLUMN error_kind TEXT CHECK (error_kind IN ('configuration', 'computation'));
    CREATE TABLE metric_run_nulls (
      run_id          INTEGER NOT NULL REFERENCES metric_runs(id) ON DELETE CASCADE,
      model           TEXT NOT NULL,
      is_primary      BOOLEAN NOT NULL,
      n               INTEGER NOT NULL,
      mean            DOUBLE PRECISION,
      sd              DOUBLE PRECISION,
      z               DOUBLE PRECISION,
      z_se            DOUBLE PRECISION,
      q_rel           DOUBLE PRECISION,
      delta_q         DOUBLE PRECISION,
      p               DOUBLE PRECISION,
      p_se            DOUBLE PRECISION,
      p_at_floor      BOOLEAN NOT NULL DEFAULT false,
      unstable        BOOLEAN NOT NULL DEFAULT false,
      unstable_reason TEXT,
      nodf_mean       DOUBLE PRECISION,
      nodf_z          DOUBLE PRECISION,
      nodf_p          DOUBLE PRECISION,
      PRIMARY KEY (run_id, model)
    );
    CREATE INDEX metric_run_nulls_model ON metric_run_nulls (model, run_id);

    UPDATE metric_runs SET null_model = results #>> '{analysis,null,model}'
     WHERE results #>> '{analysis,null,model}' IS NOT NULL;
    INSERT INTO metric_run_nulls (run_id, model, is_primary, n, mean, sd, z, q_rel, delta_q, p, p_at_floor, unstable, unstable_reason)
    SELECT id, results #>> '{analysis,null,model}', true, COALESCE((results #>> '{analysis,null,n}')::int, 0),
           (results #>> '{analysis,null,mean}')::float8, (results #>> '{analysis,null,sd}')::float8,
           (results #>> '{analysis,null,z}')::float8, (results #>> '{analysis,null,qRel}')::float8,
           (results #>> '{analysis,null,deltaQ}')::float8, (results #>> '{analysis,null,p}')::float8,
           COALESCE((results #>> '{analysis,null,p}')::float8 * ((results #>> '{analysis,null,n}')::int + 1) < 1.000001, false),
           COALESCE((results #>> '{analysis,null,unstable}')::boolean, false), results #>> '{analysis,null,unstableReason}'
      FROM metric_runs
     WHERE status IN ('succeeded', 'superseded') AND results #>> '{analysis,null,model}' IS NOT NULL;
    UPDATE metric_runs SET error_kind = 'computation' WHERE status = 'failed';
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    DROP TABLE IF EXISTS metric_run_nulls;
    ALTER TABLE metric_runs DROP COLUMN IF EXISTS null_model;
    ALTER TABLE metric_runs DROP COLUMN IF EXISTS error_kind;
  `);
};
