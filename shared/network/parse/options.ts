/**
 * What the parser is asked (ParseOptions) and what it answers (ParseResult), its limits, and the checks of
 * the options that text and workbook parsing share.
 */
import type { Network, NetworkKind } from "../types";
import { NetworkParseError, type ParseWarning } from "./errors";

export type NetworkFileFormat = "matrix" | "edgelist";

/** What cells without a number mean, as the depositor says. */
export type CellMeaning = "no-interaction" | "not-observed";

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
export const DEFAULT_MAX_CELLS = 25_000_000;

/** Checks of the options shared by text and workbook parsing. */
export function checkOptions(options: ParseOptions): void {
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
