/**
 * The Catalogue in Chromium: filter by a facet (the URL keeps it), select networks on two pages (the
 * selection survives paging), download the selection as a bundle (Playwright download event), open the
 * zip with yauzl and check its entries; a search by a word's beginning says it matched beginnings; the API
 * docs page and the tokens panel render. Axe reports no serious or critical violation on the catalogue. Invented data (tests/server/support/catalogue-fixtures.ts).
 */
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, signInViaApi, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { unzip } from "../server/support/unzip";
import { catalogueStore } from "../../server/src/api/catalogue/catalogue.store";
import { publishDataset } from "../server/support/catalogue-fixtures";
import { createUser, TEST_PASSWORD } from "../server/support/accounts";

let stack: TestStack;
let browser: BrowserSession;

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  // 30 pollination networks (two pages of 25) and 5 seed-dispersal ones
  for (let d = 0; d < 7; d++) {
    await publishDataset({
      study: { title: `Meadow survey ${d + 1}`, licence: d % 2 ? "CC0-1.0" : "CC-BY-4.0" },
      networks: Array.from({ length: 5 }, (_, k) => ({
        seed: d * 10 + k + 1,
        rowLabels: d === 2 && k === 3 ? ["Tanglewort osken", "b", "c", "d", "e", "f", "g"] : undefined,
        rows: 4 + k,
        cols: 5 + d,
        meta: { name: `Plot ${k + 1}`, interactionType: d === 6 ? ("seed-dispersal" as const) : ("pollination" as const), startDate: `${2019 + (d % 4)}-05-01`, endDate: `${2019 + (d % 4)}-08-31` },
        metrics: { q: 0.2 + 0.01 * (d * 5 + k), z: 1 + 0.1 * (d * 5 + k), qRel: 0.2 },
      })),
    });
  }
  await createUser({ email: "tokens.e2e@example.test" });
  stack = await startStack();
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

const zipEntries = (file: string) => unzip(readFileSync(file));

describe("catalogue page", () => {
  it("filters, selects across two pages, and downloads the selection as a bundle", async () => {
    const { page } = browser;
    await page.goto(stack.url + "/catalogue");
    await page.getByRole("heading", { name: "35 networks" }).waitFor();
    await screenshot(page, "catalogue-all");
    expect(await axeSerious(page)).toEqual([]);

    // facet with its count
    const facet = page.getByRole("group", { name: "Interaction type" });
    await facet.getByText("30").waitFor();
    await facet.getByLabel(/pollination/).click();
    await page.getByRole("heading", { name: "30 networks" }).waitFor();
    expect(new URL(page.url()).searchParams.get("interactionType")).toBe("pollination");

    // sort by z descending through the header
    await page.getByRole("button", { name: /^z/ }).click();
    await page.waitForURL(/sort=z/);
    await page.getByRole("button", { name: /^z/ }).click();
    await page.waitForURL(/order=desc/);

    // select two rows on page 1, two on page 2
    const rowBoxes = page.getByRole("checkbox", { name: /^Select TB-/ });
    await rowBoxes.nth(0).check();
    await rowBoxes.nth(1).check();
    await page.getByTestId("selection-count").getByText("2 selected").waitFor();
    const firstPageRefs = [(await rowBoxes.nth(0).getAttribute("aria-label"))!.replace("Select ", ""), (await rowBoxes.nth(1).getAttribute("aria-label"))!.replace("Select ", "")];
    await page.getByRole("button", { name: "Next page" }).click();
    await page.waitForURL(/page=2/);
    const second = page.getByRole("checkbox", { name: /^Select TB-/ });
    // page 2 holds the last 5 of 30 (the previous page stays on screen until it arrives)
    await expect.poll(() => second.count(), { timeout: 10_000 }).toBe(5);
    await second.nth(0).check();
    await second.nth(1).check();
    await page.getByTestId("selection-count").getByText("4 selected").waitFor();
    const refs = [...firstPageRefs, (await second.nth(0).getAttribute("aria-label"))!.replace("Select ", ""), (await second.nth(1).getAttribute("aria-label"))!.replace("Select ", "")];
    // the selection survives going back a page
    await page.getByRole("button", { name: "Previous page" }).click();
    await expect.poll(() => page.getByRole("checkbox", { name: /^Select TB-/ }).count(), { timeout: 10_000 }).toBe(25);
    await expect.poll(() => page.getByRole("checkbox", { name: `Select ${firstPageRefs[0]}` }).isChecked()).toBe(true);
    await page.getByRole("link", { name: /Bundle selection \(4, ~/ }).waitFor();
    await page.getByRole("link", { name: /Bundle everything matching \(30 networks, ~/ }).waitFor();
    await screenshot(page, "catalogue-selection");

    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: /Bundle selection/ }).click()]);
    const file = await download.path();
    expect(download.suggestedFilename()).toMatch(/^tanglebank-bundle-.*\.zip$/);
    const entries = await zipEntries(file!);
    const csvs = [...entries.keys()].filter((n) => n.startsWith("networks/")).sort();
    expect(csvs).toEqual(refs.map((r) => `networks/${r.replace(/\//g, "_")}.csv`).sort());
    for (const name of ["datapackage.json", "metrics.csv", "networks.csv", "CITATIONS.bib", "README.txt"]) expect(entries.has(name)).toBe(true);
    const dp = JSON.parse(entries.get("datapackage.json")!);
    for (const r of dp.resources) expect(entries.has(r.path)).toBe(true);
    expect(entries.get("metrics.csv")!.trim().split("\n").length).toBe(5);

    // compressed packing (in the bundle's options): the same files, deflated
    await page.getByText("What goes in the bundle").click();
    await page.getByLabel("Packing").selectOption("small");
    const compressed = page.getByRole("link", { name: /Bundle selection/ });
    expect(await compressed.getAttribute("href")).toContain("compression=small");
    const [download2] = await Promise.all([page.waitForEvent("download"), compressed.click()]);
    const entries2 = await zipEntries((await download2.path())!);
    expect([...entries2.keys()].filter((n) => n.startsWith("networks/")).sort()).toEqual(csvs);
    for (const name of csvs) expect(entries2.get(name)).toBe(entries.get(name));
    expect(entries2.get("README.txt")).toMatch(/deflated \(compression=small\)/);

    // the compare link carries the selection
    const compare = page.getByRole("link", { name: "Compare selected" });
    expect(await compare.getAttribute("href")).toBe(`/compare?refs=${refs.join(",")}`);
  });

  it("searches by a node name and keeps the query in the URL", async () => {
    const { page } = browser;
    await page.goto(stack.url + "/catalogue");
    await page.getByRole("searchbox").fill("tanglewort");
    await page.getByRole("button", { name: "Search", exact: true }).click();
    await page.waitForURL(/q=tanglewort/);
    // one network has a node named "Tanglewort osken" (survey 3, plot 4)
    await page.getByRole("heading", { name: "1 network", exact: true }).waitFor();
    expect(await page.getByRole("checkbox", { name: /^Select TB-/ }).count()).toBe(1);
    await page.getByText("Plot 4").waitFor();
    await page.getByText("Meadow survey 3").waitFor();
    expect(await page.getByTestId("search-prefix-note").count()).toBe(0);
    await screenshot(page, "catalogue-search");

    // a word's beginning: no whole word "tanglew" exists, so the same network is found by prefix, and the page says so
    await page.getByRole("searchbox").fill("tanglew");
    await page.getByRole("button", { name: "Search", exact: true }).click();
    await page.waitForURL(/q=tanglew(&|$)/);
    const note = page.getByRole("note").filter({ hasText: "No network has the whole word “tanglew”" });
    await note.waitFor();
    expect(await note.getAttribute("data-testid")).toBe("search-prefix-note");
    await page.getByRole("heading", { name: "1 network", exact: true }).waitFor();
    await screenshot(page, "catalogue-search-prefix");
  });

  it("renders the API documentation with examples, and the tokens panel creates a token", async () => {
    const { page } = browser;
    await page.goto(stack.url + "/api-docs");
    await page.getByRole("heading", { name: "Tanglebank API" }).waitFor();
    await page.getByText("R (httr2)").waitFor();
    await page.getByText("Python (requests)").waitFor();
    await page.getByRole("heading", { name: "Bundles", level: 2 }).waitFor();
    await screenshot(page, "api-docs");
    expect(await axeSerious(page)).toEqual([]);

    await signInViaApi(page, stack.url, "tokens.e2e@example.test", TEST_PASSWORD);
    await page.goto(stack.url + "/account");
    await page.getByRole("heading", { name: "API tokens" }).waitFor();
    await page.getByLabel("Token name").fill("Laptop scripts");
    await page.getByRole("button", { name: "Create token" }).click();
    const secret = (await page.getByTestId("new-token").textContent())!;
    expect(secret).toMatch(/^tb_[A-Za-z0-9_-]{32}$/);
    await page.getByRole("cell", { name: "Laptop scripts", exact: true }).waitFor();
    const res = await fetch(`${stack.url}/api/v1/tokens`, { headers: { authorization: `Bearer ${secret}` } });
    expect(res.status).toBe(200);
    await screenshot(page, "account-tokens");
  });
});
