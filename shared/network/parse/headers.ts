/**
 * Header rows and node names. The header decides the format (format "auto": an edge list when it has
 * `source` and `target` cells, else a matrix). An edge list's header names its source, target and optional
 * weight columns (any order, any case; other columns ignored with a warning). A matrix's header names the
 * column nodes after a corner cell, settled by the first data row: R's `write.table` leaves the corner
 * out (a header one cell shorter than the data rows), and empty columns at the right are dropped. Node
 * names are at most MAX_LABEL_CHARS characters with no control characters (code "bad-label").
 */
import { listLabels } from "./errors";
import { delimiterName } from "./text";
import { fail, type ReadContext } from "./context";
import type { NetworkFileFormat } from "./options";

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

/** A node name: at most MAX_LABEL_CHARS characters, no control characters. */
export function checkLabel(ctx: ReadContext, label: string, line: number, column: number, what: string): void {
  const problem = labelProblem(label);
  if (problem) fail(ctx, "bad-label", line, column, `the ${what} node name ${problem}`);
}

/** The format of a file from its header's cells (trimmed, lower case) and the format asked for. */
export function formatOf(lower: string[], requested: "auto" | NetworkFileFormat): NetworkFileFormat {
  const looksEdge = lower.includes("source") && lower.includes("target");
  if (requested === "auto") return looksEdge ? "edgelist" : "matrix";
  return requested;
}

/** The cells of a header before its empty cells at the right. */
function widthOf(names: string[]): number {
  let width = names.length;
  while (width > 0 && names[width - 1] === "") width--;
  return width;
}

/** An edge list's columns (0-based; weight -1 when absent) and the header's width. */
export interface EdgeListColumns {
  src: number;
  tgt: number;
  weight: number;
  width: number;
}

/** Reads an edge list's header (its cells trimmed, and in lower case): refused without source and target. */
export function edgeListColumns(ctx: ReadContext, names: string[], lower: string[], line: number): EdgeListColumns {
  const find = (name: string) => {
    const first = lower.indexOf(name);
    if (first >= 0 && lower.indexOf(name, first + 1) >= 0) {
      fail(ctx, "bad-header", line, lower.indexOf(name, first + 1) + 1, `the header has two "${name}" columns`);
    }
    return first;
  };
  const src = find("source");
  const tgt = find("target");
  const weight = find("weight");
  if (src < 0 || tgt < 0) {
    fail(ctx, "bad-header", line, null,
      `an edge list needs a header with "source" and "target" columns (and optionally "weight"); found ${listLabels(names)}`);
  }
  const width = widthOf(names);
  const ignored = names.slice(0, width).filter((_, k) => k !== src && k !== tgt && k !== weight);
  if (ignored.length > 0) {
    ctx.warnings.push({
      code: "ignored-columns", file: ctx.file, row: line, column: null, count: ignored.length, labels: ignored,
      message: `columns other than source, target and weight were ignored: ${listLabels(ignored)}`,
    });
  }
  return { src, tgt, weight, width };
}

/** A matrix header as read, waiting for the first data row to settle its column labels. */
export interface PendingMatrixHeader {
  /** The header's cells (trimmed) before its empty cells at the right. */
  names: string[];
  /** How many cells the header has, empty ones included. */
  cells: number;
  line: number;
}

export function pendingMatrixHeader(names: string[], line: number): PendingMatrixHeader {
  return { names: names.slice(0, widthOf(names)), cells: names.length, line };
}

/**
 * The column node names of a matrix, once the first data row shows whether the corner cell is there:
 * every name present, valid and named once; warnings for a header without corner and dropped empty
 * columns at the right.
 */
export function matrixColumnLabels(ctx: ReadContext, header: PendingMatrixHeader, first: string[]): string[] {
  const { names, line } = header;
  let firstWidth = first.length;
  while (firstWidth > 0 && first[firstWidth - 1].trim() === "") firstWidth--;
  const noCorner = names.length >= 1 && names[0] !== "" && firstWidth === names.length + 1;
  const labels = noCorner ? names : names.slice(1);
  const offset = noCorner ? 1 : 2;
  if (labels.length === 0) {
    fail(ctx, "bad-header", line, null,
      `the first row must name the column nodes after a corner cell, but it has no column names (delimiter detected: ${delimiterName(ctx.delimiter)})`);
  }
  const seen = new Map<string, number>();
  labels.forEach((label, k) => {
    if (label === "") fail(ctx, "empty-label", line, k + offset, "the column node name is empty");
    checkLabel(ctx, label, line, k + offset, "column");
    const prev = seen.get(label);
    if (prev !== undefined) {
      fail(ctx, "duplicate-node", line, k + offset, `column node "${label}" is named twice (also column ${prev + offset})`);
    }
    seen.set(label, k);
  });
  if (noCorner) {
    ctx.warnings.push({
      code: "header-without-corner", file: ctx.file, row: line, column: 1, count: 1,
      message: `the first row has one cell fewer than the data rows (no corner cell, as R's write.table writes it), so its first cell "${labels[0]}" names the first column node`,
    });
  }
  const emptyRight = header.cells - (noCorner ? labels.length : labels.length + 1);
  if (emptyRight > 0) {
    ctx.warnings.push({
      code: "dropped-empty-columns", file: ctx.file, row: line, column: header.cells - emptyRight + 1, count: emptyRight,
      message: `${emptyRight} empty column(s) at the right of the table (no name, no values) were dropped`,
    });
  }
  return labels;
}
