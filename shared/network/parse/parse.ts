/**
 * Parsing of the files a depositor may upload into the canonical `Network` (../types.ts).
 *
 * Formats
 * - Incidence matrix (bipartite), CSV or TSV: the first row names the column nodes (its first cell, the
 *   corner, is ignored), the first column names the row nodes; cells are non-negative numbers; blank = 0.
 * - Square adjacency matrix (one-mode): the same layout with the S node names on both sides; the column
 *   names must be the row names (any order; columns are matched by name). Cell (i, j) is the link i → j
 *   when `directed` (the depositor states the convention, e.g. "row eats column"); otherwise the matrix
 *   must be symmetric. Diagonal cells are self-loops (cannibal links).
 * - Edge list, CSV or TSV, header `source,target` with an optional `weight` column (any order, any case);
 *   other columns are ignored with a warning. Bipartite: source = row node, target = column node; a label
 *   used on both sides names two different nodes (warned). Repeated pairs are summed (warned); for an
 *   undirected one-mode network "a,b" and "b,a" are the same link. A weight of 0 records the nodes but no
 *   link. Node order: order of first appearance. An edge list cannot express isolated nodes.
 * - Format "auto": an edge list when the header has `source` and `target` cells, else a matrix.
 *
 * Text: UTF-8 only (a UTF-8 BOM is accepted); delimiter detected from the first non-empty line (tab,
 * semicolon or comma); fields follow RFC 4180 quoting, read by csv-parse (its browser ESM build, so the same
 * code runs in the upload preview). Empty lines are skipped; labels are trimmed; trailing empty header
 * cells (a delimiter at the end of each line) are ignored. In semicolon-delimited files a decimal comma
 * ("0,5") is accepted.
 *
 * Memory: rows are streamed from the CSV reader straight into growable typed CSR arrays, one row of
 * strings at a time; no array of all cells is built (a 3000 × 5000 matrix holds the text, its UTF-8 copy
 * inside the reader and the CSR arrays of its non-zero cells).
 *
 * Errors: `NetworkParseError` with code, file, 1-based row (line) and column; warnings for rows, columns or
 * nodes with no link (kept), summed duplicates, ignored columns, shared labels and self-loops.
 */
import { parse as csvParse } from "csv-parse/browser/esm/sync";
import type { Network, NetworkKind } from "../types";
import { NetworkParseError, listLabels, type ParseWarning } from "./errors";
import { decodeUtf8, delimiterName, detectDelimiter, parseCellNumber, utf8Length } from "./text";

export type NetworkFileFormat = "matrix" | "edgelist";

export interface ParseOptions {
  fileName: string;
  format?: "auto" | NetworkFileFormat;
  kind: NetworkKind;
  /** One-mode networks only: cell (i, j) / edge source → target is a directed link. Default false. */
  directed?: boolean;
  /** Largest accepted file size in bytes (default DEFAULT_MAX_BYTES). */
  maxBytes?: number;
  /** Largest accepted matrix (rows × columns) or number of edge-list lines (default DEFAULT_MAX_CELLS). */
  maxCells?: number;
}

export interface ParseResult {
  network: Network;
  format: NetworkFileFormat;
  delimiter: string;
  warnings: ParseWarning[];
}

export const DEFAULT_MAX_BYTES = 256 * 1024 * 1024;
export const DEFAULT_MAX_CELLS = 25_000_000;

class GrowU32 {
  a: Uint32Array;
  n = 0;
  constructor(cap = 1024) {
    this.a = new Uint32Array(cap);
  }
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = new Uint32Array(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  done(): Uint32Array {
    return this.a.slice(0, this.n);
  }
}

class GrowF64 {
  a: Float64Array;
  n = 0;
  constructor(cap = 1024) {
    this.a = new Float64Array(cap);
  }
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = new Float64Array(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  done(): Float64Array {
    return this.a.slice(0, this.n);
  }
}

interface CsvContext {
  lines: number;
}

export function parseNetworkText(text: string | Uint8Array, options: ParseOptions): ParseResult {
  const file = options.fileName;
  const whole = { file, row: null, column: null };
  if (options.kind !== "bipartite" && options.kind !== "unipartite") {
    throw new NetworkParseError("bad-option", whole, `kind must be "bipartite" or "unipartite", got ${String(options.kind)}`);
  }
  if (options.kind === "bipartite" && options.directed) {
    throw new NetworkParseError("bad-option", whole, "a bipartite network cannot be directed; the directed flag is for one-mode networks (food webs)");
  }
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  const maxCells = options.maxCells ?? DEFAULT_MAX_CELLS;
  const byteLength = typeof text === "string" ? (text.length * 3 <= maxBytes ? text.length : utf8Length(text)) : text.length;
  if (byteLength > maxBytes) {
    throw new NetworkParseError("too-large", whole, `the file has ${byteLength} bytes, more than the limit of ${maxBytes}`);
  }
  let str = typeof text === "string" ? text : decodeUtf8(text, file);
  if (str.charCodeAt(0) === 0xfeff) str = str.slice(1);
  if (str.trim() === "") throw new NetworkParseError("empty-file", whole, "the file is empty");

  const delimiter = detectDelimiter(str);
  const decimalComma = delimiter === ";";
  const sink = new RecordSink(options, file, delimiter, decimalComma, maxCells);
  // The reader is fed about 1 MB of whole records at a time: its browser build turns its input into bytes
  // through a plain array, so one call on a 30 MB text would hold hundreds of MB at once.
  for (const [chunk, lineOffset] of recordChunks(str, CHUNK_CHARS)) {
    try {
      csvParse(chunk, {
        delimiter,
        relax_column_count: true,
        skip_empty_lines: true,
        bom: false,
        on_record: (record: string[], ctx: CsvContext) => {
          sink.record(record, lineOffset + ctx.lines);
          return null;
        },
      });
    } catch (err) {
      if (err instanceof NetworkParseError) throw err;
      const e = err as { message?: string; lines?: number; code?: string };
      const row = typeof e.lines === "number" ? lineOffset + e.lines : null;
      const msg = (e.message ?? String(err)).replace(/\s*at line \d+/g, "");
      throw new NetworkParseError("bad-csv", { file, row, column: null },
        `the file is not valid ${delimiterName(delimiter)}-separated text: ${msg}`);
    }
  }
  return sink.finish();
}

const CHUNK_CHARS = 1 << 20;

/**
 * Splits the text into pieces of about `target` characters that end just after a line break outside
 * double quotes (so no record is cut), with the number of lines before each piece.
 */
function* recordChunks(text: string, target: number): Generator<[string, number]> {
  let start = 0;
  let lines = 0;
  let quoted = false;
  let linesInPiece = 0;
  for (let k = 0; k < text.length; k++) {
    const c = text.charCodeAt(k);
    if (c === 34) quoted = !quoted;
    else if (c === 10) {
      linesInPiece++;
      if (!quoted && k + 1 - start >= target) {
        yield [text.slice(start, k + 1), lines];
        lines += linesInPiece;
        linesInPiece = 0;
        start = k + 1;
      }
    }
  }
  if (start < text.length) yield [text.slice(start), lines];
}

/** Receives one CSV record at a time and builds the network. */
class RecordSink {
  private readonly kind: NetworkKind;
  private readonly directed: boolean;
  private format: NetworkFileFormat | null = null;
  private readonly requested: "auto" | NetworkFileFormat;
  private headerLine = 0;
  readonly warnings: ParseWarning[] = [];

  // Matrix state
  private colLabels: string[] = [];
  private readonly rowLabels: string[] = [];
  private readonly rowIndex = new Map<string, number>();
  private readonly rowLine = new GrowU32(256);
  private readonly colLine = new GrowU32(256);
  private readonly rowPtr = new GrowU32(256);
  private readonly colIdx = new GrowU32(4096);
  private readonly w = new GrowF64(4096);

  // Edge-list state
  private srcCol = -1;
  private tgtCol = -1;
  private wCol = -1;
  private headerWidth = 0;
  private readonly colIndex = new Map<string, number>();
  private readonly eSrc = new GrowU32(4096);
  private readonly eTgt = new GrowU32(4096);
  private readonly eW = new GrowF64(4096);
  private readonly eLine = new GrowU32(4096);
  private edgeRows = 0;

  constructor(
    options: ParseOptions,
    private readonly file: string,
    private readonly delimiter: string,
    private readonly decimalComma: boolean,
    private readonly maxCells: number,
  ) {
    this.kind = options.kind;
    this.directed = options.kind === "unipartite" && options.directed === true;
    this.requested = options.format ?? "auto";
    this.rowPtr.push(0);
  }

  private fail(code: ConstructorParameters<typeof NetworkParseError>[0], row: number | null, column: number | null, detail: string): never {
    throw new NetworkParseError(code, { file: this.file, row, column }, detail);
  }

  record(rec: string[], line: number): void {
    if (this.format === null) this.header(rec, line);
    else if (this.format === "matrix") this.matrixRow(rec, line);
    else this.edgeRow(rec, line);
  }

  private header(rec: string[], line: number): void {
    this.headerLine = line;
    const names = rec.map((s) => s.trim());
    const lower = names.map((s) => s.toLowerCase());
    const looksEdge = lower.includes("source") && lower.includes("target");
    let format: NetworkFileFormat;
    if (this.requested === "auto") format = looksEdge ? "edgelist" : "matrix";
    else format = this.requested;
    this.format = format;
    if (format === "edgelist") {
      const find = (name: string) => {
        const first = lower.indexOf(name);
        if (first >= 0 && lower.indexOf(name, first + 1) >= 0) {
          this.fail("bad-header", line, lower.indexOf(name, first + 1) + 1, `the header has two "${name}" columns`);
        }
        return first;
      };
      this.srcCol = find("source");
      this.tgtCol = find("target");
      this.wCol = find("weight");
      if (this.srcCol < 0 || this.tgtCol < 0) {
        this.fail("bad-header", line, null,
          `an edge list needs a header with "source" and "target" columns (and optionally "weight"); found ${listLabels(names)}`);
      }
      let width = names.length;
      while (width > 0 && names[width - 1] === "") width--;
      this.headerWidth = width;
      const ignored = names.slice(0, width).filter((_, k) => k !== this.srcCol && k !== this.tgtCol && k !== this.wCol);
      if (ignored.length > 0) {
        this.warnings.push({
          code: "ignored-columns", file: this.file, row: line, column: null, count: ignored.length, labels: ignored,
          message: `columns other than source, target and weight were ignored: ${listLabels(ignored)}`,
        });
      }
      return;
    }
    let width = names.length;
    while (width > 1 && names[width - 1] === "") width--;
    const labels = names.slice(1, width);
    if (labels.length === 0) {
      this.fail("bad-header", line, null,
        `the first row must name the column nodes after a corner cell, but it has no column names (delimiter detected: ${delimiterName(this.delimiter)})`);
    }
    const seen = new Map<string, number>();
    labels.forEach((label, k) => {
      if (label === "") this.fail("empty-label", line, k + 2, "the column node name is empty");
      const prev = seen.get(label);
      if (prev !== undefined) {
        this.fail("duplicate-node", line, k + 2, `column node "${label}" is named twice (also column ${prev + 2})`);
      }
      seen.set(label, k);
    });
    this.colLabels = labels;
  }

  private matrixRow(rec: string[], line: number): void {
    const J = this.colLabels.length;
    const label = (rec[0] ?? "").trim();
    if (rec.length < J + 1) {
      this.fail("ragged-row", line, rec.length + 1,
        `the row has ${rec.length} cells but the header has ${J + 1} (a row name and ${J} column nodes)`);
    }
    for (let k = J + 1; k < rec.length; k++) {
      if (rec[k].trim() !== "") {
        this.fail("ragged-row", line, k + 1, `the row has a value beyond the last named column (the header has ${J + 1} cells)`);
      }
    }
    if (label === "") this.fail("empty-label", line, 1, "the row node name is empty");
    const prev = this.rowIndex.get(label);
    if (prev !== undefined) {
      this.fail("duplicate-node", line, 1, `row node "${label}" is named twice (also row ${this.rowLine.a[prev]})`);
    }
    const i = this.rowLabels.length;
    if ((i + 1) * J > this.maxCells) {
      this.fail("too-large", line, null, `the matrix exceeds the limit of ${this.maxCells} cells (${i + 1} rows × ${J} columns so far)`);
    }
    this.rowIndex.set(label, i);
    this.rowLabels.push(label);
    this.rowLine.push(line);
    const colIdx = this.colIdx;
    const w = this.w;
    for (let j = 0; j < J; j++) {
      const raw = rec[j + 1];
      if (raw === "" || raw === "0") continue;
      const v = raw === "1" ? 1 : parseCellNumber(raw, this.decimalComma);
      if (v === 0) continue;
      if (!Number.isFinite(v)) {
        this.fail("non-numeric", line, j + 2,
          `cell "${raw.trim()}" (row node "${label}", column node "${this.colLabels[j]}") is not a number; use non-negative numbers, blank means 0`);
      }
      if (v < 0) {
        this.fail("negative", line, j + 2,
          `cell ${raw.trim()} (row node "${label}", column node "${this.colLabels[j]}") is negative; interaction values must be ≥ 0`);
      }
      colIdx.push(j);
      w.push(v);
    }
    this.rowPtr.push(colIdx.n);
  }

  private edgeRow(rec: string[], line: number): void {
    const need = Math.max(this.srcCol, this.tgtCol, this.wCol) + 1;
    if (rec.length < need) {
      this.fail("ragged-row", line, rec.length + 1, `the row has ${rec.length} cells but the header has ${this.headerWidth}`);
    }
    for (let k = this.headerWidth; k < rec.length; k++) {
      if (rec[k].trim() !== "") this.fail("ragged-row", line, k + 1, `the row has a value beyond the last named column (the header has ${this.headerWidth} cells)`);
    }
    this.edgeRows++;
    if (this.edgeRows > this.maxCells) {
      this.fail("too-large", line, null, `the edge list exceeds the limit of ${this.maxCells} lines`);
    }
    const s = rec[this.srcCol].trim();
    const t = rec[this.tgtCol].trim();
    if (s === "") this.fail("empty-label", line, this.srcCol + 1, "the source node name is empty");
    if (t === "") this.fail("empty-label", line, this.tgtCol + 1, "the target node name is empty");
    let weight = 1;
    if (this.wCol >= 0) {
      const raw = rec[this.wCol];
      if (raw.trim() === "") this.fail("non-numeric", line, this.wCol + 1, "the weight is empty; give a non-negative number");
      weight = parseCellNumber(raw, this.decimalComma);
      if (!Number.isFinite(weight)) this.fail("non-numeric", line, this.wCol + 1, `weight "${raw.trim()}" is not a number`);
      if (weight < 0) this.fail("negative", line, this.wCol + 1, `weight ${raw.trim()} is negative; interaction values must be ≥ 0`);
    }
    let a: number;
    let b: number;
    if (this.kind === "bipartite") {
      if (s === t) {
        this.fail("self-loop-bipartite", line, this.tgtCol + 1,
          `"${s}" is both source and target: a bipartite network links row nodes (source) to column nodes (target) only`);
      }
      a = this.intern(this.rowIndex, this.rowLabels, this.rowLine, s, line);
      b = this.intern(this.colIndex, this.colLabels, this.colLine, t, line);
    } else {
      a = this.intern(this.rowIndex, this.rowLabels, this.rowLine, s, line);
      b = this.intern(this.rowIndex, this.rowLabels, this.rowLine, t, line);
    }
    if (weight === 0) return;
    this.eSrc.push(a);
    this.eTgt.push(b);
    this.eW.push(weight);
    this.eLine.push(line);
  }

  private intern(index: Map<string, number>, labels: string[], lines: GrowU32, label: string, line: number): number {
    let k = index.get(label);
    if (k === undefined) {
      k = labels.length;
      index.set(label, k);
      labels.push(label);
      lines.push(line);
    }
    return k;
  }

  finish(): ParseResult {
    if (this.format === null) this.fail("empty-file", null, null, "the file is empty");
    const net = this.format === "matrix" ? this.finishMatrix() : this.finishEdgeList();
    this.checkLinksAndWarn(net);
    return { network: net, format: this.format, delimiter: this.delimiter, warnings: this.warnings };
  }

  private finishMatrix(): Network {
    const I = this.rowLabels.length;
    const J = this.colLabels.length;
    if (I === 0) this.fail("empty-file", this.headerLine, null, "the matrix has a header row but no data rows");
    const rowPtr = this.rowPtr.done();
    const colIdx = this.colIdx.done();
    const weights = this.w.done();
    if (this.kind === "bipartite") {
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
            this.fail("self-loop-bipartite", this.rowLine.a[i], j + 2,
              `"${this.rowLabels[i]}" is both a row and a column node and has a link to itself; a bipartite network cannot have self-loops`);
          }
        }
      }
      this.warnShared(shared);
      return this.makeNetwork(rowPtr, colIdx, weights, this.colLabels);
    }
    // One-mode: square, same names, columns matched by name.
    if (I !== J) {
      this.fail("not-square", null, null,
        `a one-mode adjacency matrix must be square, but it has ${I} rows and ${J} columns; for two kinds of nodes choose a bipartite network`);
    }
    const perm = new Uint32Array(J);
    let identity = true;
    for (let j = 0; j < J; j++) {
      const i = this.rowIndex.get(this.colLabels[j]);
      if (i === undefined) {
        this.fail("label-mismatch", this.headerLine, j + 2,
          `column node "${this.colLabels[j]}" is not among the row nodes; a one-mode matrix names the same nodes in its first row and first column`);
      }
      perm[j] = i;
      if (i !== j) identity = false;
    }
    if (!identity) {
      for (let p = 0; p < colIdx.length; p++) colIdx[p] = perm[colIdx[p]];
      for (let i = 0; i < I; i++) sortRow(colIdx, weights, rowPtr[i], rowPtr[i + 1]);
    }
    const net = this.makeNetwork(rowPtr, colIdx, weights, this.rowLabels);
    if (!this.directed) {
      for (let i = 0; i < I; i++) {
        for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
          const j = colIdx[p];
          const other = cellOf(net, j, i);
          if (other !== weights[p]) {
            const colOfJ = identity ? j : this.colLabels.indexOf(this.rowLabels[j]);
            this.fail("not-symmetric", this.rowLine.a[i], colOfJ + 2,
              `an undirected matrix must be symmetric, but "${this.rowLabels[i]}"→"${this.rowLabels[j]}" is ${weights[p]} and "${this.rowLabels[j]}"→"${this.rowLabels[i]}" is ${other}; mark the network as directed if links have a direction`);
          }
        }
      }
    }
    return net;
  }

  private finishEdgeList(): Network {
    const I = this.rowLabels.length;
    if (I === 0) this.fail("empty-file", this.headerLine, null, "the edge list has a header but no links");
    const undirected = this.kind === "unipartite" && !this.directed;
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
              const colName = this.kind === "bipartite" ? this.colLabels[cols[e]] : this.rowLabels[cols[e]];
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
      this.warnings.push({
        code: "duplicate-links", file: this.file, row: firstRepeatLine, column: null, count: repeats,
        message: `${repeats} line(s) repeat a pair already listed (first: ${firstRepeat} on row ${firstRepeatLine})${undirected ? "; in an undirected network a,b and b,a are the same link" : ""}; their weights were summed`,
      });
    }
    if (this.kind === "bipartite") {
      const cols2 = new Set(this.colLabels);
      this.warnShared(this.rowLabels.filter((l) => cols2.has(l)));
    }
    return this.makeNetwork(outPtr, outCol.slice(0, out), outW.slice(0, out), this.kind === "bipartite" ? this.colLabels : this.rowLabels);
  }

  private warnShared(shared: string[]): void {
    if (shared.length === 0) return;
    this.warnings.push({
      code: "shared-labels", file: this.file, row: null, column: null, count: shared.length, labels: shared,
      message: `${shared.length} name(s) label both a row node and a column node, which are kept as different nodes: ${listLabels(shared)}`,
    });
  }

  private makeNetwork(rowPtr: Uint32Array, colIdx: Uint32Array, weights: Float64Array, colLabels: string[]): Network {
    let weighted = false;
    for (let p = 0; p < weights.length; p++) if (weights[p] !== 1) { weighted = true; break; }
    return {
      kind: this.kind,
      directed: this.directed,
      weighted,
      rowLabels: this.rowLabels,
      colLabels: this.kind === "bipartite" ? colLabels : this.rowLabels,
      rowPtr,
      colIdx,
      weights,
    };
  }

  private checkLinksAndWarn(net: Network): void {
    const I = net.rowLabels.length;
    const nnz = net.rowPtr[I];
    const isMatrix = this.format === "matrix";
    if (nnz === 0) {
      this.fail("no-links", null, null, `the ${isMatrix ? "matrix" : "edge list"} has no links (every value is 0 or blank)`);
    }
    if (net.kind === "bipartite") {
      const emptyRows: string[] = [];
      let firstLine = 0;
      for (let i = 0; i < I; i++) {
        if (net.rowPtr[i + 1] === net.rowPtr[i]) {
          emptyRows.push(net.rowLabels[i]);
          if (firstLine === 0) firstLine = this.rowLine.a[i];
        }
      }
      if (emptyRows.length > 0) {
        this.warnings.push({
          code: "empty-rows", file: this.file, row: firstLine, column: isMatrix ? 1 : null, count: emptyRows.length, labels: emptyRows,
          message: `${emptyRows.length} row node(s) have no link and are kept: ${listLabels(emptyRows)}`,
        });
      }
      const J = net.colLabels.length;
      const seen = new Uint8Array(J);
      for (let p = 0; p < nnz; p++) seen[net.colIdx[p]] = 1;
      const emptyCols: string[] = [];
      let firstCol = 0;
      for (let j = 0; j < J; j++) {
        if (!seen[j]) {
          emptyCols.push(net.colLabels[j]);
          if (firstCol === 0) firstCol = j + 2;
        }
      }
      if (emptyCols.length > 0) {
        this.warnings.push({
          code: "empty-columns", file: this.file, row: isMatrix ? this.headerLine : null, column: isMatrix ? firstCol : null,
          count: emptyCols.length, labels: emptyCols,
          message: `${emptyCols.length} column node(s) have no link and are kept: ${listLabels(emptyCols)}`,
        });
      }
      return;
    }
    const touched = new Uint8Array(I);
    const loops: string[] = [];
    for (let i = 0; i < I; i++) {
      for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) {
        const j = net.colIdx[p];
        touched[i] = 1;
        touched[j] = 1;
        if (j === i) loops.push(net.rowLabels[i]);
      }
    }
    const isolated: string[] = [];
    let firstLine = 0;
    for (let i = 0; i < I; i++) {
      if (!touched[i]) {
        isolated.push(net.rowLabels[i]);
        if (firstLine === 0) firstLine = this.rowLine.a[i];
      }
    }
    if (isolated.length > 0) {
      this.warnings.push({
        code: "isolated-nodes", file: this.file, row: firstLine, column: isMatrix ? 1 : null, count: isolated.length, labels: isolated,
        message: `${isolated.length} node(s) have no link and are kept: ${listLabels(isolated)}`,
      });
    }
    if (loops.length > 0) {
      this.warnings.push({
        code: "self-loops", file: this.file, row: null, column: null, count: loops.length, labels: loops,
        message: `${loops.length} node(s) link to themselves (${this.directed ? "cannibal links" : "self-loops"}), kept: ${listLabels(loops)}`,
      });
    }
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
