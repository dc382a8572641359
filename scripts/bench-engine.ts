/**
 * Benchmark of the modularity optimizer (npm run bench:engine). It prints figures; it is not a test.
 *
 *   npm run bench:engine [-- --only PART,PART]   (networks whose name contains a part, e.g. --only 40,lfr;
 *                                                 parts holding a comma go between semicolons:
 *                                                 --only "μ=0.5, 1,000;μ=0.5, 10,000")
 *
 * Seeded networks, all generated here (scripts/lib/hard-networks.ts), from easy to hard:
 * - degree-corrected planted bipartite networks of 40 × 60, 300 × 500, 1000 × 1500 and 3000 × 5000 nodes
 *   (heavy-tailed row degrees and column propensities, modules of unequal size, 70 % of a row's links
 *   inside its module), and a random bipartite network of 1000 × 1500 with the same heavy tails and no
 *   modules;
 * - LFR-style one-mode graphs (Lancichinetti, Fortunato & Radicchi 2008: power-law degrees 5–50 with
 *   exponent 2.5, power-law module sizes with exponent 1.5) with mixing μ = 0.3 and 0.5 at 1,000, 10,000
 *   and 100,000 nodes, and a random one-mode graph of 20,000 nodes with no modules (the slowest to converge);
 * - weighted networks: an LFR-style graph (μ = 0.4, 5,000 nodes) and a degree-corrected planted bipartite
 *   network (1000 × 1500), both with heavy-tailed integer weights correlated with the degrees (counts such as
 *   visit frequencies; graphology gets the same weights);
 * - nested bipartite networks (100 × 150 and 400 × 600, a share 0.2 of the cells filled under a hyperbolic
 *   edge, 5 % of the links moved at random): no modules planted, modularity weak.
 *
 * Each network runs in a child process of its own, so its peak memory is its own (process maximum RSS).
 * Per network (after two untimed warm-up runs of ours and of graphology's on networks of at most 20,000
 * nodes, since the pipeline's worker threads run warm code): our best and median Q over the seeded restarts (the optimizer's restarts, seed 1,
 * annealing "auto") with the median wall and CPU time per restart and the passes per restart;
 * graphology-communities-louvain on the same network in the same process (as many runs, seeded through
 * its `rng` option; its partition re-scored with our modularity() for our objective: Barber's Q_B on the
 * bipartite networks), its median wall and CPU time per run, and the ratios; the planted partition's Q;
 * null replicates per second (the network's primary null model, each replicate optimized with the same
 * restarts and annealing decision, on one core, after two untimed replicates since the pipeline's worker
 * threads run warm code; not timed on the largest graphs, where one replicate would take minutes); peak
 * memory; and where the time goes in three extra traced restarts (passes, levels, the share of local
 * moving, refinement and aggregation, the shrinking of the first pass's levels, Q pass by pass).
 * CPU time (process.cpuUsage) is given beside wall time because the machine is shared; the targets are
 * judged on CPU time, and graphology's figures come from the same process on the same network, so the
 * ratios do not depend on the load.
 */
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import Graph from "graphology";
import louvain from "graphology-communities-louvain";
import { modularity } from "@shared/network/modularity/quality";
import { standardNullModels } from "@shared/network/null-models/index";
import { leiden, type LeidenTrace } from "@shared/network/optimizer/leiden";
import { annealingApplies, optimizeModularity, ANNEALING_MAX_NODES, DEFAULT_RESTARTS } from "@shared/network/optimizer/optimize";
import { buildQualityGraph } from "@shared/network/optimizer/quality-graph";
import { createRng, deriveSeed } from "@shared/network/random";
import { nullReplicateQ } from "@shared/network/significance";
import type { Network } from "@shared/network/types";
import { ENGINE_VERSION } from "@shared/network/version";
import {
  lfrGraph,
  nestedBipartite,
  plantedBipartiteDC,
  weightedBipartiteDC,
  weightedLfrGraph,
  type PlantedNetwork,
} from "./lib/hard-networks";

interface Spec {
  name: string;
  build: () => PlantedNetwork;
  restarts: number;
  /** Null replicates timed (0: not timed). */
  nulls: number;
}

const SPECS: Spec[] = [
  { name: "DC bipartite 40 × 60", build: () => plantedBipartiteDC({ rows: 40, cols: 60, modules: 4, seed: 101, minDegree: 3 }), restarts: DEFAULT_RESTARTS, nulls: 20 },
  { name: "DC bipartite 300 × 500", build: () => plantedBipartiteDC({ rows: 300, cols: 500, modules: 10, seed: 102 }), restarts: DEFAULT_RESTARTS, nulls: 3 },
  { name: "DC bipartite 1000 × 1500", build: () => plantedBipartiteDC({ rows: 1000, cols: 1500, modules: 20, seed: 103 }), restarts: DEFAULT_RESTARTS, nulls: 2 },
  { name: "DC bipartite 3000 × 5000", build: () => plantedBipartiteDC({ rows: 3000, cols: 5000, modules: 40, seed: 104 }), restarts: DEFAULT_RESTARTS, nulls: 1 },
  { name: "random bipartite 1000 × 1500", build: () => plantedBipartiteDC({ rows: 1000, cols: 1500, modules: 1, seed: 105 }), restarts: DEFAULT_RESTARTS, nulls: 1 },
  { name: "LFR μ=0.3, 1,000", build: () => lfrGraph({ nodes: 1000, mu: 0.3, seed: 111 }), restarts: DEFAULT_RESTARTS, nulls: 3 },
  { name: "LFR μ=0.5, 1,000", build: () => lfrGraph({ nodes: 1000, mu: 0.5, seed: 112 }), restarts: DEFAULT_RESTARTS, nulls: 3 },
  { name: "LFR μ=0.3, 10,000", build: () => lfrGraph({ nodes: 10000, mu: 0.3, seed: 113 }), restarts: DEFAULT_RESTARTS, nulls: 1 },
  { name: "LFR μ=0.5, 10,000", build: () => lfrGraph({ nodes: 10000, mu: 0.5, seed: 114 }), restarts: DEFAULT_RESTARTS, nulls: 1 },
  {
    name: "random one-mode 20,000",
    build: () => lfrGraph({ nodes: 20000, mu: 0, seed: 117, minDegree: 5, maxDegree: 20, tau1: 3, minModule: 20000, maxModule: 20000 }),
    restarts: 5,
    nulls: 0,
  },
  // Weighted: heavy-tailed integer weights correlated with the degrees (visit counts), on an LFR-style graph
  // and on a degree-corrected planted bipartite network.
  { name: "weighted LFR μ=0.4, 5,000", build: () => weightedLfrGraph({ nodes: 5000, mu: 0.4, seed: 121 }), restarts: DEFAULT_RESTARTS, nulls: 1 },
  { name: "weighted bipartite 1000 × 1500", build: () => weightedBipartiteDC({ rows: 1000, cols: 1500, modules: 20, seed: 122 }), restarts: DEFAULT_RESTARTS, nulls: 1 },
  // Nested with noise (5 % of the links moved at random), no modules planted: modularity is weak.
  { name: "nested bipartite 100 × 150", build: () => nestedBipartite({ rows: 100, cols: 150, seed: 123 }), restarts: DEFAULT_RESTARTS, nulls: 5 },
  { name: "nested bipartite 400 × 600", build: () => nestedBipartite({ rows: 400, cols: 600, seed: 124 }), restarts: DEFAULT_RESTARTS, nulls: 2 },
  { name: "LFR μ=0.3, 100,000", build: () => lfrGraph({ nodes: 100000, mu: 0.3, seed: 115 }), restarts: 5, nulls: 0 },
  { name: "LFR μ=0.5, 100,000", build: () => lfrGraph({ nodes: 100000, mu: 0.5, seed: 116 }), restarts: 5, nulls: 0 },
];

/** Networks up to this size get untimed warm-up runs (ours and graphology's) before the timed ones. */
const WARM_UP_MAX_NODES = 20000;

interface Timing {
  wallMs: number;
  cpuMs: number;
}

interface Result {
  name: string;
  oneMode: boolean;
  nodes: number;
  links: number;
  modules: number;
  mixing: number;
  weighted: boolean;
  totalWeight: number;
  objective: string;
  restarts: number;
  annealed: boolean;
  ourBest: number;
  ourMedian: number;
  ourRestart: Timing;
  passesMedian: number;
  passesMax: number;
  converged: boolean;
  louvainBest: number;
  louvainMedian: number;
  louvainRun: Timing;
  /** Q of the planted partition (null when no modules were planted). */
  planted: number | null;
  nullModel: string;
  nullsTimed: number;
  nullsPerSecWall: number | null;
  nullsPerSecCpu: number | null;
  peakAfterOursMB: number;
  peakMB: number;
  where: string;
  /** Q after each pass of the first traced restart. */
  passQ: number[];
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}

const cpuNow = () => {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1000;
};
const peakMB = () => process.resourceUsage().maxRSS / 1024;

/** Per-call wall and CPU times of `runs` calls of fn (median of each). */
function timed(runs: number, fn: (r: number) => void): Timing {
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let r = 0; r < runs; r++) {
    const w0 = performance.now();
    const c0 = cpuNow();
    fn(r);
    cpu.push(cpuNow() - c0);
    wall.push(performance.now() - w0);
  }
  return { wallMs: median(wall), cpuMs: median(cpu) };
}

/** The network as a graphology graph; weighted networks carry their weights in the `weight` attribute. */
function graphologyGraph(net: Network): Graph {
  const g = new Graph({ type: "undirected" });
  const R = net.rowLabels.length;
  const bip = net.kind === "bipartite";
  const n = bip ? R + net.colLabels.length : R;
  for (let v = 0; v < n; v++) g.addNode(String(v));
  for (let i = 0; i < R; i++)
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
      const j = bip ? R + net.colIdx[e] : net.colIdx[e];
      if (bip || i < j) g.addUndirectedEdge(String(i), String(j), net.weighted ? { weight: net.weights[e] } : {});
    }
  return g;
}

/**
 * Where the time of a restart goes, from traced runs (three, their step times summed: wall-clock steps
 * on a shared machine are noisy).
 */
function whereTimeGoes(net: Network, objective: ReturnType<typeof optimizeModularity>["objective"]): { where: string; passQ: number[] } {
  const g = buildQualityGraph(net, objective);
  let move = 0;
  let refine = 0;
  let aggregate = 0;
  const passes: number[] = [];
  let first: LeidenTrace | null = null;
  let firstQ = 0;
  for (let r = 0; r < 3; r++) {
    const trace: LeidenTrace = { levels: [], passQ: [] };
    const res = leiden(g, createRng(deriveSeed(1, 999, r)), { trace });
    passes.push(res.passes);
    for (const l of trace.levels) {
      move += l.moveMs;
      refine += l.refineMs;
      aggregate += l.aggregateMs;
    }
    if (!first) {
      first = trace;
      firstQ = res.Q;
    }
  }
  const t = first!;
  const total = move + refine + aggregate || 1;
  const pass1 = t.levels.filter((l) => l.pass === 0);
  const pct = (x: number) => `${Math.round((100 * x) / total)} %`;
  const levels = t.levels.length / t.passQ.length;
  const where =
    `${passes.join(", ")} passes, ${levels.toFixed(1)} levels per pass; ` +
    `local moving ${pct(move)}, refinement ${pct(refine)}, aggregation ${pct(aggregate)}; ` +
    `level 0 of pass 1: ${(pass1[0].visits / pass1[0].nodes).toFixed(1)} queue visits per node; ` +
    `nodes per level in pass 1: ${pass1.map((l) => l.nodes).join(" → ")}; ` +
    `Q after passes 1, 2 and last: ${t.passQ[0].toFixed(4)}, ${(t.passQ[1] ?? t.passQ[0]).toFixed(4)}, ${firstQ.toFixed(4)}`;
  return { where, passQ: t.passQ };
}

function runChild(spec: Spec): Result {
  const { net, planted, modules, mixing } = spec.build();
  const oneMode = net.kind === "unipartite";
  const restarts = spec.restarts;
  const n0 = net.kind === "bipartite" ? net.rowLabels.length + net.colLabels.length : net.rowLabels.length;
  const gg = graphologyGraph(net);
  if (n0 <= WARM_UP_MAX_NODES) {
    // Warm code first (two untimed runs of each, other seeds), as in the pipeline's long-lived threads:
    // otherwise the first, unoptimized runs of a small network weigh on the median.
    optimizeModularity(net, { restarts: 2, seed: 7, annealing: "off" });
    for (let r = 0; r < 2; r++) {
      const rng = createRng(deriveSeed(7, r));
      louvain.detailed(gg, { rng: () => rng.next() });
    }
  }
  const wall: number[] = [];
  const cpu: number[] = [];
  let w = performance.now();
  let c = cpuNow();
  const res = optimizeModularity(net, {
    restarts,
    seed: 1,
    onRestart: () => {
      const w1 = performance.now();
      const c1 = cpuNow();
      wall.push(w1 - w);
      cpu.push(c1 - c);
      w = w1;
      c = c1;
    },
  });
  const peakAfterOursMB = peakMB();
  const { where, passQ } = whereTimeGoes(net, res.objective);

  const n = res.partition.length;
  const part = new Int32Array(n);
  const lqs: number[] = [];
  const louvainRun = timed(restarts, (r) => {
    const rng = createRng(deriveSeed(1, 0x6c6f7576, r));
    const out = louvain.detailed(gg, { rng: () => rng.next() });
    const ids = new Map<number, number>();
    for (let v = 0; v < n; v++) {
      const k = out.communities[String(v)];
      if (!ids.has(k)) ids.set(k, ids.size);
      part[v] = ids.get(k)!;
    }
    lqs.push(modularity(net, part, res.objective));
  });

  const nullModel = standardNullModels(net).primary;
  let nullsPerSecWall: number | null = null;
  let nullsPerSecCpu: number | null = null;
  if (spec.nulls > 0) {
    const annealing = annealingApplies(net, "auto") ? "on" : "off";
    // Two replicates first, not timed: the pipeline's worker threads are long-lived, so their code is warm.
    for (let r = 0; r < Math.min(2, spec.nulls); r++) nullReplicateQ(net, { model: nullModel, seed: 1, replicate: 1000 + r, restarts, objective: res.objective, annealing });
    const w0 = performance.now();
    const c0 = cpuNow();
    for (let r = 0; r < spec.nulls; r++) nullReplicateQ(net, { model: nullModel, seed: 1, replicate: r, restarts, objective: res.objective, annealing });
    nullsPerSecWall = spec.nulls / ((performance.now() - w0) / 1000);
    nullsPerSecCpu = spec.nulls / ((cpuNow() - c0) / 1000);
  }
  const R = net.rowLabels.length;
  return {
    name: spec.name,
    oneMode,
    nodes: n,
    links: oneMode ? net.rowPtr[R] / 2 : net.rowPtr[R],
    modules,
    mixing,
    weighted: net.weighted,
    totalWeight: (() => {
      let t = 0;
      for (let e = 0; e < net.rowPtr[R]; e++) t += net.weights[e];
      return oneMode ? t / 2 : t;
    })(),
    objective: res.objective,
    restarts,
    annealed: res.algorithm.parameters.annealed,
    ourBest: Math.max(...res.restarts.qs, res.Q ?? -1),
    ourMedian: median(res.restarts.qs),
    ourRestart: { wallMs: median(wall), cpuMs: median(cpu) },
    passesMedian: median(res.restarts.passes),
    passesMax: Math.max(...res.restarts.passes),
    converged: res.convergence.converged,
    louvainBest: Math.max(...lqs),
    louvainMedian: median(lqs),
    louvainRun,
    planted: modules > 1 ? modularity(net, planted, res.objective) : null,
    nullModel,
    nullsTimed: spec.nulls,
    nullsPerSecWall,
    nullsPerSecCpu,
    peakAfterOursMB,
    peakMB: peakMB(),
    where,
    passQ,
  };
}

const f = (x: number, d = 4) => x.toFixed(d);
const ms = (t: Timing) => `${f(t.wallMs, 1)} ms wall, ${f(t.cpuMs, 1)} ms CPU`;

/**
 * How soon a restart matches graphology's best Q: the first pass of the first traced restart whose Q
 * reaches it, and the CPU time of that many passes (the median time per restart shared evenly over the
 * median passes). Running on to convergence is what costs the rest of a restart.
 */
function catchUp(r: Result): string {
  const k = r.passQ.findIndex((q) => q >= r.louvainBest - 1e-9);
  const perPass = r.ourRestart.cpuMs / Math.max(1, r.passesMedian);
  if (k < 0) return `graphology's best Q not reached by the traced restart (${r.passQ.length} passes)`;
  const ms = (k + 1) * perPass;
  return `graphology's best Q reached after ${k + 1} of ${r.passQ.length} passes: about ${f(ms, 1)} ms CPU, ${f(ms / r.louvainRun.cpuMs, 2)} × graphology's run; the passes after it (convergence) take the rest`;
}

function print(r: Result): void {
  const lines = [
    `${r.name}: ${r.nodes.toLocaleString("en")} nodes, ${r.links.toLocaleString("en")} links${r.weighted ? ` (weighted, total weight ${r.totalWeight.toLocaleString("en")})` : ""}, ${r.modules > 1 ? `${r.modules} planted modules, ${f(100 * r.mixing, 0)} % of ${r.weighted ? "the link weight" : "links"} between them` : "no modules planted"} (objective ${r.objective})`,
    `  ours (${r.restarts} restarts${r.annealed ? ", then annealing" : ""}): best Q ${f(r.ourBest, 5)}, median ${f(r.ourMedian, 5)}; per restart ${ms(r.ourRestart)}; passes median ${r.passesMedian}, max ${r.passesMax}${r.converged ? ", all converged" : ", A SAFETY CAP WAS REACHED"}`,
    `  graphology-communities-louvain (${r.restarts} runs, re-scored): best Q ${f(r.louvainBest, 5)}, median ${f(r.louvainMedian, 5)}; per run ${ms(r.louvainRun)}`,
    `  time ratio ours / graphology: ${f(r.ourRestart.wallMs / r.louvainRun.wallMs, 2)} wall, ${f(r.ourRestart.cpuMs / r.louvainRun.cpuMs, 2)} CPU; planted partition Q ${r.planted === null ? "— (none planted)" : f(r.planted, 5)}`,
    r.nullsPerSecCpu === null
      ? `  null replicates (${r.nullModel}): not timed (one replicate ≈ ${r.restarts === DEFAULT_RESTARTS ? "" : `${DEFAULT_RESTARTS} restarts × `}the time per restart, or more: null networks converge slower)`
      : `  null replicates (${r.nullModel}, ${r.restarts} restarts${r.annealed ? " + annealing" : ""}, ${r.nullsTimed} timed): ${f(r.nullsPerSecCpu, 2)} per CPU second, ${f(r.nullsPerSecWall!, 2)} per wall second`,
    `  peak memory: ${f(r.peakAfterOursMB, 0)} MB after our restarts, ${f(r.peakMB, 0)} MB with graphology's graph and the nulls`,
    `  where the time goes (three traced restarts): ${r.where}`,
    `  ${catchUp(r)}`,
  ];
  console.log(lines.join("\n"));
}

function parentMain(): void {
  const args = process.argv.slice(2);
  // Parts are separated by commas, or by semicolons when a part holds a comma ("μ=0.5, 10,000;μ=0.3, 1,000").
  const onlyArg = args.includes("--only") ? args[args.indexOf("--only") + 1] : null;
  const only = onlyArg
    ? onlyArg
        .split(onlyArg.includes(";") ? ";" : ",")
        .map((s) => s.trim().toLowerCase())
        .filter((s) => s.length > 0)
    : null;
  const specs = SPECS.filter((s) => !only || only.some((o) => s.name.toLowerCase().includes(o)));
  const t0 = performance.now();
  console.log(`Tanglebank engine benchmark — ${ENGINE_VERSION}, Node ${process.version}, seed 1`);
  console.log(`(annealing "auto": networks of at most ${ANNEALING_MAX_NODES} linked nodes; each network in a child process)\n`);
  const rows: Result[] = [];
  for (const spec of specs) {
    const child = spawnSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), "--child", spec.name], {
      encoding: "utf8",
      stdio: ["ignore", "pipe", "inherit"],
      maxBuffer: 64 * 1024 * 1024,
    });
    const line = child.stdout.trim().split("\n").pop() ?? "";
    if (child.status !== 0 || !line.startsWith("{")) {
      console.log(`${spec.name}: FAILED (exit ${child.status}, signal ${child.signal ?? "none"})\n${child.stdout}`);
      continue;
    }
    const r = JSON.parse(line) as Result;
    rows.push(r);
    print(r);
  }

  const find = (s: string) => rows.find((r) => r.name === s);
  const targets: Array<[string, boolean]> = [];
  for (const r of rows) targets.push([`best Q ≥ graphology's best on ${r.name} (${f(r.ourBest)} vs ${f(r.louvainBest)})`, r.ourBest >= r.louvainBest - 1e-9]);
  // One-mode networks with planted modules (LFR-style, binary and weighted); the random graph has none.
  for (const r of rows.filter((x) => x.oneMode && x.modules > 1)) {
    targets.push([
      `median time per restart ≤ 2 × graphology's on ${r.name} (CPU ${f(r.ourRestart.cpuMs, 0)} vs ${f(r.louvainRun.cpuMs, 0)} ms: ${f(r.ourRestart.cpuMs / r.louvainRun.cpuMs, 2)}×)`,
      r.ourRestart.cpuMs <= 2 * r.louvainRun.cpuMs,
    ]);
  }
  const mid = find("DC bipartite 1000 × 1500");
  if (mid) targets.push([`DC bipartite 1000 × 1500 under 150 ms per restart (${f(mid.ourRestart.cpuMs, 0)} ms CPU)`, mid.ourRestart.cpuMs < 150]);
  const big = find("DC bipartite 3000 × 5000");
  if (big) {
    targets.push([`DC bipartite 3000 × 5000 under 800 ms per restart (${f(big.ourRestart.cpuMs, 0)} ms CPU)`, big.ourRestart.cpuMs < 800]);
    targets.push([`DC bipartite 3000 × 5000 under 500 MB peak memory (${f(big.peakAfterOursMB, 0)} MB)`, big.peakAfterOursMB < 500]);
  }
  for (const r of rows.filter((x) => x.nodes >= 100000)) {
    targets.push([`${r.name} optimized, converged, under 1 GB (${f(r.peakAfterOursMB, 0)} MB)`, r.converged && r.peakAfterOursMB < 1024]);
  }
  const small = find("DC bipartite 40 × 60");
  if (small) {
    targets.push([`at least 10 null replicates per second on 40 × 60 on one core (${f(small.nullsPerSecCpu!, 1)} per CPU second)`, small.nullsPerSecCpu! >= 10]);
  }
  console.log("\nTargets (times are CPU time, one core):");
  for (const [text, ok] of targets) console.log(`  ${ok ? "MET    " : "NOT MET"}  ${text}`);
  const met = targets.filter((t) => t[1]).length;
  console.log(`\nSummary: ${met} of ${targets.length} targets met on ${rows.length} networks; benchmark took ${f((performance.now() - t0) / 1000, 0)} s.`);
}

const childAt = process.argv.indexOf("--child");
if (childAt >= 0) {
  const spec = SPECS.find((s) => s.name === process.argv[childAt + 1]);
  if (!spec) throw new Error(`no benchmark network named ${process.argv[childAt + 1]}`);
  const out = runChild(spec);
  process.stdout.write(JSON.stringify(out) + "\n");
} else {
  parentMain();
}
