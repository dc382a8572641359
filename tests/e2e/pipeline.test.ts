/**
 * The admin's metrics pipeline page in Chromium: the admin sets light settings, starts a batch over the
 * published networks and watches the progress bar reach the end (the page polls while the batch runs);
 * a network the engine cannot read shows up under Failures with its message.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, signInViaApi, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { sequelize } from "../../server/src/db/sequelize";
import { startMetricsWorker, stopMetricsWorker } from "../../server/src/pipeline/metrics-worker";
import { createUser, TEST_PASSWORD } from "../server/support/accounts";
import { clearQueue, createNetwork, matrixCsv, publishMatrices, randomMatrix } from "../server/support/pipeline-fixtures";

let stack: TestStack;
let browser: BrowserSession;

beforeAll(async () => {
  process.env.TB_METRICS_RETRY_DELAY_SECONDS = "1";
  process.env.TB_METRICS_THREADS = "2";
  await resetDatabase();
  await clearQueue((sql) => sequelize().query(sql));
  stack = await startStack();
  await startMetricsWorker({ pollingIntervalSeconds: 0.5 });
  await createUser({ role: "admin", email: "admin@pipeline-e2e.test" });
  const { versionId } = await publishMatrices([randomMatrix(51, 8, 11, 0.3), randomMatrix(52, 12, 9, 0.25), randomMatrix(53, 7, 7, 0.4)]);
  await createNetwork(versionId, 4, matrixCsv([[1, 0], [0, 1]]), { format: "not a network" });
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
  await stopMetricsWorker();
  await stack?.stop();
});

describe("metrics pipeline page", () => {
  it("the admin starts a batch and sees its progress reach the end", async () => {
    const { page } = browser;
    await signInViaApi(page, stack.url, "admin@pipeline-e2e.test", TEST_PASSWORD);
    await page.goto(stack.url + "/admin/pipeline");
    await page.getByRole("heading", { name: "Metrics pipeline", level: 1 }).waitFor();
    await page.getByText("No batch has been started yet.").first().waitFor();
    // A null model that cannot fit the published (binary) networks is refused on saving, naming each network.
    await page.getByLabel("Null models").selectOption("patefield");
    await page.getByRole("button", { name: "Save settings only" }).click();
    const unfit = page.getByRole("list", { name: "Networks these settings do not fit" });
    await unfit.waitFor();
    expect(await unfit.getByRole("listitem").count()).toBe(4);
    await unfit.getByText(/null model patefield: it is binary/).first().waitFor();
    await screenshot(page, "pipeline-settings-refused");
    await page.getByLabel("Null models").selectOption("standard");
    await page.getByLabel("Optimizer restarts").fill("2");
    await page.getByLabel("Null replicates").fill("5");
    await page.getByLabel("Seed").fill("3");
    await page.getByRole("button", { name: "Recompute all published networks" }).click();
    // A confirmation says how many networks will be computed and how many figures will change.
    const confirm = page.getByRole("alertdialog", { name: "Recompute 4 of 4 published networks?" });
    await confirm.waitFor();
    await confirm.getByRole("button", { name: "Yes, recompute 4" }).click();
    await page.getByText(/Batch #1 started: 4 networks queued/).waitFor();
    const bar = page.getByRole("progressbar", { name: "Batch 1 progress" });
    await bar.waitFor();
    // The page polls the running batch until every network is done or failed.
    await page.getByText("4 of 4 networks finished (100%)").waitFor({ timeout: 60_000 });
    expect(await bar.getAttribute("aria-valuenow")).toBe("100");
    await page.getByRole("heading", { name: "Latest batch #1" }).waitFor();
    // The Queue panel above follows the batch's runs in its overall counts.
    await page.getByText("batches included: 0 waiting, 0 computing observed figures, 0 with null replicates pending, 3 done, 1 failed.").waitFor();
    await page.getByRole("heading", { name: /Failures \(1\)/ }).waitFor();
    await page.getByText("Network 4").waitFor();
    const history = page.getByRole("table", { name: "Batches, newest first" });
    await history.getByRole("cell", { name: "#1" }).waitFor();
    await screenshot(page, "pipeline-finished");
    expect(await axeSerious(page)).toEqual([]);

    await page.getByRole("button", { name: "Retry failed networks" }).click();
    await page.getByText("4 of 4 networks finished (100%)").waitFor({ timeout: 60_000 });
    await page.getByRole("heading", { name: /Failures \(1\)/ }).waitFor();
  });
});
