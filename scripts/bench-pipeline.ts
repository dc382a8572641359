/**
 * Benchmark of the metrics pipeline (npm run bench:pipeline). It prints figures; it is not a test.
 * `npm run bench:pipeline -- --demo [--where]` measures a newcomer's first start instead: the time from a
 * healthy server to every demo figure, null models included (scripts/bench-pipeline-demo.ts).
 *
 * On its own throwaway database of the development test cluster (tanglebank_test_bench, via
 * scripts/dev-db.sh; BENCH_DATABASE_URL overrides) it seeds BENCH_NETWORKS (default 200) published
 * bipartite networks of mixed sizes (10 to 1000 nodes, log-uniform, seeded generator; every size class
 * present, 5 networks per dataset), inserted directly through the models. Then, in this one process as
 * `npm start` runs it, it starts the web server and a metrics worker (thread pool sized to the cores),
 * measures the latency of GET /api/v1/datasets/:accession at idle (a bounded loop of sequential requests),
 * starts a batch over every network with BENCH_NULLS (default 100) null replicates, samples the same request
 * while the batch runs, and prints: wall time, networks per minute, average busy cores (process CPU time of
 * all threads / wall time, and machine-wide from /proc/stat), peak memory (max RSS of the process), and the
 * median and 95th-percentile latency during the batch against idle, with the two targets (≥ 1.8 of 2 cores
 * busy; latency during the batch ≤ 2 × idle).
 *
 * Defaults keep a run under about ten minutes on 2 cores: BENCH_RESTARTS (default 5, not the pipeline default 20)
 * restarts per network and per replicate, and annealing off (BENCH_ANNEALING), since the annealing pass of
 * networks under 200 nodes multiplies their cost by up to 50. Every option is printed with the figures.
 */
import { execFileSync } from "node:child_process";

// `--demo`: the first start with the demo scenario instead (bench-pipeline-demo.ts; it ends the process).
if (process.argv.includes("--demo")) await import("./bench-pipeline-demo");

import { readFileSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import { createRng } from "@shared/network/random";
import { csvText } from "@shared/csv";

const N = Number(process.env.BENCH_NETWORKS ?? 200);
const NULLS = Number(process.env.BENCH_NULLS ?? 100);
const RESTARTS = Number(process.env.BENCH_RESTARTS ?? 5);
const ANNEALING = (process.env.BENCH_ANNEALING ?? "off") as "auto" | "on" | "off";
const MIN_NODES = 10;
const MAX_NODES = Number(process.env.BENCH_MAX_NODES ?? 1000);
const PER_DATASET = 5;
const IDLE_REQUESTS = 150;
const SAMPLE_GAP_MS = 100;

const url = process.env.BENCH_DATABASE_URL ?? execFileSync("bash", ["scripts/dev-db.sh", "tanglebank_test_bench"], { encoding: "utf8" }).trim();
process.env.DATABASE_URL = url;
process.env.LOG_LEVEL = "silent";
process.env.TB_API_RATE_LIMIT = "1000000";
process.env.TB_METRICS_MAINTENANCE_SECONDS = "30";

const { migrateUp } = await import("../server/src/db/migrator");
const { sequelize, closeSequelize } = await import("../server/src/db/sequelize");
const models = await import("../server/src/models");
const { startServer } = await import("../server/src/index");
const { closeSessionPool } = await import("../server/src/app");
const { startMetricsWorker, stopMetricsWorker } = await import("../server/src/pipeline/metrics-worker");
const { poolThreads } = await import("../server/src/pipeline/pool");
const { startBatch, getBatch } = await import("../server/src/api/pipeline/pipeline.service");
const { parseNetworkText, basicMetrics } = await import("@shared/network/index");
const { insertNetwork, insertVersion } = await import("../server/src/db/seeders/published-network");

/** Uniform numbers in [0, 1) from the engine's seeded generator (shared/network/random.ts). */
function rng(seed: number): () => number {
  const g = createRng(seed);
  return () => g.next();
}

/** A planted-module bipartite matrix with `nodes` = rows + columns, 2–6 links per row, 80 % inside modules. */
function matrixCsv(nodes: number, seed: number): string {
  const r = rng(seed);
  const R = Math.max(3, Math.round(nodes * 0.4));
  const C = Math.max(3, nodes - R);
  const K = Math.max(2, Math.round(Math.sqrt(nodes) / 2));
  const m = Array.from({ length: R }, () => new Uint8Array(C));
  for (let i = 0; i < R; i++) {
    const mod = i % K;
    const deg = 2 + Math.floor(r() * 5);
    for (let k = 0; k < deg; k++) {
      let j = Math.floor(r() * C);
      if (r() < 0.8) j = Math.min(C - 1, mod + K * Math.floor((r() * C) / K));
      m[i][j] = 1;
    }
  }
  for (let j = 0; j < C; j++) m[j % R][j] = 1; // no empty column
  return csvText([["", ...Array.from({ length: C }, (_, j) => `c${j + 1}`)], ...Array.from(m, (row, i) => [`r${i + 1}`, ...row])]);
}

function quantile(xs: number[], q: number): number {
  const s = [...xs].sort((a, b) => a - b);
  if (!s.length) return NaN;
  const pos = (s.length - 1) * q;
  const lo = Math.floor(pos);
  const hi = Math.ceil(pos);
  return s[lo] + (s[hi] - s[lo]) * (pos - lo);
}

function procStat(): { busy: number; total: number } {
  const cpu = readFileSync("/proc/stat", "utf8").split("\n")[0].trim().split(/\s+/).slice(1).map(Number);
  const idle = cpu[3] + (cpu[4] ?? 0);
  const total = cpu.reduce((a, b) => a + b, 0);
  return { busy: total - idle, total };
}

// ---- database ------------------------------------------------------------------------------------
await migrateUp(url);
models.initModels();
{
  const [rows] = (await sequelize().query(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename NOT IN ('SequelizeMeta', 'sequelize_meta')`)) as [Array<{ tablename: string }>, unknown];
  await sequelize().query(`TRUNCATE ${rows.map((r) => `"${r.tablename}"`).join(", ")} RESTART IDENTITY CASCADE`);
  await sequelize().query(`DO $$ BEGIN IF to_regclass('pgboss.job') IS NOT NULL THEN DELETE FROM pgboss.job; END IF; END $$`);
}
const admin = await models.User.create({ email: "bench-admin@bench.test", passwordHash: "x", displayName: "Bench admin", role: "admin" });
const sizeRng = rng(20261201);
const sizes: number[] = [];
for (let i = 0; i < N; i++) {
  // log-uniform over [MIN_NODES, MAX_NODES]; the first two are the extremes
  sizes.push(i === 0 ? MIN_NODES : i === 1 ? MAX_NODES : Math.round(MIN_NODES * Math.pow(MAX_NODES / MIN_NODES, sizeRng())));
}
const tSeed = Date.now();
const accessions: string[] = [];
let totalNodes = 0;
let totalLinks = 0;
for (let d = 0; d * PER_DATASET < N; d++) {
  const accession = `TB-${String(d + 1).padStart(6, "0")}`;
  accessions.push(accession);
  const { version: v } = await insertVersion({
    ownerId: admin.id,
    accession,
    metadata: { title: `Benchmark study ${d + 1}`, description: "Seeded benchmark data.", creators: [{ name: "Bench" }], licence: "CC0-1.0", keywords: [], contactEmail: "bench@bench.test" },
  });
  for (let p = 1; p <= PER_DATASET && d * PER_DATASET + p <= N; p++) {
    const idx = d * PER_DATASET + p - 1;
    const csv = matrixCsv(sizes[idx], idx + 1);
    const parsed = parseNetworkText(csv, { fileName: `n${idx + 1}.csv`, kind: "bipartite" });
    const b = basicMetrics(parsed.network);
    totalNodes += b.nodes;
    totalLinks += b.links;
    await insertNetwork({ versionId: v.id, position: p, text: csv, fileName: `n${idx + 1}.csv`, parsed, metadata: { name: `Benchmark network ${idx + 1}` } });
  }
}
const seedSeconds = (Date.now() - tSeed) / 1000;

// ---- server in this process (the worker starts with the batch) ---------------------------------------
const { url: base, close } = await startServer(0, "127.0.0.1");
const target = `${base}/api/v1/datasets/${accessions[Math.floor(accessions.length / 2)]}`;

async function timedGet(): Promise<number> {
  const t0 = performance.now();
  const res = await fetch(target);
  await res.arrayBuffer();
  if (res.status !== 200) throw new Error(`GET ${target} answered ${res.status}`);
  return performance.now() - t0;
}
for (let i = 0; i < 20; i++) await timedGet(); // warm-up
const idle: number[] = [];
for (let i = 0; i < IDLE_REQUESTS; i++) {
  idle.push(await timedGet());
  await new Promise((r) => setTimeout(r, SAMPLE_GAP_MS / 2));
}

// ---- the batch -------------------------------------------------------------------------------------
const settings = { objective: "auto" as const, restarts: RESTARTS, nullModels: "standard" as const, nulls: NULLS, seed: 1, annealing: ANNEALING };
const load0 = loadavg()[0];
const stat0 = procStat();
const cpu0 = process.cpuUsage();
const t0 = performance.now();
const batch = await startBatch(admin.id, settings, true);
// The worker starts after the batch is queued (its sweeper would otherwise queue every never-computed
// network with the default settings first); its thread pool starts with it.
await startMetricsWorker();
const during: number[] = [];
let finished = false;
const sampler = (async () => {
  while (!finished) {
    during.push(await timedGet());
    await new Promise((r) => setTimeout(r, SAMPLE_GAP_MS));
  }
})();
let last = "";
let progress = batch;
while (progress.status === "running") {
  await new Promise((r) => setTimeout(r, 250));
  progress = await getBatch(batch.id);
  const line = `  … ${progress.done + progress.failed}/${progress.total} networks (${progress.failed} failed)`;
  if (line !== last && (progress.done + progress.failed) % 20 === 0) console.log(line);
  last = line;
}
const wallMs = performance.now() - t0;
const cpu = process.cpuUsage(cpu0);
const stat1 = procStat();
finished = true;
await sampler;
const ticksPerCore = (stat1.total - stat0.total) / availableParallelism();
const machineBusy = (stat1.busy - stat0.busy) / ticksPerCore;
const processBusy = (cpu.user + cpu.system) / 1000 / wallMs;
const peakMB = process.resourceUsage().maxRSS / 1024;

const f = (x: number, d = 1) => x.toFixed(d);
const idleP50 = quantile(idle, 0.5);
const idleP95 = quantile(idle, 0.95);
const busyP50 = quantile(during, 0.5);
const busyP95 = quantile(during, 0.95);
const sizeClasses = [10, 30, 100, 300, 1000].map((lim, i, a) => `${i ? a[i - 1] + 1 : MIN_NODES}–${lim}: ${sizes.filter((s) => s <= lim && (i === 0 || s > a[i - 1])).length}`);
console.log(`
Metrics pipeline benchmark (${new Date().toISOString()})
  machine            ${availableParallelism()} cores, Node ${process.version}; worker pool ${poolThreads()} threads, 2 jobs at a time
  catalogue          ${N} published bipartite networks in ${accessions.length} datasets (seeded in ${f(seedSeconds)} s)
                     nodes ${MIN_NODES}–${MAX_NODES} log-uniform (${sizeClasses.join(", ")}); ${totalNodes} nodes, ${totalLinks} links in all
  settings           objective auto (Barber), ${RESTARTS} restarts, ${NULLS} null replicates (auto → Erdős–Rényi), seed 1, annealing ${ANNEALING}
  batch              #${batch.id}: ${progress.done} done, ${progress.failed} failed of ${progress.total}
  wall time          ${f(wallMs / 1000)} s
  networks / minute  ${f((progress.done + progress.failed) / (wallMs / 60000))}
  busy cores         ${f(processBusy, 2)} (this process, all threads) · ${f(machineBusy, 2)} (whole machine, /proc/stat) of ${availableParallelism()}
                     other processes used ${f(Math.max(0, machineBusy - processBusy), 2)} cores meanwhile; load average ${f(load0, 2)} at the start, ${f(loadavg()[0], 2)} at the end
  peak memory        ${f(peakMB, 0)} MB (max RSS of the process)
  GET /api/v1/datasets/:accession (5 networks with metrics)
    idle             median ${f(idleP50)} ms, p95 ${f(idleP95)} ms (${idle.length} requests)
    during batch     median ${f(busyP50)} ms, p95 ${f(busyP95)} ms (${during.length} requests)
    ratio            median ${f(busyP50 / idleP50, 2)}×, p95 ${f(busyP95 / idleP95, 2)}×
  targets            busy cores ≥ 1.8: ${processBusy >= 1.8 ? "met" : "NOT met"} (${f(processBusy, 2)}); latency during batch ≤ 2× idle: median ${busyP50 <= 2 * idleP50 ? "met" : "NOT met"}, p95 ${busyP95 <= 2 * idleP95 ? "met" : "NOT met"}
`);

await stopMetricsWorker({ timeoutMs: 5000 });
await close();
await closeSessionPool();
await closeSequelize();
process.exit(0);
