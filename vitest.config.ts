import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

/**
 * Three projects: `unit` (pure code: engine, shared, client utils), `server` (integration tests against
 * the real PostgreSQL started by scripts/test.sh; files run one at a time on one database) and `e2e`
 * (Chromium via playwright-core against the built client).
 */
export default defineConfig({
  // `@shared/…` is shared/, as in tsconfig.json "paths" and vite.config.ts; each project extends this.
  resolve: { alias: [{ find: /^@shared\//, replacement: fileURLToPath(new URL("./shared/", import.meta.url)) }] },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: "unit",
          include: ["tests/shared/**/*.test.ts", "tests/client/**/*.test.ts", "tests/scripts/**/*.test.ts"],
          environment: "node",
          testTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "server",
          include: ["tests/server/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/setup/global-db.ts"],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/setup/global-db.ts"],
          fileParallelism: false,
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
