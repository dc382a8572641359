/**
 * Personal API tokens: creation (secret shown once, only its hash stored), use as Bearer on the public
 * API and on the owner's own resources, listing, revocation (401 afterwards), the per-token rate limit
 * with its RateLimit headers, and that a token cannot mint tokens.
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetConfig } from "../../../../server/src/config/env";
import { hashApiToken } from "../../../../server/src/middlewares/authenticate";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { ApiToken } from "../../../../server/src/models";
import { catalogueStore } from "../../../../server/src/api/catalogue/catalogue.store";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { publishDataset } from "../../support/catalogue-fixtures";

const app = createApp();
let owner: SignedInAgent;
let other: SignedInAgent;
let draftRef = "";

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  await resetRateLimits();
  const u = await createUser({ email: "token.owner@example.test" });
  await createUser({ email: "someone.else@example.test" });
  owner = await agentFor(app, "token.owner@example.test");
  other = await agentFor(app, "someone.else@example.test");
  await publishDataset({ networks: [{ seed: 1, metrics: { q: 0.3, z: 1 } }] });
  // the owner's unpublished version (its dataset has an accession from an earlier publication)
  const pub = await publishDataset({ owner: u, networks: [{ seed: 2 }] });
  await publishDataset({ owner: u, dataset: { id: pub.datasetId, accession: pub.accession }, number: 2, state: "draft", networks: [{ seed: 3 }] });
  draftRef = `${pub.accession}/v2/1`;
});
afterAll(shutdownServerResources);

describe("personal API tokens", () => {
  let secret = "";
  let id = 0;

  it("creates a token whose secret is shown once and stored only as a hash", async () => {
    const res = await owner.agent.post("/api/v1/tokens").set("x-csrf-token", owner.csrf).send({ name: "R scripts" });
    expect(res.status).toBe(201);
    secret = res.body.secret;
    id = res.body.token.id;
    expect(secret).toMatch(/^tb_[A-Za-z0-9_-]{32}$/);
    expect(res.body.token).toMatchObject({ name: "R scripts", prefix: secret.slice(0, 7), revokedAt: null, lastUsedAt: null });
    const row = await ApiToken.findByPk(id);
    expect(row!.tokenHash).toBe(hashApiToken(secret));
    expect(JSON.stringify(row!.toJSON())).not.toContain(secret);
    const list = await owner.agent.get("/api/v1/tokens");
    expect(list.body.data.map((t: { name: string }) => t.name)).toEqual(["R scripts"]);
    expect(JSON.stringify(list.body)).not.toContain(secret);
  });

  it("refuses a nameless token with the field named", async () => {
    const res = await owner.agent.post("/api/v1/tokens").set("x-csrf-token", owner.csrf).send({ name: "  " });
    expect(res.status).toBe(422);
    expect(res.body.details[0].path).toBe("/name");
  });

  it("authenticates Bearer requests: the owner's draft network becomes readable; last use is recorded", async () => {
    const anon = await request(app).get(`/api/v1/networks/${draftRef}`);
    expect(anon.status).toBe(404);
    const res = await request(app).get(`/api/v1/networks/${draftRef}`).set("Authorization", `Bearer ${secret}`);
    expect(res.status).toBe(200);
    expect(res.body.state).toBe("draft");
    const list = await request(app).get("/api/v1/tokens").set("Authorization", `Bearer ${secret}`);
    expect(list.status).toBe(200);
    // the last use is recorded after the answer: wait for it (up to 5 s)
    await vi.waitFor(async () => expect((await ApiToken.findByPk(id))!.lastUsedAt).not.toBeNull(), { timeout: 5000, interval: 50 });
  });

  it("a token cannot create tokens; nobody else can revoke it", async () => {
    const res = await request(app).post("/api/v1/tokens").set("Authorization", `Bearer ${secret}`).send({ name: "more" });
    expect(res.status).toBe(403);
    const theirs = await other.agent.delete(`/api/v1/tokens/${id}`).set("x-csrf-token", other.csrf);
    expect(theirs.status).toBe(404);
  });

  it("applies the rate limit per token, with RateLimit headers, separately from the IP budget", async () => {
    process.env.TB_API_RATE_LIMIT = "2";
    resetConfig();
    await resetRateLimits();
    try {
      const codes: number[] = [];
      let last: request.Response | undefined;
      for (let i = 0; i < 3; i++) {
        last = await request(app).get("/api/v1/catalogue").set("Authorization", `Bearer ${secret}`);
        codes.push(last.status);
      }
      expect(codes).toEqual([200, 200, 429]);
      expect(last!.headers["ratelimit-policy"]).toMatch(/q=2/);
      expect(last!.headers["ratelimit"]).toMatch(/r=0/);
      // the same IP without the token has its own budget
      const anon = await request(app).get("/api/v1/catalogue");
      expect(anon.status).toBe(200);
    } finally {
      delete process.env.TB_API_RATE_LIMIT;
      resetConfig();
      await resetRateLimits();
    }
  });

  it("revocation makes the token useless at once", async () => {
    const res = await owner.agent.delete(`/api/v1/tokens/${id}`).set("x-csrf-token", owner.csrf);
    expect(res.status).toBe(200);
    expect(res.body.token.revokedAt).not.toBeNull();
    const after = await request(app).get("/api/v1/catalogue").set("Authorization", `Bearer ${secret}`);
    expect(after.status).toBe(401);
    expect(after.body.code).toBe("invalid_token");
  });

  it("visitors cannot list or create tokens", async () => {
    expect((await request(app).get("/api/v1/tokens")).status).toBe(401);
  });
});
