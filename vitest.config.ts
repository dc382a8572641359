import { defineConfig } from "vitest/config";

/**
 * Three projects: `unit` (pure code: engine, shared, client utils), `server` (integration tests against
 * the real PostgreSQL started by scripts/test.sh; files run one at a time on one database) and `e2e`
 * (Chromium via playwright-core against the built client).
 */
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: "unit",
          include: ["tests/shared/**/*.test.ts", "tests/client/**/*.test.ts", "tests/scripts/**/*.test.ts"],
          environment: "node",
          testTimeout: 60_000,
        },
      },
      {
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
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/setup/global-db.ts"],
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
