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

describe("rate limits on sign-in and sign-up (TB_AUTH_RATE_LIMIT=3 per IP)", () => {
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
