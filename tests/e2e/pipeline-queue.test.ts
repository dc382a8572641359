/**
 * The Queue panel of the metrics pipeline page in Chromium: networks queued by publishing (no batch), as on
 * the first start with the demo catalogue. Five networks are handed to the pipeline by the publishing
 * hand-over; the worker's observed phase is run for two of them before the page opens, so the panel shows
 * "2 of 5 with observed figures, 0 of 5 with null-model figures"; then the worker starts and the page
 * (polling every 2 s) follows the queue to the plain idle statement.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, signInViaApi, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { sequelize } from "../../server/src/db/sequelize";
import { enqueueNetworkMetrics } from "../../server/src/pipeline/enqueue";
import { processRun, startMetricsWorker, stopMetricsWorker } from "../../server/src/pipeline/metrics-worker";
import { setPipelineSettings } from "../../server/src/pipeline/settings";
import { createUser, TEST_PASSWORD } from "../server/support/accounts";
import { clearQueue, publishMatrices, randomMatrix } from "../server/support/pipeline-fixtures";

let stack: TestStack;
let browser: BrowserSession;
let runIds: number[] = [];

beforeAll(async () => {
  process.env.TB_METRICS_RETRY_DELAY_SECONDS = "1";
  process.env.TB_METRICS_THREADS = "2";
  await resetDatabase();
  await clearQueue((sql) => sequelize().query(sql));
  stack = await startStack();
  await setPipelineSettings({ objective: "auto", restarts: 3, nullModels: "standard", nulls: 8, seed: 7, annealing: "off" });
  await createUser({ role: "admin", email: "admin@queue-e2e.test" });
  const { networkIds } = await publishMatrices([
    randomMatrix(61, 8, 10, 0.3),
    randomMatrix(62, 12, 9, 0.25),
    randomMatrix(63, 7, 7, 0.4),
    randomMatrix(64, 10, 6, 0.35),
    randomMatrix(65, 9, 9, 0.3),
  ]);
  await enqueueNetworkMetrics(networkIds);
  const rows = await sequelize().query<{ id: number }>(`SELECT id FROM metric_runs ORDER BY id`, { type: QueryTypes.SELECT });
  runIds = rows.map((r) => r.id);
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
  await stopMetricsWorker();
  await stack?.stop();
});

describe("metrics pipeline page, Queue panel", () => {
  it("shows the progress of newly published networks, then says plainly that nothing waits", async () => {
    expect(runIds).toHaveLength(5);
    // The worker's first phase for two networks: observed figures stored, null replicates pending.
    await processRun(runIds[0], "observed");
    await processRun(runIds[1], "observed");
    await clearQueue((sql) => sequelize().query(sql)); // the worker started below re-sends through its sweeper

    const { page } = browser;
    await signInViaApi(page, stack.url, "admin@queue-e2e.test", TEST_PASSWORD);
    await page.goto(stack.url + "/admin/pipeline");
    await page.getByRole("heading", { name: "Queue", level: 2 }).waitFor();
    await page.getByText("Newly published networks: 2 of 5 with observed figures, 0 of 5 with null-model figures — estimating the time left.").waitFor();
    const observedBar = page.getByRole("progressbar", { name: /Observed figures/ });
    expect(await observedBar.getAttribute("aria-valuenow")).toBe("40");
    expect(await page.getByRole("progressbar", { name: /Null-model figures/ }).getAttribute("aria-valuenow")).toBe("0");
    // The batch section is still there, below.
    await page.getByText("No batch has been started yet.", { exact: true }).waitFor();
    await screenshot(page, "pipeline-queue-progress");
    expect(await axeSerious(page)).toEqual([]);

    await startMetricsWorker({ pollingIntervalSeconds: 0.5 });
    await page
      .getByText("Nothing is waiting: every queued network has been computed with the current settings. The last 5 newly published networks are finished.")
      .waitFor({ timeout: 90_000 });
    await expect(observedBar.count()).resolves.toBe(0);
    await screenshot(page, "pipeline-queue-idle");
    const [{ n }] = await sequelize().query<{ n: number }>(`SELECT count(*)::int AS n FROM metric_runs WHERE status = 'succeeded'`, { type: QueryTypes.SELECT });
    expect(n).toBe(5);
  });
});
