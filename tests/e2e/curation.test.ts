/**
 * Curation in Chromium against the real app, database and mail catcher: the depositor resubmits with a
 * reply; the review page shows each network's whole matrix (ordered by degree), the deposited file with its
 * SHA-256, what changed since the first submission (study fields, network fields, nodes and cells) and the
 * conversation; curator and depositor write to each other, each following the e-mailed link; a curator
 * withdraws a published dataset from its dataset page. Files and metadata are prepared through the API (the
 * deposit journey itself is tests/e2e/deposit-review.test.ts). Screenshots: test-artifacts/screenshots/curation-*.png.
 */
import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, signInViaApi, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { agentFor, createUser, TEST_PASSWORD, type SignedInAgent } from "../server/support/accounts";
import { decide, makeDraft, networkMeta, studyMeta, submit } from "../server/support/deposit-helpers";
import { resetRateLimits } from "../../server/src/middlewares/rate-limit";

let stack: TestStack;
let curator: BrowserSession;
let depositor: BrowserSession;
let owner: SignedInAgent;
let curatorApi: SignedInAgent;
const CURATOR = "maren.ilves@example.test";
const DEPOSITOR = "ines.okafor@example.test";

// Invented seed-dispersal counts; the corrected file drops one plant, adds a bird and changes one count.
const FIRST = "plant,Turdus demo,Sylvia demo,Erithacus demo\nSorbus demo,12,3,0\nPrunus demo,4,0,2\nRubus demo,0,7,5\nTaxus demo,1,0,0\n";
const CORRECTED = "plant,Turdus demo,Sylvia demo,Erithacus demo,Bombycilla demo\nSorbus demo,12,3,0,6\nPrunus demo,4,0,2,0\nRubus demo,0,9,5,1\n";
const sha = (s: string) => createHash("sha256").update(s).digest("hex");

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  stack = await startStack();
  await createUser({ email: DEPOSITOR, displayName: "Ines Okafor" });
  await createUser({ email: CURATOR, displayName: "Maren Ilves", role: "curator" });
  owner = await agentFor(stack.app, DEPOSITOR);
  curatorApi = await agentFor(stack.app, CURATOR);
  curator = await openBrowser();
  curator.page.setDefaultTimeout(15_000);
  await signInViaApi(curator.page, stack.url, CURATOR, TEST_PASSWORD);
  depositor = await openBrowser();
  depositor.page.setDefaultTimeout(15_000);
  await signInViaApi(depositor.page, stack.url, DEPOSITOR, TEST_PASSWORD);
});
afterAll(async () => {
  await curator?.close();
  await depositor?.close();
  await stack?.stop();
});

describe("the review page of a resubmission", () => {
  let versionId = 0;

  beforeAll(async () => {
    const d = await makeDraft(owner, [["orrin-valley.csv", FIRST]]);
    versionId = d.versionId;
    expect((await submit(owner, versionId)).status).toBe(200);
    expect((await decide(curatorApi, versionId, { decision: "request_changes", comment: "Rubus counts look transposed; please check the field sheets." })).status).toBe(200);
    const csrf = { "x-csrf-token": owner.csrf };
    expect((await owner.agent.put(`/api/v1/deposits/${versionId}/metadata`).set(csrf).send({ metadata: studyMeta({ title: "Fruit eaters of the Orrin valley" }) })).status).toBe(200);
    expect((await owner.agent.delete(`/api/v1/deposits/${versionId}/networks/${d.networkIds[0]}`).set(csrf)).status).toBe(200);
    const u = await owner.agent.post(`/api/v1/deposits/${versionId}/networks`).set(csrf).field("kind", "bipartite").attach("files", Buffer.from(CORRECTED), "orrin-valley.csv");
    expect(u.status).toBe(201);
    const meta = networkMeta({ name: "Orrin valley 2021", interactionType: "seed-dispersal", rowLevel: "plants", colLevel: "birds", habitat: "riparian woodland", weightMeaning: "visit-count" });
    expect((await owner.agent.patch(`/api/v1/deposits/${versionId}/networks/${u.body.networks[0].id}`).set(csrf).send({ metadata: meta })).status).toBe(200);
  });

  it("the depositor reads the request in the conversation and resubmits with a reply", async () => {
    const { page } = depositor;
    await page.goto(`${stack.url}/deposit/${versionId}?step=3`);
    const thread = page.getByRole("region", { name: "Conversation with the curators" });
    await thread.getByText("Rubus counts look transposed; please check the field sheets.").waitFor();
    await page.getByLabel("Your reply to the curators (optional)").fill("Rubus and Sylvia were swapped in two cells; corrected from the field sheets. Taxus was a misidentified Sorbus sapling and is gone.");
    await page.getByRole("button", { name: "Submit again for review" }).click();
    await page.getByText("Submitted for review.").waitFor();
    await thread.getByText("Submitted again (submission 2)", { exact: false }).waitFor();
    await thread.getByText(/^Rubus and Sylvia were swapped/).waitFor();
    await screenshot(page, "curation-0-resubmitted");
    expect(await axeSerious(page)).toEqual([]);
    const mail = await stack.catcher.waitFor((m) => m.to.includes(CURATOR) && m.subject.startsWith("Resubmitted for review"));
    expect(mail.text).toContain("> Rubus and Sylvia were swapped in two cells");
  });

  it("shows the whole matrix, the deposited file with its SHA-256, and what changed", async () => {
    const { page } = curator;
    await page.goto(`${stack.url}/review/${versionId}`);
    await page.getByRole("heading", { name: "Review: Fruit eaters of the Orrin valley" }).waitFor();
    // the whole matrix, drawn by the network pages' matrix view, ordered by degree
    const canvas = page.getByRole("img", { name: "Interaction matrix, 3 by 4, ordered by decreasing degree" });
    await canvas.waitFor();
    await expect.poll(() => canvas.getAttribute("data-rendered")).toBe("true");
    await page.getByText("No partition yet: rows and columns are sorted by decreasing degree.").waitFor();
    // the file as deposited, its full hash on the page
    expect(await page.getByTestId("file-sha256").textContent()).toBe(sha(CORRECTED));
    const link = page.getByRole("link", { name: "Download the deposited file" });
    const [download] = await Promise.all([page.waitForEvent("download"), link.click()]);
    expect(download.suggestedFilename()).toBe("orrin-valley.csv");
    const { readFileSync } = await import("node:fs");
    expect(readFileSync((await download.path())!, "utf8")).toBe(CORRECTED);

    // the diff
    const diff = page.getByRole("region", { name: "Changes since the previous submission" });
    await diff.getByText(/^Submission 2 \(.*\) compared with submission 1/).waitFor();
    await diff.getByRole("row", { name: /title .*Fruit eaters of the Orrin valley/ }).waitFor();
    const net = diff.getByTestId("network-diff");
    await net.getByText("changed", { exact: true }).waitFor();
    await net.getByText("4 × 3, 7 links → 3 × 4, 8 links").waitFor();
    await net.getByText("Row nodes: −1 (Taxus demo)").waitFor();
    await net.getByText("Column nodes: +1 (Bombycilla demo)").waitFor();
    // FIRST → CORRECTED: Taxus–Turdus gone; Sorbus–, Rubus–Bombycilla new; Rubus–Sylvia 7 → 9
    expect(await net.getByTestId("cell-diff").innerText()).toContain("Links: 2 added, 1 removed, 1 with a new weight, 5 unchanged.");
    await net.getByRole("row", { name: "Rubus demo Sylvia demo 7 9" }).waitFor();
    await net.getByRole("row", { name: "habitat upland heath riparian woodland" }).waitFor();
    await screenshot(page, "curation-1-review-diff");
    expect(await axeSerious(page)).toEqual([]);
  });

  it("curator and depositor write to each other; each follows the e-mailed link to the other's page", async () => {
    const { page } = curator;
    const thread = page.getByRole("region", { name: "Conversation with the depositor" });
    const messages = thread.getByRole("list", { name: "Messages" }).locator(":scope > li");
    // submitted, changes requested, submitted again, the reply
    await expect.poll(() => messages.count()).toBe(4);
    expect(await messages.nth(1).innerText()).toContain("Changes requested by Maren Ilves (curator)");
    expect(await messages.nth(3).innerText()).toContain("Ines Okafor (depositor)");
    await thread.getByLabel("Write to the depositor").fill("Thank you. Were the Bombycilla visits counted in the same watches?");
    await thread.getByRole("button", { name: "Send to the depositor" }).click();
    await thread.getByText("Thank you. Were the Bombycilla visits counted in the same watches?").waitFor();
    await expect.poll(() => thread.getByLabel("Write to the depositor").inputValue()).toBe("");
    await screenshot(page, "curation-4-thread-curator");

    const mail = await stack.catcher.waitFor((m) => m.to.includes(DEPOSITOR) && m.subject === "New comment: Fruit eaters of the Orrin valley");
    const link = mail.links.find((l) => l.includes(`/deposit/${versionId}`));
    expect(link).toBe(`${stack.url}/deposit/${versionId}`);
    const dp = depositor.page;
    await dp.goto(link!);
    const mine = dp.getByRole("region", { name: "Conversation with the curators" });
    await mine.getByText("Thank you. Were the Bombycilla visits counted in the same watches?").waitFor();
    await mine.getByLabel("Write to the curators").fill("Yes, the same 15-minute watches.");
    await mine.getByRole("button", { name: "Send to the curators" }).click();
    await mine.getByText("Yes, the same 15-minute watches.").waitFor();
    await screenshot(dp, "curation-5-thread-depositor");
    expect(await axeSerious(dp)).toEqual([]);

    const back = await stack.catcher.waitFor((m) => m.to.includes(CURATOR) && m.subject === "New comment: Fruit eaters of the Orrin valley");
    expect(back.links).toContain(`${stack.url}/review/${versionId}`);
    await page.goto(`${stack.url}/review/${versionId}`);
    await thread.getByText("Yes, the same 15-minute watches.").waitFor();
    await expect.poll(() => messages.count()).toBe(6);
  });
});

describe("withdraw from the dataset page", () => {
  it("a curator withdraws a published dataset with a reason and a confirmation; the page becomes its tombstone", async () => {
    const d = await makeDraft(owner, [["askel-fen.csv", FIRST]]);
    expect((await submit(owner, d.versionId)).status).toBe(200);
    const pub = await decide(curatorApi, d.versionId, { decision: "publish" });
    expect(pub.status).toBe(200);
    const accession = pub.body.accession as string;
    const { page } = curator;
    await page.goto(`${stack.url}/datasets/${accession}`);
    const section = page.getByRole("region", { name: `Withdraw ${accession}` });
    await section.waitFor();
    const button = section.getByRole("button", { name: "Withdraw the dataset…" });
    expect(await button.isDisabled()).toBe(true);
    await section.getByLabel("Reason (required, shown on the tombstone page)").fill("The counts were copied from another site's sheet.");
    await button.click();
    await section.getByText(`Withdraw every published version of ${accession}? This cannot be undone.`).waitFor();
    await screenshot(page, "curation-2-withdraw-confirm");
    // Cancel leaves it published
    await section.getByRole("button", { name: "Cancel" }).click();
    expect((await page.request.get(`${stack.url}/api/v1/datasets/${accession}`)).status()).toBe(200);
    await button.click();
    await section.getByRole("button", { name: `Yes, withdraw ${accession}` }).click();
    await page.getByText("The counts were copied from another site's sheet.").waitFor();
    await screenshot(page, "curation-3-withdrawn");
    const res = await page.request.get(`${stack.url}/api/v1/datasets/${accession}`);
    expect(res.status()).toBe(410);
    expect(await res.json()).toMatchObject({ accession, reason: "The counts were copied from another site's sheet." });
  });

  it("depositors see no Withdraw section", async () => {
    const d = await makeDraft(owner, [["tallow.csv", FIRST]]);
    await submit(owner, d.versionId);
    const accession = (await decide(curatorApi, d.versionId, { decision: "publish" })).body.accession as string;
    const { page } = depositor;
    await page.goto(`${stack.url}/datasets/${accession}`);
    await page.getByRole("heading", { name: "Networks" }).first().waitFor();
    expect(await page.getByRole("region", { name: `Withdraw ${accession}` }).count()).toBe(0);
  });
});
