/**
 * Sign-in with ORCID in Chromium, end to end through OpenID Connect against the local ORCID stand-in
 * (oidc-provider on an ephemeral port): a new account made from an ORCID record, linking an iD from the
 * Account page (shown as verified, and the dataset creator with that iD marked verified), and answers
 * whose state or nonce were tampered with refused. Each journey runs in a fresh browser session, with
 * cookies of its own (the stand-in remembers who signed in). Screenshots: test-artifacts/screenshots/orcid-*.png.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { resetConfig } from "../../server/src/config/env";
import { OrcidStandIn } from "../../server/src/lib/orcid/stand-in";
import { CALLBACK_PATH, resetOrcidClient } from "../../server/src/api/auth/orcid.service";
import { User } from "../../server/src/models";
import { startStack, type TestStack } from "../server/support/stack";
import { createFixtureDataset, fixtureUser, FIXTURE_PASSWORD } from "../server/support/published-fixture";
import { openBrowser, screenshot, signInViaApi, type BrowserSession } from "./support/browser";
import { axeSerious } from "./support/a11y";
import { resetDatabase } from "../setup/db";
import { resetRateLimits } from "../../server/src/middlewares/rate-limit";

const ROWAN_ORCID = "0000-0004-2718-3011"; // made-up demo iD (valid check digit)
let stack: TestStack;
let orcid: OrcidStandIn;
let rowanEmail: string;
let accession: string;
const open: BrowserSession[] = [];

async function fresh(): Promise<Page> {
  const b = await openBrowser();
  b.page.setDefaultTimeout(15_000);
  open.push(b);
  return b.page;
}

beforeAll(async () => {
  await resetDatabase();
  // sign-ups are limited per address, and every browser test signs up from 127.0.0.1
  await resetRateLimits();
  stack = await startStack();
  orcid = new OrcidStandIn({ clientId: "APP-TESTCLIENT0001", clientSecret: "test-client-secret", redirectUris: [`${stack.url}${CALLBACK_PATH}`] });
  await orcid.listen(0);
  Object.assign(process.env, { TB_ORCID_ISSUER: orcid.issuer, TB_ORCID_CLIENT_ID: "APP-TESTCLIENT0001", TB_ORCID_CLIENT_SECRET: "test-client-secret" });
  resetConfig();
  resetOrcidClient();
  const rowan = await fixtureUser("depositor", "Rowan Hale");
  rowanEmail = rowan.email;
  ({ accession } = await createFixtureDataset({ owner: rowan, study: { creators: [{ name: "Rowan Hale", orcid: ROWAN_ORCID, affiliation: "Verrin Hills Ecology Group" }, { name: "Okafor, Ines" }] } }));
});

afterAll(async () => {
  for (const b of open) await b.close().catch(() => undefined);
  await orcid?.close();
  for (const k of ["TB_ORCID_ISSUER", "TB_ORCID_CLIENT_ID", "TB_ORCID_CLIENT_SECRET"]) delete process.env[k];
  resetConfig();
  resetOrcidClient();
  await stack?.stop();
});

describe("sign-in with ORCID through OpenID Connect", () => {
  it("a new researcher creates an account from their ORCID record", async () => {
    const page = await fresh();
    await page.goto(`${stack.url}/sign-in`);
    await screenshot(page, "orcid-sign-in");
    await page.getByRole("button", { name: "Continue with ORCID" }).click();
    await page.getByRole("heading", { name: "ORCID stand-in: sign in" }).waitFor();
    expect(page.url().startsWith(orcid.issuer)).toBe(true);
    await screenshot(page, "orcid-stand-in");
    await page.getByRole("button", { name: /Lior Vantelle/ }).click();

    await page.getByRole("heading", { name: "Create your account with ORCID" }).waitFor();
    expect(await page.getByTestId("pending-orcid").textContent()).toBe("0000-0004-2718-3070");
    expect(await page.getByLabel("Name").inputValue()).toBe("Lior Vantelle");
    await page.getByLabel("E-mail address").fill("lior.vantelle@example.test");
    await screenshot(page, "orcid-new-account");
    expect(await axeSerious(page)).toEqual([]);
    await page.getByRole("button", { name: "Create my account" }).click();
    await page.waitForURL(/\/account$/);

    await page.getByRole("heading", { name: "Your account", exact: true }).waitFor();
    await page.getByTestId("orcid-verified").waitFor();
    expect(await page.getByTestId("orcid-verified").textContent()).toContain("0000-0004-2718-3070");
    const u = await User.findOne({ where: { email: "lior.vantelle@example.test" } });
    expect(u?.orcid).toBe("0000-0004-2718-3070");
    expect(u?.orcidVerifiedAt).toBeInstanceOf(Date);
    // a confirmation link is on its way for the new address
    await stack.catcher.waitFor((m) => m.to.includes("lior.vantelle@example.test"));
  });

  it("a signed-in researcher links their iD from the Account page; it shows as verified, here and on their dataset", async () => {
    const page = await fresh();
    await signInViaApi(page, stack.url, rowanEmail, FIXTURE_PASSWORD);
    await page.goto(`${stack.url}/datasets/${accession}`);
    await page.getByRole("heading", { name: "About this dataset" }).waitFor();
    expect(await page.getByText("✓ verified", { exact: true }).count()).toBe(0);

    await page.goto(`${stack.url}/account`);
    await page.getByRole("button", { name: "Link your ORCID iD" }).click();
    await page.getByRole("button", { name: /Rowan Hale/ }).click();
    await page.getByText("Your ORCID iD is linked and verified.").waitFor();
    expect(await page.getByTestId("orcid-verified").textContent()).toContain(ROWAN_ORCID);
    await screenshot(page, "orcid-linked-account");
    expect(await axeSerious(page)).toEqual([]);
    expect((await User.findOne({ where: { email: rowanEmail } }))?.orcidVerifiedAt).toBeInstanceOf(Date);

    await page.goto(`${stack.url}/datasets/${accession}`);
    await page.getByText("✓ verified", { exact: true }).waitFor();
    expect(await page.getByText("✓ verified", { exact: true }).count()).toBe(1); // Rowan, not the creator without an iD
    await screenshot(page, "orcid-verified-creator");

    // and she can now sign in with ORCID (a new browser: the stand-in asks who she is again)
    const again = await fresh();
    await again.goto(`${stack.url}/sign-in`);
    await again.getByRole("button", { name: "Continue with ORCID" }).click();
    await again.getByRole("button", { name: /Rowan Hale/ }).click();
    await again.waitForURL(`${stack.url}/`);
    const session = await (await again.request.get(`${stack.url}/api/v1/auth/session`)).json();
    expect(session.user.email).toBe(rowanEmail);
  });

  it("refuses an answer whose state was tampered with, and one whose ID token carries another nonce", async () => {
    // state: the code comes back with a state this browser never sent
    const page = await fresh();
    // Redirects are not routed, so the sign-in form's POST at the stand-in is carried out here, hop by hop,
    // and the browser is sent back to Tanglebank with the state changed.
    await page.route(
      (url) => url.origin === orcid.issuer && /^\/interaction\/[^/]+\/login$/.test(url.pathname),
      async (route) => {
        let res = await route.fetch({ maxRedirects: 0 });
        let loc = res.headers()["location"] ?? "";
        while (loc && new URL(loc, orcid.issuer).origin === orcid.issuer) {
          res = await page.request.get(new URL(loc, orcid.issuer).href, { maxRedirects: 0 });
          loc = res.headers()["location"] ?? "";
        }
        const back = new URL(loc);
        expect(back.pathname).toBe(CALLBACK_PATH);
        back.searchParams.set("state", "forged-state-value");
        await route.fulfill({ status: 303, headers: { location: back.href } });
      },
    );
    await page.goto(`${stack.url}/sign-in`);
    await page.getByRole("button", { name: "Continue with ORCID" }).click();
    await page.getByRole("button", { name: /Pavel Strand/ }).click();
    await page.getByText("ORCID sign-in refused").waitFor();
    expect(page.url()).toBe(`${stack.url}/sign-in?orcidError=orcid_state`);
    expect(await page.getByRole("alert").first().textContent()).toContain("state did not match");
    await screenshot(page, "orcid-tampered-state");
    expect((await (await page.request.get(`${stack.url}/api/v1/auth/session`)).json()).user).toBeNull();

    // nonce: the authorization request reaches ORCID with another nonce, so the signed ID token carries it
    const page2 = await fresh();
    await page2.route((url) => url.origin === orcid.issuer && url.pathname === "/auth", (route) => {
      const u = new URL(route.request().url());
      u.searchParams.set("nonce", "forged-nonce-value");
      return route.fulfill({ status: 302, headers: { location: u.href } });
    });
    await page2.goto(`${stack.url}/sign-in`);
    await page2.getByRole("button", { name: "Continue with ORCID" }).click();
    await page2.getByRole("button", { name: /Pavel Strand/ }).click();
    await page2.getByText("ORCID sign-in refused").waitFor();
    expect(page2.url()).toBe(`${stack.url}/sign-in?orcidError=orcid_nonce`);
    expect((await (await page2.request.get(`${stack.url}/api/v1/auth/session`)).json()).user).toBeNull();
    expect(await User.count({ where: { orcid: "0000-0004-2718-3038" } })).toBe(0);
  });
});
