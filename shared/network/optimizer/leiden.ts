/**
 * Leiden-style modularity maximisation on a {@link QualityGraph} (Traag, Waltman & van Eck 2019,
 * "From Louvain to Leiden: guaranteeing well-connected communities", Sci Rep 9:5233,
 * doi:10.1038/s41598-019-41695-z).
 *
 * One pass, as in the paper's Algorithm A.2:
 * 1. Fast local moving: nodes wait in a queue (random initial order); a node moves to the module with
 *    the largest gain g(v, c) (formula (2) of quality-graph.ts, including an empty module) when that
 *    gain beats staying; neighbours that end up outside the node's new module rejoin the queue.
 * 2. Refinement: inside every module S, start from singletons and visit the nodes in random order; a
 *    node that is still a singleton and well connected to S joins a well-connected sub-module C of S
 *    with g(v, C) ≥ 0, chosen with probability ∝ exp(g/(θ·w̄)) (θ = 0.01, w̄ the mean link weight, so
 *    the randomness does not depend on the unit of the weights). "Well connected" generalises the
 *    paper's E(C, S−C) ≥ γ‖C‖(‖S‖−‖C‖) to our null-model term: E(C, S−C) ≥ γ(A_C(B_S−B_C) + B_C(A_S−A_C)),
 *    i.e. splitting C off S would not raise Q.
 * 3. Aggregation of the refined partition into a new graph; the aggregate's initial partition puts each
 *    refined sub-module into the module of step 1 that contains it.
 * Repeat until local moving leaves every aggregate node alone. When refinement merges nothing (possible
 * when no node is well connected), the pass aggregates on the unrefined partition, as Louvain does, so
 * the level count stays finite. Whole passes repeat from the previous result until one no longer raises Q
 * (convergence; PASS_CAP and LEVEL_CAP are safety caps only, and a run that reaches one says so).
 *
 * Cost: a pass is a few sweeps over the links of each level (local moving, two in refinement, one in
 * aggregation). Nothing is allocated per move; level graphs and memberships live in the workspace (two
 * sets of level buffers used in turn), so a pass allocates only its result.
 *
 * Determinism: all randomness comes from the injected generator; ties keep the current module or the
 * first candidate in CSR order; sums run in a fixed order. Math.exp is used only to weigh the random
 * choice in refinement, where a last-bit difference between JavaScript engines could change the outcome
 * only if a uniform draw fell within ~1e-16 of a boundary; clear choices skip it (CLEAR_CHOICE).
 */
import type { Rng } from "../random";
import { graphQuality, renumber, type QualityGraph } from "./quality-graph";

/** Randomness of the refinement step (θ of the paper; 0.01 is the authors' default). */
export const REFINEMENT_THETA = 0.01;
/**
 * Refinement's weighted draw picks the best candidate C* for certain, without computing its exponentials,
 * when staying alone and every other candidate weigh at most e^−60 against C*'s 1 (gains at least 60·θ·w̄
 * below C*'s, and C*'s gain at least 60·θ·w̄) and the uniform draw u is not 0. Proof that the draw would
 * give the same: with fewer than 2^26 candidates, the sum of the small weights stays below 2^−54, so the
 * floating-point total is exactly 1 (adding less than half an ulp of 1 leaves 1); r = u − stay is then
 * positive for u ≥ 2^−32 (draws are multiples of 2^−32), stays positive while the small weights are taken
 * off, and falls below 0 at C* since r ≤ u < 1. Same draws, same choices, for every seed.
 */
const CLEAR_CHOICE = 60;
/**
 * Safety caps. A run repeats whole passes until one no longer raises Q (convergence); each accepted pass
 * raises Q by more than a relative 1e-12, so a run always ends, and these caps only guard against a
 * defect. A run that reaches either cap says so (`LeidenResult.converged` false, `capped`), and the
 * optimizer's result carries it.
 */
export const PASS_CAP = 1000;
export const LEVEL_CAP = 1000;

/** One level of one pass, as recorded by a {@link LeidenTrace} (benchmarks and diagnosis). */
export interface LevelTrace {
  pass: number;
  level: number;
  nodes: number;
  /** Stored links of the level graph (each undirected link once). */
  links: number;
  /** Modules after local moving. */
  modules: number;
  /** Nodes taken from the local-moving queue (a sweep over all nodes counts `nodes`). */
  visits: number;
  /** Sub-modules after refinement (= nodes of the next level); null on the last level. */
  refined: number | null;
  moveMs: number;
  refineMs: number;
  aggregateMs: number;
}

/** Optional recorder of what a run did, level by level and pass by pass. */
export interface LeidenTrace {
  levels: LevelTrace[];
  /** Q after each pass (the last one did not raise Q, unless a cap was reached). */
  passQ: number[];
}

/** CSR buffers of one aggregated level, sized for the largest aggregate (reused level after level). */
interface LevelBuffers {
  ptr: Int32Array;
  nbr: Int32Array;
  ew: Float64Array;
  self: Float64Array;
  a: Float64Array;
  b: Float64Array;
}

/** Scratch arrays sized for the largest level (the input graph); reused across levels and passes. */
interface Workspace {
  n: number;
  mark: Int32Array;
  stamp: number;
  nw: Float64Array;
  touched: Int32Array;
  queue: Int32Array;
  inQueue: Uint8Array;
  modA: Float64Array;
  modB: Float64Array;
  modSize: Int32Array;
  empty: Int32Array;
  perm: Int32Array;
  cut: Float64Array;
  sA: Float64Array;
  sB: Float64Array;
  cand: Int32Array;
  candW: Float64Array;
  map: Int32Array;
  refined: Int32Array;
  wellConnected: Uint8Array;
  /** Level memberships (two, used in turn) and the map from input nodes to level nodes. */
  memb: [Int32Array, Int32Array];
  toLevel: Int32Array;
  /** Aggregation: module starts, members by module, fill pointers. */
  start: Int32Array;
  members: Int32Array;
  /** Aggregated graphs, two used in turn (allocated on the first aggregation). */
  levels: [LevelBuffers, LevelBuffers] | null;
}

function createWorkspace(n: number): Workspace {
  return {
    n,
    mark: new Int32Array(n).fill(-1),
    stamp: 0,
    nw: new Float64Array(n),
    touched: new Int32Array(n),
    queue: new Int32Array(n),
    inQueue: new Uint8Array(n),
    modA: new Float64Array(n),
    modB: new Float64Array(n),
    modSize: new Int32Array(n),
    empty: new Int32Array(n),
    perm: new Int32Array(n),
    cut: new Float64Array(n),
    sA: new Float64Array(n),
    sB: new Float64Array(n),
    cand: new Int32Array(n),
    candW: new Float64Array(n),
    map: new Int32Array(n),
    refined: new Int32Array(n),
    wellConnected: new Uint8Array(n),
    memb: [new Int32Array(n), new Int32Array(n)],
    toLevel: new Int32Array(n),
    start: new Int32Array(n + 1),
    members: new Int32Array(n),
    levels: null,
  };
}

function levelBuffers(n: number, entries: number): LevelBuffers {
  return {
    ptr: new Int32Array(n + 1),
    nbr: new Int32Array(entries),
    ew: new Float64Array(entries),
    self: new Float64Array(n),
    a: new Float64Array(n),
    b: new Float64Array(n),
  };
}

function nextStamp(ws: Workspace): number {
  if (ws.stamp >= 0x7ffffff0) {
    ws.mark.fill(-1);
    ws.stamp = 0;
  }
  return ++ws.stamp;
}

/** Fisher–Yates shuffle of 0..n−1 into ws.perm. */
function shuffle(ws: Workspace, n: number, rng: Rng): Int32Array {
  const p = ws.perm;
  for (let i = 0; i < n; i++) p[i] = i;
  for (let i = n - 1; i > 0; i--) {
    const j = rng.nextInt(i + 1);
    const t = p[i];
    p[i] = p[j];
    p[j] = t;
  }
  return p;
}

/**
 * Fast local moving (Algorithm A.2, MoveNodesFast). `memb` holds module ids in [0, n) and is updated
 * in place. Returns the number of nodes taken from the queue. Leaves in ws.cut, for every node v,
 * E(v, S − v) with S its module (set at v's last visit, then updated as neighbours move), which
 * refinement needs: every node is visited at least once, so this saves refinement a sweep over the links.
 */
export function moveNodesFast(g: QualityGraph, memb: Int32Array, rng: Rng, ws: Workspace, eps: number): number {
  const { n, ptr, nbr, ew, a, b, gamma } = g;
  const { modA, modB, modSize, empty, queue, inQueue, nw, mark, touched, cut } = ws;
  modA.fill(0, 0, n);
  modB.fill(0, 0, n);
  modSize.fill(0, 0, n);
  for (let v = 0; v < n; v++) {
    const c = memb[v];
    modA[c] += a[v];
    modB[c] += b[v];
    modSize[c]++;
  }
  let nEmpty = 0;
  for (let c = n - 1; c >= 0; c--) if (modSize[c] === 0) empty[nEmpty++] = c;

  const order = shuffle(ws, n, rng);
  // Circular queue: head index and count.
  for (let i = 0; i < n; i++) {
    queue[i] = order[i];
    inQueue[order[i]] = 1;
  }
  let head = 0;
  let count = n;
  let visits = 0;

  while (count > 0) {
    const v = queue[head];
    head = head + 1 === n ? 0 : head + 1;
    count--;
    visits++;
    inQueue[v] = 0;

    const cur = memb[v];
    const av = a[v];
    const bv = b[v];
    const stamp = nextStamp(ws);
    let nt = 0;
    mark[cur] = stamp;
    nw[cur] = 0;
    touched[nt++] = cur;
    const e0 = ptr[v];
    const e1 = ptr[v + 1];
    for (let e = e0; e < e1; e++) {
      const c = memb[nbr[e]];
      if (mark[c] !== stamp) {
        mark[c] = stamp;
        nw[c] = 0;
        touched[nt++] = c;
      }
      nw[c] += ew[e];
    }
    // Take v out of its module.
    modA[cur] -= av;
    modB[cur] -= bv;
    modSize[cur]--;

    let best = cur;
    let bestGain = nw[cur] - gamma * (av * modB[cur] + bv * modA[cur]);
    const curGain = bestGain;
    for (let t = 1; t < nt; t++) {
      const c = touched[t];
      const gain = nw[c] - gamma * (av * modB[c] + bv * modA[c]);
      if (gain > bestGain + eps && gain > curGain + eps) {
        best = c;
        bestGain = gain;
      }
    }
    // An empty module has gain 0.
    if (modSize[cur] > 0 && 0 > bestGain + eps && nEmpty > 0) {
      best = empty[--nEmpty];
    }

    modA[best] += av;
    modB[best] += bv;
    modSize[best]++;
    // E(v, its module − v), kept up to date below as neighbours move: refinement starts from it.
    cut[v] = mark[best] === stamp ? nw[best] : 0;
    if (best !== cur) {
      memb[v] = best;
      if (modSize[cur] === 0) empty[nEmpty++] = cur;
      for (let e = e0; e < e1; e++) {
        const u = nbr[e];
        const mu = memb[u];
        if (mu === cur) cut[u] -= ew[e];
        else if (mu === best) cut[u] += ew[e];
        if (!inQueue[u] && mu !== best) {
          inQueue[u] = 1;
          let tail = head + count;
          if (tail >= n) tail -= n;
          queue[tail] = u;
          count++;
        }
      }
    }
  }
  return visits;
}

/**
 * Refinement (Algorithm A.2, RefinePartition / MergeNodesSubset). Returns the refined membership
 * (renumbered 0..K−1; it lives in the workspace and is valid until the next refinement) and K.
 */
export function refinePartition(
  g: QualityGraph,
  memb: Int32Array,
  rng: Rng,
  ws: Workspace,
  meanWeight: number,
  /** ws.cut already holds E(v, S − v) for `memb` (left there by moveNodesFast). */
  cutKnown = false,
): { refined: Int32Array; k: number } {
  const { n, ptr, nbr, ew, a, b, gamma } = g;
  const { modA, modB, modSize, nw, mark, touched, cut, cand, candW } = ws;
  // Totals of the unrefined modules S.
  const SA = ws.sA;
  const SB = ws.sB;
  SA.fill(0, 0, n);
  SB.fill(0, 0, n);
  for (let v = 0; v < n; v++) {
    SA[memb[v]] += a[v];
    SB[memb[v]] += b[v];
  }
  const refined = ws.refined.subarray(0, n);
  const wellConnectedNode = ws.wellConnected;
  for (let v = 0; v < n; v++) {
    refined[v] = v;
    const av = a[v];
    const bv = b[v];
    modA[v] = av;
    modB[v] = bv;
    modSize[v] = 1;
    const S = memb[v];
    let s: number;
    if (cutKnown) s = cut[v];
    else {
      s = 0;
      for (let e = ptr[v]; e < ptr[v + 1]; e++) if (memb[nbr[e]] === S) s += ew[e];
      cut[v] = s; // E({v}, S − {v})
    }
    const need = gamma * (av * (SB[S] - bv) + bv * (SA[S] - av));
    wellConnectedNode[v] = s >= need - 1e-12 * Math.abs(need) ? 1 : 0;
  }
  const scale = REFINEMENT_THETA * meanWeight;
  const order = shuffle(ws, n, rng);
  for (let i = 0; i < n; i++) {
    const v = order[i];
    const rv = refined[v];
    if (modSize[rv] !== 1 || !wellConnectedNode[v]) continue;
    const S = memb[v];
    const av = a[v];
    const bv = b[v];
    const stamp = nextStamp(ws);
    let nt = 0;
    const e1 = ptr[v + 1];
    for (let e = ptr[v]; e < e1; e++) {
      const u = nbr[e];
      if (memb[u] !== S) continue;
      const c = refined[u];
      if (c === rv) continue;
      if (mark[c] !== stamp) {
        mark[c] = stamp;
        nw[c] = 0;
        touched[nt++] = c;
      }
      nw[c] += ew[e];
    }
    if (nt === 0) continue;
    // Candidates: well-connected sub-modules with non-negative gain; staying alone has gain 0.
    let nc = 0;
    let maxGain = 0;
    // The best candidate (when its gain is positive) and the second-largest gain, for the shortcut below.
    let arg = -1;
    let second = -Infinity;
    for (let t = 0; t < nt; t++) {
      const c = touched[t];
      const need = gamma * (modA[c] * (SB[S] - modB[c]) + modB[c] * (SA[S] - modA[c]));
      if (cut[c] < need - 1e-12 * Math.abs(need)) continue;
      const gain = nw[c] - gamma * (av * modB[c] + bv * modA[c]);
      if (gain < 0) continue;
      cand[nc] = c;
      candW[nc++] = gain;
      if (gain > maxGain) {
        if (arg >= 0) second = maxGain;
        maxGain = gain;
        arg = c;
      } else if (gain > second) second = gain;
    }
    if (nc === 0) continue;
    const u = rng.next();
    let chosen: number;
    if (u !== 0 && arg >= 0 && -maxGain / scale <= -CLEAR_CHOICE && (second - maxGain) / scale <= -CLEAR_CHOICE) {
      // A clear choice: the weighted draw below would pick `arg` (see CLEAR_CHOICE), without its exponentials.
      chosen = arg;
    } else {
      const stay = Math.exp(-maxGain / scale); // staying alone
      let total = stay;
      for (let t = 0; t < nc; t++) {
        const d = candW[t] - maxGain;
        const w = d === 0 ? 1 : Math.exp(d / scale);
        candW[t] = w;
        total += w;
      }
      let r = u * total - stay;
      if (r < 0) continue; // stays a singleton
      chosen = cand[nc - 1];
      for (let t = 0; t < nc; t++) {
        r -= candW[t];
        if (r < 0) {
          chosen = cand[t];
          break;
        }
      }
    }
    // Merge v into `chosen`: the cut of the union is cut(C) + cut(v) − 2 E(v, C).
    cut[chosen] = cut[chosen] + cut[rv] - 2 * nw[chosen];
    modA[chosen] += av;
    modB[chosen] += bv;
    modSize[chosen]++;
    modSize[rv] = 0;
    refined[v] = chosen;
  }
  const k = renumber(refined, ws.map);
  return { refined, k };
}

/**
 * Collapses each module of `memb` (ids 0..k−1) into one node; inner weight goes to the self weight.
 * Writes into `out` when given (the optimizer's level buffers), else into new arrays.
 */
export function aggregateGraph(g: QualityGraph, memb: Int32Array, k: number, ws: Workspace, out?: LevelBuffers): QualityGraph {
  return aggregateInto(g, memb, k, ws, out ?? levelBuffers(k, g.ptr[g.n]));
}

/** aggregateGraph into `buf` (views of it are returned), in one form so the compiled code stays one. */
function aggregateInto(g: QualityGraph, memb: Int32Array, k: number, ws: Workspace, buf: LevelBuffers): QualityGraph {
  const { n, ptr, nbr, ew, self, a, b } = g;
  const { mark, nw, touched } = ws;
  const start = ws.start;
  start.fill(0, 0, k + 1);
  for (let v = 0; v < n; v++) start[memb[v] + 1]++;
  for (let c = 0; c < k; c++) start[c + 1] += start[c];
  const members = ws.members;
  const fill = ws.map; // fill pointers: a copy of the starts
  for (let c = 0; c < k; c++) fill[c] = start[c];
  for (let v = 0; v < n; v++) members[fill[memb[v]]++] = v;

  const nPtr = buf.ptr;
  const nNbr = buf.nbr;
  const nEw = buf.ew;
  const nSelf = buf.self;
  const nA = buf.a;
  const nB = buf.b;
  nPtr[0] = 0;
  let pos = 0;
  for (let c = 0; c < k; c++) {
    const stamp = nextStamp(ws);
    let nt = 0;
    let innerW = 0;
    let sw = 0;
    let sa = 0;
    let sb = 0;
    const i1 = start[c + 1];
    for (let i = start[c]; i < i1; i++) {
      const v = members[i];
      sw += self[v];
      sa += a[v];
      sb += b[v];
      const e1 = ptr[v + 1];
      for (let e = ptr[v]; e < e1; e++) {
        const d = memb[nbr[e]];
        if (d === c) {
          innerW += ew[e];
          continue;
        }
        if (mark[d] !== stamp) {
          mark[d] = stamp;
          nw[d] = 0;
          touched[nt++] = d;
        }
        nw[d] += ew[e];
      }
    }
    nA[c] = sa;
    nB[c] = sb;
    nSelf[c] = sw + innerW / 2;
    for (let t = 0; t < nt; t++) {
      const d = touched[t];
      nNbr[pos] = d;
      nEw[pos++] = nw[d];
    }
    nPtr[c + 1] = pos;
  }
  return {
    n: k,
    ptr: nPtr.subarray(0, k + 1),
    nbr: nNbr.subarray(0, pos),
    ew: nEw.subarray(0, pos),
    self: nSelf.subarray(0, k),
    a: nA.subarray(0, k),
    b: nB.subarray(0, k),
    alpha: g.alpha,
    gamma: g.gamma,
    totalW: g.totalW,
  };
}

interface PassOutcome {
  membership: Int32Array;
  /** Q of the membership. */
  q: number;
  /** The level cap was reached before local moving settled. */
  capped: boolean;
}

/**
 * One Leiden pass from `memb0` on graph g0; writes the membership of g0's nodes, renumbered, into `out`.
 */
function leidenPass(
  g0: QualityGraph,
  memb0: Int32Array,
  out: Int32Array,
  rng: Rng,
  ws: Workspace,
  eps: number,
  meanWeight: number,
  trace: LeidenTrace | undefined,
  pass: number,
): PassOutcome {
  const n0 = g0.n;
  let g = g0;
  let side = 0;
  let memb = ws.memb[side].subarray(0, n0);
  memb.set(memb0);
  const map = ws.toLevel;
  for (let i = 0; i < n0; i++) map[i] = i;
  if (!ws.levels || ws.levels[0].nbr.length < g0.ptr[n0] || ws.levels[0].a.length < n0) {
    ws.levels = [levelBuffers(n0, g0.ptr[n0]), levelBuffers(n0, g0.ptr[n0])];
  }
  let capped = true;
  let q = 0;
  for (let level = 0; level < LEVEL_CAP; level++) {
    const t0 = trace ? performance.now() : 0;
    const visits = moveNodesFast(g, memb, rng, ws, eps);
    const k = renumber(memb, ws.map);
    const t1 = trace ? performance.now() : 0;
    if (k === g.n) {
      if (trace) trace.levels.push(levelTrace(pass, level, g, k, visits, null, t1 - t0, 0, 0));
      capped = false;
      // Every node of this level is a module of its own: Q is (1) over the nodes, without a sweep of g0.
      let inner = 0;
      let nullTerm = 0;
      for (let v = 0; v < g.n; v++) {
        inner += g.self[v];
        nullTerm += g.a[v] * g.b[v];
      }
      q = g.alpha * (inner - g.gamma * nullTerm);
      break;
    }
    let { refined, k: kr } = refinePartition(g, memb, rng, ws, meanWeight, true);
    if (kr === g.n) {
      // Refinement merged nothing: aggregate on the unrefined partition (each aggregate node its own module).
      refined = memb;
      kr = k;
    }
    const t2 = trace ? performance.now() : 0;
    const agg = aggregateInto(g, refined, kr, ws, ws.levels[level & 1]);
    const next = ws.memb[1 - side].subarray(0, kr);
    for (let v = 0; v < g.n; v++) next[refined[v]] = memb[v];
    for (let i = 0; i < n0; i++) map[i] = refined[map[i]];
    if (trace) trace.levels.push(levelTrace(pass, level, g, k, visits, kr, t1 - t0, t2 - t1, performance.now() - t2));
    g = agg;
    side = 1 - side;
    memb = next;
  }
  for (let i = 0; i < n0; i++) out[i] = memb[map[i]];
  renumber(out, ws.map);
  if (capped) q = graphQuality(g0, out);
  return { membership: out, q, capped };
}

function levelTrace(
  pass: number,
  level: number,
  g: QualityGraph,
  modules: number,
  visits: number,
  refined: number | null,
  moveMs: number,
  refineMs: number,
  aggregateMs: number,
): LevelTrace {
  return { pass, level, nodes: g.n, links: g.ptr[g.n] / 2, modules, visits, refined, moveMs, refineMs, aggregateMs };
}

export interface LeidenResult {
  membership: Int32Array;
  Q: number;
  passes: number;
  /** True when the last pass raised Q no further (false only if a safety cap was reached). */
  converged: boolean;
  /** Which safety cap stopped the run, if any. */
  capped?: "passes" | "levels";
}

export interface LeidenOptions {
  /** Start partition (default: singletons). */
  initial?: Int32Array;
  /** Scratch space of createWorkspace(g.n), reused across runs on graphs of at most that size. */
  workspace?: Workspace;
  trace?: LeidenTrace;
}

/**
 * Q of the partition into singletons, as graphQuality computes it (same sums in the same order: no link
 * lies inside a singleton, and each module's totals are its node's a and b), without a sweep of the links.
 */
function singletonQuality(g: QualityGraph): number {
  const { n, self, a, b } = g;
  let inner = 0;
  for (let v = 0; v < n; v++) inner += self[v];
  let nullTerm = 0;
  for (let v = 0; v < n; v++) nullTerm += a[v] * b[v];
  return g.alpha * (inner - g.gamma * nullTerm);
}

/** Mean weight of a stored undirected link (E entries), the unit of the refinement randomness. */
function meanLinkWeight(g: QualityGraph): number {
  const m = g.ptr[g.n];
  if (m === 0) return 1;
  let s = 0;
  for (let e = 0; e < m; e++) s += g.ew[e];
  return s / m;
}

/**
 * Runs Leiden passes from `initial` (default: singletons) until a pass no longer raises Q.
 * Q never decreases: local moving only accepts gains and aggregation preserves Q.
 */
export function leiden(g: QualityGraph, rng: Rng, options: LeidenOptions = {}): LeidenResult {
  const ws = options.workspace && options.workspace.n >= g.n ? options.workspace : createWorkspace(g.n);
  const trace = options.trace;
  const eps = 1e-13 * Math.max(g.totalW, 1e-300);
  const meanW = meanLinkWeight(g);
  let memb: Int32Array;
  let q: number;
  if (options.initial) {
    memb = options.initial.slice();
    renumber(memb, ws.map);
    q = graphQuality(g, memb);
  } else {
    memb = new Int32Array(g.n);
    for (let i = 0; i < g.n; i++) memb[i] = i;
    q = singletonQuality(g);
  }
  // The pass writes into `spare`; an accepted pass swaps the two (no array per pass).
  let spare: Int32Array = new Int32Array(g.n);
  let passes = 0;
  let converged = false;
  let capped: LeidenResult["capped"];
  while (passes < PASS_CAP) {
    const pass = leidenPass(g, memb, spare, rng, ws, eps, meanW, trace, passes);
    passes++;
    const next = pass.membership;
    const qn = pass.q;
    trace?.passQ.push(qn);
    if (pass.capped) capped = "levels";
    if (qn > q + 1e-12 * Math.max(1, Math.abs(q))) {
      spare = memb;
      memb = next;
      q = qn;
    } else {
      if (qn >= q) memb = next;
      converged = !pass.capped;
      break;
    }
  }
  if (!converged && !capped) capped = "passes";
  const out: LeidenResult = { membership: memb, Q: graphQuality(g, memb), passes, converged };
  if (capped) out.capped = capped;
  return out;
}

export { createWorkspace, type Workspace };
