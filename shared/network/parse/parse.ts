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
 * Files as programs write them
 * - R: `write.csv` (corner cell `""`, quoted labels, `NA`) reads as above. `write.table` writes the header
 *   without the corner cell (one cell fewer than the data rows) and, by default, separates fields by
 *   spaces: a header one cell shorter than the first data row names the columns from its first cell on
 *   (noted in a warning), and a space is the delimiter when a line has no tab, semicolon or comma.
 * - Spreadsheet exports: rows with no value at all (",,,,", often left at the end) and empty columns at the
 *   right are dropped, with a warning saying how many.
 * - Cells that hold no number: markers such as `NA`, `N/A`, `NaN`, `-` or `.` (MISSING_MARKERS) are
 *   never read silently: `missing` says whether they mean "no interaction" (0) or "not observed" (also 0
 *   in the network, since a matrix cannot hold "unknown", but counted and reported so the metadata records
 *   it); without it, a file holding such markers is refused with code "missing-values" naming them. Blank
 *   cells mean 0 (no interaction) as the format says, unless `blank` says "not observed"; either way they
 *   are counted. `ParseResult.missing` reports both.
 * - `.xlsx` workbooks (parseNetworkFile, asynchronous): one sheet is read as the table above (text cells as
 *   they are, numbers as numbers); with several sheets that hold data, `sheet` names it (else code
 *   "choose-sheet" lists them). Rows are the sheet's rows.
 * - Files that are not text (pictures, PDF, zip, a workbook renamed .csv…) are recognised by their first
 *   bytes (./signature.ts) and named for what they are (code "not-a-table"); a workbook whatever its name
 *   is read as a workbook by parseNetworkFile.
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
 * Node names: at most MAX_LABEL_CHARS characters and no control characters (code "bad-label").
 *
 * Errors: `NetworkParseError` with code, file, 1-based row (line) and column; warnings for rows, columns or
 * nodes with no link (kept), summed duplicates, ignored columns, shared labels and self-loops.
 */
import { parse as csvParse } from "csv-parse/browser/esm/sync";
import type { Network, NetworkKind } from "../types";
import { NetworkParseError, listLabels, type ParseWarning } from "./errors";
import { decodeUtf8, delimiterName, detectDelimiter, parseCellNumber, utf8Length } from "./text";
import { detectSignature, signatureAdvice, zipDeclaredSize } from "./signature";
import { looksLikeFormula } from "../../csv";

export type NetworkFileFormat = "matrix" | "edgelist";

/** What cells without a number mean, as the depositor says. */
export type CellMeaning = "no-interaction" | "not-observed";

/** Cell texts that mark a missing value (compared trimmed, case-insensitively). */
export const MISSING_MARKERS = ["NA", "N/A", "NaN", "-", "–", "—", ".", "?", "missing"] as const;
const MISSING_SET = new Set(MISSING_MARKERS.map((m) => m.toLowerCase()));

export function isMissingMarker(raw: string): boolean {
  const s = raw.trim();
  return s !== "" && s.length <= 7 && MISSING_SET.has(s.toLowerCase());
}

/** How the cells without a number were read. */
export interface MissingCells {
  /** The distinct marker texts found (e.g. ["NA"]), in order of first appearance. */
  markers: string[];
  markerCells: number;
  /** Meaning of the marker cells (null when there were none). */
  markerMeaning: CellMeaning | null;
  blankCells: number;
  blankMeaning: CellMeaning;
}

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
  /** What marker cells (NA, -, …) mean; required when the file has any. */
  missing?: CellMeaning;
  /** What blank matrix cells mean (default "no-interaction", i.e. 0). */
  blank?: CellMeaning;
  /** Workbooks: the sheet to read (by name). */
  sheet?: string;
}

export interface ParseResult {
  network: Network;
  format: NetworkFileFormat;
  delimiter: string;
  warnings: ParseWarning[];
  /** Cells that held no number and how they were read. */
  missing: MissingCells;
  /** Workbooks: the sheet read and every sheet of the workbook. */
  workbook?: { sheet: string; sheets: string[] };
}

export const DEFAULT_MAX_BYTES = 256 * 1024 * 1024;
/** Longest node name accepted (characters): taxon names with authority and notes fit well within it. */
export const MAX_LABEL_CHARS = 500;

/**
 * Why a node name is refused ("is 12000 characters long…", "contains a control character…"), or null.
 * Control characters (NUL, escape codes, DEL, C1…) would be invisible on pages and break downloads and the
 * database (NUL); tabs and line breaks inside quoted names are kept (CSV quoting carries them and pages
 * show them as spaces). Over-long names are almost always a broken file (a quote left open).
 */
export function labelProblem(label: string): string | null {
  if (label.length > MAX_LABEL_CHARS) {
    return `"${label.slice(0, 30)}…" is ${label.length} characters long; at most ${MAX_LABEL_CHARS} are accepted (a quote left open makes a long name of the lines after it)`;
  }
  // eslint-disable-next-line no-control-regex
  const m = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/.exec(label);
  if (m) {
    const code = `U+${m[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}`;
    return `${JSON.stringify(label.length > 60 ? label.slice(0, 60) + "…" : label)} contains a control character (${code}, at character ${m.index + 1}); remove it`;
  }
  return null;
}
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
  checkOptions(options);
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  const maxCells = options.maxCells ?? DEFAULT_MAX_CELLS;
  const byteLength = typeof text === "string" ? (text.length * 3 <= maxBytes ? text.length : utf8Length(text)) : text.length;
  if (byteLength > maxBytes) {
    throw new NetworkParseError("too-large", whole, `the file has ${byteLength} bytes, more than the limit of ${maxBytes}`);
  }
  if (typeof text !== "string") {
    const sig = detectSignature(text);
    if (sig) {
      throw new NetworkParseError("not-a-table", whole, `the file is ${sig.what}, not a table of text: ${signatureAdvice(sig)}`, { fileType: sig.type });
    }
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

/** Checks of the options shared by text and workbook parsing. */
function checkOptions(options: ParseOptions): void {
  const whole = { file: options.fileName, row: null, column: null };
  if (options.kind !== "bipartite" && options.kind !== "unipartite") {
    throw new NetworkParseError("bad-option", whole, `kind must be "bipartite" or "unipartite", got ${String(options.kind)}`);
  }
  if (options.kind === "bipartite" && options.directed) {
    throw new NetworkParseError("bad-option", whole, "a bipartite network cannot be directed; the directed flag is for one-mode networks (food webs)");
  }
  for (const k of ["missing", "blank"] as const) {
    const v = options[k];
    if (v !== undefined && v !== "no-interaction" && v !== "not-observed") {
      throw new NetworkParseError("bad-option", whole, `${k} must be "no-interaction" or "not-observed", got ${String(v)}`);
    }
  }
}

/** Text of a workbook cell as the table reader sees it. */
function workbookCellText(v: unknown): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : "";
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  if (v instanceof Date) return Number.isNaN(v.getTime()) ? "" : v.toISOString().slice(0, 10);
  return String(v);
}

/**
 * Parses any network file: an .xlsx workbook (recognised by its content, whatever its name) or a text table
 * (parseNetworkText). Asynchronous because the workbook reader is.
 */
export async function parseNetworkFile(bytes: Uint8Array, options: ParseOptions): Promise<ParseResult> {
  const sig = detectSignature(bytes);
  if (sig?.type !== "xlsx") return parseNetworkText(bytes, options);
  checkOptions(options);
  const file = options.fileName;
  const whole = { file, row: null, column: null };
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  const maxCells = options.maxCells ?? DEFAULT_MAX_CELLS;
  if (bytes.length > maxBytes) throw new NetworkParseError("too-large", whole, `the file has ${bytes.length} bytes, more than the limit of ${maxBytes}`);
  const expanded = zipDeclaredSize(bytes);
  if (expanded === null) throw new NetworkParseError("bad-workbook", whole, "the workbook is damaged: its zip directory cannot be read");
  if (expanded > maxBytes * 4) {
    throw new NetworkParseError("too-large", whole, `the workbook expands to ${expanded} bytes, more than the limit of ${maxBytes * 4}`);
  }
  const { default: readXlsxFile } = await import("read-excel-file/universal");
  let sheets: Array<{ sheet: string; data: unknown[][] }>;
  try {
    const ab = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
    sheets = (await readXlsxFile(ab, { trim: false })) as unknown as Array<{ sheet: string; data: unknown[][] }>;
  } catch (err) {
    throw new NetworkParseError("bad-workbook", whole, `the workbook cannot be read: ${(err as Error).message ?? String(err)}`);
  }
  const names = sheets.map((s) => s.sheet);
  const withData = sheets.filter((s) => s.data.some((r) => r.some((c) => workbookCellText(c).trim() !== "")));
  let chosen: { sheet: string; data: unknown[][] } | undefined;
  if (options.sheet !== undefined) {
    chosen = sheets.find((s) => s.sheet === options.sheet);
    if (!chosen) throw new NetworkParseError("choose-sheet", whole, `the workbook has no sheet "${options.sheet}"; its sheets are ${listLabels(names)}`, { sheets: names });
  } else if (withData.length === 1) chosen = withData[0];
  else if (withData.length === 0) throw new NetworkParseError("empty-file", whole, `every sheet of the workbook is empty (${listLabels(names)})`);
  else throw new NetworkParseError("choose-sheet", whole, `the workbook has ${withData.length} sheets with data (${listLabels(withData.map((s) => s.sheet))}); choose the sheet that holds the network`, { sheets: withData.map((s) => s.sheet) });
  const where = `${file} (sheet "${chosen.sheet}")`;
  const sink = new RecordSink(options, where, ",", false, maxCells);
  chosen.data.forEach((row, i) => {
    const rec = row.map(workbookCellText);
    if (rec.length) sink.record(rec, i + 1);
  });
  const result = sink.finish();
  result.delimiter = "";
  result.workbook = { sheet: chosen.sheet, sheets: names };
  if (sig && !/\.xlsx$/i.test(file)) {
    result.warnings.unshift({ code: "file-type", file, row: null, column: null, count: 1, message: `the file is ${sig.what} although its name does not end in .xlsx; it was read as a workbook` });
  }
  return result;
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

  // Spreadsheet and R shapes
  private headerNames: string[] | null = null;
  private headerCells = 0;
  private droppedRows = 0;
  private firstDroppedRow = 0;
  private readonly missingOpt: CellMeaning | undefined;
  private readonly blankOpt: CellMeaning;
  private readonly markers: string[] = [];
  private markerCells = 0;
  private firstMarker: { line: number; column: number } | null = null;
  private blankCells = 0;

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
    this.missingOpt = options.missing;
    this.blankOpt = options.blank ?? "no-interaction";
    this.rowPtr.push(0);
  }

  /** A cell holding a missing-value marker: counted; its meaning decides later (both read as 0). */
  private marker(raw: string, line: number, column: number): void {
    const m = raw.trim();
    if (!this.markers.includes(m)) this.markers.push(m);
    this.markerCells++;
    if (!this.firstMarker) this.firstMarker = { line, column };
  }

  private fail(code: ConstructorParameters<typeof NetworkParseError>[0], row: number | null, column: number | null, detail: string): never {
    throw new NetworkParseError(code, { file: this.file, row, column }, detail);
  }

  /** A node name: at most MAX_LABEL_CHARS characters, no control characters. */
  private checkLabel(label: string, line: number, column: number, what: string): void {
    const problem = labelProblem(label);
    if (problem) this.fail("bad-label", line, column, `the ${what} node name ${problem}`);
  }

  record(rec: string[], line: number): void {
    let blank = true;
    for (let k = 0; k < rec.length; k++) if (rec[k] !== "" && rec[k].trim() !== "") { blank = false; break; }
    if (blank) {
      // A row of empty fields (",,,,"), as spreadsheet exports leave below the table: dropped, reported.
      this.droppedRows++;
      if (this.firstDroppedRow === 0) this.firstDroppedRow = line;
      return;
    }
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
    // The column labels are settled by the first data row: R's write.table leaves out the corner cell.
    let width = names.length;
    while (width > 0 && names[width - 1] === "") width--;
    this.headerCells = names.length;
    this.headerNames = names.slice(0, width);
  }

  /** Settles the matrix header once the first data row shows whether the corner cell is there. */
  private matrixHeader(first: string[]): void {
    const names = this.headerNames!;
    const line = this.headerLine;
    this.headerNames = null;
    let firstWidth = first.length;
    while (firstWidth > 0 && first[firstWidth - 1].trim() === "") firstWidth--;
    const noCorner = names.length >= 1 && names[0] !== "" && firstWidth === names.length + 1;
    const labels = noCorner ? names : names.slice(1);
    const offset = noCorner ? 1 : 2;
    if (labels.length === 0) {
      this.fail("bad-header", line, null,
        `the first row must name the column nodes after a corner cell, but it has no column names (delimiter detected: ${delimiterName(this.delimiter)})`);
    }
    const seen = new Map<string, number>();
    labels.forEach((label, k) => {
      if (label === "") this.fail("empty-label", line, k + offset, "the column node name is empty");
      this.checkLabel(label, line, k + offset, "column");
      const prev = seen.get(label);
      if (prev !== undefined) {
        this.fail("duplicate-node", line, k + offset, `column node "${label}" is named twice (also column ${prev + offset})`);
      }
      seen.set(label, k);
    });
    this.colLabels = labels;
    if (noCorner) {
      this.warnings.push({
        code: "header-without-corner", file: this.file, row: line, column: 1, count: 1,
        message: `the first row has one cell fewer than the data rows (no corner cell, as R's write.table writes it), so its first cell "${labels[0]}" names the first column node`,
      });
    }
    const emptyRight = this.headerCells - (noCorner ? labels.length : labels.length + 1);
    if (emptyRight > 0) {
      this.warnings.push({
        code: "dropped-empty-columns", file: this.file, row: line, column: this.headerCells - emptyRight + 1, count: emptyRight,
        message: `${emptyRight} empty column(s) at the right of the table (no name, no values) were dropped`,
      });
    }
  }

  private matrixRow(rec: string[], line: number): void {
    if (this.headerNames) this.matrixHeader(rec);
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
    this.checkLabel(label, line, 1, "row");
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
      if (raw === "0") continue;
      if (raw === "") {
        this.blankCells++;
        continue;
      }
      const v = raw === "1" ? 1 : parseCellNumber(raw, this.decimalComma);
      if (v === 0) {
        if (raw.trim() === "") this.blankCells++;
        continue;
      }
      if (!Number.isFinite(v)) {
        if (isMissingMarker(raw)) {
          this.marker(raw, line, j + 2);
          continue;
        }
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
    this.checkLabel(s, line, this.srcCol + 1, "source");
    this.checkLabel(t, line, this.tgtCol + 1, "target");
    let weight = 1;
    if (this.wCol >= 0) {
      const raw = rec[this.wCol];
      if (raw.trim() === "") this.fail("non-numeric", line, this.wCol + 1, "the weight is empty; give a non-negative number");
      weight = parseCellNumber(raw, this.decimalComma);
      if (!Number.isFinite(weight) && isMissingMarker(raw)) {
        this.marker(raw, line, this.wCol + 1);
        weight = 0;
      }
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
    if (this.headerNames) this.fail("empty-file", this.headerLine, null, "the matrix has a header row but no data rows");
    if (this.markerCells > 0 && this.missingOpt === undefined) {
      const at = this.firstMarker!;
      throw new NetworkParseError("missing-values", { file: this.file, row: at.line, column: at.column },
        `${this.markerCells} cell(s) hold ${listLabels(this.markers)} instead of a number (first at row ${at.line}, column ${at.column}); say whether they mean "no interaction" or "not observed" (upload option missing=no-interaction or missing=not-observed)`,
        { markers: this.markers, cells: this.markerCells });
    }
    const net = this.format === "matrix" ? this.finishMatrix() : this.finishEdgeList();
    this.checkLinksAndWarn(net);
    if (this.droppedRows > 0) {
      this.warnings.push({
        code: "dropped-empty-rows", file: this.file, row: this.firstDroppedRow, column: null, count: this.droppedRows,
        message: `${this.droppedRows} row(s) with no name and no value (e.g. left below the table by a spreadsheet export) were dropped`,
      });
    }
    const missing: MissingCells = {
      markers: this.markers,
      markerCells: this.markerCells,
      markerMeaning: this.markerCells > 0 ? this.missingOpt ?? null : null,
      blankCells: this.blankCells,
      blankMeaning: this.blankOpt,
    };
    if (this.markerCells > 0) {
      const at = this.firstMarker!;
      this.warnings.push({
        code: "missing-values", file: this.file, row: at.line, column: at.column, count: this.markerCells, labels: this.markers,
        message: `${this.markerCells} cell(s) holding ${listLabels(this.markers)} were read as ${this.missingOpt === "not-observed" ? "not observed (no link in the network; recorded in the metadata)" : "no interaction (0)"}`,
      });
    }
    if (this.blankCells > 0 && this.blankOpt === "not-observed") {
      this.warnings.push({
        code: "missing-values", file: this.file, row: null, column: null, count: this.blankCells, labels: [""],
        message: `${this.blankCells} empty cell(s) were read as not observed (no link in the network; recorded in the metadata)`,
      });
    }
    return { network: net, format: this.format, delimiter: this.delimiter, warnings: this.warnings, missing };
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
    if (this.colLabels.every((l) => !this.rowIndex.has(l))) {
      this.fail("label-mismatch", this.headerLine, 2,
        `no column name appears among the row names (rows ${listLabels(this.rowLabels, 3)}; columns ${listLabels(this.colLabels, 3)}): this looks like a bipartite incidence matrix of two kinds of nodes; read it as bipartite`);
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
    } else this.warnTwoMode(src, tgt, nE, I);
    return this.makeNetwork(outPtr, outCol.slice(0, out), outW.slice(0, out), this.kind === "bipartite" ? this.colLabels : this.rowLabels);
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
    this.warnings.push({
      code: "two-mode", file: this.file, row: null, column: null, count: sources + targets,
      message: `no name appears both as a source and as a target (${sources} sources, ${targets} targets): this looks like a two-mode network of two kinds of nodes; read it as bipartite (sources as rows, targets as columns) if so`,
    });
  }

  private warnShared(shared: string[]): void {
    if (shared.length === 0) return;
    this.warnings.push({
      code: "shared-labels", file: this.file, row: null, column: null, count: shared.length, labels: shared,
      message: `${shared.length} name(s) label both a row node and a column node, which are kept as different nodes: ${listLabels(shared)}`,
    });
  }

  private warnFormulaLike(labels: string[]): void {
    const found = labels.filter(looksLikeFormula);
    if (found.length === 0) return;
    this.warnings.push({
      code: "formula-like-labels", file: this.file, row: null, column: null, count: found.length, labels: found,
      message: `${found.length} label(s) begin like a spreadsheet formula ("=", "+", "-" or "@"): ${listLabels(found)}. They are kept exactly as written; a spreadsheet program may run them as formulas when a CSV file is opened in it, so the network's CSV download offers a spreadsheet-safe form (a leading apostrophe)`,
    });
  }

  private makeNetwork(rowPtr: Uint32Array, colIdx: Uint32Array, weights: Float64Array, colLabels: string[]): Network {
    this.warnFormulaLike(this.kind === "bipartite" ? [...this.rowLabels, ...colLabels] : this.rowLabels);
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
