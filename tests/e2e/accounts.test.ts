/**
 * The account journey in Chromium: sign up, read the confirmation mail in the admin Outbox and follow its
 * link, sign in, see the account page, sign out; then a password reset through its e-mailed link.
 * Screenshots of every page go to test-artifacts/screenshots/accounts-*.png.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { startStack, type TestStack } from "../server/support/stack";
import { openBrowser, screenshot, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { createUser, TEST_PASSWORD } from "../server/support/accounts";

let stack: TestStack;
let browser: BrowserSession;
const NEW_EMAIL = "linnea.marsh@example.test";
const NEW_PASSWORD = "bog-cotton-2025";

beforeAll(async () => {
  await resetDatabase();
  stack = await startStack();
  await createUser({ role: "admin", email: "warden@example.test", displayName: "Warden Admin" });
  browser = await openBrowser();
  browser.page.setDefaultTimeout(10_000);
});
afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

async function signInThroughForm(page: Page, email: string, password: string) {
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password", { exact: true }).fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

async function signOutFromAccount(page: Page) {
  await page.goto(stack.url + "/account");
  await page.getByRole("button", { name: "Sign out" }).click();
  await page.getByRole("link", { name: "Sign in" }).first().waitFor();
}

describe("accounts in the browser", () => {
  it("sign up → outbox link → confirmed → sign in → account → sign out", async () => {
    const { page } = browser;
    await page.goto(stack.url + "/sign-up");
    await page.getByRole("heading", { name: "Create an account" }).waitFor();
    await screenshot(page, "accounts-sign-up");

    // The API's field errors appear beside the fields.
    await page.getByLabel("Your name").fill("Linnea Marsh");
    await page.getByLabel("E-mail address").fill("not-an-address");
    await page.getByLabel("Password").fill("short");
    await page.getByRole("button", { name: "Create account" }).click();
    await page.getByText("This is not a valid e-mail address").waitFor();
    await page.getByText("Password must be at least 10 characters long.").first().waitFor();
    expect(await page.getByLabel("E-mail address").getAttribute("aria-invalid")).toBe("true");
    await screenshot(page, "accounts-sign-up-errors");

    await page.getByLabel("E-mail address").fill(NEW_EMAIL);
    await page.getByLabel("Password").fill(NEW_PASSWORD);
    await page.getByRole("button", { name: "Create account" }).click();
    await page.getByRole("heading", { name: "Check your e-mail" }).waitFor();
    expect(await page.getByText(NEW_EMAIL).count()).toBeGreaterThan(0);
    await screenshot(page, "accounts-sign-up-done");

    // The admin opens the Outbox (sign-in with ?next= lands there).
    await page.goto(stack.url + "/admin/outbox");
    await page.waitForURL(/\/sign-in\?next=%2Fadmin%2Foutbox/);
    await page.getByRole("heading", { name: "Sign in" }).waitFor();
    await screenshot(page, "accounts-sign-in");
    expect(await axeSerious(page)).toEqual([]);

    await signInThroughForm(page, "warden@example.test", "wrong-password-1");
    await page.getByText("The e-mail address or the password is not correct.").waitFor();
    await screenshot(page, "accounts-sign-in-wrong");
    await signInThroughForm(page, "warden@example.test", TEST_PASSWORD);
    await page.waitForURL(/\/admin\/outbox$/);
    const subject = page.getByRole("link", { name: "Confirm your e-mail address for Tanglebank" });
    await subject.waitFor();
    await screenshot(page, "accounts-outbox");
    expect(await axeSerious(page)).toEqual([]);

    await subject.click();
    await page.getByRole("heading", { name: "Confirm your e-mail address for Tanglebank" }).waitFor();
    const link = page.locator("pre a[href*='/verify-email?token=']");
    const href = await link.getAttribute("href");
    expect(href).toMatch(new RegExp(`^${stack.url}/verify-email\\?token=[A-Za-z0-9_-]{40,}$`));
    await screenshot(page, "accounts-outbox-message");

    // The users page while we are admin.
    await page.goto(stack.url + "/admin/users");
    await page.getByRole("cell", { name: NEW_EMAIL }).waitFor();
    await screenshot(page, "accounts-users");
    expect(await axeSerious(page)).toEqual([]);

    await signOutFromAccount(page);

    // Follow the link from the mail as the new person.
    await page.goto(href!);
    await page.getByRole("heading", { name: "Your e-mail address is confirmed" }).waitFor();
    await screenshot(page, "accounts-verify-email");
    // Opening it again says plainly that it was used.
    await page.reload();
    await page.getByText("This link has already been used").waitFor();
    await screenshot(page, "accounts-verify-email-used");

    await page.goto(stack.url + "/sign-in");
    await signInThroughForm(page, NEW_EMAIL, NEW_PASSWORD);
    await page.waitForURL(/\/account$/);
    await page.getByRole("heading", { name: "Your account", exact: true }).waitFor();
    await page.getByText("confirmed", { exact: true }).waitFor();
    const nav = page.getByRole("banner");
    await nav.getByRole("link", { name: /Linnea Marsh/ }).waitFor();
    expect(await nav.getByRole("link", { name: "Users" }).count()).toBe(0);
    expect(await page.locator("#account-extra").count()).toBe(1);
    await screenshot(page, "accounts-account");
    expect(await axeSerious(page)).toEqual([]);

    // Profile with a bad ORCID: the field shows the API's message; then a good one is saved.
    await page.getByLabel("ORCID iD").fill("0000-0002-1825-0098");
    await page.getByRole("button", { name: "Save profile" }).click();
    await page.getByText("check digit is wrong").waitFor();
    await page.getByLabel("ORCID iD").fill("0000-0002-1825-0097");
    await page.getByLabel("Affiliation").fill("Lake Osk Institute");
    await page.getByRole("button", { name: "Save profile" }).click();
    await page.getByText("Your profile is saved.").waitFor();
    await screenshot(page, "accounts-account-saved");

    // The sign-in page knows who is signed in.
    await page.goto(stack.url + "/sign-in");
    await page.getByRole("heading", { name: "You are signed in" }).waitFor();

    // A depositor who opens an admin page sees "Not allowed".
    await page.goto(stack.url + "/admin/users");
    await page.getByRole("heading", { name: "Not allowed" }).waitFor();

    await signOutFromAccount(page);
    await page.goto(stack.url + "/account");
    await page.waitForURL(/\/sign-in\?next=%2Faccount/);
    await screenshot(page, "accounts-signed-out");
  });

  it("forgot password → e-mailed link → new password; a used or broken link gets a clear page", async () => {
    const { page } = browser;
    await page.goto(stack.url + "/sign-in");
    await page.getByRole("link", { name: "Forgot your password?" }).click();
    await page.getByRole("heading", { name: "Forgot your password?" }).waitFor();
    await screenshot(page, "accounts-forgot-password");
    await page.getByLabel("E-mail address").fill(NEW_EMAIL);
    await page.getByRole("button", { name: "Send me a reset link" }).click();
    await page.getByText("Check your e-mail").waitFor();
    await screenshot(page, "accounts-forgot-password-sent");

    const mail = await stack.catcher.waitFor((m) => m.to.includes(NEW_EMAIL) && m.subject === "Reset your Tanglebank password");
    const link = mail.links.find((l) => l.includes("/reset-password?token="))!;
    await page.goto(link);
    await page.getByRole("heading", { name: "Choose a new password" }).waitFor();
    await page.getByLabel("New password", { exact: true }).fill("fen-orchid-2026");
    await page.getByLabel("New password again").fill("fen-orchid-2027");
    await page.getByRole("button", { name: "Set new password" }).click();
    await page.getByText("The two passwords differ.").waitFor();
    await screenshot(page, "accounts-reset-password");
    await page.getByLabel("New password again").fill("fen-orchid-2026");
    await page.getByRole("button", { name: "Set new password" }).click();
    await page.getByRole("heading", { name: "Your password is changed" }).waitFor();
    await screenshot(page, "accounts-reset-password-done");

    await page.goto(link);
    await page.getByLabel("New password", { exact: true }).fill("another-one-2028");
    await page.getByLabel("New password again").fill("another-one-2028");
    await page.getByRole("button", { name: "Set new password" }).click();
    await page.getByText("This link has already been used").waitFor();
    await screenshot(page, "accounts-reset-password-used");

    await page.goto(stack.url + "/reset-password");
    await page.getByText("This page needs the link from the e-mail").waitFor();

    await page.goto(stack.url + "/sign-in");
    await signInThroughForm(page, NEW_EMAIL, "fen-orchid-2026");
    await page.waitForURL(/\/account$/);
  });
});
