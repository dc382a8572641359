/**
 * `.xlsx` workbooks (parseNetworkFile, asynchronous because the workbook reader is): one sheet is read as
 * the table parse.ts describes (text cells as they are, numbers as numbers, rows as the sheet's rows);
 * with several sheets that hold data, `sheet` names it (else code "choose-sheet" lists them). A workbook
 * is recognised by its content whatever its name; its expanded size is checked before it is read.
 */
import { NetworkParseError, listLabels } from "./errors";
import { detectSignature, zipDeclaredSize } from "./signature";
import { checkOptions, DEFAULT_MAX_BYTES, DEFAULT_MAX_CELLS, type ParseOptions, type ParseResult } from "./options";
import { parseNetworkText } from "./parse";
import { RecordSink } from "./record-sink";

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
