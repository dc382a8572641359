/**
 * What the readers of one file share while its records stream past: where it is (the file, or the file
 * and its sheet), the network asked for, the text's delimiter, the limits, the warnings so far and the
 * tally of cells without a number.
 */
import type { NetworkKind } from "../types";
import { NetworkParseError, type NetworkParseErrorCode, type ParseWarning } from "./errors";
import type { CellTally } from "./cells";

export interface ReadContext {
  /** The file's name as errors and warnings name it (a workbook's adds its sheet). */
  readonly file: string;
  readonly kind: NetworkKind;
  /** One-mode and directed. */
  readonly directed: boolean;
  readonly delimiter: string;
  /** Semicolon-delimited text: "0,5" is a number. */
  readonly decimalComma: boolean;
  readonly maxCells: number;
  readonly warnings: ParseWarning[];
  readonly cells: CellTally;
}

/** Throws the parse error `code` at (row, column) of the context's file. */
export function fail(ctx: { readonly file: string }, code: NetworkParseErrorCode, row: number | null, column: number | null, detail: string): never {
  throw new NetworkParseError(code, { file: ctx.file, row, column }, detail);
}
