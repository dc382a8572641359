import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

/**
 * Three projects: `unit` (pure code: engine, shared, client utils), `server` (integration tests against
 * the real PostgreSQL started by scripts/test.sh) and `e2e` (Chromium via playwright-core against the
 * built client). Files run in `maxWorkers` workers, one file per worker at a time, each worker on a
 * database of its own (tests/setup/workers.ts). Two workers unless TB_TEST_WORKERS says otherwise: on this
 * 2-core machine a file runs while another waits on its server, PostgreSQL or Chromium (BENCHMARKS.md,
 * "npm test": a quiet full run passed with 2 and with 3 workers). All projects need the same `maxWorkers`
 * to share one group of workers.
 */
const maxWorkers = Number(process.env.TB_TEST_WORKERS) || 2;

export default defineConfig({
  // `@shared/…` is shared/, as in tsconfig.json "paths" and vite.config.ts; each project extends this.
  resolve: { alias: [{ find: /^@shared\//, replacement: fileURLToPath(new URL("./shared/", import.meta.url)) }] },
  test: {
    maxWorkers,
    projects: [
      {
        extends: true,
        test: {
          name: "unit",
          include: ["tests/shared/**/*.test.ts", "tests/client/**/*.test.ts", "tests/scripts/**/*.test.ts"],
          environment: "node",
          maxWorkers,
          testTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "server",
          include: ["tests/server/**/*.test.ts"],
          // One process per worker imports the server once for all its files (about 4 s of imports saved per file);
          // tests/setup/file-state.ts puts back what a file changed in the environment and the settings.
          isolate: false,
          environment: "node",
          globalSetup: ["tests/setup/global-db.ts"],
          setupFiles: ["tests/setup/worker-db.ts", "tests/setup/file-state.ts"],
          maxWorkers,
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          // As the server project: a worker imports the server and playwright once for all its files.
          isolate: false,
          environment: "node",
          globalSetup: ["tests/setup/global-db.ts"],
          setupFiles: ["tests/setup/worker-db.ts", "tests/setup/file-state.ts"],
          maxWorkers,
          testTimeout: 120_000,
          hookTimeout: 120_000,
          // expect.poll waits like a locator does (15 s), not vitest's 1 s default: an upload is parsed in a
          // child process and a page may still be fetching when a check starts.
          expect: { poll: { timeout: 15_000 } },
        },
      },
    ],
  },
});
