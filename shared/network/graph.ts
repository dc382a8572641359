/**
 * Small helpers over the canonical CSR `Network` (see types.ts) shared by every engine module:
 * node counts, degrees and strengths, a binary copy, partition checks and a structural validator.
 * Pure TypeScript, no Node, DOM or database imports.
 */
import { NetworkEngineError } from "./errors";
import type { Network, Partition } from "./types";

/** Number of nodes: I + J for bipartite networks (rows first, then columns), S for one-mode networks. */
export function nodeCount(net: Network): number {
  return net.kind === "bipartite" ? net.rowLabels.length + net.colLabels.length : net.rowLabels.length;
}

/** Label of node `v` in the engine's node numbering (bipartite: rows 0..I-1, then columns I..I+J-1). */
export function nodeLabel(net: Network, v: number): string {
  const I = net.rowLabels.length;
  return net.kind === "bipartite" && v >= I ? net.colLabels[v - I] : net.rowLabels[v];
}

/** Number of stored non-zero cells (an undirected link i–j, i ≠ j, is stored twice; a self-loop once). */
export function storedCells(net: Network): number {
  return net.rowPtr[net.rowLabels.length];
}

/** Sum of stored weights per row (out-strength) and per column (in-strength). */
export function marginalTotals(net: Network, binary = false): { rows: Float64Array; cols: Float64Array } {
  const I = net.rowLabels.length;
  const J = net.kind === "bipartite" ? net.colLabels.length : I;
  const rows = new Float64Array(I);
  const cols = new Float64Array(J);
  const { rowPtr, colIdx, weights } = net;
  for (let i = 0; i < I; i++) {
    let s = 0;
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const w = binary ? 1 : weights[p];
      s += w;
      cols[colIdx[p]] += w;
    }
    rows[i] = s;
  }
  return { rows, cols };
}

/** A copy of the network with every non-zero cell set to 1 (`weighted: false`). Shares labels and indices. */
export function binarize(net: Network): Network {
  if (!net.weighted) return net;
  return { ...net, weighted: false, weights: new Float64Array(net.colIdx.length).fill(1) };
}

/** True when the network has no non-zero cell. */
export function isEdgeless(net: Network): boolean {
  return storedCells(net) === 0;
}

/**
 * Checks that `partition` has one integer module number in [0, n) per node and returns the number of
 * module slots (max + 1). Module numbers need not be consecutive here; empty slots contribute nothing.
 */
export function checkPartition(net: Network, partition: Partition | ArrayLike<number>): number {
  const n = nodeCount(net);
  if (partition.length !== n) {
    throw new NetworkEngineError(
      "bad-partition",
      `Partition has ${partition.length} entries but the network has ${n} nodes` +
        (net.kind === "bipartite" ? ` (${net.rowLabels.length} rows, then ${net.colLabels.length} columns)` : ""),
    );
  }
  let max = -1;
  for (let v = 0; v < n; v++) {
    const c = partition[v];
    if (!Number.isInteger(c) || c < 0 || c >= Math.max(n, 1)) {
      throw new NetworkEngineError(
        "bad-partition",
        `Module number ${c} of node ${v} (${nodeLabel(net, v)}) is not an integer in [0, ${n})`,
      );
    }
    if (c > max) max = c;
  }
  return max + 1;
}

/**
 * Validates the CSR invariants of types.ts: array lengths, strictly increasing column indices within a
 * row, indices in range, finite positive weights, `weighted` flag consistent, undirected one-mode
 * networks symmetric. Throws `NetworkEngineError("bad-network")` naming the first violation.
 */
export function validateNetwork(net: Network): void {
  const bad = (msg: string): never => {
    throw new NetworkEngineError("bad-network", msg);
  };
  if (net.kind !== "bipartite" && net.kind !== "unipartite") bad(`Unknown kind ${String(net.kind)}`);
  if (net.kind === "bipartite" && net.directed) bad("A bipartite network cannot be directed");
  const I = net.rowLabels.length;
  const J = net.kind === "bipartite" ? net.colLabels.length : I;
  if (net.kind === "unipartite" && net.colLabels.length !== I) bad("One-mode network: colLabels must equal rowLabels");
  const { rowPtr, colIdx, weights } = net;
  if (rowPtr.length !== I + 1) bad(`rowPtr has length ${rowPtr.length}, expected ${I + 1}`);
  if (rowPtr[0] !== 0) bad("rowPtr[0] must be 0");
  const nnz = rowPtr[I];
  if (colIdx.length !== nnz || weights.length !== nnz) bad(`colIdx/weights must have length rowPtr[I] = ${nnz}`);
  let anyNonUnit = false;
  for (let i = 0; i < I; i++) {
    if (rowPtr[i + 1] < rowPtr[i]) bad(`rowPtr decreases at row ${i}`);
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const j = colIdx[p];
      if (j >= J) bad(`Column index ${j} out of range in row ${i}`);
      if (p > rowPtr[i] && colIdx[p - 1] >= j) bad(`Column indices not strictly increasing in row ${i}`);
      const w = weights[p];
      if (!(w > 0) || !Number.isFinite(w)) bad(`Weight ${w} in row ${i}, column ${j} is not a finite positive number`);
      if (w !== 1) anyNonUnit = true;
    }
  }
  if (anyNonUnit !== net.weighted) bad(`weighted flag is ${net.weighted} but ${anyNonUnit ? "some" : "no"} weight differs from 1`);
  if (net.kind === "unipartite" && !net.directed) {
    for (let i = 0; i < I; i++) {
      for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
        const j = colIdx[p];
        if (findCell(net, j, i) !== weights[p]) bad(`Undirected network is not symmetric at (${i}, ${j})`);
      }
    }
  }
}

/** Weight of cell (i, j), 0 when absent (binary search within the row). */
export function findCell(net: Network, i: number, j: number): number {
  let lo = net.rowPtr[i];
  let hi = net.rowPtr[i + 1] - 1;
  const idx = net.colIdx;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    const c = idx[mid];
    if (c === j) return net.weights[mid];
    if (c < j) lo = mid + 1;
    else hi = mid - 1;
  }
  return 0;
}

/**
 * Builds a canonical Network from row-major triples. Cells are sorted per row; repeated (i, j) cells
 * are summed; zero weights are dropped. For undirected one-mode networks the caller passes both
 * directions of every link (self-loops once).
 */
export function networkFromTriples(
  shape: { kind: Network["kind"]; directed: boolean; rowLabels: string[]; colLabels: string[] },
  rowsOf: ArrayLike<number>,
  colsOf: ArrayLike<number>,
  weightsOf: ArrayLike<number> | null,
  count = rowsOf.length,
): Network {
  const I = shape.rowLabels.length;
  const counts = new Uint32Array(I + 1);
  for (let e = 0; e < count; e++) counts[rowsOf[e] + 1]++;
  for (let i = 0; i < I; i++) counts[i + 1] += counts[i];
  const pos = counts.slice(0, I);
  const tmpCol = new Uint32Array(count);
  const tmpW = new Float64Array(count);
  for (let e = 0; e < count; e++) {
    const p = pos[rowsOf[e]]++;
    tmpCol[p] = colsOf[e];
    tmpW[p] = weightsOf ? weightsOf[e] : 1;
  }
  // Sort each row by column (insertion sort for short rows, index sort otherwise), merge duplicates.
  const rowPtr = new Uint32Array(I + 1);
  let out = 0;
  let order = new Uint32Array(0);
  for (let i = 0; i < I; i++) {
    const a = counts[i];
    const b = counts[i + 1];
    const len = b - a;
    if (len > order.length) order = new Uint32Array(Math.max(len, order.length * 2));
    for (let k = 0; k < len; k++) order[k] = a + k;
    const ord = order.subarray(0, len);
    if (len > 1) {
      let sorted = true;
      for (let k = 1; k < len; k++) if (tmpCol[a + k - 1] >= tmpCol[a + k]) { sorted = false; break; }
      if (!sorted) {
        const keys = Array.from(ord);
        keys.sort((x, y) => tmpCol[x] - tmpCol[y] || x - y);
        for (let k = 0; k < len; k++) ord[k] = keys[k];
      }
    }
    // Write merged cells in place (out <= a + k always holds, and we read through `ord` copies first).
    const cols: number[] = [];
    const ws: number[] = [];
    for (let k = 0; k < len; k++) {
      const c = tmpCol[ord[k]];
      const w = tmpW[ord[k]];
      if (cols.length > 0 && cols[cols.length - 1] === c) ws[ws.length - 1] += w;
      else {
        cols.push(c);
        ws.push(w);
      }
    }
    for (let k = 0; k < cols.length; k++) {
      if (ws[k] !== 0) {
        tmpCol[out] = cols[k];
        tmpW[out] = ws[k];
        out++;
      }
    }
    rowPtr[i + 1] = out;
  }
  const colIdx = tmpCol.slice(0, out);
  const weights = tmpW.slice(0, out);
  let weighted = false;
  for (let p = 0; p < out; p++) if (weights[p] !== 1) { weighted = true; break; }
  return {
    kind: shape.kind,
    directed: shape.kind === "bipartite" ? false : shape.directed,
    weighted,
    rowLabels: shape.rowLabels,
    colLabels: shape.kind === "bipartite" ? shape.colLabels : shape.rowLabels,
    rowPtr,
    colIdx,
    weights,
  };
}
