/**
 * Vitest global setup for database tests: requires DATABASE_URL (scripts/test.sh starts a throwaway
 * cluster and sets it), applies the migrations once, and copies the migrated database for every worker
 * (tests/setup/workers.ts). Both database projects name this file; the second call finds the work done.
 */
import pg from "pg";
import type { TestProject } from "vitest/node";
import { migrateUp } from "../../server/src/db/migrator";
import { workerDatabaseUrl } from "./workers";

export default async function setup(project: TestProject): Promise<void> {
  const url = process.env.DATABASE_URL;
  if (!url || !/tanglebank_test/.test(url)) {
    throw new Error("Database tests need DATABASE_URL pointing at a *_test database: run them through `npm test`.");
  }
  if (process.env.TB_TEST_WORKER_DATABASES === url) return;
  await migrateUp(url);
  const template = new URL(url).pathname.slice(1);
  const admin = new pg.Client({ connectionString: Object.assign(new URL(url), { pathname: "/postgres" }).href });
  await admin.connect();
  try {
    for (let n = 1; n <= (project.config.maxWorkers || 1); n++) {
      const name = new URL(workerDatabaseUrl(url, n)).pathname.slice(1);
      await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await admin.query(`CREATE DATABASE "${name}" TEMPLATE "${template}"`);
    }
  } finally {
    await admin.end();
  }
  process.env.TB_TEST_WORKER_DATABASES = url;
}
