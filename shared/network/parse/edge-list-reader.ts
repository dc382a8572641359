/**
 * Reads an edge list, one record at a time: a source, a target and an optional weight per line.
 * Bipartite: source = row node, target = column node (a label on both sides names two different nodes,
 * warned). Repeated pairs are summed (warned); for an undirected one-mode network "a,b" and "b,a" are the
 * same link. A weight of 0 records the nodes but no link. Nodes are numbered in order of first appearance;
 * an edge list cannot express isolated nodes. A one-mode list whose sources are never targets is likely
 * two-mode data (warned).
 */
import type { Network } from "../types";
import { parseCellNumber } from "./text";
import { isMissingMarker } from "./cells";
import { fail, type ReadContext } from "./context";
import { GrowF64, GrowU32 } from "./grow";
import { checkLabel, edgeListColumns, type EdgeListColumns } from "./headers";
import { makeNetwork, warnShared } from "./finish";

export class EdgeListReader {
  readonly rowLabels: string[] = [];
  /** The line where each row node (source) first appears. */
  readonly rowLine = new GrowU32(256);
  private readonly rowIndex = new Map<string, number>();
  private readonly colLabels: string[] = [];
  private readonly colIndex = new Map<string, number>();
  private readonly colLine = new GrowU32(256);
  private readonly cols: EdgeListColumns;
  private readonly eSrc = new GrowU32(4096);
  private readonly eTgt = new GrowU32(4096);
  private readonly eW = new GrowF64(4096);
  private readonly eLine = new GrowU32(4096);
  private edgeRows = 0;

  /** `names`: the header's cells trimmed; `lower`: the same in lower case. */
  constructor(
    private readonly ctx: ReadContext,
    names: string[],
    lower: string[],
    readonly headerLine: number,
  ) {
    this.cols = edgeListColumns(ctx, names, lower, headerLine);
  }

  row(rec: string[], line: number): void {
    const ctx = this.ctx;
    const { src: srcCol, tgt: tgtCol, weight: wCol, width: headerWidth } = this.cols;
    const need = Math.max(srcCol, tgtCol, wCol) + 1;
    if (rec.length < need) {
      fail(ctx, "ragged-row", line, rec.length + 1, `the row has ${rec.length} cells but the header has ${headerWidth}`);
    }
    for (let k = headerWidth; k < rec.length; k++) {
      if (rec[k].trim() !== "") fail(ctx, "ragged-row", line, k + 1, `the row has a value beyond the last named column (the header has ${headerWidth} cells)`);
    }
    this.edgeRows++;
    if (this.edgeRows > ctx.maxCells) {
      fail(ctx, "too-large", line, null, `the edge list exceeds the limit of ${ctx.maxCells} lines`);
    }
    const s = rec[srcCol].trim();
    const t = rec[tgtCol].trim();
    if (s === "") fail(ctx, "empty-label", line, srcCol + 1, "the source node name is empty");
    if (t === "") fail(ctx, "empty-label", line, tgtCol + 1, "the target node name is empty");
    checkLabel(ctx, s, line, srcCol + 1, "source");
    checkLabel(ctx, t, line, tgtCol + 1, "target");
    let weight = 1;
    if (wCol >= 0) {
      const raw = rec[wCol];
      if (raw.trim() === "") fail(ctx, "non-numeric", line, wCol + 1, "the weight is empty; give a non-negative number");
      weight = parseCellNumber(raw, ctx.decimalComma);
      if (!Number.isFinite(weight) && isMissingMarker(raw)) {
        ctx.cells.marker(raw, line, wCol + 1);
        weight = 0;
      }
      if (!Number.isFinite(weight)) fail(ctx, "non-numeric", line, wCol + 1, `weight "${raw.trim()}" is not a number`);
      if (weight < 0) fail(ctx, "negative", line, wCol + 1, `weight ${raw.trim()} is negative; interaction values must be ≥ 0`);
    }
    let a: number;
    let b: number;
    if (ctx.kind === "bipartite") {
      if (s === t) {
        fail(ctx, "self-loop-bipartite", line, tgtCol + 1,
          `"${s}" is both source and target: a bipartite network links row nodes (source) to column nodes (target) only`);
      }
      a = intern(this.rowIndex, this.rowLabels, this.rowLine, s, line);
      b = intern(this.colIndex, this.colLabels, this.colLine, t, line);
    } else {
      a = intern(this.rowIndex, this.rowLabels, this.rowLine, s, line);
      b = intern(this.rowIndex, this.rowLabels, this.rowLine, t, line);
    }
    if (weight === 0) return;
    this.eSrc.push(a);
    this.eTgt.push(b);
    this.eW.push(weight);
    this.eLine.push(line);
  }

  /** The network: links sorted by row and column, repeated pairs summed. */
  finish(): Network {
    const ctx = this.ctx;
    const I = this.rowLabels.length;
    if (I === 0) fail(ctx, "empty-file", this.headerLine, null, "the edge list has a header but no links");
    const undirected = ctx.kind === "unipartite" && !ctx.directed;
    const nE = this.eSrc.n;
    const src = this.eSrc.a;
    const tgt = this.eTgt.a;
    const ew = this.eW.a;
    const eline = this.eLine.a;
    // Expand undirected links into both directions (self-loops once).
    let total = nE;
    if (undirected) for (let e = 0; e < nE; e++) if (src[e] !== tgt[e]) total++;
    const rows = new Uint32Array(total);
    const cols = new Uint32Array(total);
    const ws = new Float64Array(total);
    const lines = new Uint32Array(total);
    let k = 0;
    for (let e = 0; e < nE; e++) {
      rows[k] = src[e]; cols[k] = tgt[e]; ws[k] = ew[e]; lines[k] = eline[e]; k++;
      if (undirected && src[e] !== tgt[e]) {
        rows[k] = tgt[e]; cols[k] = src[e]; ws[k] = ew[e]; lines[k] = eline[e]; k++;
      }
    }
    // Counting sort by row, then sort each row by column and merge repeats.
    const rowPtr = new Uint32Array(I + 1);
    for (let e = 0; e < total; e++) rowPtr[rows[e] + 1]++;
    for (let i = 0; i < I; i++) rowPtr[i + 1] += rowPtr[i];
    const pos = rowPtr.slice(0, I);
    const order = new Uint32Array(total);
    for (let e = 0; e < total; e++) order[pos[rows[e]]++] = e;
    const outCol = new Uint32Array(total);
    const outW = new Float64Array(total);
    const outPtr = new Uint32Array(I + 1);
    let out = 0;
    let repeats = 0;
    let firstRepeatLine = 0;
    let firstRepeat = "";
    for (let i = 0; i < I; i++) {
      const seg = Array.from(order.subarray(rowPtr[i], rowPtr[i + 1]));
      seg.sort((x, y) => cols[x] - cols[y] || lines[x] - lines[y]);
      for (let q = 0; q < seg.length; q++) {
        const e = seg[q];
        if (q > 0 && cols[seg[q - 1]] === cols[e]) {
          outW[out - 1] += ws[e];
          // Count each repeated line once (undirected links appear in two rows; count where row ≤ col).
          if (!undirected || i <= cols[e]) {
            repeats++;
            if (firstRepeatLine === 0 || lines[e] < firstRepeatLine) {
              firstRepeatLine = lines[e];
              const colName = ctx.kind === "bipartite" ? this.colLabels[cols[e]] : this.rowLabels[cols[e]];
              firstRepeat = `"${this.rowLabels[i]}" – "${colName}"`;
            }
          }
          continue;
        }
        outCol[out] = cols[e];
        outW[out] = ws[e];
        out++;
      }
      outPtr[i + 1] = out;
    }
    if (repeats > 0) {
      ctx.warnings.push({
        code: "duplicate-links", file: ctx.file, row: firstRepeatLine, column: null, count: repeats,
        message: `${repeats} line(s) repeat a pair already listed (first: ${firstRepeat} on row ${firstRepeatLine})${undirected ? "; in an undirected network a,b and b,a are the same link" : ""}; their weights were summed`,
      });
    }
    if (ctx.kind === "bipartite") {
      const cols2 = new Set(this.colLabels);
      warnShared(ctx, this.rowLabels.filter((l) => cols2.has(l)));
    } else this.warnTwoMode(src, tgt, nE, I);
    return makeNetwork(ctx, this.rowLabels, outPtr, outCol.slice(0, out), outW.slice(0, out), ctx.kind === "bipartite" ? this.colLabels : this.rowLabels);
  }

  /** A one-mode edge list whose sources never appear as targets (and back) is likely two-mode data. */
  private warnTwoMode(src: Uint32Array, tgt: Uint32Array, nE: number, I: number): void {
    if (nE === 0) return;
    const side = new Uint8Array(I);
    for (let e = 0; e < nE; e++) {
      side[src[e]] |= 1;
      side[tgt[e]] |= 2;
    }
    let sources = 0;
    let targets = 0;
    for (let i = 0; i < I; i++) {
      if (side[i] === 3) return;
      if (side[i] === 1) sources++;
      else if (side[i] === 2) targets++;
    }
    if (sources < 2 || targets < 2) return;
    this.ctx.warnings.push({
      code: "two-mode", file: this.ctx.file, row: null, column: null, count: sources + targets,
      message: `no name appears both as a source and as a target (${sources} sources, ${targets} targets): this looks like a two-mode network of two kinds of nodes; read it as bipartite (sources as rows, targets as columns) if so`,
    });
  }
}

/** The index of `label`, numbering it (with the line where it first appears) when new. */
function intern(index: Map<string, number>, labels: string[], lines: GrowU32, label: string, line: number): number {
  let k = index.get(label);
  if (k === undefined) {
    k = labels.length;
    index.set(label, k);
    labels.push(label);
    lines.push(line);
  }
  return k;
}
