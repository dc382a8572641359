import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";

let stack: TestStack;
let browser: BrowserSession;

beforeAll(async () => {
  await resetDatabase();
  stack = await startStack();
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

describe("client shell", () => {
  it("serves the front page with our font and navigation, and a useful 404", async () => {
    const { page } = browser;
    await page.goto(stack.url + "/");
    await page.getByRole("heading", { level: 1, name: "Ecological interaction networks, deposited, curated and measured the same way" }).waitFor();
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Catalogue" }).waitFor();
    const font = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(font).toContain("Noto Sans");
    await page.evaluate(() => document.fonts.ready);
    const loaded = await page.evaluate(() => document.fonts.check('16px "Noto Sans"'));
    expect(loaded).toBe(true);
    await screenshot(page, "shell-home");
    expect(await axeSerious(page)).toEqual([]);

    await page.goto(stack.url + "/no/such/page");
    await page.getByRole("heading", { name: "Page not found" }).waitFor();
    await screenshot(page, "shell-404");
  });

  it("the accessibility check reports serious violations, naming the rule and the element", async () => {
    const { page } = browser;
    // a known-bad page: an image without alternative text (critical) and grey text on white at 1.6:1 (serious)
    await page.setContent(`<!doctype html><html lang="en"><head><title>Known bad</title></head><body><main>
      <h1>Known bad</h1><img id="no-alt" src="data:image/gif;base64,R0lGODlhAQABAAAAACw="><p id="faint" style="color:#ccc;background:#fff">Faint text</p>
    </main></body></html>`);
    const found = await axeSerious(page);
    expect(found).toContain("image-alt: #no-alt");
    expect(found).toContain("color-contrast: #faint");
    expect(await axeSerious(page, "h1")).toEqual([]);
  });
});
