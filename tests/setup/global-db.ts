/**
 * Vitest global setup for database tests: requires DATABASE_URL (scripts/test.sh starts a throwaway
 * cluster and sets it) and applies the migrations once.
 */
import { migrateUp } from "../../server/src/db/migrator";

export default async function setup(): Promise<void> {
  const url = process.env.DATABASE_URL;
  if (!url || !/tanglebank_test/.test(url)) {
    throw new Error("Database tests need DATABASE_URL pointing at a *_test database: run them through `npm test`.");
  }
  await migrateUp(url);
}
