/**
 * Seeded generators of "hard" benchmark networks for the modularity optimizer: heavy-tailed degrees,
 * modules of very different sizes and weak separation, the shape of real interaction webs. Used by
 * `npm run bench:engine` and by the optimizer tests (small sizes). Everything random comes from the
 * engine's seeded generator, so a seed gives the same network on any machine.
 *
 * - `lfrGraph`: a one-mode benchmark graph in the manner of Lancichinetti, Fortunato & Radicchi 2008
 *   (Phys Rev E 78:046110, doi:10.1103/PhysRevE.78.046110): power-law degrees (exponent τ1) and module
 *   sizes (exponent τ2), each node with a share μ (the mixing parameter) of its links outside its module.
 *   Links are wired by configuration models inside each module and between modules; self-loops, repeated
 *   pairs and external stubs that would land in their own module are dropped, so the realised mixing is
 *   reported beside the requested one.
 * - `plantedBipartiteDC`: a degree-corrected planted-module bipartite network: module sizes, row degrees
 *   and column propensities all power-law distributed; each link of a row goes to a column of the row's
 *   module with probability `pIn` (else to any column), the column drawn in proportion to its propensity.
 *   With `modules: 1` it is a random bipartite network with heavy-tailed degrees and no modules.
 * - `weightedLfrGraph`, `weightedBipartiteDC`: the same networks with heavy-tailed integer weights that grow
 *   with the degrees of both ends (`withHeavyTailedWeights`), like visit counts.
 * - `nestedBipartite`: a nested matrix (hyperbolic edge, a set share of the cells filled) with a share of
 *   its links moved at random; no modules planted.
 */
import { createRng, type Rng } from "@shared/network/random";
import type { Network } from "@shared/network/types";

/** Integer x ≥ min with P(x) ∝ x^−τ (continuous power law rounded down), capped at max. */
function powerLawInt(rng: Rng, min: number, max: number, tau: number): number {
  for (;;) {
    const u = 1 - rng.next(); // (0, 1]
    const x = Math.floor(min * Math.pow(u, -1 / (tau - 1)));
    if (x <= max) return x;
  }
}

/** A binary bipartite network of R rows r0… and C columns c0…; row i links the columns in rowsOut[i]. */
function binaryBipartite(R: number, C: number, rowsOut: number[][]): Network {
  return {
    kind: "bipartite",
    directed: false,
    weighted: false,
    rowLabels: Array.from({ length: R }, (_, i) => `r${i}`),
    colLabels: Array.from({ length: C }, (_, j) => `c${j}`),
    ...csrFromRows(rowsOut),
  };
}

function csrFromRows(rows: number[][]): { rowPtr: Uint32Array; colIdx: Uint32Array; weights: Float64Array } {
  let nnz = 0;
  for (const r of rows) nnz += r.length;
  const rowPtr = new Uint32Array(rows.length + 1);
  const colIdx = new Uint32Array(nnz);
  let p = 0;
  rows.forEach((r, i) => {
    r.sort((x, y) => x - y);
    for (const j of r) colIdx[p++] = j;
    rowPtr[i + 1] = p;
  });
  return { rowPtr, colIdx, weights: new Float64Array(nnz).fill(1) };
}

function shuffleInPlace(rng: Rng, xs: Int32Array | number[], n = xs.length): void {
  for (let i = n - 1; i > 0; i--) {
    const j = rng.nextInt(i + 1);
    const t = xs[i];
    xs[i] = xs[j];
    xs[j] = t;
  }
}

export interface LfrOptions {
  nodes: number;
  mu: number;
  seed: number;
  /** Degree exponent τ1 (default 2.5), minimum and maximum degree (defaults 5 and 50). */
  tau1?: number;
  minDegree?: number;
  maxDegree?: number;
  /** Module-size exponent τ2 (default 1.5), smallest and largest module (defaults 20 and max(100, 3√n)). */
  tau2?: number;
  minModule?: number;
  maxModule?: number;
}

export interface PlantedNetwork {
  net: Network;
  /** The planted module of every node (bipartite: rows first, then columns). */
  planted: Int32Array;
  modules: number;
  /** Realised share of links between modules. */
  mixing: number;
}

/** An LFR-style one-mode benchmark graph (see the file header). */
export function lfrGraph(o: LfrOptions): PlantedNetwork {
  const rng = createRng(o.seed);
  const n = o.nodes;
  const tau1 = o.tau1 ?? 2.5;
  const kMin = o.minDegree ?? 5;
  const kMax = Math.min(o.maxDegree ?? 50, n - 1);
  const tau2 = o.tau2 ?? 1.5;
  const sMin = o.minModule ?? 20;
  const sMax = o.maxModule ?? Math.max(100, Math.round(3 * Math.sqrt(n)));

  const deg = new Int32Array(n);
  for (let v = 0; v < n; v++) deg[v] = powerLawInt(rng, kMin, kMax, tau1);
  const kIn = new Int32Array(n);
  for (let v = 0; v < n; v++) kIn[v] = Math.round((1 - o.mu) * deg[v]);

  // Module sizes until they cover n; the last one is trimmed (and merged into a neighbour if too small).
  const sizes: number[] = [];
  let covered = 0;
  while (covered < n) {
    const s = Math.min(powerLawInt(rng, sMin, sMax, tau2), n - covered);
    sizes.push(s);
    covered += s;
  }
  if (sizes.length > 1 && sizes[sizes.length - 1] < sMin) sizes[sizes.length - 2] += sizes.pop()!;
  const K = sizes.length;
  // Nodes in decreasing internal degree take a random module that still has room and is big enough.
  const order = Int32Array.from({ length: n }, (_, i) => i);
  shuffleInPlace(rng, order);
  order.sort((x, y) => kIn[y] - kIn[x]);
  const free = sizes.slice();
  const module = new Int32Array(n).fill(-1);
  const open: number[] = [];
  for (let c = 0; c < K; c++) open.push(c);
  for (const v of order) {
    let c = -1;
    for (let tries = 0; tries < 50 && open.length > 0; tries++) {
      const t = open[rng.nextInt(open.length)];
      if (sizes[t] - 1 >= kIn[v]) {
        c = t;
        break;
      }
    }
    if (c < 0) {
      // No roomy module found at random: the largest one with room; the node's internal degree shrinks.
      let bestSize = -1;
      for (const t of open)
        if (sizes[t] > bestSize) {
          bestSize = sizes[t];
          c = t;
        }
      kIn[v] = Math.min(kIn[v], sizes[c] - 1);
    }
    module[v] = c;
    if (--free[c] === 0) open.splice(open.indexOf(c), 1);
  }

  const adj: Set<number>[] = Array.from({ length: n }, () => new Set());
  const addLink = (u: number, v: number) => {
    if (u === v || adj[u].has(v)) return;
    adj[u].add(v);
    adj[v].add(u);
  };
  // Inside each module: a configuration model on the internal stubs.
  const members: number[][] = Array.from({ length: K }, () => []);
  for (let v = 0; v < n; v++) members[module[v]].push(v);
  for (let c = 0; c < K; c++) {
    const stubs: number[] = [];
    for (const v of members[c]) for (let s = 0; s < kIn[v]; s++) stubs.push(v);
    shuffleInPlace(rng, stubs);
    for (let s = 0; s + 1 < stubs.length; s += 2) addLink(stubs[s], stubs[s + 1]);
  }
  // Between modules: a configuration model on the external stubs, pairs inside one module dropped.
  const ext: number[] = [];
  for (let v = 0; v < n; v++) for (let s = kIn[v]; s < deg[v]; s++) ext.push(v);
  shuffleInPlace(rng, ext);
  for (let s = 0; s + 1 < ext.length; s += 2) {
    const u = ext[s];
    const v = ext[s + 1];
    if (module[u] !== module[v]) addLink(u, v);
  }
  let links = 0;
  let between = 0;
  for (let u = 0; u < n; u++)
    for (const v of adj[u])
      if (u < v) {
        links++;
        if (module[u] !== module[v]) between++;
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
  return { net, planted: module, modules: K, mixing: links > 0 ? between / links : 0 };
}

export interface PlantedBipartiteOptions {
  rows: number;
  cols: number;
  modules: number;
  seed: number;
  /** Share of a row's links drawn inside its module (default 0.7). */
  pIn?: number;
  /** Row degree: power law from minDegree (default 5) with exponent tau (default 2.5), at most cols/4. */
  minDegree?: number;
  tau?: number;
  /** Exponent of the column propensities (default 2.5) and of the module sizes (default 2). */
  colTau?: number;
  moduleTau?: number;
}

/** Cumulative sums of `w` over `idx`, for drawing an index in proportion to its weight. */
function cumulative(idx: number[], w: Float64Array): Float64Array {
  const cum = new Float64Array(idx.length);
  let s = 0;
  idx.forEach((j, t) => {
    s += w[j];
    cum[t] = s;
  });
  return cum;
}

function drawFrom(rng: Rng, idx: number[], cum: Float64Array): number {
  const x = rng.next() * cum[cum.length - 1];
  let lo = 0;
  let hi = cum.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (cum[mid] > x) hi = mid;
    else lo = mid + 1;
  }
  return idx[lo];
}

/** A degree-corrected planted-module bipartite network (see the file header). */
export function plantedBipartiteDC(o: PlantedBipartiteOptions): PlantedNetwork {
  const rng = createRng(o.seed);
  const { rows: R, cols: C } = o;
  const K = o.modules;
  const pIn = K > 1 ? (o.pIn ?? 0.7) : 0;
  // Module shares: power law, so a few modules are large and many small; every module gets at least two
  // rows and two columns, the rest is dealt in proportion to the shares.
  const share = new Float64Array(K);
  for (let c = 0; c < K; c++) share[c] = powerLawInt(rng, 10, 100000, o.moduleTau ?? 2);
  const deal = (count: number): Int32Array => {
    const out = new Int32Array(count);
    const base = Math.min(2, Math.floor(count / K));
    let p = 0;
    for (let c = 0; c < K; c++) for (let t = 0; t < base; t++) out[p++] = c;
    const cum = cumulative(
      Array.from({ length: K }, (_, c) => c),
      share,
    );
    const all = Array.from({ length: K }, (_, c) => c);
    while (p < count) out[p++] = drawFrom(rng, all, cum);
    shuffleInPlace(rng, out);
    return out;
  };
  const rowModule = deal(R);
  const colModule = deal(C);
  const propensity = new Float64Array(C);
  for (let j = 0; j < C; j++) propensity[j] = powerLawInt(rng, 1, 1e9, o.colTau ?? 2.5);
  const colsOf: number[][] = Array.from({ length: K }, () => []);
  for (let j = 0; j < C; j++) colsOf[colModule[j]].push(j);
  const cumOf = colsOf.map((idx) => cumulative(idx, propensity));
  const allCols = Array.from({ length: C }, (_, j) => j);
  const cumAll = cumulative(allCols, propensity);

  const rowsOut: number[][] = [];
  let links = 0;
  let between = 0;
  for (let i = 0; i < R; i++) {
    const d = powerLawInt(rng, o.minDegree ?? 5, Math.max(o.minDegree ?? 5, Math.floor(C / 4)), o.tau ?? 2.5);
    const own = rowModule[i];
    const set = new Set<number>();
    // Draws that repeat a column are retried a bounded number of times (a row may end a little short).
    for (let tries = 0; set.size < d && tries < 20 * d; tries++) {
      const j = rng.next() < pIn ? drawFrom(rng, colsOf[own], cumOf[own]) : drawFrom(rng, allCols, cumAll);
      set.add(j);
    }
    for (const j of set) if (colModule[j] !== own) between++;
    links += set.size;
    rowsOut.push([...set]);
  }
  // A column that drew no link gets one, to a row of its module, so no column node is isolated.
  const hasLink = new Uint8Array(C);
  for (const r of rowsOut) for (const j of r) hasLink[j] = 1;
  const rowsOf: number[][] = Array.from({ length: K }, () => []);
  for (let i = 0; i < R; i++) rowsOf[rowModule[i]].push(i);
  for (let j = 0; j < C; j++) {
    if (hasLink[j]) continue;
    const pool = rowsOf[colModule[j]];
    rowsOut[pool[rng.nextInt(pool.length)]].push(j);
    links++;
  }
  const net = binaryBipartite(R, C, rowsOut);
  const planted = new Int32Array(R + C);
  planted.set(rowModule, 0);
  planted.set(colModule, R);
  return { net, planted, modules: K, mixing: links > 0 ? between / links : 0 };
}

/**
 * Heavy-tailed weights on the links of `net` (a new network with the same links): the weight of link
 * (i, j) is ⌈X · √(k_i k_j) / k̄⌉ with X a power law from 1 with exponent `tau` (k the node degrees with
 * rows and columns told apart on bipartite networks, k̄ their mean), so strong nodes carry strong links
 * and a few links carry much of the weight, as visit counts do. Integer counts (`integer`, the default)
 * or reals. Undirected one-mode networks get the same weight on both stored directions of a link.
 */
export function withHeavyTailedWeights(net: Network, seed: number, o: { tau?: number; integer?: boolean } = {}): Network {
  const rng = createRng(seed);
  const tau = o.tau ?? 2.2;
  const integer = o.integer ?? true;
  const R = net.rowLabels.length;
  const bip = net.kind === "bipartite";
  const C = bip ? net.colLabels.length : R;
  const rowDeg = new Float64Array(R);
  const colDeg = new Float64Array(C);
  for (let i = 0; i < R; i++)
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
      rowDeg[i]++;
      colDeg[net.colIdx[e]]++;
    }
  const nnz = net.rowPtr[R];
  const meanDeg = (2 * nnz) / (R + C);
  const weights = new Float64Array(nnz);
  // One draw per undirected link (i ≤ j); the mirror entry copies it.
  const drawn = new Map<number, number>();
  for (let i = 0; i < R; i++)
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
      const j = net.colIdx[e];
      if (!bip && j < i) {
        weights[e] = drawn.get(j * R + i)!;
        continue;
      }
      const u = 1 - rng.next(); // (0, 1]
      const x = Math.pow(u, -1 / (tau - 1));
      const raw = (x * Math.sqrt(rowDeg[i] * colDeg[j])) / meanDeg;
      const w = integer ? Math.max(1, Math.ceil(raw)) : Math.max(1e-3, raw);
      weights[e] = w;
      if (!bip) drawn.set(i * R + j, w);
    }
  let weighted = false;
  for (let e = 0; e < nnz; e++) if (weights[e] !== 1) weighted = true;
  return { ...net, weighted, weights };
}

/** A weighted LFR-style one-mode graph: lfrGraph's links with heavy-tailed weights (withHeavyTailedWeights). */
export function weightedLfrGraph(o: LfrOptions & { weightTau?: number; integer?: boolean }): PlantedNetwork {
  const base = lfrGraph(o);
  const net = withHeavyTailedWeights(base.net, o.seed + 0x5eed, { tau: o.weightTau, integer: o.integer });
  return { ...base, net, mixing: weightedMixing(net, base.planted) };
}

/** A degree-corrected planted bipartite network with heavy-tailed counts on its links (visit frequencies). */
export function weightedBipartiteDC(o: PlantedBipartiteOptions & { weightTau?: number }): PlantedNetwork {
  const base = plantedBipartiteDC(o);
  const net = withHeavyTailedWeights(base.net, o.seed + 0x5eed, { tau: o.weightTau, integer: true });
  return { ...base, net, mixing: weightedMixing(net, base.planted) };
}

/** Share of the link weight between planted modules. */
function weightedMixing(net: Network, planted: Int32Array): number {
  const R = net.rowLabels.length;
  const off = net.kind === "bipartite" ? R : 0;
  let total = 0;
  let between = 0;
  for (let i = 0; i < R; i++)
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
      total += net.weights[e];
      if (planted[i] !== planted[net.colIdx[e] + off]) between += net.weights[e];
    }
  return total > 0 ? between / total : 0;
}

export interface NestedOptions {
  rows: number;
  cols: number;
  seed: number;
  /** Share of the cells filled (default 0.2). */
  fill?: number;
  /** Share of the links moved to random empty cells (default 0.05): 0 gives a perfectly nested matrix. */
  noise?: number;
}

/**
 * A nested bipartite network with noise: row i (0-based) and column j get ranks x_i = (i + ½)/R and
 * y_j = (j + ½)/C, and cell (i, j) is a link when x_i · y_j ≤ t, the threshold t chosen so that a share
 * `fill` of the cells are links. Every row's columns then contain those of the rows below it (a perfectly
 * nested matrix, with a hyperbolic edge as in many pollination webs); a share `noise` of the links is then
 * moved to empty cells drawn at random. Rows or columns left without links get one (to column 0 or row 0,
 * the generalists). No modules are planted: modularity is weak, and every module found is the optimizer's.
 */
export function nestedBipartite(o: NestedOptions): PlantedNetwork {
  const rng = createRng(o.seed);
  const { rows: R, cols: C } = o;
  const fill = o.fill ?? 0.2;
  const noise = o.noise ?? 0.05;
  const x = (i: number) => (i + 0.5) / R;
  const y = (j: number) => (j + 0.5) / C;
  // Threshold by bisection on the filled share (monotone in t).
  const filled = (t: number) => {
    let s = 0;
    for (let i = 0; i < R; i++) s += Math.min(C, Math.max(0, Math.floor((t / x(i)) * C - 0.5) + 1));
    return s / (R * C);
  };
  let lo = 0;
  let hi = 1;
  for (let it = 0; it < 60; it++) {
    const mid = (lo + hi) / 2;
    if (filled(mid) < fill) lo = mid;
    else hi = mid;
  }
  const t = hi;
  const cell = new Uint8Array(R * C);
  const links: number[] = [];
  for (let i = 0; i < R; i++)
    for (let j = 0; j < C; j++)
      if (x(i) * y(j) <= t) {
        cell[i * C + j] = 1;
        links.push(i * C + j);
      }
  const moves = Math.round(noise * links.length);
  shuffleInPlace(rng, links);
  for (let m = 0; m < moves; m++) {
    let target: number;
    do target = rng.nextInt(R * C);
    while (cell[target]);
    cell[links[m]] = 0;
    cell[target] = 1;
  }
  for (let i = 0; i < R; i++) {
    let any = false;
    for (let j = 0; j < C && !any; j++) any = cell[i * C + j] === 1;
    if (!any) cell[i * C] = 1;
  }
  for (let j = 0; j < C; j++) {
    let any = false;
    for (let i = 0; i < R && !any; i++) any = cell[i * C + j] === 1;
    if (!any) cell[j] = 1;
  }
  const rowsOut: number[][] = [];
  for (let i = 0; i < R; i++) {
    const r: number[] = [];
    for (let j = 0; j < C; j++) if (cell[i * C + j]) r.push(j);
    rowsOut.push(r);
  }
  const net = binaryBipartite(R, C, rowsOut);
  return { net, planted: new Int32Array(R + C), modules: 1, mixing: 0 };
}
