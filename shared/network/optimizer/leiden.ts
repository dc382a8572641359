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
 * the level count stays finite. Whole passes repeat from the previous result until Q stops rising.
 *
 * Determinism: all randomness comes from the injected generator; ties keep the current module or the
 * first candidate in CSR order; sums run in a fixed order. Math.exp is used only to weigh the random
 * choice in refinement, where a last-bit difference between JavaScript engines could change the outcome
 * only if a uniform draw fell within ~1e-16 of a boundary.
 */
import type { Rng } from "../random";
import { graphQuality, renumber, type QualityGraph } from "./quality-graph";

/** Randomness of the refinement step (θ of the paper; 0.01 is the authors' default). */
export const REFINEMENT_THETA = 0.01;
/**
 * Cap on whole passes per run. A pass starts from the previous pass's partition and can only raise Q;
 * a run stops at the first pass that does not. Structured networks settle within a few passes; on random
 * graphs (e.g. null replicates) each pass still adds a little (20,000-node random graph: Q 0.260 after
 * one pass — the same as a Louvain run —, 0.306 after 10, 0.309 after 20, 0.312 after 50), at ~65 ms a
 * pass there, so 20 passes bound the cost of a restart.
 */
export const MAX_PASSES = 20;

/** Scratch arrays sized for the largest level (the input graph); reused across levels and passes. */
interface Workspace {
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
}

function createWorkspace(n: number): Workspace {
  return {
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
 * in place. Returns true when any node moved.
 */
export function moveNodesFast(g: QualityGraph, memb: Int32Array, rng: Rng, ws: Workspace, eps: number): boolean {
  const { n, ptr, nbr, ew, a, b, gamma } = g;
  const { modA, modB, modSize, empty, queue, inQueue, nw, mark, touched } = ws;
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
  let moved = false;

  while (count > 0) {
    const v = queue[head];
    head = head + 1 === n ? 0 : head + 1;
    count--;
    inQueue[v] = 0;

    const cur = memb[v];
    const av = a[v];
    const bv = b[v];
    const stamp = nextStamp(ws);
    let nt = 0;
    mark[cur] = stamp;
    nw[cur] = 0;
    touched[nt++] = cur;
    for (let e = ptr[v]; e < ptr[v + 1]; e++) {
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
      if (c === cur) continue;
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
    if (best !== cur) {
      memb[v] = best;
      moved = true;
      if (modSize[cur] === 0) empty[nEmpty++] = cur;
      for (let e = ptr[v]; e < ptr[v + 1]; e++) {
        const u = nbr[e];
        if (!inQueue[u] && memb[u] !== best) {
          inQueue[u] = 1;
          let tail = head + count;
          if (tail >= n) tail -= n;
          queue[tail] = u;
          count++;
        }
      }
    }
  }
  return moved;
}

/**
 * Refinement (Algorithm A.2, RefinePartition / MergeNodesSubset). Returns the refined membership
 * (renumbered 0..K−1) and K.
 */
export function refinePartition(
  g: QualityGraph,
  memb: Int32Array,
  rng: Rng,
  ws: Workspace,
  meanWeight: number,
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
  const refined = new Int32Array(n);
  for (let v = 0; v < n; v++) {
    refined[v] = v;
    modA[v] = a[v];
    modB[v] = b[v];
    modSize[v] = 1;
    let s = 0;
    const c = memb[v];
    for (let e = ptr[v]; e < ptr[v + 1]; e++) if (memb[nbr[e]] === c) s += ew[e];
    cut[v] = s; // E({v}, S − {v})
  }
  const wellConnectedNode = new Uint8Array(n);
  for (let v = 0; v < n; v++) {
    const S = memb[v];
    const need = gamma * (a[v] * (SB[S] - b[v]) + b[v] * (SA[S] - a[v]));
    wellConnectedNode[v] = cut[v] >= need - 1e-12 * Math.abs(need) ? 1 : 0;
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
    for (let e = ptr[v]; e < ptr[v + 1]; e++) {
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
    for (let t = 0; t < nt; t++) {
      const c = touched[t];
      const need = gamma * (modA[c] * (SB[S] - modB[c]) + modB[c] * (SA[S] - modA[c]));
      if (cut[c] < need - 1e-12 * Math.abs(need)) continue;
      const gain = nw[c] - gamma * (av * modB[c] + bv * modA[c]);
      if (gain < 0) continue;
      cand[nc] = c;
      candW[nc++] = gain;
      if (gain > maxGain) maxGain = gain;
    }
    if (nc === 0) continue;
    let total = Math.exp(-maxGain / scale); // staying alone
    for (let t = 0; t < nc; t++) {
      const w = Math.exp((candW[t] - maxGain) / scale);
      candW[t] = w;
      total += w;
    }
    let r = rng.next() * total - Math.exp(-maxGain / scale);
    if (r < 0) continue; // stays a singleton
    let chosen = cand[nc - 1];
    for (let t = 0; t < nc; t++) {
      r -= candW[t];
      if (r < 0) {
        chosen = cand[t];
        break;
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

/** Collapses each module of `memb` (ids 0..k−1) into one node; inner weight goes to the self weight. */
export function aggregateGraph(g: QualityGraph, memb: Int32Array, k: number, ws: Workspace): QualityGraph {
  const { n, ptr, nbr, ew, self, a, b } = g;
  const { mark, nw, touched } = ws;
  const start = new Int32Array(k + 1);
  for (let v = 0; v < n; v++) start[memb[v] + 1]++;
  for (let c = 0; c < k; c++) start[c + 1] += start[c];
  const members = new Int32Array(n);
  const fill = start.slice(0, k);
  for (let v = 0; v < n; v++) members[fill[memb[v]]++] = v;

  const nPtr = new Int32Array(k + 1);
  const nNbr = new Int32Array(ptr[n]);
  const nEw = new Float64Array(ptr[n]);
  const nSelf = new Float64Array(k);
  const nA = new Float64Array(k);
  const nB = new Float64Array(k);
  let pos = 0;
  for (let c = 0; c < k; c++) {
    const stamp = nextStamp(ws);
    let nt = 0;
    let innerW = 0;
    let sw = 0;
    for (let i = start[c]; i < start[c + 1]; i++) {
      const v = members[i];
      sw += self[v];
      nA[c] += a[v];
      nB[c] += b[v];
      for (let e = ptr[v]; e < ptr[v + 1]; e++) {
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
    nSelf[c] = sw + innerW / 2;
    for (let t = 0; t < nt; t++) {
      nNbr[pos] = touched[t];
      nEw[pos++] = nw[touched[t]];
    }
    nPtr[c + 1] = pos;
  }
  return {
    n: k,
    ptr: nPtr,
    nbr: nNbr.slice(0, pos),
    ew: nEw.slice(0, pos),
    self: nSelf,
    a: nA,
    b: nB,
    alpha: g.alpha,
    gamma: g.gamma,
    totalW: g.totalW,
  };
}

/**
 * One Leiden pass from `initial` (or singletons) on graph g0; returns the membership of g0's nodes,
 * renumbered.
 */
function leidenPass(g0: QualityGraph, memb0: Int32Array, rng: Rng, ws: Workspace, eps: number, meanWeight: number): Int32Array {
  let g = g0;
  let memb = memb0.slice();
  const map = new Int32Array(g0.n);
  for (let i = 0; i < g0.n; i++) map[i] = i;
  for (let level = 0; level < 1000; level++) {
    moveNodesFast(g, memb, rng, ws, eps);
    const k = renumber(memb, ws.map);
    if (k === g.n) break;
    let { refined, k: kr } = refinePartition(g, memb, rng, ws, meanWeight);
    if (kr === g.n) {
      // Refinement merged nothing: aggregate on the unrefined partition (each aggregate node its own module).
      refined = memb;
      kr = k;
    }
    const agg = aggregateGraph(g, refined, kr, ws);
    const next = new Int32Array(kr);
    for (let v = 0; v < g.n; v++) next[refined[v]] = memb[v];
    for (let i = 0; i < g0.n; i++) map[i] = refined[map[i]];
    g = agg;
    memb = next;
  }
  const out = new Int32Array(g0.n);
  for (let i = 0; i < g0.n; i++) out[i] = memb[map[i]];
  renumber(out, ws.map);
  return out;
}

export interface LeidenResult {
  membership: Int32Array;
  Q: number;
  passes: number;
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
export function leiden(g: QualityGraph, rng: Rng, initial?: Int32Array, workspace?: Workspace): LeidenResult {
  const ws = workspace ?? createWorkspace(g.n);
  const eps = 1e-13 * Math.max(g.totalW, 1e-300);
  const meanW = meanLinkWeight(g);
  let memb: Int32Array;
  if (initial) {
    memb = initial.slice();
    renumber(memb, ws.map);
  } else {
    memb = new Int32Array(g.n);
    for (let i = 0; i < g.n; i++) memb[i] = i;
  }
  let q = graphQuality(g, memb);
  let passes = 0;
  for (; passes < MAX_PASSES; ) {
    const next = leidenPass(g, memb, rng, ws, eps, meanW);
    passes++;
    const qn = graphQuality(g, next);
    if (qn > q + 1e-12 * Math.max(1, Math.abs(q))) {
      memb = next;
      q = qn;
    } else {
      if (qn >= q) memb = next;
      break;
    }
  }
  return { membership: memb, Q: graphQuality(g, memb), passes };
}

export { createWorkspace, type Workspace };
