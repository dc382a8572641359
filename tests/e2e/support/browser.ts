/**
 * Debian's Chromium driven by playwright-core (never a downloaded browser). Screenshots go to
 * test-artifacts/screenshots/ (ignored by git) so people can look at them.
 */
import { mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";

export const SCREENSHOT_DIR = join(process.cwd(), "test-artifacts", "screenshots");

export interface BrowserSession {
  context: BrowserContext;
  page: Page;
  close: () => Promise<void>;
}

export async function openBrowser(viewport = { width: 1280, height: 900 }): Promise<BrowserSession> {
  const profile = mkdtempSync(join(tmpdir(), "tb-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    viewport,
    acceptDownloads: true,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
      "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Signs in through the UI's API (sets the session cookie in the browser context). */
export async function signInViaApi(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  const session = await page.request.get(`${baseUrl}/api/v1/auth/session`);
  const { csrfToken } = (await session.json()) as { csrfToken: string };
  const res = await page.request.post(`${baseUrl}/api/v1/auth/sign-in`, { data: { email, password }, headers: { "x-csrf-token": csrfToken } });
  if (!res.ok()) throw new Error(`sign-in failed: ${res.status()} ${await res.text()}`);
}
