/**
 * Benchmark of the network view on a 3000 × 5000 network (npm run bench:matrix). It prints figures; it is
 * not a test.
 *
 * 1. Database `tanglebank_test_benchmatrix` on the developers' test cluster (scripts/dev-db.sh): its public
 *    schema dropped and migrated afresh.
 * 2. A seeded planted-module bipartite network of 3000 rows × 5000 columns (12 modules; rows and columns
 *    dealt round-robin; each row 10–40 links, each to a column of its own module with probability 0.8,
 *    else to any column), published as TB-000001 v1 with a succeeded metric run holding the engine's real
 *    analyzeNetwork output (1 restart, no annealing, 20 ER null replicates: enough to draw every plot).
 * 3. The app on an ephemeral port serving the built client (`npx vite build` first if client/dist is missing).
 * 4. Chromium (playwright-core, /usr/bin/chromium) opens /datasets/TB-000001/v/1/networks/1 three times
 *    (a cold load, then two reloads). For each: time from navigation start until the matrix canvas carries
 *    `data-rendered="true"` (recorded by a MutationObserver in the page), until the roles plot exists,
 *    and the main thread's long tasks (PerformanceObserver "longtask", > 50 ms): the longest, their
 *    number and total.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { chromium } from "playwright-core";

const ROWS = 3000;
const COLS = 5000;
const MODULES = 12;
const SEED = 20261201;

function log(s: string) {
  process.stdout.write(`${s}\n`);
}

async function main() {
  const url = execFileSync("bash", [join(process.cwd(), "scripts", "dev-db.sh"), "tanglebank_test_benchmatrix"], { encoding: "utf8" }).trim();
  process.env.DATABASE_URL = url;
  process.env.NODE_ENV ??= "test";
  process.env.LOG_LEVEL ??= "warn";
  const root = process.cwd();
  if (!existsSync(join(root, "client", "dist", "index.html"))) {
    log("client/dist is missing: building the client (npx vite build)…");
    execFileSync("npx", ["vite", "build", "--logLevel", "warn"], { stdio: "inherit" });
  }

  // a fresh schema every run (this database belongs to the benchmark alone)
  const { createSequelize } = await import("../server/src/db/sequelize");
  const admin = createSequelize(url, { pool: 1 });
  await admin.query("DROP SCHEMA public CASCADE; CREATE SCHEMA public;");
  await admin.close();
  const { migrateUp } = await import("../server/src/db/migrator");
  await migrateUp(url);
  const models = await import("../server/src/models");
  models.initModels();

  const { createRng } = await import("@shared/network/random");
  const { parseNetworkText, basicMetrics, analyzeNetwork } = await import("@shared/network/index");
  const { setPipelineSettings, DEFAULT_PIPELINE_SETTINGS } = await import("../server/src/pipeline/settings");
  const { insertNetwork, insertRun, insertVersion } = await import("../server/src/db/seeders/published-network");
  const { hashPassword } = await import("../server/src/lib/passwords");

  // --- the synthetic network (edge list CSV, as a depositor would upload it)
  const t0 = performance.now();
  const rng = createRng(SEED);
  const colsOf: number[][] = Array.from({ length: MODULES }, () => []);
  for (let j = 0; j < COLS; j++) colsOf[j % MODULES].push(j);
  const lines = ["source,target"];
  for (let i = 0; i < ROWS; i++) {
    const k = 10 + rng.nextInt(31);
    const seen = new Set<number>();
    const mine = colsOf[i % MODULES];
    while (seen.size < k) seen.add(rng.next() < 0.8 ? mine[rng.nextInt(mine.length)] : rng.nextInt(COLS));
    for (const j of seen) lines.push(`r${i},c${j}`);
  }
  const text = lines.join("\n") + "\n";
  const { network, format } = parseNetworkText(text, { fileName: "bench.csv", kind: "bipartite" });
  const b = basicMetrics(network);
  log(`network: ${b.rows} × ${b.cols} (S = ${b.nodes}), L = ${b.links}, C = ${b.connectance?.toFixed(5)}; generated and parsed in ${Math.round(performance.now() - t0)} ms`);

  const settings = { ...DEFAULT_PIPELINE_SETTINGS, restarts: 1, nulls: 20, annealing: "off" as const, seed: 1 };
  const t1 = performance.now();
  const analysis = analyzeNetwork(network, { restarts: settings.restarts, nulls: settings.nulls, annealing: "off", seed: settings.seed });
  log(`analysis (1 restart, 20 ER nulls): Q_B = ${analysis.modularity.Q?.toFixed(4)}, ${analysis.modularity.modules} modules, z = ${analysis.null?.z?.toFixed(1)}; ${Math.round(performance.now() - t1)} ms`);

  // --- published dataset with its current metric run
  await setPipelineSettings(settings);
  const owner = await models.User.create({ email: "bench@example.test", displayName: "Bench Depositor", passwordHash: await hashPassword("bench-password-1234"), role: "depositor", emailVerifiedAt: new Date() });
  const { version } = await insertVersion({
    ownerId: owner.id,
    accession: "TB-000001",
    metadata: {
      title: "Benchmark: a 3000 × 5000 planted-module network",
      description: "Synthetic, seeded network for the matrix-view benchmark (not real data).",
      creators: [{ name: "Bench Depositor" }],
      licence: "CC0-1.0",
      keywords: ["benchmark"],
      contactEmail: "bench@example.test",
    },
  });
  const net = await insertNetwork({
    versionId: version.id,
    position: 1,
    text,
    fileName: "bench.csv",
    parsed: { network, format },
    metadata: {
      name: "Planted modules, 3000 × 5000",
      interactionType: "pollination",
      weightMeaning: "binary",
      rowLevel: "plants",
      colLevel: "pollinators",
      locality: { placeName: "Nowhere (synthetic)", countryCode: "NO", decimalLatitude: 60, decimalLongitude: 10, generalisation: "1" },
      habitat: "synthetic",
      startDate: "2024-01-01",
      endDate: "2024-12-31",
      samplingProtocol: "generated",
    },
  });
  await insertRun({ networkId: net.id, settings, analysis });

  // --- serve and measure
  const { startServer, shutdownServerResources } = await import("../server/src/index");
  const { server, url: base, close } = await startServer(0, "127.0.0.1");
  process.env.PUBLIC_URL = base;
  const apiStart = performance.now();
  const apiRes = await fetch(`${base}/api/v1/network-views/TB-000001/v1/1`);
  const apiBody = await apiRes.arrayBuffer();
  log(`API: GET /api/v1/network-views/TB-000001/v1/1 → ${apiRes.status}, ${(apiBody.byteLength / 1024 / 1024).toFixed(2)} MB in ${Math.round(performance.now() - apiStart)} ms (server and client on this machine)`);

  const profile = mkdtempSync(join(tmpdir(), "tb-bench-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    viewport: { width: 1280, height: 900 },
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  await context.addInitScript(() => {
    const w = window as unknown as { __longTasks: number[]; __renderedAt: number | null; __rolesAt: number | null };
    w.__longTasks = [];
    w.__renderedAt = null;
    w.__rolesAt = null;
    new PerformanceObserver((list) => {
      for (const e of list.getEntries()) w.__longTasks.push(e.duration);
    }).observe({ type: "longtask", buffered: true });
    new MutationObserver(() => {
      if (w.__renderedAt === null && document.querySelector('canvas[data-rendered="true"]')) w.__renderedAt = performance.now();
      if (w.__rolesAt === null && document.querySelector('[aria-label^="Roles plot"]')) w.__rolesAt = performance.now();
    }).observe(document, { subtree: true, childList: true, attributes: true, attributeFilter: ["data-rendered"] });
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const target = `${base}/datasets/TB-000001/v/1/networks/1`;
  const results: Array<{ run: string; rendered: number; roles: number; longest: number; count: number; total: number; size: string }> = [];
  for (const run of ["cold", "reload 1", "reload 2"]) {
    if (run === "cold") await page.goto(target);
    else await page.reload();
    await page.waitForSelector('canvas[data-rendered="true"]', { timeout: 120_000 });
    await page.waitForTimeout(500); // let trailing long tasks be reported
    const r = await page.evaluate(() => {
      const w = window as unknown as { __longTasks: number[]; __renderedAt: number; __rolesAt: number | null };
      const c = document.querySelector("canvas") as HTMLCanvasElement;
      return { rendered: w.__renderedAt, roles: w.__rolesAt ?? NaN, tasks: w.__longTasks, size: `${c.width} × ${c.height}` };
    });
    results.push({
      run,
      rendered: r.rendered,
      roles: r.roles,
      longest: r.tasks.length ? Math.max(...r.tasks) : 0,
      count: r.tasks.length,
      total: r.tasks.reduce((s, x) => s + x, 0),
      size: r.size,
    });
  }
  await context.close();
  rmSync(profile, { recursive: true, force: true });
  await close();
  void server;
  await shutdownServerResources();

  log("");
  log(`Network view of ${ROWS} × ${COLS} (${b.links} links) in Chromium ${process.env.CHROMIUM_PATH ?? "/usr/bin/chromium"}, viewport 1280 × 900`);
  log("run       | matrix rendered | roles plot in DOM | longest main-thread task | long tasks (>50 ms) | canvas");
  for (const r of results) {
    log(
      `${r.run.padEnd(9)} | ${`${Math.round(r.rendered)} ms`.padStart(15)} | ${`${Math.round(r.roles)} ms`.padStart(17)} | ${`${Math.round(r.longest)} ms`.padStart(24)} | ${`${r.count}, total ${Math.round(r.total)} ms`.padStart(19)} | ${r.size}`,
    );
  }
  log("(times from navigation start; the matrix image is built in a Web Worker, so long tasks come from parsing the JSON and rendering the SVG plots)");
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
