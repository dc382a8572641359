/**
 * Fault test: the server process (as `npm start` runs it, tests/server/support/fault-server.ts) is killed
 * with SIGKILL in the middle of an upload's and of a publication's database writes, and nothing is left
 * half-written: no stored file, network, matrix CSV, metric run, DOI, review or audit row of the killed
 * request, the draft and the submission as they were; the same requests then succeed (answered in-process
 * here, which is what a restarted server runs). Two servers are started at once, one killed per case.
 *
 * "In the middle" is made certain, not a matter of timing: the test holds a SHARE lock on audit_log (the
 * last table both writes touch), waits until the server's transaction is blocked on it — everything before
 * it already written, uncommitted — and kills the server there; then it lets the lock go, so the orphaned
 * backend runs on, finds its client gone and rolls back.
 */
import pg from "pg";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/src/app";
import { shutdownServerResources } from "../../server/src/index";
import { sequelize } from "../../server/src/db/sequelize";
import { resetDatabase } from "../setup/db";
import { agentFor, createUser, TEST_PASSWORD } from "./support/accounts";
import { davisCsv, networkMeta, SMALL_MATRIX, studyMeta } from "./support/deposit-helpers";
import { spawnServer, type SpawnedServer } from "./support/scratch-cluster";
import { waitFor } from "./support/wait";

const app = createApp();
let servers: SpawnedServer[] = [];
let ownerEmail = "";
let curatorEmail = "";

beforeAll(async () => {
  await resetDatabase();
  ownerEmail = (await createUser({ displayName: "Rowan Hale" })).email;
  curatorEmail = (await createUser({ role: "curator", displayName: "Tomas Brand" })).email;
  servers = await Promise.all([spawnServer(process.env.DATABASE_URL!), spawnServer(process.env.DATABASE_URL!)]);
}, 120_000);
afterAll(async () => {
  for (const s of servers) await s.kill();
  await shutdownServerResources();
});

async function signIn(url: string, email: string) {
  const agent = request.agent(url);
  const s = await agent.get("/api/v1/auth/session");
  const res = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", s.body.csrfToken).send({ email, password: TEST_PASSWORD });
  expect(res.status).toBe(200);
  return { agent, csrf: res.body.csrfToken as string };
}

async function one<T>(sql: string, replacements: Record<string, unknown> = {}): Promise<T> {
  const [rows] = (await sequelize().query(sql, { replacements })) as [T[], unknown];
  return rows[0];
}

/** Counts of every table a deposit or a publication writes, and the state of one version. */
async function snapshot(versionId: number) {
  return one<Record<string, unknown>>(
    `SELECT (SELECT count(*)::int FROM stored_files) AS files,
            (SELECT count(*)::int FROM networks) AS networks,
            (SELECT count(*)::int FROM networks WHERE matrix_csv_format IS NOT NULL) AS matrix_csvs,
            (SELECT count(*)::int FROM metric_runs) AS runs,
            (SELECT count(*)::int FROM dataset_dois) AS dois,
            (SELECT count(*)::int FROM reviews) AS reviews,
            (SELECT count(*)::int FROM audit_log) AS audit,
            v.state, v.lock_version, v.published_at, d.accession
       FROM dataset_versions v JOIN datasets d ON d.id = v.dataset_id WHERE v.id = :versionId`,
    { versionId },
  );
}

/**
 * Sends `fire`'s request, waits until the server's transaction is blocked on the audit_log lock this
 * test holds, kills the server there, and lets the lock go once the server is dead. Returns when the
 * orphaned backend has gone.
 */
async function killMidWrite(server: SpawnedServer, fire: () => Promise<unknown>): Promise<void> {
  const locker = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await locker.connect();
  try {
    await locker.query("BEGIN");
    await locker.query("LOCK TABLE audit_log IN SHARE MODE");
    const answer = fire().then(
      (r) => r,
      (e: unknown) => e,
    );
    const blocked = await waitFor(
      async () => {
        // a backend waiting on this test's lock, in a transaction that has written already (the statistics
        // snapshot is cleared first: inside a transaction pg_stat_activity would show the same rows each time)
        await locker.query("SELECT pg_stat_clear_snapshot()");
        const r = await locker.query<{ pid: number }>(
          `SELECT pid FROM pg_stat_activity WHERE pg_backend_pid() = ANY (pg_blocking_pids(pid)) AND backend_xid IS NOT NULL AND query ILIKE '%audit_log%'`,
        );
        return r.rows[0]?.pid;
      },
      "the server's transaction to wait on the audit_log lock",
      30_000,
      50,
    );
    await server.kill("SIGKILL");
    const res = (await answer) as { status?: number; code?: string };
    expect(res.status, "the killed server cannot have answered").toBeUndefined();
    await locker.query("ROLLBACK");
    await waitFor(async () => (await locker.query(`SELECT 1 FROM pg_stat_activity WHERE pid = $1`, [blocked])).rowCount === 0, "the orphaned backend to end", 20_000, 50);
  } finally {
    await locker.end();
  }
}

describe("the server killed with SIGKILL mid-write", () => {
  let versionId = 0;

  it("mid-upload: no stored file, network or audit row of the upload; the same upload then works", { timeout: 120_000 }, async () => {
    const server = servers[0];
    const setup = await agentFor(app, ownerEmail);
    const c = await setup.agent.post("/api/v1/deposits").set("x-csrf-token", setup.csrf).send({ metadata: studyMeta() });
    expect(c.status).toBe(201);
    versionId = c.body.versionId;
    const owner = await signIn(server.url, ownerEmail);
    const first = await setup.agent.post(`/api/v1/deposits/${versionId}/networks`).set("x-csrf-token", setup.csrf).field("kind", "bipartite").attach("files", Buffer.from(SMALL_MATRIX), "heath.csv");
    expect(first.status).toBe(201);
    const before = await snapshot(versionId);

    const upload = () =>
      owner.agent
        .post(`/api/v1/deposits/${versionId}/networks`)
        .set("x-csrf-token", owner.csrf)
        .field("kind", "bipartite")
        .attach("files", davisCsv(), "davis.csv")
        .attach("files", Buffer.from("plant,bee A\nThyme,1\nSorrel,1\n"), "sorrel.csv");
    await killMidWrite(server, upload);
    expect(server.exited()).toBe(true);
    expect(await snapshot(versionId)).toEqual(before);

    const res = await setup.agent
      .post(`/api/v1/deposits/${versionId}/networks`)
      .set("x-csrf-token", setup.csrf)
      .field("kind", "bipartite")
      .attach("files", davisCsv(), "davis.csv")
      .attach("files", Buffer.from("plant,bee A\nThyme,1\nSorrel,1\n"), "sorrel.csv");
    expect(res.status).toBe(201);
    expect(res.body.deposit.networks.map((n: { originalName: string }) => n.originalName)).toEqual(["heath.csv", "davis.csv", "sorrel.csv"]);
    const after = await snapshot(versionId);
    expect(after.networks).toBe(Number(before.networks) + 2);
    expect(after.files).toBe(Number(before.files) + 2);
  });

  it("mid-publication: the submission stays submitted with no accession, run, DOI, matrix CSV, review or audit row; publishing again works once", { timeout: 120_000 }, async () => {
    const server = servers[1];
    const owner = await agentFor(app, ownerEmail);
    const nets = (await owner.agent.get(`/api/v1/deposits/${versionId}`)).body.networks as Array<{ id: number }>;
    for (const n of nets) {
      const r = await owner.agent.patch(`/api/v1/deposits/${versionId}/networks/${n.id}`).set("x-csrf-token", owner.csrf).send({ metadata: networkMeta({ name: `Network ${n.id}` }) });
      expect(r.status, JSON.stringify(r.body)).toBe(200);
    }
    const sub = await owner.agent.post(`/api/v1/deposits/${versionId}/submit`).set("x-csrf-token", owner.csrf).send({});
    expect(sub.status, JSON.stringify(sub.body)).toBe(200);
    const curator = await signIn(server.url, curatorEmail);
    const before = await snapshot(versionId);
    expect(before).toMatchObject({ state: "submitted", accession: null, published_at: null });

    const publish = () => curator.agent.post(`/api/v1/reviews/${versionId}/decision`).set("x-csrf-token", curator.csrf).send({ decision: "publish" });
    await killMidWrite(server, publish);
    expect(await snapshot(versionId)).toEqual(before);

    const again = await agentFor(app, curatorEmail);
    const res = await again.agent.post(`/api/v1/reviews/${versionId}/decision`).set("x-csrf-token", again.csrf).send({ decision: "publish" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const after = await snapshot(versionId);
    expect(after).toMatchObject({ state: "published", accession: expect.stringMatching(/^TB-\d{6}$/), reviews: Number(before.reviews) + 1 });
    expect(after.runs).toBe(Number(before.runs) + nets.length);
    expect(after.dois).toBe(Number(before.dois) + 2);
    expect(after.matrix_csvs).toBe(Number(before.matrix_csvs) + nets.length);
  });
});

