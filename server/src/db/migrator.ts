/**
 * Migrations with Umzug. Run in their own Sequelize instance, so the app's instance reads PostgreSQL's
 * type OIDs after the migrations created the types. The app migrates on start, never `sync()`.
 */
import { readdirSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import type { QueryInterface, Sequelize } from "sequelize";
import { SequelizeStorage, Umzug } from "umzug";
import { createSequelize } from "./sequelize";

export interface MigrationContext {
  queryInterface: QueryInterface;
  sequelize: Sequelize;
}
export type MigrationFn = (ctx: MigrationContext) => Promise<void>;

// migrations/ beside this module: the TypeScript sources, or their compiled .js files beside the compiled
// server (dist/server/migrations, scripts/build-server.ts). A migration's name is its file name without
// the extension either way.
const migrationsDir = join(dirname(fileURLToPath(import.meta.url)), "migrations");

export function createMigrator(seq: Sequelize) {
  const files = readdirSync(migrationsDir)
    .filter((f) => /^\d{8}-\d{4}-[a-z0-9-]+\.(ts|js)$/.test(f))
    .sort();
  return new Umzug<MigrationContext>({
    migrations: files.map((f) => {
      const path = join(migrationsDir, f);
      const load = async () => (await import(pathToFileURL(path).href)) as { up: MigrationFn; down: MigrationFn };
      return {
        name: f.replace(/\.(ts|js)$/, ""),
        up: async ({ context }) => (await load()).up(context),
        down: async ({ context }) => (await load()).down(context),
      };
    }),
    context: { queryInterface: seq.getQueryInterface(), sequelize: seq },
    storage: new SequelizeStorage({ sequelize: seq }),
    logger: undefined,
  });
}

/** Applies all pending migrations to the database at `url`, using a private connection. */
export async function migrateUp(url: string): Promise<string[]> {
  // One connection, so the advisory lock below guards every statement: two processes (e.g. two test
  // projects, or a web server and a worker) starting together migrate one after the other.
  const seq = createSequelize(url, { pool: 1 });
  try {
    await seq.query("SELECT pg_advisory_lock(727364001)");
    const done = await createMigrator(seq).up();
    await seq.query("SELECT pg_advisory_unlock(727364001)");
    return done.map((m) => m.name);
  } finally {
    await seq.close();
  }
}
