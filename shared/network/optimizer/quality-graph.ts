/**
 * The working graph of the modularity optimizer: one form for every objective, so that local moving,
 * refinement, aggregation and annealing are written once.
 *
 * Every objective the engine optimizes can be written as a sum over modules c of
 *
 *     Q = α · Σ_c W_c  −  α·γ · Σ_c A_c · B_c                                            (1)
 *
 * where W_c is the link weight inside c counted over ordered node pairs (i, j) (self-loops once) and
 * A_c = Σ_{i∈c} a_i, B_c = Σ_{i∈c} b_i are module totals of two per-node "null-model masses":
 *
 * | objective                 | nodes          | W_ij (ordered pairs)                 | a_i             | b_i             | α = γ |
 * |---------------------------|----------------|--------------------------------------|-----------------|-----------------|-------|
 * | newman, undirected        | S              | A_ij, both ways; a loop A_ii = 2w    | k_i             | k_i             | 1/2m  |
 * | newman, directed/bipartite| S or I + J     | B = A + Aᵀ (direction ignored)       | k_i of B        | k_i of B        | 1/2m  |
 * | newman-directed           | S (or I + J)   | A_ij (i → j), a loop once            | k_i^out         | k_i^in          | 1/m   |
 * | barber                    | I + J          | A_ij from row i to column j          | k_i (rows), 0   | 0, d_j (columns)| 1/m   |
 *
 * (Conventions as in ../modularity/quality.ts, which evaluates the same objectives on a given partition.)
 * Newman & Girvan 2004 (doi:10.1103/PhysRevE.69.026113; weighted: Newman 2004, doi:10.1103/PhysRevE.70.056131):
 *   Q = (1/2m) Σ_ij [A_ij − k_i k_j/2m] δ(c_i, c_j).
 * Leicht & Newman 2008 (doi:10.1103/PhysRevLett.100.118703): Q_d = (1/m) Σ_ij [A_ij − k_i^out k_j^in/m] δ(c_i, c_j).
 * Barber 2007 (doi:10.1103/PhysRevE.76.066102): Q_B = (1/m) Σ_i Σ_j [A_ij − k_i d_j/m] δ(g_i, h_j), rows i,
 *   columns j; the weighted form uses interaction totals (Dormann & Strauss 2014, doi:10.1111/2041-210X.12139).
 *
 * Only the symmetrised weight matters for moves, so the graph stores E_ij = W_ij + W_ji (i ≠ j) as an
 * undirected CSR graph plus a separate self weight s_i = W_ii. The gain, in link-weight units, of moving a
 * node v (already taken out of its module) into module c is
 *
 *     g(v, c) = E(v, c) − γ · (a_v · B_c + b_v · A_c)                                     (2)
 *
 * with E(v, c) the weight between v and c; ΔQ = α · g. For Barber a row node carries only a and a column
 * node only b, so (2) is E(v,c) − (k_v · D_c)/m for a row and E(v,c) − (d_v · K_c)/m for a column: exactly
 * the change of Σ_s [L_s/m − K_s D_s/m²] times m. Aggregating a module into one node sums a, b and E and
 * puts the module's inner weight into the self weight, which leaves (1) unchanged.
 */
import { NetworkEngineError } from "../errors";
import type { Objective } from "../modularity/quality";
import type { Network } from "../types";

export type OptimizerObjective = Objective;

export interface QualityGraph {
  /** Number of nodes at this level. */
  n: number;
  /** CSR of the symmetrised weights E (no diagonal). */
  ptr: Int32Array;
  nbr: Int32Array;
  ew: Float64Array;
  /** Self weight W_ii (ordered pairs inside an aggregated node). */
  self: Float64Array;
  a: Float64Array;
  b: Float64Array;
  /** Q = alpha · (Σ W_c − gamma · Σ A_c B_c). */
  alpha: number;
  gamma: number;
  /** Total of all W (ordered pairs) = Σ self + ½ Σ E; used for tolerances. */
  totalW: number;
}

/** Barber's Q_B needs two node kinds; throws NetworkEngineError("objective-mismatch") otherwise. */
export function checkObjective(net: Network, objective: OptimizerObjective): void {
  if (objective !== "newman" && objective !== "newman-directed" && objective !== "barber") {
    throw new NetworkEngineError("bad-option", `Unknown objective ${String(objective)}`);
  }
  if (objective === "barber" && net.kind !== "bipartite") {
    throw new NetworkEngineError(
      "objective-mismatch",
      "Barber's bipartite modularity needs a bipartite network (rows and columns are different node kinds)",
    );
  }
}

function nodeCount(net: Network): number {
  return net.kind === "bipartite" ? net.rowLabels.length + net.colLabels.length : net.rowLabels.length;
}

/** Builds the working graph of `objective` for `net` (table in the file header). */
export function buildQualityGraph(net: Network, objective: OptimizerObjective): QualityGraph {
  checkObjective(net, objective);
  const R = net.rowLabels.length;
  const n = nodeCount(net);
  const { rowPtr, colIdx, weights } = net;
  const a = new Float64Array(n);
  const b = new Float64Array(n);
  const self = new Float64Array(n);
  const bip = net.kind === "bipartite";
  // Undirected one-mode networks store every link both ways (a self-loop once): each stored
  // off-diagonal cell then becomes one CSR entry at its row node, and the reverse cell gives the other.
  const oneEnd = objective === "newman" && net.kind === "unipartite" && !net.directed;
  const deg = new Int32Array(n);
  for (let i = 0; i < R; i++) {
    for (let e = rowPtr[i]; e < rowPtr[i + 1]; e++) {
      const j = bip ? R + colIdx[e] : colIdx[e];
      if (j === i) continue;
      deg[i]++;
      if (!oneEnd) deg[j]++;
    }
  }
  const ptr = new Int32Array(n + 1);
  for (let v = 0; v < n; v++) ptr[v + 1] = ptr[v] + deg[v];
  const nbr = new Int32Array(ptr[n]);
  const ew = new Float64Array(ptr[n]);
  const fill = ptr.slice(0, n);
  const link = (i: number, j: number, w: number) => {
    nbr[fill[i]] = j;
    ew[fill[i]++] = w;
    if (!oneEnd) {
      nbr[fill[j]] = i;
      ew[fill[j]++] = w;
    }
  };
  // M: the normaliser (m for Q_d and Q_B, 2m for Newman's Q) — see the table in the file header.
  let M = 0;
  for (let i = 0; i < R; i++) {
    for (let e = rowPtr[i]; e < rowPtr[i + 1]; e++) {
      const j = bip ? R + colIdx[e] : colIdx[e];
      const w = weights[e];
      if (objective === "barber" || objective === "newman-directed") {
        // W = A as stored (rows → columns, or i → j); a = out-strength, b = in-strength.
        M += w;
        a[i] += w;
        b[j] += w;
        if (j === i) self[i] += w;
        else link(i, j, w);
      } else if (oneEnd) {
        // Newman, symmetric storage: A_ii = 2w for a loop (the usual convention), E_ij = 2 A_ij.
        const aw = j === i ? 2 * w : w;
        M += aw;
        a[i] += aw;
        b[i] += aw;
        if (j === i) self[i] += aw;
        else link(i, j, 2 * w);
      } else {
        // Newman on A + Aᵀ (a directed one-mode or a bipartite network seen as one-mode): each stored
        // cell is one undirected link; a loop is A_ii = 2w.
        M += 2 * w;
        a[i] += w;
        b[i] += w;
        a[j] += w;
        b[j] += w;
        if (j === i) self[i] += 2 * w;
        else link(i, j, 2 * w);
      }
    }
  }
  const alpha = 1 / M;
  const gamma = 1 / M;
  let totalW = 0;
  for (let v = 0; v < n; v++) totalW += self[v];
  for (let e = 0; e < ptr[n]; e++) totalW += ew[e] / 2;
  return { n, ptr, nbr, ew, self, a, b, alpha, gamma, totalW };
}

/** Q of a membership vector on the working graph, by formula (1). Summation order is fixed (node order). */
export function graphQuality(g: QualityGraph, memb: Int32Array): number {
  const { n, ptr, nbr, ew, self, a, b } = g;
  let inner = 0;
  let k = 0;
  for (let v = 0; v < n; v++) {
    if (memb[v] + 1 > k) k = memb[v] + 1;
    inner += self[v];
    const c = memb[v];
    let s = 0;
    for (let e = ptr[v]; e < ptr[v + 1]; e++) if (memb[nbr[e]] === c) s += ew[e];
    inner += s / 2;
  }
  const A = new Float64Array(k);
  const B = new Float64Array(k);
  for (let v = 0; v < n; v++) {
    A[memb[v]] += a[v];
    B[memb[v]] += b[v];
  }
  let nullTerm = 0;
  for (let c = 0; c < k; c++) nullTerm += A[c] * B[c];
  return g.alpha * (inner - g.gamma * nullTerm);
}

/**
 * Renumbers module ids to 0..K−1 in order of first appearance (node order). Returns K. This canonical
 * numbering makes "the same partition" mean "the same array".
 */
export function renumber(memb: Int32Array, scratch?: Int32Array): number {
  const n = memb.length;
  let max = 0;
  for (let v = 0; v < n; v++) if (memb[v] > max) max = memb[v];
  const map = scratch && scratch.length > max ? scratch : new Int32Array(max + 1);
  map.fill(-1, 0, max + 1);
  let k = 0;
  for (let v = 0; v < n; v++) {
    const c = memb[v];
    if (map[c] < 0) map[c] = k++;
    memb[v] = map[c];
  }
  return k;
}

/**
 * Splits every module into the connected components of the sub-graph it induces. This never lowers Q
 * for the objectives here: two parts with no link between them lose no inner weight and the null term
 * drops by γ(A_1 B_2 + A_2 B_1) ≥ 0. Returns the number of modules after splitting (ids renumbered).
 */
export function splitDisconnected(g: QualityGraph, memb: Int32Array): number {
  const { n, ptr, nbr } = g;
  const comp = new Int32Array(n).fill(-1);
  const stack = new Int32Array(n);
  let k = 0;
  for (let s = 0; s < n; s++) {
    if (comp[s] >= 0) continue;
    const c = memb[s];
    comp[s] = k;
    let top = 0;
    stack[top++] = s;
    while (top > 0) {
      const v = stack[--top];
      for (let e = ptr[v]; e < ptr[v + 1]; e++) {
        const u = nbr[e];
        if (comp[u] < 0 && memb[u] === c) {
          comp[u] = k;
          stack[top++] = u;
        }
      }
    }
    k++;
  }
  memb.set(comp);
  return k;
}
