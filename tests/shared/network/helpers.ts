/** Test helpers: small networks from edge lists or matrices, random graphs, and dense reference formulas. */
import { networkFromTriples } from "@shared/network/graph";
import type { Network } from "@shared/network/types";
import type { Rng } from "@shared/network/random";
import type { Objective } from "@shared/network/modularity/quality";

export function labels(n: number, prefix = "n"): string[] {
  return Array.from({ length: n }, (_, i) => `${prefix}${i}`);
}

/** One-mode network from [i, j, w?] links (undirected links listed once). */
export function oneMode(n: number, edges: Array<[number, number, number?]>, directed = false): Network {
  const r: number[] = [];
  const c: number[] = [];
  const w: number[] = [];
  for (const [i, j, wt = 1] of edges) {
    r.push(i); c.push(j); w.push(wt);
    if (!directed && i !== j) { r.push(j); c.push(i); w.push(wt); }
  }
  const names = labels(n);
  return networkFromTriples({ kind: "unipartite", directed, rowLabels: names, colLabels: names }, r, c, w);
}

/** Bipartite network from a dense matrix (rows × cols). */
export function bipartite(matrix: number[][]): Network {
  const I = matrix.length;
  const J = I > 0 ? matrix[0].length : 0;
  const r: number[] = [];
  const c: number[] = [];
  const w: number[] = [];
  matrix.forEach((row, i) => row.forEach((v, j) => { if (v !== 0) { r.push(i); c.push(j); w.push(v); } }));
  return networkFromTriples({ kind: "bipartite", directed: false, rowLabels: labels(I, "r"), colLabels: labels(J, "c") }, r, c, w);
}

export function randomMatrix(rng: Rng, I: number, J: number, p: number, weighted: boolean): number[][] {
  return Array.from({ length: I }, () => Array.from({ length: J }, () => (rng.next() < p ? (weighted ? 1 + rng.nextInt(5) : 1) : 0)));
}

export function randomOneMode(rng: Rng, n: number, p: number, directed: boolean, weighted: boolean, loops = false): Network {
  const edges: Array<[number, number, number]> = [];
  for (let i = 0; i < n; i++) {
    for (let j = directed ? 0 : i; j < n; j++) {
      if (i === j && !loops) continue;
      if (rng.next() < p) edges.push([i, j, weighted ? 0.5 + rng.nextInt(7) : 1]);
    }
  }
  return oneMode(n, edges, directed);
}

export function randomPartition(rng: Rng, n: number, k: number): Int32Array {
  const p = new Int32Array(n);
  const kk = Math.max(1, Math.min(k, n));
  for (let v = 0; v < n; v++) p[v] = rng.nextInt(kk);
  return p;
}

/** Dense matrix of the stored cells (rows × cols). */
export function dense(net: Network, binary = false): number[][] {
  const I = net.rowLabels.length;
  const J = net.kind === "bipartite" ? net.colLabels.length : I;
  const A = Array.from({ length: I }, () => new Array<number>(J).fill(0));
  for (let i = 0; i < I; i++) for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) A[i][net.colIdx[p]] = binary ? 1 : net.weights[p];
  return A;
}

/**
 * Dense O(N²) evaluation of each objective straight from its published double-sum definition
 * (Newman & Girvan 2004; Leicht & Newman 2008; Barber 2007), independent of the sparse kernels.
 */
export function denseModularity(net: Network, part: ArrayLike<number>, objective: Objective, binary = false): number {
  const A = dense(net, binary);
  const I = net.rowLabels.length;
  const bip = net.kind === "bipartite";
  const J = bip ? net.colLabels.length : I;
  if (objective === "barber") {
    const k = A.map((row) => row.reduce((s, x) => s + x, 0));
    const d = Array.from({ length: J }, (_, j) => A.reduce((s, row) => s + row[j], 0));
    const m = k.reduce((s, x) => s + x, 0);
    let q = 0;
    for (let i = 0; i < I; i++) for (let j = 0; j < J; j++) if (part[i] === part[I + j]) q += A[i][j] - (k[i] * d[j]) / m;
    return q / m;
  }
  // Square N × N directed matrix D over all nodes.
  const N = bip ? I + J : I;
  const D = Array.from({ length: N }, () => new Array<number>(N).fill(0));
  for (let i = 0; i < I; i++) for (let j = 0; j < J; j++) D[i][bip ? I + j : j] = A[i][j];
  if (objective === "newman-directed") {
    const kout = D.map((row) => row.reduce((s, x) => s + x, 0));
    const kin = Array.from({ length: N }, (_, j) => D.reduce((s, row) => s + row[j], 0));
    const m = kout.reduce((s, x) => s + x, 0);
    let q = 0;
    for (let i = 0; i < N; i++) for (let j = 0; j < N; j++) if (part[i] === part[j]) q += D[i][j] - (kout[i] * kin[j]) / m;
    return q / m;
  }
  // Newman: symmetric B. Undirected one-mode: B = A with loops doubled; otherwise B = D + Dᵀ.
  const B = Array.from({ length: N }, (_, i) => Array.from({ length: N }, (_, j) => {
    if (!bip && !net.directed) return i === j ? 2 * D[i][i] : D[i][j];
    return D[i][j] + D[j][i];
  }));
  const k = B.map((row) => row.reduce((s, x) => s + x, 0));
  const twoM = k.reduce((s, x) => s + x, 0);
  let q = 0;
  for (let i = 0; i < N; i++) for (let j = 0; j < N; j++) if (part[i] === part[j]) q += B[i][j] - (k[i] * k[j]) / twoM;
  return q / twoM;
}
