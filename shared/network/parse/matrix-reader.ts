/**
 * Reads a matrix, one record at a time, into growable CSR arrays: an incidence matrix (bipartite: rows and
 * columns are two kinds of nodes) or a square adjacency matrix (one-mode: the same names on both sides,
 * columns matched by name in any order; an undirected one must be symmetric). Cells are non-negative
 * numbers; blank cells and missing-value markers are counted (cells.ts); every problem names its row and
 * column.
 */
import type { Network } from "../types";
import { listLabels } from "./errors";
import { parseCellNumber } from "./text";
import { isMissingMarker } from "./cells";
import { fail, type ReadContext } from "./context";
import { GrowF64, GrowU32 } from "./grow";
import { checkLabel, matrixColumnLabels, pendingMatrixHeader, type PendingMatrixHeader } from "./headers";
import { makeNetwork, warnShared } from "./finish";

export class MatrixReader {
  readonly rowLabels: string[] = [];
  /** The line of each row. */
  readonly rowLine = new GrowU32(256);
  private colLabels: string[] = [];
  private readonly rowIndex = new Map<string, number>();
  private readonly rowPtr = new GrowU32(256);
  private readonly colIdx = new GrowU32(4096);
  private readonly w = new GrowF64(4096);
  /** The header until the first data row settles its column labels. */
  private header: PendingMatrixHeader | null;

  constructor(
    private readonly ctx: ReadContext,
    names: string[],
    readonly headerLine: number,
  ) {
    this.header = pendingMatrixHeader(names, headerLine);
    this.rowPtr.push(0);
  }

  /** True while no data row has come (a header alone is no matrix). */
  get waitingForRows(): boolean {
    return this.header !== null;
  }

  row(rec: string[], line: number): void {
    if (this.header) {
      this.colLabels = matrixColumnLabels(this.ctx, this.header, rec);
      this.header = null;
    }
    const ctx = this.ctx;
    const J = this.colLabels.length;
    const label = (rec[0] ?? "").trim();
    if (rec.length < J + 1) {
      fail(ctx, "ragged-row", line, rec.length + 1,
        `the row has ${rec.length} cells but the header has ${J + 1} (a row name and ${J} column nodes)`);
    }
    for (let k = J + 1; k < rec.length; k++) {
      if (rec[k].trim() !== "") {
        fail(ctx, "ragged-row", line, k + 1, `the row has a value beyond the last named column (the header has ${J + 1} cells)`);
      }
    }
    if (label === "") fail(ctx, "empty-label", line, 1, "the row node name is empty");
    checkLabel(ctx, label, line, 1, "row");
    const prev = this.rowIndex.get(label);
    if (prev !== undefined) {
      fail(ctx, "duplicate-node", line, 1, `row node "${label}" is named twice (also row ${this.rowLine.a[prev]})`);
    }
    const i = this.rowLabels.length;
    if ((i + 1) * J > ctx.maxCells) {
      fail(ctx, "too-large", line, null, `the matrix exceeds the limit of ${ctx.maxCells} cells (${i + 1} rows × ${J} columns so far)`);
    }
    this.rowIndex.set(label, i);
    this.rowLabels.push(label);
    this.rowLine.push(line);
    const colIdx = this.colIdx;
    const w = this.w;
    const decimalComma = ctx.decimalComma;
    let blanks = 0;
    for (let j = 0; j < J; j++) {
      const raw = rec[j + 1];
      if (raw === "0") continue;
      if (raw === "") {
        blanks++;
        continue;
      }
      const v = raw === "1" ? 1 : parseCellNumber(raw, decimalComma);
      if (v === 0) {
        if (raw.trim() === "") blanks++;
        continue;
      }
      if (!Number.isFinite(v)) {
        if (isMissingMarker(raw)) {
          ctx.cells.marker(raw, line, j + 2);
          continue;
        }
        fail(ctx, "non-numeric", line, j + 2,
          `cell "${raw.trim()}" (row node "${label}", column node "${this.colLabels[j]}") is not a number; use non-negative numbers, blank means 0`);
      }
      if (v < 0) {
        fail(ctx, "negative", line, j + 2,
          `cell ${raw.trim()} (row node "${label}", column node "${this.colLabels[j]}") is negative; interaction values must be ≥ 0`);
      }
      colIdx.push(j);
      w.push(v);
    }
    ctx.cells.blankCells += blanks;
    this.rowPtr.push(colIdx.n);
  }

  /** The network: a bipartite one as read; a one-mode one checked square, named alike and (undirected) symmetric. */
  finish(): Network {
    const ctx = this.ctx;
    const I = this.rowLabels.length;
    const J = this.colLabels.length;
    if (I === 0) fail(ctx, "empty-file", this.headerLine, null, "the matrix has a header row but no data rows");
    const rowPtr = this.rowPtr.done();
    const colIdx = this.colIdx.done();
    const weights = this.w.done();
    if (ctx.kind === "bipartite") {
      // Self-loops: a label that names both a row and a column node with a non-zero cell between them.
      const shared: string[] = [];
      const colPos = new Map<string, number>();
      this.colLabels.forEach((l, j) => colPos.set(l, j));
      for (let i = 0; i < I; i++) {
        const j = colPos.get(this.rowLabels[i]);
        if (j === undefined) continue;
        shared.push(this.rowLabels[i]);
        for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
          if (colIdx[p] === j) {
            fail(ctx, "self-loop-bipartite", this.rowLine.a[i], j + 2,
              `"${this.rowLabels[i]}" is both a row and a column node and has a link to itself; a bipartite network cannot have self-loops`);
          }
        }
      }
      warnShared(ctx, shared);
      return makeNetwork(ctx, this.rowLabels, rowPtr, colIdx, weights, this.colLabels);
    }
    // One-mode: square, same names, columns matched by name.
    if (I !== J) {
      fail(ctx, "not-square", null, null,
        `a one-mode adjacency matrix must be square, but it has ${I} rows and ${J} columns; for two kinds of nodes choose a bipartite network`);
    }
    if (this.colLabels.every((l) => !this.rowIndex.has(l))) {
      fail(ctx, "label-mismatch", this.headerLine, 2,
        `no column name appears among the row names (rows ${listLabels(this.rowLabels, 3)}; columns ${listLabels(this.colLabels, 3)}): this looks like a bipartite incidence matrix of two kinds of nodes; read it as bipartite`);
    }
    const perm = new Uint32Array(J);
    let identity = true;
    for (let j = 0; j < J; j++) {
      const i = this.rowIndex.get(this.colLabels[j]);
      if (i === undefined) {
        fail(ctx, "label-mismatch", this.headerLine, j + 2,
          `column node "${this.colLabels[j]}" is not among the row nodes; a one-mode matrix names the same nodes in its first row and first column`);
      }
      perm[j] = i;
      if (i !== j) identity = false;
    }
    if (!identity) {
      for (let p = 0; p < colIdx.length; p++) colIdx[p] = perm[colIdx[p]];
      for (let i = 0; i < I; i++) sortRow(colIdx, weights, rowPtr[i], rowPtr[i + 1]);
    }
    const net = makeNetwork(ctx, this.rowLabels, rowPtr, colIdx, weights, this.rowLabels);
    if (!ctx.directed) {
      for (let i = 0; i < I; i++) {
        for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
          const j = colIdx[p];
          const other = cellOf(net, j, i);
          if (other !== weights[p]) {
            const colOfJ = identity ? j : this.colLabels.indexOf(this.rowLabels[j]);
            fail(ctx, "not-symmetric", this.rowLine.a[i], colOfJ + 2,
              `an undirected matrix must be symmetric, but "${this.rowLabels[i]}"→"${this.rowLabels[j]}" is ${weights[p]} and "${this.rowLabels[j]}"→"${this.rowLabels[i]}" is ${other}; mark the network as directed if links have a direction`);
          }
        }
      }
    }
    return net;
  }
}

function cellOf(net: Network, i: number, j: number): number {
  let lo = net.rowPtr[i];
  let hi = net.rowPtr[i + 1] - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    const c = net.colIdx[mid];
    if (c === j) return net.weights[mid];
    if (c < j) lo = mid + 1;
    else hi = mid - 1;
  }
  return 0;
}

function sortRow(colIdx: Uint32Array, weights: Float64Array, a: number, b: number): void {
  const n = b - a;
  if (n < 2) return;
  const idx = Array.from({ length: n }, (_, k) => a + k);
  idx.sort((x, y) => colIdx[x] - colIdx[y]);
  const c = idx.map((k) => colIdx[k]);
  const w = idx.map((k) => weights[k]);
  for (let k = 0; k < n; k++) {
    colIdx[a + k] = c[k];
    weights[a + k] = w[k];
  }
}
