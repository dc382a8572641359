/**
 * Typed parse errors and warnings. Every problem names the file, the 1-based line ("row") in the file and
 * the 1-based field ("column") where it was found, when they apply, and says what is wrong.
 */
export type NetworkParseErrorCode =
  | "empty-file"
  | "not-utf8"
  | "bad-csv"
  | "bad-header"
  | "empty-label"
  /** A node name that is too long or holds control characters. */
  | "bad-label"
  | "non-numeric"
  | "negative"
  | "ragged-row"
  | "duplicate-node"
  | "no-links"
  | "self-loop-bipartite"
  | "too-large"
  | "not-square"
  | "label-mismatch"
  | "not-symmetric"
  | "bad-option"
  /** The file is not a text table (a picture, PDF, zip…: named from its first bytes). */
  | "not-a-table"
  /** Cells hold NA-like markers and the depositor has not said what they mean. */
  | "missing-values"
  /** A workbook with several sheets of data and no sheet chosen (or an unknown one). */
  | "choose-sheet"
  /** A workbook that cannot be read. */
  | "bad-workbook";

export interface ParseLocation {
  file: string;
  /** 1-based line in the file, null when the problem concerns the whole file. */
  row: number | null;
  /** 1-based field within the line, null when the problem concerns a whole line or file. */
  column: number | null;
}

export function describeLocation(loc: ParseLocation): string {
  let s = loc.file || "(unnamed file)";
  if (loc.row !== null) s += `, row ${loc.row}`;
  if (loc.column !== null) s += `, column ${loc.column}`;
  return s;
}

export class NetworkParseError extends Error {
  readonly code: NetworkParseErrorCode;
  readonly file: string;
  readonly row: number | null;
  readonly column: number | null;
  /** The problem without the location prefix. */
  readonly detail: string;
  /** What a program needs to offer a choice: the sheets to choose from, the markers found, the file type. */
  readonly extra?: Record<string, unknown>;
  constructor(code: NetworkParseErrorCode, loc: ParseLocation, detail: string, extra?: Record<string, unknown>) {
    super(`${describeLocation(loc)}: ${detail}`);
    this.name = "NetworkParseError";
    this.code = code;
    this.file = loc.file;
    this.row = loc.row;
    this.column = loc.column;
    this.detail = detail;
    if (extra) this.extra = extra;
  }
  toJSON(): { code: string; message: string; file: string; row: number | null; column: number | null; extra?: Record<string, unknown> } {
    return { code: this.code, message: this.message, file: this.file, row: this.row, column: this.column, ...(this.extra ? { extra: this.extra } : {}) };
  }
}

export type ParseWarningCode =
  /** Row nodes of an incidence matrix (or sources of a bipartite edge list) with no link; kept. */
  | "empty-rows"
  /** Column nodes with no link; kept. */
  | "empty-columns"
  /** One-mode nodes with no link at all; kept. */
  | "isolated-nodes"
  /** Edge-list pairs given more than once; their weights were summed. */
  | "duplicate-links"
  /** Edge-list columns other than source, target and weight; ignored. */
  | "ignored-columns"
  /** A label used for both a row node and a column node of a bipartite network; they are different nodes. */
  | "shared-labels"
  /** Self-loops (cannibal links) in a one-mode network; kept. */
  | "self-loops"
  /** A matrix header one cell short (R's write.table): its first cell names the first column node. */
  | "header-without-corner"
  /** Rows with no name and no value (spreadsheet exports); dropped. */
  | "dropped-empty-rows"
  /** Columns with no name and no value at the right; dropped. */
  | "dropped-empty-columns"
  /** Cells with NA-like markers (or blank cells read as not observed), and how they were read. */
  | "missing-values"
  /** A one-mode edge list whose sources and targets are two disjoint sets of names. */
  | "two-mode"
  /** Labels beginning like a spreadsheet formula ("=", "+", "-", "@"); kept exactly as written. */
  | "formula-like-labels"
  /** The file's content is of another type than its name says (e.g. a workbook named .csv). */
  | "file-type";

export interface ParseWarning extends ParseLocation {
  code: ParseWarningCode;
  message: string;
  /** How many nodes/links/columns the warning concerns. */
  count: number;
  /** The labels concerned (all of them; the message shows the first few). */
  labels?: string[];
}

export function listLabels(labels: string[], max = 10): string {
  const shown = labels.slice(0, max).map((l) => `"${l}"`).join(", ");
  return labels.length > max ? `${shown} and ${labels.length - max} more` : shown;
}
