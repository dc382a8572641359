/**
 * First-start benchmark of the metrics pipeline (npm run bench:pipeline -- --demo [--where]). It prints
 * figures; it is not a test.
 *
 * What a newcomer's first `npm start` does, in the order scripts/run.ts does it, on an empty throwaway
 * database of the development test cluster (tanglebank_test_benchdemo, via scripts/dev-db.sh;
 * BENCH_DATABASE_URL overrides): migrations, demo accounts, the web server, then the start-up tasks
 * (metrics worker with its thread pool sized to the cores, catalogue, demo scenario seeded through the
 * services). The clock starts when GET /api/v1/health first answers 200 ("healthy") and stops when every
 * demo network that the pipeline computes has its figures, null models included (no run queued or
 * running, every network with a succeeded run). It prints the time to the first observed figures of every
 * network, the time to every figure, the process CPU time (all threads), the load average, and per
 * network its size, annealing, run time and share of the total, largest first: where the time goes.
 * The pipeline's default settings are used (what `npm start` computes), printed with the figures.
 *
 * On a shared machine the wall time says more about the other processes than about the pipeline, so the
 * process CPU time (all threads) is printed beside it, divided by the cores: the wall time the same work
 * takes on an otherwise idle machine when the pool keeps every core busy. With `--where`, each network's
 * cost is then measured alone on this thread (the observed analysis, and BENCH_WHERE_SAMPLE (default 4)
 * null replicates per null model scaled to the settings' count): CPU seconds per network, largest first.
 */
import { execFileSync } from "node:child_process";
import { availableParallelism, loadavg } from "node:os";

const url = process.env.BENCH_DATABASE_URL ?? execFileSync("bash", ["scripts/dev-db.sh", "tanglebank_test_benchdemo"], { encoding: "utf8" }).trim();
process.env.DATABASE_URL = url;
process.env.LOG_LEVEL = "silent";
process.env.TB_METRICS_MAINTENANCE_SECONDS = "30";

const { QueryTypes } = await import("sequelize");
const { migrateUp } = await import("../server/src/db/migrator");
const { sequelize, closeSequelize } = await import("../server/src/db/sequelize");
const { initModels } = await import("../server/src/models");
const { seedDemoAccounts } = await import("../server/src/db/seeders/demo-accounts");
const { startServer } = await import("../server/src/index");
const { closeSessionPool } = await import("../server/src/app");
const { startMetricsWorker, stopMetricsWorker } = await import("../server/src/pipeline/metrics-worker");
const { poolThreads } = await import("../server/src/pipeline/pool");
const { getPipelineSettings } = await import("../server/src/pipeline/settings");
const { seedDemoScenario } = await import("../server/src/db/seeders/demo-scenario");
const { annealingApplies } = await import("@shared/network/optimizer/optimize");
const { deserializeNetwork } = await import("@shared/network/index");
const { nullChunk, observedAnalysis } = await import("../server/src/pipeline/compute");

// ---- an empty database, as on a fresh clone --------------------------------------------------------
await migrateUp(url);
initModels();
{
  const [rows] = (await sequelize().query(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename NOT IN ('SequelizeMeta', 'sequelize_meta')`)) as [Array<{ tablename: string }>, unknown];
  await sequelize().query(`TRUNCATE ${rows.map((r) => `"${r.tablename}"`).join(", ")} RESTART IDENTITY CASCADE`);
  await sequelize().query(`DO $$ BEGIN IF to_regclass('pgboss.job') IS NOT NULL THEN DELETE FROM pgboss.job; END IF; END $$`);
}
await seedDemoAccounts();

const { url: base, close } = await startServer(0, "127.0.0.1");
for (;;) {
  const res = await fetch(`${base}/api/v1/health`).catch(() => null);
  if (res?.status === 200) break;
  await new Promise((r) => setTimeout(r, 50));
}
const load0 = loadavg();
const cpu0 = process.cpuUsage();
const t0 = performance.now();
const settings = await getPipelineSettings();
// Start-up tasks, in the order of server/src/startup.ts (DOI and catalogue tasks compute no figures).
await startMetricsWorker();
await seedDemoScenario({ log: () => {} });
const seededS = (performance.now() - t0) / 1000;

interface Row {
  id: number;
  network_id: number;
  status: string;
  q: number | null;
  z: number | null;
  duration_ms: number | null;
}
let observedS: number | null = null;
let allS: number;
for (;;) {
  const runs = await sequelize().query<Row>(`SELECT id, network_id, status, q, z, duration_ms FROM metric_runs`, { type: QueryTypes.SELECT });
  const pending = runs.filter((r) => r.status === "queued" || r.status === "running");
  if (observedS === null && runs.length && runs.every((r) => r.q !== null || r.status === "failed")) observedS = (performance.now() - t0) / 1000;
  if (runs.length && pending.length === 0) {
    allS = (performance.now() - t0) / 1000;
    break;
  }
  await new Promise((r) => setTimeout(r, 250));
}
const cpu = process.cpuUsage(cpu0);
const cpuS = (cpu.user + cpu.system) / 1e6;
const load1 = loadavg();

const nets = await sequelize().query<{ id: number; n_nodes: number; n_links: number; canonical: unknown; status: string; duration_ms: number | null; z: number | null; title: string }>(
  `SELECT n.id, n.n_nodes, n.n_links, n.canonical, r.status, r.duration_ms, r.z, v.metadata->>'title' AS title
     FROM metric_runs r JOIN networks n ON n.id = r.network_id JOIN dataset_versions v ON v.id = n.version_id
    ORDER BY r.duration_ms DESC NULLS LAST`,
  { type: QueryTypes.SELECT },
);
const failed = nets.filter((n) => n.status !== "succeeded");
const sumMs = nets.reduce((s, n) => s + (n.duration_ms ?? 0), 0);
const f = (x: number, d = 1) => x.toFixed(d);
console.log(`
Metrics pipeline, first start with the demo scenario (${new Date().toISOString()})
  machine            ${availableParallelism()} cores, Node ${process.version}; worker pool ${poolThreads()} threads
  load average       ${load0.map((x) => f(x, 2)).join(" ")} at the start, ${load1.map((x) => f(x, 2)).join(" ")} at the end (the machine is shared)
  settings           ${JSON.stringify(settings)}
  networks computed  ${nets.length} (${failed.length} not succeeded)
  demo seeded        ${f(seededS)} s after the server was healthy
  observed figures   ${observedS === null ? "—" : `${f(observedS)} s`} (every network's Q, modules, NODF)
  every figure       ${f(allS)} s (null models included) — target ≤ 120 s: ${allS <= 120 ? "met" : "NOT met"}
  CPU time           ${f(cpuS)} s (this process, all threads: ${f(cpuS / allS, 2)} cores busy on average)
  CPU time / cores   ${f(cpuS / availableParallelism())} s — the wall time on an otherwise idle ${availableParallelism()}-core machine with every core busy; target ≤ 120 s: ${cpuS / availableParallelism() <= 120 ? "met" : "NOT met"}
  run durations      (wall time from start to finish of each run on the shared pool; they overlap)`);
for (const n of nets) {
  const net = deserializeNetwork(n.canonical as Parameters<typeof deserializeNetwork>[0]);
  const annealed = annealingApplies(net, settings.annealing);
  console.log(
    `    ${f((n.duration_ms ?? 0) / 1000).padStart(6)} s  ${f((100 * (n.duration_ms ?? 0)) / (sumMs || 1), 0).padStart(3)} %  ${String(n.n_nodes).padStart(4)} nodes ${String(n.n_links).padStart(5)} links${annealed ? ", annealed" : "          "}  ${n.status}  ${n.title.slice(0, 60)}`,
  );
}

if (process.argv.includes("--where")) {
  // Each network alone on this thread: the observed analysis and a sample of null replicates per model.
  const sample = Number(process.env.BENCH_WHERE_SAMPLE ?? 4);
  const cpuNow = () => {
    const u = process.cpuUsage();
    return (u.user + u.system) / 1e6;
  };
  const costs: Array<{ s: number; line: string }> = [];
  for (const n of nets) {
    const net = deserializeNetwork(n.canonical as Parameters<typeof deserializeNetwork>[0]);
    let c0 = cpuNow();
    const obs = observedAnalysis(n.canonical, settings);
    const observedCpu = cpuNow() - c0;
    let nullsCpu = 0;
    const per: string[] = [];
    if (obs.analysis.modularity.Q !== null && settings.nulls > 0) {
      for (const model of obs.nullChoice.models) {
        c0 = cpuNow();
        nullChunk({ canonical: n.canonical, settings, model, objective: obs.analysis.modularity.objective, replicates: Array.from({ length: sample }, (_, i) => i) });
        const each = (cpuNow() - c0) / sample;
        nullsCpu += each * settings.nulls;
        per.push(`${model} ${f(each * 1000, 0)} ms`);
      }
    }
    const total = observedCpu + nullsCpu;
    costs.push({
      s: total,
      line: `${String(n.n_nodes).padStart(4)} nodes ${String(n.n_links).padStart(5)} links${annealingApplies(net, settings.annealing) ? ", annealed" : "          "}: observed ${f(observedCpu, 2)} s, ${settings.nulls} nulls per model ≈ ${f(nullsCpu)} s (per replicate: ${per.join(", ")})`,
    });
  }
  const sum = costs.reduce((x, c) => x + c.s, 0);
  console.log(`  where the time goes (each network alone on one thread, CPU; ${sample} replicates per model timed): ${f(sum)} s in all, ${f(sum / availableParallelism())} s over ${availableParallelism()} cores`);
  for (const c of costs.sort((x, y) => y.s - x.s)) console.log(`    ${f(c.s).padStart(6)} s  ${f((100 * c.s) / (sum || 1), 0).padStart(3)} %  ${c.line}`);
}

await stopMetricsWorker({ timeoutMs: 5000 });
await close();
await closeSessionPool();
await closeSequelize();
process.exit(0);
