/**
 * A network's matrix CSV, written straight from its stored canonical JSON: into one Buffer (bundles, and
 * the CSV stored at publication), or in pieces of whole rows for large matrices (bundles and the network
 * download stream those, so a 20,000-node network's 800 MB of ",0" is never held whole).
 *
 * The output is byte for byte what the engine's `networkToMatrixCsv(deserializeNetwork(json))` gives
 * (tests/server/lib/matrix-csv.test.ts compares them), but it skips building the typed arrays and the
 * per-cell strings (labels are quoted by the one CSV rule of shared/csv): a row of zero cells (",0,0,…,0") is made once per network and copied into each line,
 * and only the non-zero cells are written (an unweighted network only changes a "0" into a "1" in place).
 * Stored networks were validated when they were deposited; the checks here (array lengths, column
 * indices in range and strictly increasing, positive finite weights) only make sure a damaged row can
 * never produce a malformed file: it throws instead.
 */
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { MATRIX_CORNER } from "@shared/network/parse/write";
import { quoteField } from "@shared/csv";

const COMMA = 0x2c;
const NEWLINE = 0x0a;
const ZERO = 0x30;
const ONE = 0x31;

/** A stored network that cannot be written as CSV (damaged): the only error the writer throws. */
export class MatrixCsvError extends Error {
  constructor(msg: string) {
    super(`Stored network cannot be written as CSV: ${msg}`);
    this.name = "MatrixCsvError";
  }
}

function fail(msg: string): never {
  throw new MatrixCsvError(msg);
}

/**
 * `corner` is the text of the header's first cell: `node` (MATRIX_CORNER), as the engine writes it and as the
 * Table Schema of a bundle names the first column. One Buffer of exactly the CSV's size.
 */
export function matrixCsvFromCanonical(json: unknown, corner = MATRIX_CORNER): Buffer {
  const parts = [...matrixCsvPieces(json, corner, Infinity).pieces];
  return parts.length === 1 ? parts[0] : Buffer.concat(parts);
}

/**
 * The same bytes in pieces of about `chunkBytes` (whole rows; a row longer than that is one piece): a
 * large sparse network's matrix (20,000 nodes are 800 MB of ",0") is streamed without ever being held
 * whole. The form is checked and the exact size computed here, at the call (a damaged network throws
 * MatrixCsvError before anything is sent); only a column index out of order or range is found while the
 * pieces are written (MatrixCsvError from the iterator).
 */
export function matrixCsvPieces(json: unknown, corner = MATRIX_CORNER, chunkBytes = 1024 * 1024): { bytes: number; pieces: Generator<Buffer> } {
  const c = json as CanonicalNetworkJson;
  if (!c || typeof c !== "object" || c.v !== 1) fail("unknown canonical form");
  const rows = c.rows;
  const cols = c.kind === "bipartite" ? c.cols : rows;
  if (!Array.isArray(rows) || !Array.isArray(cols)) fail("missing node labels");
  const { ptr, idx } = c;
  const w = c.w ?? null;
  const I = rows.length;
  const J = cols.length;
  if (!Array.isArray(ptr) || ptr.length !== I + 1 || ptr[0] !== 0 || !Array.isArray(idx) || idx.length !== ptr[I]) fail("row pointers do not match the links");
  if (w !== null && (!Array.isArray(w) || w.length !== idx.length)) fail("weights do not match the links");
  for (let i = 0; i < I; i++) if (!(ptr[i + 1] >= ptr[i])) fail(`row pointers decrease at row ${i + 1}`);

  // exact sizes: header, then per row its label, J ",0" cells and a newline, plus the extra length of weights
  const header = (cols.length ? quoteField(corner) + "," + cols.map((c) => quoteField(c)).join(",") : quoteField(corner)) + "\n";
  const headerBytes = Buffer.byteLength(header);
  const labels = new Array<string>(I);
  let ascii = true;
  for (let i = 0; i < I; i++) {
    labels[i] = quoteField(rows[i]);
    if (ascii && !isAscii(labels[i])) ascii = false;
  }
  const rowBytes = new Float64Array(I);
  for (let i = 0; i < I; i++) rowBytes[i] = (ascii ? labels[i].length : Buffer.byteLength(labels[i])) + 2 * J + 1;
  // weights: whole numbers are written digit by digit; other numbers through String() (shortest round trip)
  let texts: Map<number, string> | null = null;
  if (w !== null) {
    for (let i = 0; i < I; i++) {
      for (let p = ptr[i]; p < ptr[i + 1]; p++) {
        const x = w[p];
        if (typeof x !== "number" || !(x > 0) || !Number.isFinite(x)) fail(`weight ${String(x)} at link ${p + 1}`);
        if (Number.isInteger(x) && x < 1e15) rowBytes[i] += digitCount(x) - 1;
        else {
          const t = String(x);
          (texts ??= new Map()).set(p, t);
          rowBytes[i] += t.length - 1;
        }
      }
    }
  }
  let total = headerBytes;
  let longest = headerBytes;
  for (let i = 0; i < I; i++) {
    total += rowBytes[i];
    if (rowBytes[i] > longest) longest = rowBytes[i];
  }
  const capacity = Math.min(total, Math.max(chunkBytes, longest));
  function* write(): Generator<Buffer> {
    let out = Buffer.allocUnsafe(capacity);
    let pos = out.write(header, 0, "utf8");
    let written = 0;
    const zeros = Buffer.allocUnsafe(2 * J);
    for (let j = 0; j < J; j++) {
      zeros[2 * j] = COMMA;
      zeros[2 * j + 1] = ZERO;
    }
    for (let i = 0; i < I; i++) {
      if (pos > 0 && pos + rowBytes[i] > Math.min(chunkBytes, out.length)) {
        written += pos;
        yield out.subarray(0, pos);
        out = Buffer.allocUnsafe(Math.min(capacity, total - written));
        pos = 0;
      }
      const start = pos;
      pos += out.write(labels[i], pos, ascii ? "latin1" : "utf8");
      const from = ptr[i];
      const to = ptr[i + 1];
      let prev = -1;
      if (w === null) {
        zeros.copy(out, pos);
        for (let p = from; p < to; p++) {
          const j = idx[p];
          if (!(j > prev && j < J)) fail(`column index ${j} out of order or range in row ${i + 1}`);
          out[pos + 2 * j + 1] = ONE;
          prev = j;
        }
        pos += 2 * J;
      } else {
        let cell = 0; // next cell not yet written
        for (let p = from; p < to; p++) {
          const j = idx[p];
          if (!(j > prev && j < J)) fail(`column index ${j} out of order or range in row ${i + 1}`);
          pos = writeZeros(out, pos, zeros, j - cell);
          out[pos++] = COMMA;
          const x = w[p];
          if (Number.isInteger(x) && x < 1e15) pos = writeDigits(out, pos, x);
          else pos += out.write(texts!.get(p)!, pos, "latin1");
          cell = j + 1;
          prev = j;
        }
        pos = writeZeros(out, pos, zeros, J - cell);
      }
      out[pos++] = NEWLINE;
      if (pos - start !== rowBytes[i]) fail(`row ${i + 1}: wrote ${pos - start} bytes where ${rowBytes[i]} were expected`);
    }
    written += pos;
    if (written !== total) fail(`wrote ${written} bytes where ${total} were expected`);
    if (pos > 0 || total === 0) yield out.subarray(0, pos);
  }
  return { bytes: total, pieces: write() };
}

/** n cells ",0": a byte loop for short runs, a copy of the zero row for long ones. */
function writeZeros(out: Buffer, pos: number, zeros: Buffer, n: number): number {
  if (n > 16) return pos + zeros.copy(out, pos, 0, 2 * n);
  for (let k = 0; k < n; k++) {
    out[pos++] = COMMA;
    out[pos++] = ZERO;
  }
  return pos;
}

function digitCount(x: number): number {
  let n = 1;
  while (x >= 10) {
    x = Math.floor(x / 10);
    n++;
  }
  return n;
}

/** A whole number below 10^15 in decimal, as String() writes it. */
function writeDigits(out: Buffer, pos: number, x: number): number {
  if (x < 10) {
    out[pos] = ZERO + x;
    return pos + 1;
  }
  const end = pos + digitCount(x);
  for (let k = end - 1; k >= pos; k--) {
    const q = Math.floor(x / 10);
    out[k] = ZERO + (x - q * 10);
    x = q;
  }
  return end;
}

function isAscii(s: string): boolean {
  for (let k = 0; k < s.length; k++) if (s.charCodeAt(k) > 0x7f) return false;
  return true;
}

const QUOTE = 0x22;

/**
 * The labels of a matrix CSV's header after its first cell: the inverse of the header written by
 * matrixCsvFromCanonical (RFC 4180: a quoted cell may hold commas, doubled quotes and line breaks). A
 * bundle takes its Table Schema fields from the stored CSV's header this way, so they always match.
 */
export function csvHeaderLabels(csv: Buffer): string[] {
  let end = csv.indexOf(NEWLINE);
  if (end < 0) end = csv.length;
  const firstQuote = csv.indexOf(QUOTE);
  if (firstQuote < 0 || firstQuote > end) return end === 0 ? [] : csv.toString("utf8", 0, end).split(",").slice(1);
  const cells: string[] = [];
  let pos = 0;
  for (;;) {
    if (csv[pos] === QUOTE) {
      // quotes, commas and line breaks are single bytes in UTF-8, so every cut below is between characters
      let text = "";
      let from = pos + 1;
      for (;;) {
        const k = csv.indexOf(QUOTE, from);
        if (k < 0) fail("unterminated quoted cell in the header");
        if (csv[k + 1] === QUOTE) {
          text += csv.toString("utf8", from, k + 1);
          from = k + 2;
          continue;
        }
        text += csv.toString("utf8", from, k);
        pos = k + 1;
        break;
      }
      cells.push(text);
    } else {
      let k = pos;
      while (k < csv.length && csv[k] !== COMMA && csv[k] !== NEWLINE) k++;
      cells.push(csv.toString("utf8", pos, k));
      pos = k;
    }
    if (pos >= csv.length || csv[pos] === NEWLINE) break;
    if (csv[pos] !== COMMA) fail(`unexpected byte after a quoted header cell at ${pos}`);
    pos++;
  }
  return cells.slice(1);
}
