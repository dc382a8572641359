/**
 * Receives one record (a row of cells) at a time from the text or workbook reader and builds the network:
 * rows with no value at all are dropped (counted), the first row left is the header, which decides the
 * format and hands the rest to the matrix or edge-list reader; `finish` builds the network and gathers
 * the warnings and the tally of cells without a number.
 */
import { fail, type ReadContext } from "./context";
import { CellTally } from "./cells";
import { EdgeListReader } from "./edge-list-reader";
import { checkLinks } from "./finish";
import { formatOf } from "./headers";
import { MatrixReader } from "./matrix-reader";
import type { NetworkFileFormat, ParseOptions, ParseResult } from "./options";

export class RecordSink {
  private readonly ctx: ReadContext;
  private readonly requested: "auto" | NetworkFileFormat;
  private matrix: MatrixReader | null = null;
  private edges: EdgeListReader | null = null;
  private droppedRows = 0;
  private firstDroppedRow = 0;

  constructor(options: ParseOptions, file: string, delimiter: string, decimalComma: boolean, maxCells: number) {
    this.ctx = {
      file,
      kind: options.kind,
      directed: options.kind === "unipartite" && options.directed === true,
      delimiter,
      decimalComma,
      maxCells,
      warnings: [],
      cells: new CellTally(options.missing, options.blank ?? "no-interaction"),
    };
    this.requested = options.format ?? "auto";
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
    if (this.matrix) this.matrix.row(rec, line);
    else if (this.edges) this.edges.row(rec, line);
    else this.header(rec, line);
  }

  private header(rec: string[], line: number): void {
    const names = rec.map((s) => s.trim());
    const lower = names.map((s) => s.toLowerCase());
    if (formatOf(lower, this.requested) === "edgelist") this.edges = new EdgeListReader(this.ctx, names, lower, line);
    else this.matrix = new MatrixReader(this.ctx, names, line);
  }

  finish(): ParseResult {
    const ctx = this.ctx;
    const reader = this.matrix ?? this.edges;
    if (reader === null) fail(ctx, "empty-file", null, null, "the file is empty");
    if (this.matrix?.waitingForRows) fail(ctx, "empty-file", this.matrix.headerLine, null, "the matrix has a header row but no data rows");
    ctx.cells.checkMeaning(ctx.file);
    const net = reader.finish();
    const format: NetworkFileFormat = this.matrix ? "matrix" : "edgelist";
    checkLinks(ctx, net, format === "matrix", reader.rowLine.a, reader.headerLine);
    if (this.droppedRows > 0) {
      ctx.warnings.push({
        code: "dropped-empty-rows", file: ctx.file, row: this.firstDroppedRow, column: null, count: this.droppedRows,
        message: `${this.droppedRows} row(s) with no name and no value (e.g. left below the table by a spreadsheet export) were dropped`,
      });
    }
    const missing = ctx.cells.summary();
    ctx.cells.warn(ctx.file, ctx.warnings);
    return { network: net, format, delimiter: ctx.delimiter, warnings: ctx.warnings, missing };
  }
}
