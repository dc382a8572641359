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
  | "bad-option";

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
  constructor(code: NetworkParseErrorCode, loc: ParseLocation, detail: string) {
    super(`${describeLocation(loc)}: ${detail}`);
    this.name = "NetworkParseError";
    this.code = code;
    this.file = loc.file;
    this.row = loc.row;
    this.column = loc.column;
    this.detail = detail;
  }
  toJSON(): { code: string; message: string; file: string; row: number | null; column: number | null } {
    return { code: this.code, message: this.message, file: this.file, row: this.row, column: this.column };
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
  | "self-loops";

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
