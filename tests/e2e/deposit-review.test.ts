/**
 * The deposit and curation journey in Chromium against the real app, database and mail catcher:
 * a depositor deposits a study with two networks (real CSV files) and submits; a curator follows the
 * e-mailed link and requests changes; the depositor follows their e-mailed link, edits and resubmits; the
 * curator publishes. Screenshots of each step: test-artifacts/screenshots/deposit-*.png. Axe on the
 * deposit flow and the review page.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Locator } from "playwright-core";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, signInViaApi, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { createUser, TEST_PASSWORD } from "../server/support/accounts";
import { resetRateLimits } from "../../server/src/middlewares/rate-limit";

let stack: TestStack;
let depositor: BrowserSession;
let curator: BrowserSession;
const DEPOSITOR = "rowan.hale@example.test";
const CURATOR = "tomas.brand@example.test";
const files = mkdtempSync(join(tmpdir(), "tb-e2e-"));
const DAVIS = join(process.cwd(), "tests", "fixtures", "davis-southern-women.csv");
const HEATH = join(files, "crook-heath-2019.csv");

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  stack = await startStack();
  await createUser({ email: DEPOSITOR, displayName: "Rowan Hale" });
  await createUser({ email: CURATOR, displayName: "Tomas Brand", role: "curator" });
  writeFileSync(HEATH, "plant,Bombus verrinus,Andrena oskensis,Syrphus tallowi\nCalluna demo,4,1,0\nUlex demo,0,3,2\nVaccinium demo,2,0,5\n");
  depositor = await openBrowser();
  curator = await openBrowser();
  depositor.page.setDefaultTimeout(15_000);
  curator.page.setDefaultTimeout(15_000);
  await signInViaApi(depositor.page, stack.url, DEPOSITOR, TEST_PASSWORD);
  await signInViaApi(curator.page, stack.url, CURATOR, TEST_PASSWORD);
});
afterAll(async () => {
  await depositor?.close();
  await curator?.close();
  await stack?.stop();
});

async function fillNetwork(card: Locator, m: { name: string; rows: string; cols: string; place: string; lat: string; lon: string }) {
  await card.getByLabel("Network name", { exact: true }).fill(m.name);
  await card.getByLabel("Interaction type", { exact: true }).selectOption("pollination");
  await card.getByLabel("What the weights mean", { exact: true }).selectOption("visit-count");
  await card.getByLabel("Row nodes are", { exact: true }).fill(m.rows);
  await card.getByLabel("Column nodes are", { exact: true }).fill(m.cols);
  await card.getByLabel("Place name", { exact: true }).fill(m.place);
  await card.getByLabel("Country code", { exact: true }).fill("gb");
  await card.getByLabel("Latitude", { exact: true }).fill(m.lat);
  await card.getByLabel("Longitude", { exact: true }).fill(m.lon);
  await card.getByLabel("Public coordinates", { exact: true }).selectOption("0.1");
  await card.getByLabel("Habitat", { exact: true }).fill("upland heath");
  await card.getByLabel("Start date", { exact: true }).fill("2019-05-01");
  await card.getByLabel("End date", { exact: true }).fill("2019-08-31");
  await card.getByLabel("Sampling protocol", { exact: true }).fill("Timed 15-minute watches of flowering plants.");
}

describe("deposit → review → changes → publish", () => {
  let versionId = 0;

  it("a depositor fills in the study, uploads two networks with an instant preview, and submits", async () => {
    const { page } = depositor;
    await page.goto(`${stack.url}/deposit`);
    await page.getByRole("heading", { name: "New deposit" }).waitFor();
    await page.getByLabel("Title").fill("Flower visitors of the Verrin Hills heath");
    await page.getByLabel("Description").fill("Plant–pollinator interactions on heath sites (invented demo data).");
    // An inline error from the shared schema while typing a malformed ORCID.
    await page.getByLabel("ORCID iD").fill("0000-0002");
    await page.getByText("must be an ORCID iD of 16 characters").waitFor();
    await page.getByLabel("ORCID iD").fill("0000-0002-1825-0097");
    await page.getByLabel("Creator 1 name").fill("Hale, Rowan");
    await page.getByLabel("Licence").selectOption("CC-BY-4.0");
    await page.getByLabel("Contact e-mail").fill(DEPOSITOR);
    await page.getByLabel("Keywords").fill("pollination, heath");
    await screenshot(page, "deposit-1-study");
    expect(await axeSerious(page)).toEqual([]);
    await page.getByRole("button", { name: "Save draft and continue" }).click();
    await page.waitForURL(/\/deposit\/\d+\?step=2/);
    versionId = Number(/\/deposit\/(\d+)/.exec(page.url())![1]);

    await page.getByLabel("Files", { exact: true }).setInputFiles([DAVIS, HEATH]);
    await page.getByText("Instant preview (parsed in your browser)").waitFor();
    await page.getByText("18 rows × 14 columns · 89 links").waitFor();
    await page.getByText("3 rows × 3 columns · 6 links").waitFor();
    await screenshot(page, "deposit-2-preview");
    expect(await axeSerious(page)).toEqual([]);
    await page.getByRole("button", { name: "Upload 2 files" }).click();
    const cards = page.getByRole("list", { name: "Networks of this deposit" }).locator(":scope > li");
    await expect.poll(() => cards.count()).toBe(2);

    await fillNetwork(cards.nth(0), { name: "Davis events (test file)", rows: "women", cols: "events", place: "Crook Heath", lat: "54.43127", lon: "-2.98714" });
    await cards.nth(0).getByRole("button", { name: "Save network 1" }).click();
    await cards.nth(0).getByText("Saved, complete.").waitFor();
    await fillNetwork(cards.nth(1), { name: "Crook Heath 2019", rows: "plants", cols: "pollinators", place: "Crook Heath", lat: "54.43", lon: "-2.98" });
    await cards.nth(1).getByRole("button", { name: "Save network 2" }).click();
    await cards.nth(1).getByText("Saved, complete.").waitFor();
    await screenshot(page, "deposit-3-networks");
    expect(await axeSerious(page)).toEqual([]);

    await page.getByRole("button", { name: "Continue to review" }).click();
    await page.getByText("Everything required is filled in.").waitFor();
    await page.getByRole("button", { name: "Submit for review" }).click();
    await page.getByText("Submitted for review.").waitFor();
    await screenshot(page, "deposit-4-submitted");
    expect(await axeSerious(page)).toEqual([]);
  });

  it("the curator follows the e-mailed link and requests changes", async () => {
    const mail = await stack.catcher.waitFor((m) => m.to.includes(CURATOR) && m.subject.startsWith("New submission"));
    const link = mail.links.find((l) => l.includes(`/review/${versionId}`));
    expect(link).toBe(`${stack.url}/review/${versionId}`);
    const { page } = curator;
    await page.goto(link!);
    await page.getByRole("heading", { name: "Review: Flower visitors of the Verrin Hills heath" }).waitFor();
    await page.getByRole("img", { name: /Matrix picture of network 1/ }).waitFor();
    await page.getByText("54.43127, -2.98714 (exact; public: rounded to 0.1°)").waitFor();
    await screenshot(page, "deposit-5-review");
    expect(await axeSerious(page)).toEqual([]);
    await page.getByLabel("Request changes").check();
    await page.getByLabel("What should change (required)").fill("Please give the sampling effort of network 2.");
    await page.getByRole("button", { name: "Send the change request" }).click();
    await page.getByText("Changes requested by Tomas Brand", { exact: true }).waitFor();
    await screenshot(page, "deposit-6-changes-requested");
  });

  it("the depositor follows their e-mailed link, edits and resubmits", async () => {
    const mail = await stack.catcher.waitFor((m) => m.to.includes(DEPOSITOR) && m.subject.startsWith("Changes requested"));
    const link = mail.links.find((l) => l.includes(`/deposit/${versionId}`));
    expect(link).toBe(`${stack.url}/deposit/${versionId}`);
    const { page } = depositor;
    await page.goto(`${link}?step=2`);
    await page.getByText("Please give the sampling effort of network 2.").waitFor();
    const card = page.getByRole("list", { name: "Networks of this deposit" }).locator(":scope > li").nth(1);
    await card.getByLabel("Sampling effort", { exact: true }).fill("120");
    await card.getByLabel("Effort unit", { exact: true }).fill("observation hours");
    await card.getByRole("button", { name: "Save network 2" }).click();
    await card.getByText("Saved, complete.").waitFor();
    await screenshot(page, "deposit-7-answer");
    await page.getByRole("button", { name: "3. Review and submit" }).click();
    await page.getByRole("button", { name: "Submit again for review" }).click();
    await page.getByText("Submitted for review.").waitFor();
    expect(await axeSerious(page)).toEqual([]);
  });

  it("the curator publishes; the dataset gets TB-000001", async () => {
    await stack.catcher.waitFor((m) => m.to.includes(CURATOR) && m.subject.startsWith("Resubmitted"));
    const { page } = curator;
    await page.goto(`${stack.url}/review/${versionId}`);
    await page.getByText("120 observation hours").waitFor();
    await page.getByLabel("Publish").check();
    await page.getByRole("button", { name: "Publish" }).click();
    await page.getByText("Published as TB-000001.").waitFor();
    await screenshot(page, "deposit-8-published");
    const res = await page.request.get(`${stack.url}/api/v1/datasets/TB-000001`);
    expect(res.status()).toBe(200);
    const body = (await res.json()) as { networks: Array<{ ref: string }> };
    expect(body.networks.map((n) => n.ref)).toEqual(["TB-000001/v1/1", "TB-000001/v1/2"]);
    const mail = await stack.catcher.waitFor((m) => m.to.includes(DEPOSITOR) && m.subject.startsWith("Published: TB-000001"));
    expect(mail.links).toContain(`${stack.url}/datasets/TB-000001`);
    // My deposits shows the state and offers a new version.
    await depositor.page.goto(`${stack.url}/my-deposits`);
    await depositor.page.getByRole("button", { name: "Start version 2" }).waitFor();
    await screenshot(depositor.page, "deposit-9-my-deposits");
    expect(await axeSerious(depositor.page)).toEqual([]);
  });

  it("a curator withdraws the dataset with a reason; the read API answers 410 with the tombstone", async () => {
    const { page } = curator;
    await page.goto(`${stack.url}/review/${versionId}`);
    await page.getByLabel("Reason (required, shown on the tombstone page)").fill("Test withdrawal: the events matrix is not a pollination network.");
    page.once("dialog", (d) => void d.accept());
    await page.getByRole("button", { name: "Withdraw the dataset" }).click();
    await page.getByText(/^Withdrawn on /).waitFor();
    await screenshot(page, "deposit-10-withdrawn");
    const res = await page.request.get(`${stack.url}/api/v1/datasets/TB-000001`);
    expect(res.status()).toBe(410);
    expect(await res.json()).toMatchObject({ accession: "TB-000001", reason: "Test withdrawal: the events matrix is not a pollination network." });
  });

  it("the review queue lists submissions for curators", async () => {
    const { page } = curator;
    await page.goto(`${stack.url}/review`);
    await page.getByRole("heading", { name: "Review queue" }).waitFor();
    await page.getByText("Nothing is waiting for review.").waitFor();
    expect(await axeSerious(page)).toEqual([]);
  });
});
