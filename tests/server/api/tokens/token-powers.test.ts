/**
 * What a personal API token (Bearer) may do: read with its owner's role and act as a depositor; curator
 * and admin writes (decisions, withdrawal, role changes, pipeline settings), the outbox (live account
 * links), managing tokens and changing the account need a browser session and answer 403
 * `session_required` to a token (one guard: requireRole / requireBrowserSession).
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { setCurrentMailCatcher } from "../../../../server/src/lib/mail-catcher";
import { User } from "../../../../server/src/models";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, TEST_PASSWORD, type SignedInAgent } from "../../support/accounts";

const app = createApp();
const secrets: Record<"depositor" | "curator" | "admin", string> = { depositor: "", curator: "", admin: "" };
let adminSession: SignedInAgent;
let victimId = 0;

async function tokenFor(who: SignedInAgent): Promise<string> {
  const res = await who.agent.post("/api/v1/tokens").set("x-csrf-token", who.csrf).send({ name: "script" });
  expect(res.status).toBe(201);
  return res.body.secret as string;
}

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  setCurrentMailCatcher(undefined);
  for (const role of ["depositor", "curator", "admin"] as const) {
    const u = await createUser({ role, email: `${role}@token-powers.test` });
    const agent = await agentFor(app, u.email);
    if (role === "admin") adminSession = agent;
    secrets[role] = await tokenFor(agent);
  }
  victimId = (await createUser({ email: "victim@token-powers.test" })).id;
});
afterAll(shutdownServerResources);

const bearer = (secret: string) => ({ Authorization: `Bearer ${secret}` });

describe("API token powers", () => {
  it("an admin token cannot change roles; the admin's session can", async () => {
    const res = await request(app).patch(`/api/v1/users/${victimId}/role`).set(bearer(secrets.admin)).send({ role: "admin" });
    expect(res.status).toBe(403);
    expect(res.body.code).toBe("session_required");
    expect((await User.findByPk(victimId))!.role).toBe("depositor");
    const viaSession = await adminSession.agent.patch(`/api/v1/users/${victimId}/role`).set("x-csrf-token", adminSession.csrf).send({ role: "curator" });
    expect(viaSession.status).toBe(200);
    expect((await User.findByPk(victimId))!.role).toBe("curator");
  });

  it("an admin token cannot read the outbox or change pipeline settings", async () => {
    const outbox = await request(app).get("/api/v1/outbox").set(bearer(secrets.admin));
    expect(outbox.status).toBe(403);
    expect(outbox.body.code).toBe("session_required");
    const settings = await request(app).put("/api/v1/pipeline/settings").set(bearer(secrets.admin)).send({ restarts: 0 });
    expect(settings.status).toBe(403);
    expect(settings.body.code).toBe("session_required");
  });

  it("a curator token reads the review queue but cannot decide, correct or withdraw", async () => {
    expect((await request(app).get("/api/v1/reviews").set(bearer(secrets.curator))).status).toBe(200);
    const calls = [
      request(app).post("/api/v1/reviews/999999/decision").set(bearer(secrets.curator)).send({ decision: "publish" }),
      request(app).put("/api/v1/reviews/999999/metadata").set(bearer(secrets.curator)).send({ metadata: {} }),
      request(app).patch("/api/v1/reviews/999999/networks/1").set(bearer(secrets.curator)).send({ metadata: {} }),
      request(app).post("/api/v1/datasets/TB-999999/withdraw").set(bearer(secrets.curator)).send({ reason: "test" }),
    ];
    for (const [i, res] of (await Promise.all(calls)).entries()) {
      expect(res.status, `call ${i}`).toBe(403);
      expect(res.body.code, `call ${i}`).toBe("session_required");
    }
  });

  it("a depositor token may deposit (depositor actions), but not mint tokens or change the account", async () => {
    const dep = await request(app).post("/api/v1/deposits").set(bearer(secrets.depositor)).send({ metadata: { title: "From a script" } });
    expect(dep.status).toBe(201);
    const calls = [
      request(app).post("/api/v1/tokens").set(bearer(secrets.depositor)).send({ name: "more" }),
      request(app).delete("/api/v1/tokens/1").set(bearer(secrets.depositor)),
      request(app).patch("/api/v1/account").set(bearer(secrets.depositor)).send({ displayName: "X" }),
      request(app).put("/api/v1/account/password").set(bearer(secrets.depositor)).send({ currentPassword: TEST_PASSWORD, newPassword: "another-pass-123" }),
      request(app).delete("/api/v1/account/orcid").set(bearer(secrets.depositor)),
    ];
    for (const [i, res] of (await Promise.all(calls)).entries()) {
      expect(res.status, `call ${i}`).toBe(403);
      expect(res.body.code, `call ${i}`).toBe("session_required");
    }
  });

  it("signing in with an Authorization header is a clear 400, not a server error", async () => {
    const res = await request(app).post("/api/v1/auth/sign-in").set(bearer(secrets.depositor)).send({ email: "depositor@token-powers.test", password: TEST_PASSWORD });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/Authorization header/);
  });
});
