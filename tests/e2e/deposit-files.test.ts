/**
 * Depositing files as people have them, in Chromium against the real app: an R write.csv file with NA cells
 * (the preview asks what they mean) and a workbook with two sheets (the preview asks which), uploaded in
 * one go with the answers. Screenshots: test-artifacts/screenshots/files-*.png.
 */
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, signInViaApi, type BrowserSession } from "./support/browser";
import { resetDatabase } from "../setup/db";
import { createUser, TEST_PASSWORD } from "../server/support/accounts";
import { resetRateLimits } from "../../server/src/middlewares/rate-limit";
import { Network } from "../../server/src/models";

let stack: TestStack;
let depositor: BrowserSession;
const DEPOSITOR = "ines.okafor@example.test";
const SHAPES = join(process.cwd(), "tests", "fixtures", "shapes");

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  stack = await startStack();
  await createUser({ email: DEPOSITOR, displayName: "Ines Okafor" });
  depositor = await openBrowser();
  depositor.page.setDefaultTimeout(15_000);
  await signInViaApi(depositor.page, stack.url, DEPOSITOR, TEST_PASSWORD);
});
afterAll(async () => {
  await depositor?.close();
  await stack?.stop();
});

describe("files from R and spreadsheets", () => {
  it("the preview asks what NA cells mean and which sheet to read, and the upload keeps the answers", async () => {
    const { page } = depositor;
    const created = await page.request.post(`${stack.url}/api/v1/deposits`, {
      data: { metadata: { title: "Heath visitors from R and a workbook" } },
      headers: { "x-csrf-token": (await (await page.request.get(`${stack.url}/api/v1/auth/session`)).json()).csrfToken },
    });
    const versionId = (await created.json()).versionId as number;
    await page.goto(`${stack.url}/deposit/${versionId}?step=2`);
    await page.locator("#network-files").setInputFiles([join(SHAPES, "r-write-csv.csv"), join(SHAPES, "two-sheets.xlsx")]);
    const upload = page.getByRole("button", { name: "Upload 2 files" });
    await page.getByText("3 cell(s) hold “NA” instead of a number").waitFor();
    await page.getByText("the workbook has several sheets with data").waitFor();
    expect(await upload.isDisabled()).toBe(true);
    await screenshot(page, "files-questions");

    await page.getByRole("group", { name: "Cells marked NA mean" }).getByLabel("not observed").click();
    await page.getByLabel("Sheet of two-sheets.xlsx").selectOption("Lowland 2021");
    await page.getByText("two-sheets.xlsx · sheet “Lowland 2021”").waitFor();
    await page.getByText("r-write-csv.csv", { exact: true }).waitFor();
    await screenshot(page, "files-answered");
    await upload.click();
    await page.getByRole("heading", { name: /Network 2: Lowland 2021/ }).waitFor();
    await screenshot(page, "files-uploaded");
    const nets = await Network.findAll({ where: { versionId }, order: [["position", "ASC"]] });
    expect(nets.map((n) => n.readOptions)).toEqual([{ missing: "not-observed" }, { sheet: "Lowland 2021" }]);
    expect(nets[0].metadata.missingValues).toMatchObject({ markers: ["NA"], markerCells: 3, markerMeaning: "not-observed" });
  });
});
