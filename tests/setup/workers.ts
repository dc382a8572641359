/**
 * Test files run in parallel workers (vitest.config.ts `maxWorkers`), and each worker has a database of its
 * own: `<DATABASE_URL's database>_w<n>` for worker n (vitest's VITEST_POOL_ID, 1…maxWorkers), copied from
 * the migrated test database before the run (tests/setup/global-db.ts), so files that empty and fill the
 * database never share one at the same time.
 */

/** The database of worker `n` on the same server as `baseUrl`. */
export function workerDatabaseUrl(baseUrl: string, n: number | string): string {
  const url = new URL(baseUrl);
  url.pathname = `${url.pathname}_w${n}`;
  return url.href;
}
