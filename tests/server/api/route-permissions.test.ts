/**
 * Every protected route, signed out and with each lower role. Add a line per protected route to ROUTES:
 * the test signs in as each role and checks 401 for a visitor and 403 for every role below `min`
 * (and that `min` itself gets past the permission check: neither 401 nor 403).
 * Paths may contain ids that do not exist: permission is checked before the entity is loaded.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../server/src/app";
import { shutdownServerResources } from "../../../server/src/index";
import { resetRateLimits } from "../../../server/src/middlewares/rate-limit";
import { setCurrentMailCatcher } from "../../../server/src/lib/mail-catcher";
import { resetDatabase } from "../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../support/accounts";

type Min = "depositor" | "curator" | "admin";
interface ProtectedRoute {
  method: "get" | "post" | "put" | "patch" | "delete";
  path: string;
  min: Min;
  body?: Record<string, unknown>;
}

const ROUTES: ProtectedRoute[] = [
  // accounts
  { method: "get", path: "/api/v1/account", min: "depositor" },
  { method: "patch", path: "/api/v1/account", min: "depositor", body: {} },
  { method: "put", path: "/api/v1/account/password", min: "depositor", body: {} },
  { method: "delete", path: "/api/v1/account/orcid", min: "depositor" },
  { method: "get", path: "/api/v1/users", min: "admin" },
  { method: "patch", path: "/api/v1/users/1/role", min: "admin", body: { role: "depositor" } },
  { method: "get", path: "/api/v1/outbox", min: "admin" },
  { method: "get", path: "/api/v1/outbox/1", min: "admin" },
  // --- other features: add your routes below ---
  // collections (signed in; codes that do not exist answer 404 after the check)
  { method: "get", path: "/api/v1/collections", min: "depositor" },
  { method: "post", path: "/api/v1/collections", min: "depositor", body: { name: "" } },
  { method: "patch", path: "/api/v1/collections/TBC-999999", min: "depositor", body: {} },
  { method: "delete", path: "/api/v1/collections/TBC-999999", min: "depositor" },
  { method: "post", path: "/api/v1/collections/TBC-999999/members", min: "depositor", body: { refs: [] } },
  { method: "delete", path: "/api/v1/collections/TBC-999999/members/TB-000001/v1/1", min: "depositor" },
  // personal API tokens (signed in; revoking a token id that does not exist answers 404 after the check)
  { method: "get", path: "/api/v1/tokens", min: "depositor" },
  { method: "post", path: "/api/v1/tokens", min: "depositor", body: { name: "" } },
  { method: "delete", path: "/api/v1/tokens/999999", min: "depositor" },
  // metrics pipeline (admin); bodies are invalid on purpose, so an admin gets 400/404 and nothing is queued
  { method: "get", path: "/api/v1/pipeline/settings", min: "admin" },
  { method: "put", path: "/api/v1/pipeline/settings", min: "admin", body: { restarts: 0 } },
  { method: "get", path: "/api/v1/pipeline/queue", min: "admin" },
  { method: "get", path: "/api/v1/pipeline/batches", min: "admin" },
  { method: "post", path: "/api/v1/pipeline/batches", min: "admin", body: { force: "yes" } },
  { method: "post", path: "/api/v1/pipeline/batches/preview", min: "admin", body: { force: "yes" } },
  { method: "get", path: "/api/v1/pipeline/batches/current", min: "admin" },
  { method: "get", path: "/api/v1/pipeline/batches/999999", min: "admin" },
  { method: "get", path: "/api/v1/pipeline/batches/999999/failures", min: "admin" },
  { method: "post", path: "/api/v1/pipeline/batches/999999/retry", min: "admin" },
  { method: "get", path: "/api/v1/pipeline/runs", min: "admin" },
  { method: "get", path: "/api/v1/pipeline/networks/999999", min: "admin" },
  // deposits (owner; ids that do not exist answer 404 after the permission check)
  { method: "get", path: "/api/v1/deposits", min: "depositor" },
  { method: "post", path: "/api/v1/deposits", min: "depositor", body: { metadata: [] } },
  { method: "get", path: "/api/v1/deposits/999999", min: "depositor" },
  { method: "delete", path: "/api/v1/deposits/999999", min: "depositor" },
  { method: "put", path: "/api/v1/deposits/999999/metadata", min: "depositor", body: { metadata: {} } },
  { method: "post", path: "/api/v1/deposits/999999/networks", min: "depositor" },
  { method: "put", path: "/api/v1/deposits/999999/networks/order", min: "depositor", body: { order: [] } },
  { method: "patch", path: "/api/v1/deposits/999999/networks/1", min: "depositor", body: { metadata: {} } },
  { method: "get", path: "/api/v1/deposits/999999/metadata-sheet", min: "depositor" },
  { method: "put", path: "/api/v1/deposits/999999/metadata-sheet", min: "depositor", body: { csv: "network\n1\n" } },
  { method: "post", path: "/api/v1/deposits/999999/networks/apply", min: "depositor", body: { from: 1, blocks: ["locality"] } },
  { method: "delete", path: "/api/v1/deposits/999999/networks/1", min: "depositor" },
  { method: "get", path: "/api/v1/deposits/999999/networks/1/file", min: "depositor" },
  { method: "get", path: "/api/v1/deposits/999999/networks/1/canonical", min: "depositor" },
  { method: "post", path: "/api/v1/deposits/999999/submit", min: "depositor" },
  { method: "post", path: "/api/v1/datasets/TB-999999/versions", min: "depositor" },
  // curation
  { method: "get", path: "/api/v1/reviews", min: "curator" },
  { method: "get", path: "/api/v1/reviews/999999", min: "curator" },
  { method: "get", path: "/api/v1/reviews/999999/diff", min: "curator" },
  { method: "get", path: "/api/v1/deposits/999999/comments", min: "depositor" },
  { method: "post", path: "/api/v1/deposits/999999/comments", min: "depositor", body: { body: "test" } },
  { method: "post", path: "/api/v1/reviews/999999/decision", min: "curator", body: { decision: "publish" } },
  { method: "put", path: "/api/v1/reviews/999999/metadata", min: "curator", body: { metadata: {} } },
  { method: "patch", path: "/api/v1/reviews/999999/networks/1", min: "curator", body: { metadata: {} } },
  { method: "post", path: "/api/v1/datasets/TB-999999/withdraw", min: "curator", body: { reason: "test" } },
  // network views: the curators' audit history of a dataset (the accession need not exist)
  { method: "get", path: "/api/v1/network-views/history/TB-999999", min: "curator" },
];

const ORDER: Min[] = ["depositor", "curator", "admin"];
const agents: Partial<Record<Min | "visitor", SignedInAgent>> = {};
const app = createApp();

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  setCurrentMailCatcher(undefined);
  agents.visitor = await agentFor(app);
  for (const role of ORDER) {
    const u = await createUser({ role, email: `${role}@permissions.test` });
    agents[role] = await agentFor(app, u.email);
  }
});
afterAll(shutdownServerResources);

function call(who: SignedInAgent, r: ProtectedRoute) {
  const req = who.agent[r.method](r.path);
  return r.method === "get" ? req : req.set("x-csrf-token", who.csrf).send(r.body ?? {});
}

describe("route permissions", () => {
  it.each(ROUTES.map((r) => [`${r.method.toUpperCase()} ${r.path} (${r.min})`, r] as const))("%s", async (_name, r) => {
    const visitor = await call(agents.visitor!, r);
    expect(visitor.status, "visitor").toBe(401);
    for (const role of ORDER) {
      const res = await call(agents[role]!, r);
      if (ORDER.indexOf(role) < ORDER.indexOf(r.min)) {
        expect(res.status, role).toBe(403);
        expect(res.body.code, role).toBe("forbidden");
      } else {
        expect([401, 403], `${role} must pass the permission check`).not.toContain(res.status);
      }
    }
  });
});
