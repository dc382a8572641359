/**
 * Debian's Chromium driven by playwright-core (never a downloaded browser). Screenshots go to
 * test-artifacts/screenshots/ (ignored by git) so people can look at them.
 */
import { mkdirSync } from "node:fs";
import { join } from "node:path";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";

export const SCREENSHOT_DIR = join(process.cwd(), "test-artifacts", "screenshots");

export interface BrowserSession {
  context: BrowserContext;
  page: Page;
  close: () => Promise<void>;
}

/** The Chromium of this test file: started by the first session, closed when its last session closes. */
let shared: { browser: Promise<Browser>; sessions: number } | undefined;

/**
 * A fresh browser session (its own cookies, storage and cache: a new browser context) with one page. The
 * sessions of a test file share one Chromium process, so a file that needs several people at once, or a
 * clean slate per test, does not start Chromium again for each.
 */
export async function openBrowser(viewport = { width: 1280, height: 900 }): Promise<BrowserSession> {
  shared ??= {
    browser: chromium.launch({
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      headless: true,
      args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    }),
    sessions: 0,
  };
  const mine = shared;
  mine.sessions++;
  const browser = await mine.browser;
  const context = await browser.newContext({ viewport, acceptDownloads: true });
  const page = await context.newPage();
  let closed = false;
  return {
    context,
    page,
    close: async () => {
      if (closed) return;
      closed = true;
      await context.close();
      if (--mine.sessions === 0) {
        if (shared === mine) shared = undefined;
        await browser.close();
      }
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
