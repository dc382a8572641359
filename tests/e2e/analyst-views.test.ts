/**
 * What analysts and teachers take away, in Chromium: the compare view survives references it cannot plot
 * (unknown, withdrawn, malformed: named beside the chart with a Remove button while the rest is plotted),
 * adds a whole dataset or a collection, opens a collection whose member was withdrawn; "Bundle selection"
 * with a stale, withdrawn network says so and bundles the others with their size.
 * Screenshots at desktop width and at 390 px (a phone) go to test-artifacts/screenshots; axe must find no
 * serious or critical violation. Invented data (tests/server/support/catalogue-fixtures.ts).
 */
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { QueryTypes } from "sequelize";
import { startStack, type TestStack } from "../server/support/stack";
import { join } from "node:path";
import { openBrowser, screenshot, signInViaApi, SCREENSHOT_DIR, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { unzip } from "../server/support/unzip";
import { catalogueStore } from "../../server/src/api/catalogue/catalogue.store";
import { publishDataset, type PublishedFixture } from "../server/support/catalogue-fixtures";
import { createUser, TEST_PASSWORD } from "../server/support/accounts";
import { sequelize } from "../../server/src/db/sequelize";

let stack: TestStack;
let browser: BrowserSession;
let meadow: PublishedFixture;
let coast: PublishedFixture;
let gone: PublishedFixture;
let collectionCode: string;
const ref = (f: PublishedFixture, pos: number) => `${f.accession}/v1/${pos}`;

/** Axe on the page, or on the part of it a test changed (the whole catalogue takes axe about 20 s). */
async function axeCheck(page: Page, include?: string) {
  expect(await axeSerious(page, include)).toEqual([]);
}

/** The visible part only (a phone's full page is too tall to look at in one picture). */
async function viewportShot(page: Page, name: string) {
  await page.screenshot({ path: join(SCREENSHOT_DIR, `${name}.png`) });
}

/** Circles of both compare charts (each plotted network is one focusable point per chart). */
const plotted = (page: Page) => page.locator("svg circle[tabindex='0']").count();

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  const owner = await createUser({ email: "analyst.e2e@example.test", displayName: "Ada Marsh" });
  meadow = await publishDataset({
    study: { title: "Meadow visitors of the Verrin Hills" },
    networks: [1, 2, 3].map((k) => ({ seed: k, rows: 4 + k, cols: 6, meta: { name: `Meadow plot ${k}` }, metrics: { q: 0.3 + 0.05 * k, z: 1.5 + k, qRel: 0.2 } })),
  });
  coast = await publishDataset({
    study: { title: "Fruit eaters of the Tallow Coast" },
    networks: [4, 5].map((k) => ({ seed: k, rows: 5, cols: 4 + k, meta: { name: `Coast transect ${k - 3}`, interactionType: "seed-dispersal" as const }, metrics: { q: 0.25 + 0.04 * k, z: 2 + k, qRel: 0.3 } })),
  });
  // 22 more, so that the catalogue has more than one page of 25
  await publishDataset({
    study: { title: "Grid survey of the Osk lakeshore" },
    networks: Array.from({ length: 22 }, (_, k) => ({ seed: 20 + k, rows: 4, cols: 5 + (k % 4), meta: { name: `Grid cell ${k + 1}` }, metrics: { q: 0.2 + 0.01 * k, z: 1 + 0.1 * k, qRel: 0.2 } })),
  });
  // one network far from the others, for the region filters
  await publishDataset({
    study: { title: "Fynbos flower visitors" },
    networks: [{ seed: 70, meta: { name: "Fynbos slope", locality: { placeName: "Kogel Ridge", countryCode: "ZA", decimalLatitude: -33.9, decimalLongitude: 18.9, elevation: 640, generalisation: "exact" } }, metrics: { q: 0.5, z: 4, qRel: 0.3 } }],
  });
  gone = await publishDataset({ study: { title: "Later withdrawn survey" }, networks: [{ seed: 9, meta: { name: "Duplicated plot" }, metrics: { q: 0.4, z: 3, qRel: 0.2 } }] });
  stack = await startStack();
  browser = await openBrowser();
  // a public collection holding a network that is withdrawn afterwards
  await signInViaApi(browser.page, stack.url, owner.email, TEST_PASSWORD);
  const { csrfToken } = (await (await browser.page.request.get(`${stack.url}/api/v1/auth/session`)).json()) as { csrfToken: string };
  const created = await browser.page.request.post(`${stack.url}/api/v1/collections`, {
    data: { name: "Upland and coast webs", visibility: "public", refs: [ref(meadow, 1), ref(gone, 1), ref(coast, 1)] },
    headers: { "x-csrf-token": csrfToken },
  });
  expect(created.status()).toBe(201);
  collectionCode = ((await created.json()) as { code: string }).code;
  await browser.page.request.post(`${stack.url}/api/v1/auth/sign-out`, { headers: { "x-csrf-token": csrfToken } });
  await sequelize().query(`UPDATE dataset_versions SET state = 'withdrawn', withdrawn_at = now(), withdrawal_reason = 'Duplicated transects.' WHERE id = :id`, {
    replacements: { id: gone.versionId },
    type: QueryTypes.UPDATE,
  });
});
afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

describe("compare view with references it cannot plot", () => {
  it("plots the rest, names each bad reference with its reason, removes it, and adds a whole dataset", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/compare?refs=${ref(meadow, 1)},${ref(gone, 1)},TB-999999/v1/1,${ref(meadow, 2)}`);
    await page.getByRole("group", { name: "Scatter plot of Q against connectance" }).waitFor();
    const notes = page.getByTestId("not-plotted");
    await notes.getByRole("heading", { name: "Not plotted (2 of 4)" }).waitFor();
    await expect.poll(() => plotted(page)).toBe(4); // 2 networks × 2 charts
    await notes.getByText("Duplicated transects.").waitFor();
    await notes.getByText(/No dataset TB-999999/).waitFor();
    expect(await notes.getByRole("link", { name: "What it was and how to cite it" }).getAttribute("href")).toBe(`/datasets/${gone.accession}/v/1`);
    await screenshot(page, "compare-not-plotted");
    await axeCheck(page);

    await notes.getByRole("button", { name: "Remove TB-999999/v1/1 from the comparison" }).click();
    await page.waitForURL((u) => !u.searchParams.get("refs")!.includes("TB-999999"));
    await notes.getByRole("heading", { name: "Not plotted (1 of 3)" }).waitFor();
    // the chip of a withdrawn network says so and removes it too
    await page.getByRole("button", { name: `Remove ${ref(gone, 1)}`, exact: true }).click();
    await page.waitForURL((u) => u.searchParams.get("refs") === `${ref(meadow, 1)},${ref(meadow, 2)}`);
    await expect.poll(() => notes.count()).toBe(0);

    // a whole dataset at once (latest published version): its 2 networks join
    await page.getByLabel("Add a network, a dataset or a collection").fill(coast.accession);
    await page.getByRole("button", { name: "Add", exact: true }).click();
    await page.getByText(`Added 2 networks of ${coast.accession} v1.`).waitFor();
    expect(new URL(page.url()).searchParams.get("refs")).toBe([ref(meadow, 1), ref(meadow, 2), ref(coast, 1), ref(coast, 2)].join(","));
    await expect.poll(() => plotted(page)).toBe(8);
    // a dataset page address adds the missing network only
    await page.getByLabel("Add a network, a dataset or a collection").fill(`${stack.url}/datasets/${meadow.accession}/v/1`);
    await page.getByRole("button", { name: "Add", exact: true }).click();
    await page.getByText(`Added 1 network of ${meadow.accession} v1. 2 were already here.`).waitFor();
    // unknown input is refused at the field
    await page.getByLabel("Add a network, a dataset or a collection").fill("meadow");
    await page.getByRole("button", { name: "Add", exact: true }).click();
    await page.getByText(/Write a network \(TB-000042\/v2\/3\), a dataset/).waitFor();
    await page.getByLabel("Add a network, a dataset or a collection").fill("TB-999998");
    await page.getByRole("button", { name: "Add", exact: true }).click();
    await page.getByText(/No dataset TB-999998/).waitFor();
  });

  it("adds a collection's published members and opens a collection whose member was withdrawn", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/compare?refs=${ref(coast, 2)}`);
    await page.getByRole("group", { name: "Scatter plot of Q against connectance" }).waitFor();
    await page.getByLabel("Add a network, a dataset or a collection").fill(collectionCode);
    await page.getByRole("button", { name: "Add", exact: true }).click();
    await page.getByText(`Added 2 networks of ${collectionCode} “Upland and coast webs” (revision 1). 1 withdrawn member was left out.`).waitFor();
    expect(new URL(page.url()).searchParams.get("refs")).toBe([ref(coast, 2), ref(meadow, 1), ref(coast, 1)].join(","));

    // the collection page's compare link: the withdrawn member is a note, the two others are plotted
    await page.goto(`${stack.url}/compare?collection=${collectionCode}`);
    await page.getByTestId("compare-collection").getByRole("link", { name: new RegExp(collectionCode) }).waitFor();
    const notes = page.getByTestId("not-plotted");
    await notes.getByRole("heading", { name: "Not plotted (1 of 3)" }).waitFor();
    await notes.getByText(ref(gone, 1)).waitFor();
    await expect.poll(() => plotted(page)).toBe(4);
    await screenshot(page, "compare-collection");
  });

  it("reads well on a 390 px phone", async () => {
    const { page } = browser;
    await page.setViewportSize({ width: 390, height: 844 });
    try {
      await page.goto(`${stack.url}/compare?refs=${ref(meadow, 1)},${ref(gone, 1)},${ref(coast, 1)}`);
      await page.getByTestId("not-plotted").waitFor();
      await page.getByRole("group", { name: "Scatter plot of Q against connectance" }).waitFor();
      expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
      await screenshot(page, "compare-not-plotted-390");
    } finally {
      await page.setViewportSize({ width: 1280, height: 900 });
    }
  });
});

describe("bundling a stale selection", () => {
  it("names the withdrawn network, shows the size of the rest and bundles them", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/catalogue`);
    // a selection made before the withdrawal, kept by the browser
    await page.evaluate((refs) => localStorage.setItem("tanglebank.catalogue.selection", JSON.stringify(refs)), [ref(meadow, 3), ref(gone, 1), ref(coast, 2)]);
    await page.reload();
    const actions = page.getByTestId("bundle-actions");
    await actions.getByText(new RegExp(`One selected network can no longer be bundled: ${ref(gone, 1)} \\(withdrawn\\)`)).waitFor();
    const link = actions.getByRole("link", { name: /^Bundle selection: the other 2 networks \(~\d[\d.]* [kMG]?B\)$/ });
    await link.waitFor();
    await actions.getByText(/The bundle holds the other 2 \(~/).waitFor();
    await screenshot(page, "catalogue-stale-selection");
    const [download] = await Promise.all([page.waitForEvent("download"), link.click()]);
    const entries = await unzip(readFileSync((await download.path())!));
    expect([...entries.keys()].filter((n) => n.startsWith("networks/")).sort()).toEqual([ref(meadow, 3), ref(coast, 2)].map((r) => `networks/${r.replace(/\//g, "_")}.csv`).sort());
    // dropping it restores the ordinary button
    await actions.getByRole("button", { name: "Remove it from the selection" }).click();
    await actions.getByRole("link", { name: /^Bundle selection \(2, ~/ }).waitFor();
  });
});

describe("catalogue conveniences", () => {
  const heading = (page: Page) => page.locator("#results-heading");

  it("offers 25, 50, 100 or 250 rows per page, keeping the first row in view", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/catalogue`);
    await page.getByRole("heading", { name: "28 networks" }).waitFor();
    const rows = page.getByRole("checkbox", { name: /^Select TB-/ });
    await expect.poll(() => rows.count()).toBe(25);
    await page.getByText("Page 1 of 2", { exact: true }).waitFor();
    const choice = page.getByRole("combobox", { name: "Rows per page", exact: true });
    expect(await choice.locator("option").allTextContents()).toEqual(["25", "50", "100", "250"]);
    await choice.selectOption("50");
    await page.waitForURL(/pageSize=50/);
    await expect.poll(() => rows.count()).toBe(28);
    await page.getByText("Page 1 of 1", { exact: true }).waitFor();
    // back to 25 from page 1 stays on page 1; the URL drops the default
    await choice.selectOption("25");
    await expect.poll(() => new URL(page.url()).searchParams.has("pageSize")).toBe(false);
  });

  it("flags an inverted range at the field instead of showing 0 rows", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/catalogue`);
    await page.getByRole("heading", { name: "28 networks" }).waitFor();
    const min = page.getByLabel("Connectance (C): at least");
    await min.fill("0.5");
    await page.getByLabel("Connectance (C): at most").fill("0.1");
    await page.getByRole("button", { name: "Apply ranges" }).click();
    await page.getByText("The minimum (0.5) is above the maximum (0.1): no network could match. Swap them or change one.").waitFor();
    expect(await min.getAttribute("aria-invalid")).toBe("true");
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe("range-connectanceMin");
    expect(new URL(page.url()).searchParams.has("connectanceMin")).toBe(false); // nothing applied
    expect(await heading(page).textContent()).toBe("28 networks");
    await screenshot(page, "catalogue-inverted-range");
    await axeCheck(page, "aside[aria-label='Filters']"); // the whole page is checked by catalogue.test.ts
    // out of bounds too
    await min.fill("");
    await page.getByLabel("Connectance (C): at most").fill("");
    await page.getByLabel("p against the chosen null model: at most").fill("2");
    await page.getByRole("button", { name: "Apply ranges" }).click();
    await page.getByText("The maximum must be between 0 and 1 (got 2).").waitFor();

    // a shared link with an inverted range: the server's answer is shown at the field and above the table
    await page.goto(`${stack.url}/catalogue?qMin=0.6&qMax=0.2`);
    await page.getByText("These ranges cannot be searched").waitFor();
    await page.locator("#range-Q-error").getByText(/qMin \(0\.6\) is greater than qMax \(0\.2\)/).waitFor();
    expect(await heading(page).textContent()).toBe("No results");
  });

  it("ticks a facet at once while the counts are still on their way", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/catalogue`);
    await page.getByRole("heading", { name: "28 networks" }).waitFor();
    // hold every catalogue answer back until the checks below are done, as a slow connection would
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    await page.route("**/api/v1/catalogue?**", async (route) => {
      await held;
      await route.continue();
    });
    try {
      const box = page.getByRole("group", { name: "Interaction type" }).getByLabel(/seed dispersal/);
      await box.click();
      // ticked while the server's answer is still held back: the tick did not wait for it
      expect(await box.isChecked()).toBe(true);
      expect(await heading(page).textContent()).toBe("28 networks"); // still the old answer
      await page.getByText(/Updating…/).waitFor();
      release();
      await page.getByRole("heading", { name: "2 networks" }).waitFor();
      expect(await box.isChecked()).toBe(true);
    } finally {
      release();
      await page.unroute("**/api/v1/catalogue?**");
    }
  });

  it("fits a 390 px phone: filters fold away and the table scrolls inside its own box", async () => {
    const { page } = browser;
    await page.setViewportSize({ width: 390, height: 844 });
    try {
      await page.goto(`${stack.url}/catalogue`);
      await page.getByRole("heading", { name: "28 networks" }).waitFor();
      expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
      const box = page.getByTestId("catalogue-table-box");
      const { scrollWidth, clientWidth } = await box.evaluate((el) => ({ scrollWidth: el.scrollWidth, clientWidth: el.clientWidth }));
      expect(scrollWidth).toBeGreaterThan(clientWidth); // the wide table scrolls in its card
      expect(clientWidth).toBeLessThanOrEqual(390);
      expect(await page.getByLabel("Connectance (C): at least").isVisible()).toBe(false);
      await viewportShot(page, "catalogue-390");
      await axeCheck(page, "aside[aria-label='Filters']");
      await page.getByRole("button", { name: /^Show filters/ }).click();
      expect(await page.getByLabel("Connectance (C): at least").isVisible()).toBe(true);
      expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
      await page.getByRole("button", { name: "Apply ranges" }).scrollIntoViewIfNeeded();
      await viewportShot(page, "catalogue-390-filters");
      await page.getByTestId("catalogue-table-box").scrollIntoViewIfNeeded();
      await viewportShot(page, "catalogue-390-table");
    } finally {
      await page.setViewportSize({ width: 1280, height: 900 });
    }
  });
});

describe("where: region filters", () => {
  it("filters the catalogue by continent and latitude band", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/catalogue`);
    await page.getByRole("heading", { name: "28 networks" }).waitFor();
    const continent = page.getByRole("group", { name: "Continent" });
    await continent.getByText("Europe").waitFor();
    await continent.getByLabel(/Africa/).click();
    await page.getByRole("heading", { name: "1 network", exact: true }).waitFor();
    expect(new URL(page.url()).searchParams.get("continent")).toBe("AF");
    await page.getByText("Fynbos slope").waitFor();
    await page.goto(`${stack.url}/catalogue`);
    await page.getByLabel("Latitude (°, south negative): at least").fill("-40");
    await page.getByLabel("Latitude (°, south negative): at most").fill("-20");
    await page.getByRole("button", { name: "Apply ranges" }).click();
    await page.getByRole("heading", { name: "1 network", exact: true }).waitFor();
    await page.getByLabel("Elevation (m): at least").fill("700");
    await page.getByRole("button", { name: "Apply ranges" }).click();
    await page.getByRole("heading", { name: "0 networks" }).waitFor();
  });

  it("draws an area on the map, filters the map by it and carries it to the catalogue", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/map`);
    await page.locator('svg[data-map-ready="true"]').waitFor();
    await page.getByRole("heading", { name: /28 of 28 matching networks placed/ }).waitFor();
    await page.getByRole("button", { name: "Draw an area" }).click();
    // drag a box around the southern African point
    const dot = page.getByRole("link", { name: /^1 network at Kogel Ridge, ZA/ });
    await dot.scrollIntoViewIfNeeded();
    const b = (await dot.boundingBox())!;
    const [cx, cy] = [b.x + b.width / 2, b.y + b.height / 2];
    await page.mouse.move(cx - 40, cy - 30);
    await page.mouse.down();
    await page.mouse.move(cx, cy, { steps: 4 });
    await page.mouse.move(cx + 40, cy + 30, { steps: 4 });
    await page.mouse.up();
    await page.waitForURL(/bbox=/);
    const [w, s, e, n] = new URL(page.url()).searchParams.get("bbox")!.split(",").map(Number);
    expect(w).toBeLessThan(18.9);
    expect(e).toBeGreaterThan(18.9);
    expect(s).toBeLessThan(-33.9);
    expect(n).toBeGreaterThan(-33.9);
    await page.getByRole("heading", { name: /1 of 1 matching networks placed/ }).waitFor();
    await page.getByTestId("map-area").waitFor();
    expect(await page.getByLabel("West (longitude)").inputValue()).toBe(String(w));
    await screenshot(page, "map-area");
    await axeCheck(page, "form[aria-label='Area']");

    // typed edges: northern Europe
    await page.getByLabel("West (longitude)").fill("-10");
    await page.getByLabel("South (latitude)").fill("50");
    await page.getByLabel("East (longitude)").fill("30");
    await page.getByLabel("North (latitude)").fill("70");
    await page.getByRole("button", { name: "Apply area" }).click();
    await page.getByRole("heading", { name: /27 of 27 matching networks placed/ }).waitFor();
    await page.getByLabel("South (latitude)").fill("80");
    await page.getByRole("button", { name: "Apply area" }).click();
    await page.getByText("The south edge (80) is north of the north edge (70).").waitFor();

    // the catalogue link carries the area; the catalogue shows it and can clear it
    await page.getByRole("link", { name: "Show these networks in the catalogue" }).click();
    await page.waitForURL(/\/catalogue\?.*bbox=-10%2C50%2C30%2C70|\/catalogue\?.*bbox=-10,50,30,70/);
    await page.getByRole("heading", { name: "27 networks" }).waitFor();
    const areaBox = page.getByTestId("area-filter");
    await areaBox.getByText("-10, 50, 30, 70").waitFor();
    await areaBox.getByRole("button", { name: "Clear area" }).click();
    await page.getByRole("heading", { name: "28 networks" }).waitFor();
  });
});

describe("coverage map: networks at one site", () => {
  it("groups networks at the same locality into one marker with their count, and lists them", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/map`);
    await page.locator('svg[data-map-ready="true"]').waitFor();
    await page.getByRole("heading", { name: /28 of 28 matching networks placed/ }).waitFor();
    // 27 networks share the Norwegian site (the same public coordinates), one is in South Africa
    const markers = page.locator("svg g[data-site-count]");
    await expect.poll(() => markers.count()).toBe(2);
    expect((await markers.evaluateAll((els) => els.map((e) => Number(e.getAttribute("data-site-count"))))).sort((a, b) => a - b)).toEqual([1, 27]);
    const big = page.getByRole("link", { name: /^27 networks at Verrin Hills, NO: 25 Pollination, 2 Seed dispersal$/ });
    await big.click();
    const panel = page.getByTestId("site-panel");
    await panel.getByRole("heading", { name: "27 networks at Verrin Hills, NO" }).waitFor();
    expect(await panel.getByRole("link").count()).toBe(27);
    await panel.getByText(ref(coast, 1)).waitFor();
    await screenshot(page, "map-sites");
    await axeCheck(page, "[data-testid='site-panel']");
    await panel.getByRole("link", { name: "Coast transect 1" }).click();
    await page.waitForURL(new RegExp(`/datasets/${coast.accession}/v/1/networks/1$`));
  });
});
