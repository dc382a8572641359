/**
 * Cells without a number. Markers such as `NA`, `N/A`, `NaN`, `-` or `.` (MISSING_MARKERS) are never read
 * silently: the depositor says whether they mean "no interaction" or "not observed" (both 0 in the
 * network, which cannot hold "unknown"; counted and reported so the metadata records it), else the file
 * is refused with code "missing-values" naming them. Blank cells mean 0 unless `blank` says "not
 * observed"; either way they are counted. The readers parse the numbers themselves (text.ts,
 * parseCellNumber) and count the cells here.
 */
import { NetworkParseError, listLabels, type ParseWarning } from "./errors";
import type { CellMeaning, MissingCells } from "./options";

/** Cell texts that mark a missing value (compared trimmed, case-insensitively). */
export const MISSING_MARKERS = ["NA", "N/A", "NaN", "-", "–", "—", ".", "?", "missing"] as const;
const MISSING_SET = new Set(MISSING_MARKERS.map((m) => m.toLowerCase()));

export function isMissingMarker(raw: string): boolean {
  const s = raw.trim();
  return s !== "" && s.length <= 7 && MISSING_SET.has(s.toLowerCase());
}

/** The count of marker and blank cells of one file, with what the depositor said they mean. */
export class CellTally {
  readonly markers: string[] = [];
  markerCells = 0;
  firstMarker: { line: number; column: number } | null = null;
  blankCells = 0;

  constructor(
    private readonly missingOpt: CellMeaning | undefined,
    private readonly blankOpt: CellMeaning,
  ) {}

  /** A cell holding a missing-value marker: counted; its meaning decides later (both read as 0). */
  marker(raw: string, line: number, column: number): void {
    const m = raw.trim();
    if (!this.markers.includes(m)) this.markers.push(m);
    this.markerCells++;
    if (!this.firstMarker) this.firstMarker = { line, column };
  }

  /** Refuses the file when it holds markers and the depositor has not said what they mean. */
  checkMeaning(file: string): void {
    if (this.markerCells > 0 && this.missingOpt === undefined) {
      const at = this.firstMarker!;
      throw new NetworkParseError("missing-values", { file, row: at.line, column: at.column },
        `${this.markerCells} cell(s) hold ${listLabels(this.markers)} instead of a number (first at row ${at.line}, column ${at.column}); say whether they mean "no interaction" or "not observed" (upload option missing=no-interaction or missing=not-observed)`,
        { markers: this.markers, cells: this.markerCells });
    }
  }

  summary(): MissingCells {
    return {
      markers: this.markers,
      markerCells: this.markerCells,
      markerMeaning: this.markerCells > 0 ? this.missingOpt ?? null : null,
      blankCells: this.blankCells,
      blankMeaning: this.blankOpt,
    };
  }

  /** The warnings saying how marker cells, and blank cells read as not observed, were read. */
  warn(file: string, warnings: ParseWarning[]): void {
    if (this.markerCells > 0) {
      const at = this.firstMarker!;
      warnings.push({
        code: "missing-values", file, row: at.line, column: at.column, count: this.markerCells, labels: this.markers,
        message: `${this.markerCells} cell(s) holding ${listLabels(this.markers)} were read as ${this.missingOpt === "not-observed" ? "not observed (no link in the network; recorded in the metadata)" : "no interaction (0)"}`,
      });
    }
    if (this.blankCells > 0 && this.blankOpt === "not-observed") {
      warnings.push({
        code: "missing-values", file, row: null, column: null, count: this.blankCells, labels: [""],
        message: `${this.blankCells} empty cell(s) were read as not observed (no link in the network; recorded in the metadata)`,
      });
    }
  }
}
