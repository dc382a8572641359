/**
 * The one CSV writer of Tanglebank: every CSV the product writes (network matrices and edge lists, bundle
 * tables, the metadata sheet, partition downloads, the compare table, the demo's files) quotes its fields
 * here, and the fast matrix writer of the server (server/src/lib/matrix-csv.ts) uses `quoteField` for its
 * labels, so every file follows one rule.
 *
 * The rule (RFC 4180): a field holding the delimiter, a double quote, a line break (CR or LF) or outer
 * white space (what String.prototype.trim removes, Unicode spaces included) is written between double
 * quotes, its quotes doubled; any other field is written as it is. Empty values (null, undefined) are
 * empty fields; numbers are written in JavaScript's shortest round-trip form.
 */

export type CsvDelimiter = "," | "\t" | ";";

/**
 * Text that spreadsheet programs may read as a formula when a CSV file is opened in them: it begins with
 * "=", "+", "-" or "@", or with a tab or carriage return before one of those (OWASP, "CSV Injection").
 * Tanglebank keeps labels exactly as deposited; the parser warns about such labels and the network CSV
 * can be downloaded in a spreadsheet-safe form (`spreadsheetSafe`).
 */
export function looksLikeFormula(s: string): boolean {
  return /^[\t\r]*[=+\-@]/.test(s);
}

/**
 * A label as written in a spreadsheet-safe CSV file: formula-like text gets a leading apostrophe, which
 * spreadsheet programs read as "this cell is text" and do not show. Any other text is unchanged.
 */
export function spreadsheetSafe(s: string): string {
  return looksLikeFormula(s) ? `'${s}` : s;
}

export interface CsvTextOptions {
  delimiter?: CsvDelimiter;
  /** Line ending (default "\n"; spreadsheet-facing files use "\r\n"). Every line ends with it, the last too. */
  eol?: "\n" | "\r\n";
  /** Start with a UTF-8 byte-order mark (so spreadsheet programs read accents right). */
  bom?: boolean;
}

/** White space and line terminators of ECMAScript (the characters trim() removes). */
function isTrimmed(c: number): boolean {
  if (c <= 0x20) return c === 0x20 || (c >= 0x09 && c <= 0x0d);
  if (c < 0xa0) return false;
  return c === 0xa0 || c === 0x1680 || (c >= 0x2000 && c <= 0x200a) || c === 0x2028 || c === 0x2029 || c === 0x202f || c === 0x205f || c === 0x3000 || c === 0xfeff;
}

/** True when the field must be quoted: the delimiter, a quote or a line break inside, or outer white space. One pass. */
export function needsQuotes(s: string, delimiter: CsvDelimiter = ","): boolean {
  const n = s.length;
  if (n === 0) return false;
  if (isTrimmed(s.charCodeAt(0)) || isTrimmed(s.charCodeAt(n - 1))) return true;
  const d = delimiter.charCodeAt(0);
  for (let k = 0; k < n; k++) {
    const c = s.charCodeAt(k);
    if (c === d || c === 0x22 || c === 0x0a || c === 0x0d) return true;
  }
  return false;
}

/** A text field as written in a CSV file (quoted only when needed). */
export function quoteField(s: string, delimiter: CsvDelimiter = ","): string {
  return needsQuotes(s, delimiter) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Any value as a field: null and undefined empty, numbers as JavaScript writes them, the rest as quoted text. */
export function csvCell(v: unknown, delimiter: CsvDelimiter = ","): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "number") return String(v);
  return quoteField(String(v), delimiter);
}

/** One line of fields (without its line ending). */
export function csvLine(values: readonly unknown[], delimiter: CsvDelimiter = ","): string {
  let out = "";
  for (let k = 0; k < values.length; k++) out += (k ? delimiter : "") + csvCell(values[k], delimiter);
  return out;
}

/** A whole file from its rows (the header first). */
export function csvText(rows: ReadonlyArray<readonly unknown[]>, options: CsvTextOptions = {}): string {
  const eol = options.eol ?? "\n";
  let out = options.bom ? "\ufeff" : "";
  for (const r of rows) out += csvLine(r, options.delimiter ?? ",") + eol;
  return out;
}
