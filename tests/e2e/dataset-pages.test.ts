/**
 * Browser journey over the public pages of published data: a dataset page (citation, locator map, networks,
 * versions, newer-version notice), a network view with each plot (matrix, null histogram, roles), the
 * compare view (Q/z toggle, CSV and SVG export), the coverage map and a withdrawn dataset's tombstone.
 * Screenshots go to test-artifacts/screenshots; axe must find no serious or critical violation.
 * Data: Davis Southern Women and Zachary's karate club (tests/fixtures/README.md); metadata invented.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import type { Page } from "playwright-core";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, signInViaApi, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { createFixtureDataset, DAVIS_CSV, KARATE_CSV, fixtureUser, FIXTURE_PASSWORD } from "../server/support/published-fixture";

let stack: TestStack;
let browser: BrowserSession;
let curatorEmail: string;

async function axeCheck(page: Page) {
  expect(await axeSerious(page)).toEqual([]);
}

beforeAll(async () => {
  await resetDatabase();
  stack = await startStack();
  const first = await createFixtureDataset({
    accession: "TB-000001",
    networks: [
      { text: DAVIS_CSV, fileName: "upper-meadow.csv" },
      {
        text: KARATE_CSV,
        fileName: "club.csv",
        kind: "unipartite",
        metadata: { name: "Lower meadow (one-mode)", interactionType: "other", rowLevel: undefined, colLevel: undefined },
      },
    ],
  });
  await createFixtureDataset({
    dataset: first.dataset,
    owner: first.owner,
    number: 2,
    publishedAt: new Date("2025-09-01T10:00:00Z"),
    study: { description: "Second version with corrected plant names (invented demo data). Plant–pollinator interactions in upland meadows." },
    networks: [{ text: DAVIS_CSV, fileName: "upper-meadow.csv" }],
  });
  await createFixtureDataset({
    accession: "TB-000002",
    study: { title: "Fruit eaters of the Tallow Coast", creators: [{ name: "Ines Okafor" }], licence: "CC0-1.0" },
    networks: [
      {
        text: DAVIS_CSV,
        fileName: "coast.csv",
        metadata: {
          name: "Coastal scrub",
          interactionType: "seed-dispersal",
          rowLevel: "plants",
          colLevel: "frugivores",
          locality: { placeName: "Tallow Coast", countryCode: "CL", decimalLatitude: -41.47, decimalLongitude: -72.94, generalisation: "0.1" },
        },
      },
    ],
  });
  await createFixtureDataset({ accession: "TB-000003", state: "withdrawn", withdrawalReason: "The depositor found duplicated transects." });
  curatorEmail = (await fixtureUser("curator", "Curator Brand")).email;
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

describe("dataset pages", () => {
  it("shows a dataset page with citation, networks, locator map and versions; keyboard downloads BibTeX", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/datasets/TB-000001`);
    await page.getByRole("heading", { level: 1, name: "Flower visitors of the Verrin Hills meadows" }).waitFor();
    await page.getByText("TB-000001 · version 2").waitFor();
    await page.locator('svg[data-map-ready="true"]').first().waitFor();
    expect(await page.getByTestId("citation-text").textContent()).toMatch(/^Hale R, Okafor I \(2025\) Flower visitors of the Verrin Hills meadows\. Version 2\. Tanglebank\. TB-000001\./);
    expect(await page.getByRole("link", { name: /ORCID 0000-0002-1825-0097/ }).getAttribute("href")).toBe("https://orcid.org/0000-0002-1825-0097");
    expect(await page.getByRole("link", { name: "doi:10.5555/tb.demo.1" }).getAttribute("href")).toBe("https://doi.org/10.5555/tb.demo.1");
    await page.getByText("61.2° N, 9° E").first().waitFor();
    await screenshot(page, "dataset-page");
    await axeCheck(page);

    // keyboard: focus the BibTeX button and press Enter
    const bib = page.getByRole("button", { name: "Download BibTeX" });
    await bib.focus();
    const [download] = await Promise.all([page.waitForEvent("download"), page.keyboard.press("Enter")]);
    expect(download.suggestedFilename()).toBe("TB-000001-v2.bib");
    const text = readFileSync((await download.path())!, "utf8");
    expect(text).toMatch(/^@dataset\{TB-000001-v2,/);
  });

  it("tells readers of an old version that a newer one exists, and shows curators the audit history", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/datasets/TB-000001/v/1`);
    await page.getByRole("note").getByText("A newer version of this dataset exists").waitFor();
    await page.getByRole("heading", { name: /Networks \(2\)/ }).waitFor();
    expect(await page.getByRole("heading", { name: /Audit history/ }).count()).toBe(0);
    await signInViaApi(page, stack.url, curatorEmail, FIXTURE_PASSWORD);
    await page.goto(`${stack.url}/datasets/TB-000001/v/1`);
    await page.getByRole("heading", { name: /Audit history/ }).waitFor();
    await page.getByRole("cell", { name: "version.submitted" }).first().waitFor();
    await screenshot(page, "dataset-page-old-version-curator");
    await axeCheck(page);
    await page.request.post(`${stack.url}/api/v1/auth/sign-out`, {
      headers: { "x-csrf-token": ((await (await page.request.get(`${stack.url}/api/v1/auth/session`)).json()) as { csrfToken: string }).csrfToken },
    });
  });

  it("shows a tombstone for a withdrawn dataset", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/datasets/TB-000003`);
    await page.getByRole("heading", { name: "TB-000003 v1 was withdrawn" }).waitFor();
    await page.getByText("The depositor found duplicated transects.").waitFor();
    await screenshot(page, "dataset-tombstone");
    await axeCheck(page);
  });
});

describe("network view", () => {
  it("draws the matrix ordered by module, the null histogram with the observed Q and the roles plot", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/datasets/TB-000001/v/2/networks/1`);
    await page.getByRole("heading", { level: 1, name: "Upper meadow" }).waitFor();
    await page.locator('canvas[data-rendered="true"]').waitFor();
    // the canvas really holds ink: links inside the first module in its hue (#0072B2), links between modules grey (#a8a29e)
    const inked = await page.evaluate(() => {
      const c = document.querySelector("canvas") as HTMLCanvasElement;
      const d = c.getContext("2d")!.getImageData(0, 0, c.width, c.height).data;
      let first = 0;
      let grey = 0;
      for (let k = 0; k < d.length; k += 4) {
        if (d[k] === 0 && d[k + 1] === 114 && d[k + 2] === 178) first++;
        if (d[k] === 168 && d[k + 1] === 162 && d[k + 2] === 158) grey++;
      }
      return { first, grey };
    });
    expect(inked.first).toBeGreaterThan(100);
    expect(inked.grey).toBeGreaterThan(10);
    // a legend names every module, and the share of links inside modules is stated
    expect(await page.getByTestId("module-legend-item").count()).toBeGreaterThan(1);
    expect(await page.getByTestId("inside-share").textContent()).toMatch(/^\d+\.\d % of links lie inside modules/);
    // by keyboard: focus the matrix and move along the first row
    await page.getByTestId("matrix-canvas").focus();
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("ArrowRight");
    await page.getByText(/^Evelyn Jefferson \(module \d+\) × E\d+ \(module \d+\): (0|1, (inside its module|between modules))$/).waitFor();
    await page.getByRole("img", { name: /Histogram of 30 null modularity values/ }).waitFor();
    await page.getByRole("img", { name: /Roles plot of \d+ nodes/ }).waitFor();
    await page.getByText("Barber's bipartite modularity Q_B").waitFor();
    await page.getByText(/^None of them is free of size/).first().waitFor();
    await page.getByRole("heading", { name: "Modules" }).waitFor();
    expect(await page.getByRole("link", { name: "Partition (CSV)" }).getAttribute("href")).toBe("/api/v1/network-views/TB-000001/v2/1/partition.csv");
    await screenshot(page, "network-view");
    await axeCheck(page);

    // Charts as image files for slides: PNG (twice the drawn size, read from the file's own header) and SVG.
    const pngSize = (bytes: Buffer) => {
      expect(bytes.subarray(0, 8).toString("hex")).toBe("89504e470d0a1a0a"); // the PNG signature (ISO/IEC 15948)
      return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) }; // IHDR, the first chunk
    };
    const downloadOf = async (group: string | RegExp, format: "SVG" | "PNG") => {
      const [d] = await Promise.all([page.waitForEvent("download"), page.getByRole("group", { name: group }).getByRole("button", { name: format, exact: true }).click()]);
      return { name: d.suggestedFilename(), bytes: readFileSync((await d.path())!) };
    };
    // each file is a figure: the chart's title above it, its caption below
    const hist = await downloadOf(/^Download Null distribution of modularity: .* as an image$/, "PNG");
    expect(hist.name).toMatch(/^tanglebank-TB-000001-v2-1-null-q-[a-z-]+\.png$/);
    const histPng = pngSize(hist.bytes);
    expect(histPng.width).toBe(1280); // the histogram's 640-wide view box, twice
    expect(histPng.height).toBeGreaterThan(600 + 2 * 40); // its 300 high view box, twice, plus title and caption
    const histSvg = (await downloadOf(/^Download Null distribution of modularity: .* as an image$/, "SVG")).bytes.toString("utf8");
    expect(histSvg).toMatch(/^<\?xml[^>]*>\n<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"[^>]*width="640"/);
    expect((histSvg.match(/<rect[^>]*fill="rgb/g) ?? []).length).toBeGreaterThan(0); // colours travel with the file
    expect(histSvg).toMatch(/font-weight="700"[^>]*>Null distribution of modularity/);
    const captionStart = (await page.locator("figure", { hasText: "Null distribution of modularity" }).locator("figcaption").first().innerText()).split(/\s+/).slice(0, 3).join(" ");
    expect(histSvg).toContain(captionStart);
    // the matrix, drawn on a canvas, gives the same drawing as SVG (pixels embedded, labels as text)
    const matrixSvg = (await downloadOf("Download Interaction matrix ordered by module as an image", "SVG")).bytes.toString("utf8");
    expect(matrixSvg).toMatch(/<image [^>]*href="data:image\/png;base64,/);
    expect(matrixSvg).toContain(">Evelyn Jefferson</text>");
    const matrix = await downloadOf("Download Interaction matrix ordered by module as an image", "PNG");
    const canvasSize = await page.getByTestId("matrix-canvas").evaluate((c) => ({ width: (c as HTMLCanvasElement).width, height: (c as HTMLCanvasElement).height }));
    const matrixPng = pngSize(matrix.bytes);
    expect(matrixPng.width).toBe(2 * Math.max(480, canvasSize.width));
    expect(matrixPng.height).toBeGreaterThan(2 * canvasSize.height);
    expect((await downloadOf("Download Node roles: participation P against within-module degree z as an image", "PNG")).name).toBe("tanglebank-TB-000001-v2-1-roles.png");
  });

  it("draws a one-mode network too", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/datasets/TB-000001/v/1/networks/2`);
    await page.locator('canvas[data-rendered="true"]').waitFor();
    await page.getByText("Newman–Girvan modularity Q").waitFor();
    await screenshot(page, "network-view-one-mode");
  });
});

describe("compare view and coverage map", () => {
  it("plots networks side by side, toggles Q/z by keyboard and exports CSV and SVG", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/compare?refs=TB-000001/v2/1,TB-000001/v1/2,TB-000002/v1/1`);
    await page.getByRole("group", { name: "Scatter plot of Q against connectance" }).waitFor();
    await page.getByRole("group", { name: "Scatter plot of Q against network size" }).waitFor();
    expect(await page.locator("svg circle[tabindex='0']").count()).toBe(6);
    await screenshot(page, "compare-q");
    await axeCheck(page);
    await page.getByRole("radio", { name: /z against the chosen null model/ }).focus();
    await page.keyboard.press("Space");
    await page.getByRole("group", { name: "Scatter plot of z against connectance" }).waitFor();
    const [csv] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "Export table (CSV)" }).click()]);
    const csvText = readFileSync((await csv.path())!, "utf8");
    expect(csvText.split("\r\n")[0]).toMatch(/^ref,dataset,network,interaction_type/);
    expect(csvText.trim().split("\r\n")).toHaveLength(4);
    const [svg] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("group", { name: "Download z against connectance as an image" }).getByRole("button", { name: "SVG", exact: true }).click(),
    ]);
    expect(svg.suggestedFilename()).toMatch(/^tanglebank-compare-z.*-vs-connectance\.svg$/);
    const svgText = readFileSync((await svg.path())!, "utf8");
    expect(svgText).toMatch(/^<\?xml[^>]*>\n<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    expect((svgText.match(/<circle/g) ?? []).length).toBe(3);
    await screenshot(page, "compare-z");
    await axeCheck(page);
  });

  it("places catalogue networks on the world outline", async () => {
    const { page } = browser;
    await page.goto(`${stack.url}/map`);
    await page.locator('svg[data-map-ready="true"]').waitFor();
    await page.getByRole("heading", { name: /2 of 2 matching networks placed/ }).waitFor();
    await screenshot(page, "coverage-map");
    await axeCheck(page);
    await page.goto(`${stack.url}/map?interactionType=seed-dispersal`);
    await page.getByRole("heading", { name: /1 of 1 matching networks placed/ }).waitFor();
  });
});
