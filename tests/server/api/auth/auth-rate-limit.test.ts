import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetConfig } from "../../../../server/src/config/env";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, TEST_PASSWORD } from "../../support/accounts";

let app: ReturnType<typeof createApp>;
beforeAll(async () => {
  process.env.TB_AUTH_RATE_LIMIT = "3";
  resetConfig();
  await resetDatabase();
  app = createApp();
});
afterAll(async () => {
  delete process.env.TB_AUTH_RATE_LIMIT;
  resetConfig();
  await shutdownServerResources();
});

describe("rate limits on sign-in (TB_AUTH_RATE_LIMIT=3 per account and IP, 30 per IP) and sign-up (3 per IP)", () => {
  it("answers 429 after repeated failed sign-ins, with draft-8 headers, even for the right password", async () => {
    await resetRateLimits();
    const u = await createUser();
    const { agent, csrf } = await agentFor(app);
    // A successful sign-in does not count.
    const good = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf).send({ email: u.email, password: TEST_PASSWORD });
    expect(good.status).toBe(200);
    const c = good.body.csrfToken;
    for (let i = 0; i < 3; i++) {
      const r = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", c).send({ email: u.email, password: `wrong-guess-${i}0` });
      expect(r.status).toBe(401);
      expect(r.headers["ratelimit-policy"]).toMatch(/q=3/);
      expect(r.headers["x-ratelimit-limit"]).toBeUndefined();
    }
    const blocked = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", c).send({ email: u.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.code).toBe("rate_limited");
    expect(blocked.body.message).toMatch(/Too many failed sign-in attempts/);
    expect(blocked.headers["ratelimit"]).toMatch(/r=0/);
    expect(blocked.headers["retry-after"]).toBeDefined();
    expect(blocked.body.message).toMatch(/for this account from this address/);
    // Counted per account and address together: someone else behind the same address still signs in.
    const other = await createUser();
    const ok = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", c).send({ email: other.email.toUpperCase(), password: TEST_PASSWORD });
    expect(ok.status).toBe(200);
    // …and the same account in other letter case is the same account
    const again = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", ok.body.csrfToken).send({ email: ` ${u.email.toUpperCase()}`, password: TEST_PASSWORD });
    expect(again.status).toBe(429);
  });

  it("bounds guessing across many accounts from one address at ten times the limit", async () => {
    await resetRateLimits();
    const { agent, csrf } = await agentFor(app);
    const statuses: number[] = [];
    for (let i = 0; i < 31; i++) {
      const r = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf).send({ email: `nobody${i}@example.test`, password: "wrong-guess-00" });
      statuses.push(r.status);
    }
    expect(statuses.slice(0, 30).every((s) => s === 401)).toBe(true);
    expect(statuses[30]).toBe(429);
  });

  it("answers 429 after the sign-up limit", async () => {
    await resetRateLimits();
    const { agent, csrf } = await agentFor(app);
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      const r = await agent.post("/api/v1/auth/sign-up").set("x-csrf-token", csrf).send({ email: `burst${i}@example.test`, displayName: "Burst", password: "burst-password-1" });
      statuses.push(r.status);
    }
    expect(statuses).toEqual([201, 201, 201, 429]);
  });
});
