/**
 * Vitest setup file of the database projects: points this worker at its own database (tests/setup/workers.ts)
 * before a test file imports anything that reads DATABASE_URL.
 */
import { workerDatabaseUrl } from "./workers";

process.env.TB_TEST_BASE_DATABASE_URL ??= process.env.DATABASE_URL;
const base = process.env.TB_TEST_BASE_DATABASE_URL;
if (!base) throw new Error("Database tests need DATABASE_URL pointing at a *_test database: run them through `npm test`.");
process.env.DATABASE_URL = workerDatabaseUrl(base, process.env.VITEST_POOL_ID ?? "1");
