/**
 * Benchmark of the modularity optimizer (npm run bench:engine). It prints figures; it is not a test.
 *
 * Seeded networks (all generated here, nothing read from disk):
 * - planted-module bipartite networks of 40 × 60, 300 × 500, 1000 × 1500 and 3000 × 5000 nodes: rows and
 *   columns dealt round-robin into K modules; each row gets 5–15 links (3–8 on the smallest), each to a
 *   column of its own module with probability 0.8, else to any column (connectance 0.002–0.09, the sparse
 *   range of real interaction webs);
 * - one random bipartite network (300 × 500, 5–15 links per row, columns uniform: no modules);
 * - one-mode stochastic block models of 200, 2,000 and 20,000 nodes, modules of 50 (200 nodes) or 100
 *   nodes, 5 links per node (mean degree 10), 70 % of the links inside modules.
 * Per network: our best and median Q over 20 seeded restarts (the optimizer's restarts, seed 1) and the
 * median time per restart; graphology-communities-louvain's best and median over 20 runs seeded through
 * its `rng` option (one-mode only; its partition re-scored with our modularity()); Q of the planted
 * partition; null-model replicates per second (ER model, each replicate optimized with the same 20
 * restarts); peak memory (process-wide maximum resident set size, so an upper bound for each network).
 * The last lines state whether each target is met.
 */
import Graph from "graphology";
import louvain from "graphology-communities-louvain";
import { modularity } from "../shared/network/modularity/quality";
import { optimizeModularity, ANNEALING_MAX_NODES } from "../shared/network/optimizer/optimize";
import { createRng, deriveSeed, type Rng } from "../shared/network/random";
import { nullReplicateQ } from "../shared/network/significance";
import type { Network } from "../shared/network/types";
import { ENGINE_VERSION } from "../shared/network/version";

const RESTARTS = 20;
const MB = 1024 * 1024;

function peakRssMB(): number {
  return process.resourceUsage().maxRSS / 1024; // maxRSS is in kilobytes
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}

function csrFromRows(rows: number[][]): { rowPtr: Uint32Array; colIdx: Uint32Array; weights: Float64Array } {
  let nnz = 0;
  for (const r of rows) nnz += r.length;
  const rowPtr = new Uint32Array(rows.length + 1);
  const colIdx = new Uint32Array(nnz);
  let p = 0;
  rows.forEach((r, i) => {
    r.sort((a, b) => a - b);
    for (const j of r) colIdx[p++] = j;
    rowPtr[i + 1] = p;
  });
  return { rowPtr, colIdx, weights: new Float64Array(nnz).fill(1) };
}

function plantedBipartite(rng: Rng, R: number, C: number, K: number, dMin: number, dMax: number, pIn: number) {
  const colsOf: number[][] = Array.from({ length: K }, () => []);
  for (let j = 0; j < C; j++) colsOf[j % K].push(j);
  const rows: number[][] = [];
  for (let i = 0; i < R; i++) {
    const d = dMin + rng.nextInt(dMax - dMin + 1);
    const set = new Set<number>();
    const own = colsOf[i % K];
    while (set.size < Math.min(d, C)) {
      set.add(rng.next() < pIn ? own[rng.nextInt(own.length)] : rng.nextInt(C));
    }
    rows.push([...set]);
  }
  const net: Network = {
    kind: "bipartite",
    directed: false,
    weighted: false,
    rowLabels: Array.from({ length: R }, (_, i) => `r${i}`),
    colLabels: Array.from({ length: C }, (_, j) => `c${j}`),
    ...csrFromRows(rows),
  };
  const planted = new Int32Array(R + C);
  for (let i = 0; i < R; i++) planted[i] = i % K;
  for (let j = 0; j < C; j++) planted[R + j] = j % K;
  return { net, planted };
}

function sbm(rng: Rng, n: number, size: number, linksPerNode: number, inside: number) {
  const K = Math.ceil(n / size);
  const module = Int32Array.from({ length: n }, (_, v) => Math.floor(v / size));
  const adj: Set<number>[] = Array.from({ length: n }, () => new Set());
  let links = 0;
  while (links < linksPerNode * n) {
    const u = rng.nextInt(n);
    let v: number;
    if (rng.next() < inside) {
      const c = module[u];
      const lo = c * size;
      v = lo + rng.nextInt(Math.min(size, n - lo));
    } else v = rng.nextInt(n);
    if (u === v || adj[u].has(v)) continue;
    adj[u].add(v);
    adj[v].add(u);
    links++;
  }
  const labels = Array.from({ length: n }, (_, i) => `n${i}`);
  const net: Network = {
    kind: "unipartite",
    directed: false,
    weighted: false,
    rowLabels: labels,
    colLabels: labels,
    ...csrFromRows(adj.map((s) => [...s])),
  };
  void K;
  return { net, planted: module };
}

function louvainRuns(net: Network, runs: number): { best: number; median: number; msMedian: number } {
  const g = new Graph({ type: "undirected" });
  const n = net.rowLabels.length;
  for (let v = 0; v < n; v++) g.addNode(String(v));
  for (let i = 0; i < n; i++)
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
      const j = net.colIdx[e];
      if (i < j) g.addUndirectedEdge(String(i), String(j));
    }
  const qs: number[] = [];
  const times: number[] = [];
  const part = new Int32Array(n);
  for (let r = 0; r < runs; r++) {
    const rng = createRng(deriveSeed(1, 0x6c6f7576, r));
    const t = performance.now();
    const res = louvain.detailed(g, { rng: () => rng.next() });
    times.push(performance.now() - t);
    // Renumber and re-score with our modularity() so both use the same formula.
    const ids = new Map<number, number>();
    for (let v = 0; v < n; v++) {
      const c = res.communities[String(v)];
      if (!ids.has(c)) ids.set(c, ids.size);
      part[v] = ids.get(c)!;
    }
    qs.push(modularity(net, part, "newman"));
  }
  return { best: Math.max(...qs), median: median(qs), msMedian: median(times) };
}

interface Row {
  name: string;
  oneMode: boolean;
  nodes: number;
  links: number;
  ourBest: number;
  ourMedian: number;
  restartMs: number;
  totalMs: number;
  restarts: number;
  annealed: boolean;
  louvain?: { best: number; median: number; msMedian: number };
  planted: number | null;
  nullsPerSec: number;
  nullsTimed: number;
  peakMB: number;
}

function bench(name: string, net: Network, planted: Int32Array | null, opts: { restarts?: number; nulls?: number } = {}): Row {
  const restarts = opts.restarts ?? RESTARTS;
  const oneMode = net.kind === "unipartite";
  const times: number[] = [];
  let last = performance.now();
  const t0 = last;
  const res = optimizeModularity(net, {
    restarts,
    seed: 1,
    onRestart: () => {
      const now = performance.now();
      times.push(now - last);
      last = now;
    },
  });
  const totalMs = performance.now() - t0;
  const qs = res.restarts.qs;
  const louv = oneMode ? louvainRuns(net, RESTARTS) : undefined;
  const plantedQ = planted ? modularity(net, planted, res.objective) : null;
  const nNulls = opts.nulls ?? 3;
  const tn = performance.now();
  for (let r = 0; r < nNulls; r++) nullReplicateQ(net, { model: "er", seed: 1, replicate: r, restarts, objective: res.objective });
  const nullsPerSec = nNulls / ((performance.now() - tn) / 1000);
  let links = net.rowPtr[net.rowLabels.length];
  if (oneMode) links /= 2;
  const row: Row = {
    name,
    oneMode,
    nodes: net.kind === "bipartite" ? net.rowLabels.length + net.colLabels.length : net.rowLabels.length,
    links,
    ourBest: Math.max(...qs, res.Q ?? -1),
    ourMedian: median(qs),
    restartMs: median(times),
    totalMs,
    restarts,
    annealed: res.algorithm.parameters.annealed,
    louvain: louv,
    planted: plantedQ,
    nullsPerSec,
    nullsTimed: nNulls,
    peakMB: peakRssMB(),
  };
  print(row);
  return row;
}

const f = (x: number, d = 4) => x.toFixed(d);

function print(r: Row) {
  const lines = [
    `${r.name}: ${r.nodes} nodes, ${r.links} links`,
    `  ours (${r.restarts} restarts${r.annealed ? ", then annealing" : ""}): best Q ${f(r.ourBest, 6)}, median ${f(r.ourMedian, 6)}, median ${f(r.restartMs, 1)} ms per restart, ${f(r.totalMs / 1000, 2)} s in all`,
  ];
  if (r.louvain) {
    lines.push(`  graphology-communities-louvain (20 seeded runs): best Q ${f(r.louvain.best, 6)}, median ${f(r.louvain.median, 6)}, median ${f(r.louvain.msMedian, 1)} ms per run`);
  }
  lines.push(`  planted partition: ${r.planted === null ? "none (no modules planted)" : `Q ${f(r.planted, 6)}`}`);
  lines.push(`  null replicates (ER, ${r.restarts} restarts each, ${r.nullsTimed} timed): ${f(r.nullsPerSec, 2)} per second`);
  lines.push(`  peak memory (process maximum RSS so far): ${f(r.peakMB, 0)} MB`);
  console.log(lines.join("\n"));
}

function main() {
  const t0 = performance.now();
  console.log(`Tanglebank engine benchmark — ${ENGINE_VERSION}, Node ${process.version}, ${RESTARTS} restarts, seed 1`);
  console.log(`(annealing on networks of at most ${ANNEALING_MAX_NODES} linked nodes; RSS at start ${f(process.memoryUsage().rss / MB, 0)} MB)\n`);
  const rows: Row[] = [];
  const g = (k: number) => createRng(deriveSeed(2024, k));
  {
    const { net, planted } = plantedBipartite(g(1), 40, 60, 4, 3, 8, 0.8);
    rows.push(bench("planted bipartite 40 × 60", net, planted, { nulls: 5 }));
  }
  {
    const { net, planted } = plantedBipartite(g(2), 300, 500, 8, 5, 15, 0.8);
    rows.push(bench("planted bipartite 300 × 500", net, planted));
  }
  {
    const { net, planted } = plantedBipartite(g(3), 1000, 1500, 15, 5, 15, 0.8);
    rows.push(bench("planted bipartite 1000 × 1500", net, planted));
  }
  {
    const { net, planted } = plantedBipartite(g(4), 3000, 5000, 30, 5, 15, 0.8);
    rows.push(bench("planted bipartite 3000 × 5000", net, planted, { nulls: 1 }));
  }
  {
    const { net } = plantedBipartite(g(5), 300, 500, 1, 5, 15, 0);
    rows.push(bench("random bipartite 300 × 500 (no modules)", net, null));
  }
  {
    const { net, planted } = sbm(g(6), 200, 50, 5, 0.7);
    rows.push(bench("stochastic block model 200", net, planted, { nulls: 3 }));
  }
  {
    const { net, planted } = sbm(g(7), 2000, 100, 5, 0.7);
    rows.push(bench("stochastic block model 2,000", net, planted));
  }
  {
    const { net, planted } = sbm(g(8), 20000, 100, 5, 0.7);
    rows.push(bench("stochastic block model 20,000", net, planted, { nulls: 1 }));
  }

  const oneMode = rows.filter((r) => r.oneMode);
  const big = rows.find((r) => r.name.includes("20,000"))!;
  const mid = rows.find((r) => r.name.includes("1000 × 1500"))!;
  const huge = rows.find((r) => r.name.includes("3000 × 5000"))!;
  const targets: Array<[string, boolean]> = [
    [
      `best Q ≥ graphology's best on every one-mode network (${oneMode.map((r) => `${f(r.ourBest)} vs ${f(r.louvain!.best)}`).join("; ")})`,
      oneMode.every((r) => r.ourBest >= r.louvain!.best - 1e-9),
    ],
    [`best Q ≥ planted Q on the 20,000-node model (${f(big.ourBest)} vs ${f(big.planted!)})`, big.ourBest >= big.planted! - 1e-9],
    [`median time per restart < 2 s on the 20,000-node model (${f(big.restartMs, 0)} ms)`, big.restartMs < 2000],
    [`median time per restart < 100 ms on 1000 × 1500 (${f(mid.restartMs, 1)} ms)`, mid.restartMs < 100],
    [`3000 × 5000 optimized with < 500 MB peak memory (${f(huge.peakMB, 0)} MB process peak after it)`, huge.peakMB < 500],
  ];
  console.log("\nTargets:");
  for (const [text, ok] of targets) console.log(`  ${ok ? "MET    " : "NOT MET"}  ${text}`);
  const met = targets.filter((t) => t[1]).length;
  console.log(`\nSummary: ${met} of ${targets.length} targets met; benchmark took ${f((performance.now() - t0) / 1000, 1)} s.`);
}

main();
