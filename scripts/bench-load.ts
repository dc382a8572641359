/**
 * Load benchmark of the read routes (npm run bench:load). It prints figures; it is not a test.
 *
 * - Database: its own database on the development test cluster (scripts/dev-db.sh tanglebank_test_benchload),
 *   migrated and seeded with the demo accounts and the demo scenario (published datasets through the real
 *   deposit and review services); re-runs reuse it.
 * - Server: a child process running the server as `npm start` does (server/src/main.ts: web server, metrics
 *   worker, catalogue index) on 127.0.0.1 with DOIs and ORCID off and the per-IP read limit raised (all
 *   clients share one address here), so its memory is sampled alone (VmRSS from /proc every 100 ms).
 * - Load: 20 clients (keep-alive connections on 127.0.0.1), each sending its next request as soon as the
 *   last one is answered, for a fixed time per phase (TB_BENCH_LOAD_SECONDS, default 20), over a mix of
 *   read routes: the catalogue with random filters and pages, full-text search, dataset JSON, network
 *   views, network metrics, and a bundle size estimate. Every latency is recorded: requests/s, p50/p95/p99
 *   per route, errors (any status ≥ 400, or a failed connection), and the server's memory.
 * - Phases: "idle" once the pipeline has nothing to do; then "computing": every published network is
 *   recomputed (forced) with null replicates while the same load runs, so the pipeline's threads compete
 *   with the web server for the 2 cores.
 * Targets (printed beside the figures): no errors; p95 under 200 ms for JSON reads when idle and under 2×
 * that while the pipeline computes; server memory flat (RSS at the end of a phase within 50 MB of its start).
 */
import { spawn, execFileSync, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import http from "node:http";
import { createRng } from "@shared/network/random";

const SECONDS = Number(process.env.TB_BENCH_LOAD_SECONDS ?? 20);
const CLIENTS = 20;
const PORT = Number(process.env.PORT ?? 3199);
const MB = 1024 * 1024;

function rss(pid: number): number {
  try {
    const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, "utf8"));
    return m ? Number(m[1]) * 1024 : 0;
  } catch {
    return 0;
  }
}

async function prepare(url: string): Promise<void> {
  process.env.DATABASE_URL = url;
  const { migrateUp } = await import("../server/src/db/migrator");
  await migrateUp(url);
  const { initModels } = await import("../server/src/models");
  initModels();
  const { seedDemoAccounts } = await import("../server/src/db/seeders/demo-accounts");
  const { seedDemoScenario } = await import("../server/src/db/seeders/demo-scenario");
  await seedDemoAccounts();
  const r = await seedDemoScenario({ log: (m) => console.log(m) });
  console.log(r ? `Seeded the demo scenario: ${r.datasets} datasets, ${r.networks} networks.` : "Reusing the seeded demo scenario.");
}

interface Target {
  accession: string;
  version: number;
  positions: number[];
}

async function targets(): Promise<{ datasets: Target[]; networkIds: number[] }> {
  const { sequelize } = await import("../server/src/db/sequelize");
  const [rows] = (await sequelize().query(
    `SELECT d.accession, v.number, array_agg(n.position ORDER BY n.position) AS positions, array_agg(n.id) AS ids
       FROM datasets d JOIN dataset_versions v ON v.dataset_id = d.id JOIN networks n ON n.version_id = v.id
      WHERE v.state = 'published' GROUP BY d.accession, v.number ORDER BY d.accession, v.number`,
  )) as [Array<{ accession: string; number: number; positions: number[]; ids: number[] }>, unknown];
  return { datasets: rows.map((r) => ({ accession: r.accession, version: r.number, positions: r.positions })), networkIds: rows.flatMap((r) => r.ids) };
}

async function pipelineBusy(): Promise<number> {
  const { sequelize } = await import("../server/src/db/sequelize");
  const [[r]] = (await sequelize().query(`SELECT count(*)::int AS n FROM metric_runs WHERE status IN ('queued', 'running')`)) as [[{ n: number }], unknown];
  return r.n;
}

function startServer(url: string): Promise<ChildProcess> {
  const child = spawn(process.execPath, ["--import", "tsx", "server/src/main.ts"], {
    env: { ...process.env, DATABASE_URL: url, PORT: String(PORT), HOST: "127.0.0.1", NODE_ENV: "development", LOG_LEVEL: "warn", TB_DOI: "off", TB_ORCID: "off", TB_API_RATE_LIMIT: "100000000", TB_MAIL_PORT: "0", SMTP_PORT: "9" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stderr?.on("data", (d: Buffer) => process.stderr.write(`[server] ${d}`));
  return new Promise((resolve, reject) => {
    let out = "";
    child.stdout?.on("data", (d: Buffer) => {
      out += d.toString();
      if (out.includes("listening on")) resolve(child);
    });
    child.once("exit", (code) => reject(new Error(`the server exited (${code}) before listening:\n${out}`)));
  });
}

type Route = { name: string; method: "GET" | "POST"; path: () => string; body?: () => string };

function routes(t: { datasets: Target[] }, seed: number): Route[] {
  const g = createRng(seed);
  const r = () => g.next();
  const pick = <T>(a: T[]) => a[Math.floor(r() * a.length)];
  const net = () => {
    const d = pick(t.datasets);
    return `${d.accession}/${d.version}/${pick(d.positions)}`;
  };
  const ref = () => {
    const d = pick(t.datasets);
    return `${d.accession}/v${d.version}/${pick(d.positions)}`;
  };
  const TYPES = ["pollination", "seed-dispersal", "host-parasitoid", "herbivory"];
  const WORDS = ["heath", "meadow", "bee", "fen", "verrin", "moor", "coast", "forest"];
  return [
    { name: "catalogue (random filters)", method: "GET", path: () => `/api/v1/catalogue?connectanceMin=${(r() * 0.3).toFixed(5)}&interactionType=${pick(TYPES)}&sort=${pick(["S", "C", "title", "accession"])}&page=${1 + Math.floor(r() * 3)}&pageSize=25` },
    { name: "search", method: "GET", path: () => `/api/v1/catalogue?q=${pick(WORDS)}&sort=relevance` },
    { name: "dataset JSON", method: "GET", path: () => `/api/v1/datasets/${pick(t.datasets).accession}` },
    { name: "network view", method: "GET", path: () => `/api/v1/network-views/${net()}` },
    { name: "network metrics", method: "GET", path: () => `/api/v1/networks/${net()}/metrics` },
    { name: "bundle estimate", method: "POST", path: () => `/api/v1/bundles/estimate`, body: () => JSON.stringify({ refs: [ref(), ref(), ref()] }) },
  ];
}

interface Stats {
  lat: Map<string, number[]>;
  errors: Map<string, number>;
  firstErrors: string[];
}

function request(agent: http.Agent, route: Route): Promise<{ ms: number; status: number; body: string }> {
  return new Promise((resolve) => {
    const t0 = process.hrtime.bigint();
    const body = route.body?.();
    const req = http.request({ host: "127.0.0.1", port: PORT, method: route.method, path: route.path(), agent, headers: body ? { "content-type": "application/json", "content-length": Buffer.byteLength(body) } : {} }, (res) => {
      let text = "";
      res.on("data", (c: Buffer) => {
        if (text.length < 300) text += c.toString();
      });
      res.on("end", () => resolve({ ms: Number(process.hrtime.bigint() - t0) / 1e6, status: res.statusCode ?? 0, body: text }));
      res.on("error", () => resolve({ ms: Number(process.hrtime.bigint() - t0) / 1e6, status: 0, body: "response error" }));
    });
    req.on("error", (e) => resolve({ ms: Number(process.hrtime.bigint() - t0) / 1e6, status: 0, body: e.message }));
    if (body) req.write(body);
    req.end();
  });
}

async function phase(name: string, t: { datasets: Target[] }, pid: number): Promise<void> {
  const stats: Stats = { lat: new Map(), errors: new Map(), firstErrors: [] };
  const rssStart = rss(pid);
  let rssPeak = rssStart;
  const sampler = setInterval(() => (rssPeak = Math.max(rssPeak, rss(pid))), 100);
  const end = Date.now() + SECONDS * 1000;
  const t0 = Date.now();
  await Promise.all(
    Array.from({ length: CLIENTS }, async (_, c) => {
      const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
      const rs = routes(t, 1000 + c);
      let k = c;
      while (Date.now() < end) {
        const route = rs[k++ % rs.length];
        const res = await request(agent, route);
        if (!stats.lat.has(route.name)) stats.lat.set(route.name, []);
        stats.lat.get(route.name)!.push(res.ms);
        if (res.status === 0 || res.status >= 400) {
          stats.errors.set(route.name, (stats.errors.get(route.name) ?? 0) + 1);
          if (stats.firstErrors.length < 5) stats.firstErrors.push(`${route.name}: ${res.status} ${res.body.slice(0, 160)}`);
        }
      }
      agent.destroy();
    }),
  );
  clearInterval(sampler);
  const secs = (Date.now() - t0) / 1000;
  const rssEnd = rss(pid);
  const q = (a: number[], p: number) => a[Math.min(a.length - 1, Math.floor(p * a.length))];
  let total = 0;
  let errors = 0;
  let worstP95 = 0;
  console.log(`\n== ${name}: ${CLIENTS} clients for ${secs.toFixed(1)} s ==`);
  console.log("route".padEnd(28) + "requests".padStart(9) + "req/s".padStart(8) + "p50 ms".padStart(9) + "p95 ms".padStart(9) + "p99 ms".padStart(9) + "errors".padStart(8));
  for (const [route, a] of stats.lat) {
    a.sort((x, y) => x - y);
    total += a.length;
    const e = stats.errors.get(route) ?? 0;
    errors += e;
    worstP95 = Math.max(worstP95, q(a, 0.95));
    console.log(route.padEnd(28) + String(a.length).padStart(9) + (a.length / secs).toFixed(1).padStart(8) + q(a, 0.5).toFixed(1).padStart(9) + q(a, 0.95).toFixed(1).padStart(9) + q(a, 0.99).toFixed(1).padStart(9) + String(e).padStart(8));
  }
  console.log(`all routes: ${total} requests, ${(total / secs).toFixed(1)} req/s, ${errors} errors; worst route p95 ${worstP95.toFixed(1)} ms`);
  console.log(`server memory (RSS): start ${(rssStart / MB).toFixed(0)} MB, peak ${(rssPeak / MB).toFixed(0)} MB, end ${(rssEnd / MB).toFixed(0)} MB (end − start ${((rssEnd - rssStart) / MB).toFixed(0)} MB)`);
  for (const e of stats.firstErrors) console.log(`  error: ${e}`);
  results.push({ name, errors, worstP95, grow: (rssEnd - rssStart) / MB });
}

const results: Array<{ name: string; errors: number; worstP95: number; grow: number }> = [];

async function waitIdle(what: string, maxMs: number): Promise<void> {
  const until = Date.now() + maxMs;
  let n = await pipelineBusy();
  while (n > 0 && Date.now() < until) {
    await new Promise((r) => setTimeout(r, 2000));
    n = await pipelineBusy();
  }
  console.log(n ? `(${n} runs still ${what} after ${maxMs / 1000} s; measuring anyway)` : "Pipeline idle.");
}

async function main(): Promise<void> {
  // this process seeds and queues; its own log (e-mails the seed cannot send) is not part of the figures
  process.env.LOG_LEVEL = "silent";
  const url = execFileSync("bash", ["scripts/dev-db.sh", "tanglebank_test_benchload"], { encoding: "utf8" }).trim();
  await prepare(url);
  const t = await targets();
  console.log(`${t.datasets.length} published dataset versions, ${t.networkIds.length} networks. Starting the server on 127.0.0.1:${PORT}…`);
  const server = await startServer(url);
  try {
    await waitIdle("queued or running", Number(process.env.TB_BENCH_LOAD_IDLE_WAIT_SECONDS ?? 600) * 1000);
    // warm-up: compile routes, fill caches
    await phase("warm-up (not judged)", t, server.pid!).then(() => results.pop());
    await phase("idle", t, server.pid!);
    const { enqueueNetworkMetrics } = await import("../server/src/pipeline/enqueue");
    await enqueueNetworkMetrics(t.networkIds, { force: true });
    await new Promise((r) => setTimeout(r, 3000));
    console.log(`\nRecomputing ${t.networkIds.length} networks (forced); ${await pipelineBusy()} runs queued or running.`);
    await phase("while the pipeline computes", t, server.pid!);
    console.log(`(${await pipelineBusy()} runs still queued or running at the end of the phase)`);
  } finally {
    server.kill("SIGTERM");
    await new Promise((r) => server.once("exit", r));
    const { stopQueue } = await import("../server/src/pipeline/queue");
    await stopQueue({ graceful: false }).catch(() => undefined);
    const { closeSequelize } = await import("../server/src/db/sequelize");
    await closeSequelize();
  }
  const [idle, busy] = results;
  console.log("\n== targets ==");
  console.log(`no errors: ${idle.errors + busy.errors === 0 ? "met" : `NOT met (${idle.errors} idle, ${busy.errors} computing)`}`);
  console.log(`p95 < 200 ms idle (worst route): ${idle.worstP95.toFixed(0)} ms — ${idle.worstP95 < 200 ? "met" : "NOT met"}`);
  console.log(`p95 < 2 × idle target (400 ms) while computing (worst route): ${busy.worstP95.toFixed(0)} ms — ${busy.worstP95 < 400 ? "met" : "NOT met"}`);
  console.log(`memory flat (growth < 50 MB per phase): idle ${idle.grow.toFixed(0)} MB, computing ${busy.grow.toFixed(0)} MB — ${Math.max(idle.grow, busy.grow) < 50 ? "met" : "NOT met"}`);
  console.log(`machine: ${execFileSync("nproc", { encoding: "utf8" }).trim()} cores, load average ${readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" ")}`);
}

await main();
