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
 *
 * Files: this one reads text (decoding and delimiter detection in text.ts, the format's signature in
 * signature.ts); workbook.ts reads .xlsx sheets; both feed records to record-sink.ts, which reads the
 * header (headers.ts: format, column names, node names) and hands the rows to matrix-reader.ts or
 * edge-list-reader.ts; cells.ts counts cells without a number; finish.ts builds the Network and its
 * warnings; options.ts holds the options, the result and the limits; errors.ts the errors and warnings.
 */
import { parse as csvParse } from "csv-parse/browser/esm/sync";
import { NetworkParseError } from "./errors";
import { decodeUtf8, delimiterName, detectDelimiter, utf8Length } from "./text";
import { detectSignature, signatureAdvice } from "./signature";
import { checkOptions, DEFAULT_MAX_BYTES, DEFAULT_MAX_CELLS, type ParseOptions, type ParseResult } from "./options";
import { RecordSink } from "./record-sink";

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
