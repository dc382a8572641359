import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AxeBuilder } from "@axe-core/playwright";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, type BrowserSession } from "./support/browser";
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
    const axe = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa"]).analyze();
    expect(axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical")).toEqual([]);

    await page.goto(stack.url + "/no/such/page");
    await page.getByRole("heading", { name: "Page not found" }).waitFor();
    await screenshot(page, "shell-404");
  });
});
