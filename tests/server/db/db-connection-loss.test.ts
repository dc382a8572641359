/**
 * Regression: a database connection that drops while idle (restart, failover, idle timeout, a terminated
 * backend) must not stop the server. Before the fix, the session store's pool had no 'error' listener
 * and "Unhandled 'error' event" ended the process.
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { createApp } from "../../../server/src/app";
import { shutdownServerResources } from "../../../server/src/index";
import { resetDatabase } from "../../setup/db";

const app = createApp();
beforeAll(resetDatabase);
afterAll(shutdownServerResources);

async function terminateOtherBackends(): Promise<number> {
  const c = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await c.connect();
  try {
    const r = await c.query(
      "SELECT pg_terminate_backend(pid) AS ok FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid() AND backend_type = 'client backend'",
    );
    return r.rowCount ?? 0;
  } finally {
    await c.end();
  }
}

describe("a dropped database connection", () => {
  it("is replaced: the session store and the app keep answering after every backend is terminated", async () => {
    const agent = request.agent(app);
    // A session read and write opens connections in the session store's pool and in Sequelize's.
    const s1 = await agent.get("/api/v1/auth/session");
    expect(s1.status).toBe(200);
    const terminated = await terminateOtherBackends();
    expect(terminated).toBeGreaterThan(0);
    // Give the pools time to see the closed sockets (the 'error' event fires on idle clients).
    await new Promise((r) => setTimeout(r, 300));
    const s2 = await agent.get("/api/v1/auth/session");
    expect(s2.status).toBe(200);
    const health = await request(app).get("/api/v1/health");
    expect(health.status).toBe(200);
    expect(health.body.database.status).toBe("ok");
  });
});
