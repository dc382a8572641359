/**
 * The deployment path (README: "Deploying"): `npm run build` compiles the server (scripts/build-server.ts)
 * and `NODE_ENV=production node dist/server/main.js` runs it without tsx. This file compiles the server,
 * starts the compiled process on a database of its own (so its metrics worker never takes the jobs of
 * other test files), and checks that it migrates an empty database with the compiled migrations, answers
 * /health, stops cleanly on SIGTERM, refuses a bad setting with exit status 78, and that the compiled
 * worker thread computes exactly what the source computes.
 */
import { fork, spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, readdirSync } from "node:fs";
import { join } from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runParseTask } from "../../server/src/lib/parse/task";
import { runTask } from "../../server/src/pipeline/compute";
import { serializeNetwork } from "@shared/network/index";
import type { PipelineSettings } from "@shared/types/pipeline";
import { karate } from "../shared/optimizer/helpers";

const ROOT = join(import.meta.dirname, "..", "..");
const DIST = join(ROOT, "dist", "server");
const baseUrl = process.env.DATABASE_URL!;
const dbName = `${new URL(baseUrl).pathname.slice(1)}_build`;
const dbUrl = Object.assign(new URL(baseUrl), { pathname: `/${dbName}` }).href;

async function admin(sql: string): Promise<void> {
  const c = new pg.Client({ connectionString: baseUrl });
  await c.connect();
  try {
    await c.query(sql);
  } finally {
    await c.end();
  }
}

const productionEnv = (extra: Record<string, string> = {}) => ({
  PATH: process.env.PATH ?? "",
  NODE_ENV: "production",
  DATABASE_URL: dbUrl,
  SESSION_SECRET: "production-build-test-secret-0123456789",
  PORT: "0",
  HOST: "127.0.0.1",
  LOG_LEVEL: "silent",
  TB_DOI: "off",
  TB_ORCID: "off",
  TB_METRICS_THREADS: "1",
  ...extra,
});

/** Starts the compiled server and resolves with its URL once it says where it listens. */
function startCompiled(): Promise<{ child: ChildProcess; url: string; output: () => string }> {
  const child = spawn(process.execPath, [join(DIST, "main.js")], { cwd: ROOT, env: productionEnv(), stdio: ["ignore", "pipe", "pipe"] });
  let out = "";
  child.stderr!.on("data", (d: Buffer) => (out += d.toString()));
  return new Promise((resolve, reject) => {
    child.stdout!.on("data", (d: Buffer) => {
      out += d.toString();
      const m = /listening on (http:\/\/127\.0\.0\.1:\d+)/.exec(out);
      if (m) resolve({ child, url: m[1], output: () => out });
    });
    child.once("exit", (code) => reject(new Error(`the compiled server exited (${code}) before listening:\n${out}`)));
  });
}

function exited(child: ChildProcess): Promise<number | null> {
  return new Promise((resolve) => (child.exitCode !== null ? resolve(child.exitCode) : child.once("exit", (code) => resolve(code))));
}

beforeAll(async () => {
  const build = spawnSync(process.execPath, ["--import", "tsx", "scripts/build-server.ts"], { cwd: ROOT, encoding: "utf8" });
  expect(build.status, `${build.stdout}\n${build.stderr}`).toBe(0);
  await admin(`DROP DATABASE IF EXISTS ${dbName}`);
  await admin(`CREATE DATABASE ${dbName}`);
}, 120_000);

afterAll(async () => {
  await admin(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
});

describe("the compiled server (npm run build)", () => {
  it("holds no TypeScript and no tsx: every entry is plain JavaScript", () => {
    for (const f of ["main.js", "worker.js", "set-role.js", "metrics-thread.mjs", "parse-process.mjs"]) expect(existsSync(join(DIST, f)), f).toBe(true);
    const migrations = readdirSync(join(DIST, "migrations")).filter((f) => f.endsWith(".js"));
    const sources = readdirSync(join(ROOT, "server", "src", "db", "migrations")).filter((f) => f.endsWith(".ts"));
    expect(migrations.map((f) => f.replace(/\.js$/, ""))).toEqual(sources.map((f) => f.replace(/\.ts$/, "")));
  });

  it("migrates an empty database, answers /health, serves the API and stops cleanly on SIGTERM", async () => {
    const { child, url, output } = await startCompiled();
    try {
      const health = await fetch(`${url}/api/v1/health`);
      expect(health.status).toBe(200);
      expect(await health.json()).toMatchObject({ status: "ok", database: { status: "ok" } });
      const missing = await fetch(`${url}/api/v1/no-such-thing`);
      expect(missing.status).toBe(404);
      expect(await missing.json()).toEqual({ code: "not_found", message: "No API route GET /api/v1/no-such-thing" });
      const spec = await fetch(`${url}/api/v1/openapi.json`);
      expect(spec.status).toBe(200);
      expect(((await spec.json()) as { paths: Record<string, unknown> }).paths).toHaveProperty("/health");
    } finally {
      child.kill("SIGTERM");
    }
    expect(await exited(child)).toBe(0);
    const c = new pg.Client({ connectionString: dbUrl });
    await c.connect();
    const { rows } = await c.query<{ name: string }>("SELECT name FROM sequelize_meta ORDER BY name").finally(() => c.end());
    const sources = readdirSync(join(ROOT, "server", "src", "db", "migrations")).filter((f) => f.endsWith(".ts")).sort();
    expect(rows.map((r) => r.name)).toEqual(sources.map((f) => f.replace(/\.ts$/, "")));
    expect(output()).toContain("Applied migrations: ");
  });

  it("set-role gives an account a role from the command line (a deployment's first admin), audited", async () => {
    const c = new pg.Client({ connectionString: dbUrl });
    await c.connect();
    try {
      await c.query(`INSERT INTO users (email, password_hash, display_name) VALUES ('First.Admin@example.test', 'x', 'First Admin')`);
      const setRole = (...args: string[]) => spawnSync(process.execPath, [join(DIST, "set-role.js"), ...args], { cwd: ROOT, env: productionEnv(), encoding: "utf8" });
      const done = setRole("first.admin@example.test", "admin");
      expect(done.status, done.stderr).toBe(0);
      expect(done.stdout).toContain("First.Admin@example.test: depositor → admin.");
      const { rows } = await c.query<{ role: string }>(`SELECT role FROM users WHERE email = 'First.Admin@example.test'`);
      expect(rows[0].role).toBe("admin");
      const log = await c.query<{ actor_id: number | null; details: Record<string, unknown> }>(`SELECT actor_id, details FROM audit_log WHERE action = 'role.changed'`);
      expect(log.rows).toEqual([{ actor_id: null, details: { from: "depositor", to: "admin", email: "First.Admin@example.test", via: "command line" } }]);
      // the last admin stays; unknown accounts and roles are refused
      expect(setRole("first.admin@example.test", "curator")).toMatchObject({ status: 1, stderr: expect.stringContaining("the last admin") });
      expect(setRole("nobody@example.test", "admin")).toMatchObject({ status: 1, stderr: expect.stringContaining("no account") });
      expect(setRole("first.admin@example.test", "owner")).toMatchObject({ status: 2, stderr: expect.stringContaining('unknown role "owner"') });
    } finally {
      await c.end();
    }
  });

  it("refuses a bad setting with a message naming it and exit status 78", () => {
    const r = spawnSync(process.execPath, [join(DIST, "main.js")], { cwd: ROOT, env: productionEnv({ SESSION_SECRET: "short" }), encoding: "utf8" });
    expect(r.status).toBe(78);
    expect(r.stderr).toContain("SESSION_SECRET must be set to at least 32 characters in production");
  });

  it("computes on the compiled worker thread exactly what the source computes (karate club, Zachary 1977)", () => {
    // Zachary's karate club from tests/fixtures (34 nodes, 78 links); seeded, so both runs are identical.
    const settings: PipelineSettings = { objective: "auto", restarts: 3, nullModels: ["er"], nulls: 4, seed: 5, annealing: "off" };
    const task = { kind: "observed" as const, canonical: serializeNetwork(karate()), settings };
    const script = `
      import { Piscina } from "piscina";
      const pool = new Piscina({ filename: new URL("./dist/server/metrics-thread.mjs", "file://${ROOT}/").href, maxThreads: 1 });
      let input = "";
      for await (const chunk of process.stdin) input += chunk;
      process.stdout.write(JSON.stringify(await pool.run(JSON.parse(input))));
      await pool.destroy();`;
    const r = spawnSync(process.execPath, ["--input-type=module", "-e", script], { cwd: ROOT, input: JSON.stringify(task), encoding: "utf8", env: { PATH: process.env.PATH ?? "" } });
    expect(r.status, r.stderr).toBe(0);
    const compiled = JSON.parse(r.stdout) as { analysis: { modularity: { Q: number }; elapsedMs?: number } };
    const source = JSON.parse(JSON.stringify(runTask(task))) as typeof compiled;
    delete compiled.analysis.elapsedMs;
    delete source.analysis.elapsedMs;
    expect(compiled).toEqual(source);
    expect(compiled.analysis.modularity.Q).toBeGreaterThan(0.41);
  });

  it("reads an uploaded file in the compiled parse process as the source does", async () => {
    const child = fork(join(DIST, "parse-process.mjs"), [], { serialization: "advanced", env: { PATH: process.env.PATH ?? "" }, stdio: ["ignore", "ignore", "pipe", "ipc"] });
    try {
      const answers: Array<Record<string, unknown>> = [];
      const got = (n: number) => new Promise<void>((resolve) => {
        const check = () => (answers.length >= n ? resolve() : child.once("message", (m) => (answers.push(m as Record<string, unknown>), check())));
        check();
      });
      await got(1);
      expect(answers[0]).toEqual({ ready: true });
      const task = { bytes: new TextEncoder().encode("plant,bee A,bee B\nHeather,1,0\nGorse,2,1\n"), options: { fileName: "heath.csv", kind: "bipartite" as const } };
      child.send({ id: 7, task });
      await got(2);
      const compiled = answers[1] as { id: number; result: Awaited<ReturnType<typeof runParseTask>> };
      expect(compiled.id).toBe(7);
      expect(compiled.result).toEqual(await runParseTask(task));
      expect(compiled.result).toMatchObject({ ok: true, metrics: { links: 3 } });
    } finally {
      child.kill();
    }
  });
});
