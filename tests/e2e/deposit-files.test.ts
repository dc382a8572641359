/**
 * Depositing files as people have them, in Chromium against the real app: an R write.csv file with NA cells
 * (the preview asks what they mean) and a workbook with two sheets (the preview asks which), uploaded in
 * one go with the answers. Screenshots: test-artifacts/screenshots/files-*.png.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parse as csvParse } from "csv-parse/sync";
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

let versionId = 0;

describe("files from R and spreadsheets", () => {
  it("the preview asks what NA cells mean and which sheet to read, and the upload keeps the answers", async () => {
    const { page } = depositor;
    const created = await page.request.post(`${stack.url}/api/v1/deposits`, {
      data: { metadata: { title: "Heath visitors from R and a workbook" } },
      headers: { "x-csrf-token": (await (await page.request.get(`${stack.url}/api/v1/auth/session`)).json()).csrfToken },
    });
    versionId = (await created.json()).versionId as number;
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

  it("the metadata sheet: download, fill in, upload; problems shown per cell and per network, never 'Saved.' beside an error", async () => {
    const { page } = depositor;
    const dl = await page.request.get(`${stack.url}/api/v1/deposits/${versionId}/metadata-sheet`);
    const rows = csvParse((await dl.text()).replace(/^\ufeff/, "")) as string[][];
    const col = (name: string) => rows[0].indexOf(name);
    const fill: Record<string, string> = {
      interactionType: "pollination", weightMeaning: "visit-count", rowLevel: "plants", colLevel: "flower visitors",
      "locality.placeName": "Verrin Hills", "locality.countryCode": "GB", "locality.decimalLatitude": "54.43", "locality.decimalLongitude": "-2.98",
      "locality.generalisation": "0.1", habitat: "upland heath", startDate: "2021-05-01", endDate: "2021-08-31", samplingProtocol: "Timed watches of flowering plants.",
    };
    for (const r of rows.slice(1)) for (const [k, v] of Object.entries(fill)) r[col(k)] = v;
    rows[2][col("endDate")] = "2021-04-01"; // before the start: a problem to show
    const dir = mkdtempSync(join(tmpdir(), "tb-sheet-"));
    const file = join(dir, "network-metadata.csv");
    writeFileSync(file, rows.map((r) => r.map((c) => (/[",]/.test(c) ? `"${c.replace(/"/g, '""')}"` : c)).join(",")).join("\n"));
    await page.reload();
    await page.getByLabel("Filled-in sheet").setInputFiles(file);
    await page.getByRole("button", { name: "Upload the sheet" }).click();
    await page.getByText("Sheet read and saved. 1 cell to fix:").waitFor();
    await page.getByRole("cell", { name: /End date 2021-04-01 is before the start date 2021-05-01/ }).waitFor();
    const status = page.getByRole("list", { name: "Status of each network" });
    await status.getByText("Network 1: saved, complete").waitFor();
    await status.getByText("Network 2: saved with 1 problem").waitFor();
    await screenshot(page, "files-sheet-uploaded");
    // Saving the form of the network with the problem says so instead of "Saved."
    const card = page.getByRole("form", { name: "Metadata of network 2" });
    await card.getByRole("button", { name: "Save network 2" }).click();
    await card.getByText("Saved with 1 problem (marked above).").waitFor();
    expect(await page.getByText("Saved.", { exact: true }).count()).toBe(0);
    await screenshot(page, "files-sheet-network-status");
  });
});
