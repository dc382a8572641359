/**
 * A stored matrix CSV (networks.matrix_csv) is derived from the network's canonical form, and published
 * versions are frozen, so it never goes stale through the application. This trigger makes that hold for
 * any other writer too (a repair by hand, a later data migration): changing `canonical` clears the stored
 * CSV, and bundles write it from the new form until the fill stores it again.
 */
import type { MigrationFn } from "../migrator";

export const up: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    CREATE OR REPLACE FUNCTION networks_clear_matrix_csv() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      NEW.matrix_csv := NULL;
      NEW.matrix_csv_format := NULL;
      RETURN NEW;
    END $$;
    CREATE TRIGGER networks_matrix_csv_follows_canonical
      BEFORE UPDATE OF canonical ON networks
      FOR EACH ROW WHEN (OLD.canonical IS DISTINCT FROM NEW.canonical)
      EXECUTE FUNCTION networks_clear_matrix_csv();
  `);
};

export const down: MigrationFn = async ({ sequelize }) => {
  await sequelize.query(`
    DROP TRIGGER IF EXISTS networks_matrix_csv_follows_canonical ON networks;
    DROP FUNCTION IF EXISTS networks_clear_matrix_csv();
  `);
};
