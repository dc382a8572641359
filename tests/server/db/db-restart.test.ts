/**
 * Fault test: PostgreSQL is stopped and started again under a running server (a process of its own, as
 * `npm start` runs it, against a scratch cluster so the other test files are not disturbed). While the
 * database is away every route that needs it answers 503 with a plain message (never the driver's text),
 * and the process stays up; when the database returns the server recovers by itself: sessions, queries,
 * the catalogue and its LISTEN connection work again without a restart.
 */
import request from "supertest";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startScratchCluster, spawnServer, type ScratchCluster, type SpawnedServer } from "../support/scratch-cluster";
import { waitFor } from "../support/wait";

let cluster: ScratchCluster;
let server: SpawnedServer;

beforeAll(async () => {
  cluster = await startScratchCluster("restart");
  server = await spawnServer(cluster.databaseUrl);
}, 120_000);
afterAll(async () => {
  await server?.kill();
  await cluster?.destroy();
});

const DRIVER_WORDS = /ECONNREFUSED|127\.0\.0\.1|postgres|terminating connection|Sequelize|connect /i;

async function listenerConnected(): Promise<boolean> {
  const c = new pg.Client({ connectionString: cluster.databaseUrl });
  await c.connect();
  try {
    const r = await c.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE application_name = 'tanglebank-catalogue-listener' AND query LIKE 'LISTEN%'`);
    return r.rows[0].n === 1;
  } finally {
    await c.end();
  }
}

describe("PostgreSQL restarting under a running server", () => {
  it("answers 503 with a plain message while the database is away and recovers by itself", { timeout: 120_000 }, async () => {
    const agent = request.agent(server.url);
    const csrf0 = (await agent.get("/api/v1/auth/session")).body.csrfToken as string;
    const email = "fault.tester@example.test";
    const password = "restart-and-recover-7";
    expect((await agent.post("/api/v1/auth/sign-up").set("x-csrf-token", csrf0).send({ email, displayName: "Fault Tester", password })).status).toBe(201);
    const signIn = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf0).send({ email, password });
    expect(signIn.status).toBe(200);
    expect((await agent.get("/api/v1/auth/session")).body.user.email).toBe(email);
    expect((await agent.get("/api/v1/catalogue")).status).toBe(200);
    await waitFor(listenerConnected, "the catalogue listener", 10_000);

    await cluster.stop();

    // The catalogue (and the network list built on it) is held in memory and checked against the database
    // every few seconds: within that interval it may still answer from memory (a whole page, never a driver
    // error); after it, 503.
    for (const path of ["/api/v1/catalogue?q=moss", "/api/v1/networks"]) {
      const res = await request(server.url).get(path);
      if (res.status === 200) expect(res.body, path).toMatchObject({ data: expect.any(Array), meta: expect.any(Object) });
      else expect(res.status, path).toBe(503);
      expect(res.text).not.toMatch(DRIVER_WORDS);
    }
    const during: Array<[string, request.Response]> = [
      ["health", await request(server.url).get("/api/v1/health")],
      ["dataset", await request(server.url).get("/api/v1/datasets/TB-000001")],
      ["session", await agent.get("/api/v1/auth/session")],
      ["account", await agent.get("/api/v1/account")],
      ["sign-in", await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", signIn.body.csrfToken as string).send({ email, password })],
    ];
    for (const [what, res] of during) {
      expect(res.status, what).toBe(503);
      expect(res.headers["retry-after"]).toBe("10");
      expect(res.text).toMatch(/database is not reachable right now/);
      expect(res.text).not.toMatch(DRIVER_WORDS);
    }
    const page = await request(server.url).get("/datasets/TB-000001");
    if (page.status !== 404) {
      // The dataset page's server-side part needs the database (when the client is built).
      expect(page.status).toBe(503);
      expect(page.headers["content-type"]).toMatch(/html/);
      expect(page.text).not.toMatch(DRIVER_WORDS);
    }
    expect(server.exited()).toBe(false);

    await cluster.start();

    await waitFor(async () => (await request(server.url).get("/api/v1/health")).status === 200, "the health check to pass again", 20_000);
    const session = await agent.get("/api/v1/auth/session");
    expect(session.status).toBe(200);
    expect(session.body.user.email).toBe(email);
    expect((await agent.get("/api/v1/account")).status).toBe(200);
    expect((await request(server.url).get("/api/v1/catalogue?q=moss")).status).toBe(200);
    await waitFor(listenerConnected, "the catalogue listener to listen again", 30_000, 500);
    expect(server.exited()).toBe(false);
    expect(server.stderr()).not.toMatch(/Unhandled|uncaught/i);
  });
});
