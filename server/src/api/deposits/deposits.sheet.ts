/**
 * The metadata sheet: every network of a deposit as one CSV row, one column per field of the network
 * schema (schemas/network.schema.json, nested fields as dotted paths such as `locality.placeName`), so a
 * study with 40 networks is filled in a spreadsheet instead of 40 forms. The columns come from the schema
 * (a new field is a new column); `network` (the position) and `file` identify the rows. `missingValues`
 * is left out: it records how the file was read, not something to type.
 *
 * Upload: the header must name known columns and the rows existing networks (else 422, nothing saved);
 * each row replaces that network's metadata (an empty cell leaves the field out), all in one transaction,
 * like saving every form at once. Problems of the values (schema and cross-field rules) do not stop the
 * save, as for drafts; they come back one per cell: row, column, field and message.
 */
import { parse as csvParse } from "csv-parse/sync";
import { csvText } from "@shared/csv";
import { schemaJson } from "../../lib/schemas";
import { ApiError, type ErrorDetail } from "../../lib/api-error";

export interface SheetColumn {
  /** Column name: the field's path with dots (locality.placeName). */
  name: string;
  /** JSON pointer of the field (/locality/placeName). */
  pointer: string;
  type: "string" | "number" | "integer";
}

const SKIP = new Set(["missingValues"]);

/** The sheet's field columns, walked from the network schema in its property order. */
export function sheetColumns(): SheetColumn[] {
  const out: SheetColumn[] = [];
  const walk = (schema: Record<string, unknown>, prefix: string[]) => {
    const props = (schema.properties ?? {}) as Record<string, Record<string, unknown>>;
    for (const [key, sub] of Object.entries(props)) {
      if (!prefix.length && SKIP.has(key)) continue;
      const path = [...prefix, key];
      if (sub.type === "object") walk(sub, path);
      else if (sub.type === "string" || sub.type === "number" || sub.type === "integer") out.push({ name: path.join("."), pointer: `/${path.join("/")}`, type: sub.type });
    }
  };
  walk(schemaJson("network"), []);
  return out;
}

const ID_COLUMNS = ["network", "file"];

function get(obj: unknown, path: string[]): unknown {
  let cur = obj;
  for (const k of path) {
    if (!cur || typeof cur !== "object") return undefined;
    cur = (cur as Record<string, unknown>)[k];
  }
  return cur;
}

/** The sheet as CSV text (UTF-8 with a byte-order mark, so spreadsheet programs read accents right). */
export function writeSheet(networks: Array<{ position: number; originalName: string; metadata: Record<string, unknown> }>): string {
  const cols = sheetColumns();
  const rows: unknown[][] = [[...ID_COLUMNS, ...cols.map((c) => c.name)]];
  for (const n of networks) rows.push([n.position, n.originalName, ...cols.map((c) => get(n.metadata, c.name.split(".")))]);
  return csvText(rows, { eol: "\r\n", bom: true });
}

export interface SheetRow {
  /** 1-based line of the sheet. */
  row: number;
  position: number;
  metadata: Record<string, unknown>;
  /** Field pointer → 1-based column of the sheet, for cell-addressed messages. */
  columnOf: Map<string, { column: number; name: string }>;
}

/** Reads an uploaded sheet into metadata per network position; 422 listing every structural problem. */
export function readSheet(text: string, positions: number[], fileName = "metadata sheet"): SheetRow[] {
  let records: string[][];
  try {
    records = csvParse(text.replace(/^\ufeff/, ""), { relax_column_count: true, skip_empty_lines: true, delimiter: detect(text) }) as string[][];
  } catch (err) {
    throw ApiError.unprocessable(`${fileName} is not a readable CSV file: ${(err as Error).message}`, [{ file: fileName, message: (err as Error).message }]);
  }
  if (!records.length) throw ApiError.unprocessable(`${fileName} is empty.`, [{ file: fileName, message: "The sheet is empty." }]);
  const cols = sheetColumns();
  const byName = new Map(cols.map((c) => [c.name, c]));
  const header = records[0].map((h) => h.trim());
  const problems: ErrorDetail[] = [];
  header.forEach((h, k) => {
    if (h === "" || ID_COLUMNS.includes(h) || byName.has(h)) return;
    problems.push({ file: fileName, row: 1, column: k + 1, field: h, message: `Row 1, column ${k + 1}: "${h}" is not a column of the metadata sheet; download the sheet again to get its columns.` });
  });
  const netCol = header.indexOf("network");
  if (netCol < 0) problems.push({ file: fileName, row: 1, message: 'Row 1: the sheet needs a "network" column (the network\'s number in the deposit).' });
  const seen = new Set<number>();
  const rows: SheetRow[] = [];
  for (let r = 1; r < records.length && netCol >= 0; r++) {
    const rec = records[r];
    if (rec.every((c) => c.trim() === "")) continue;
    const raw = (rec[netCol] ?? "").trim();
    const pos = Number(raw);
    if (!Number.isInteger(pos) || !positions.includes(pos)) {
      problems.push({ file: fileName, row: r + 1, column: netCol + 1, field: "network", message: `Row ${r + 1}, column ${netCol + 1} (network): "${raw}" is not the number of a network of this deposit (${positions.join(", ")}).` });
      continue;
    }
    if (seen.has(pos)) {
      problems.push({ file: fileName, row: r + 1, column: netCol + 1, field: "network", message: `Row ${r + 1}: network ${pos} has two rows.` });
      continue;
    }
    seen.add(pos);
    const metadata: Record<string, unknown> = {};
    const columnOf = new Map<string, { column: number; name: string }>();
    header.forEach((h, k) => {
      const col = byName.get(h);
      if (!col) return;
      columnOf.set(col.pointer, { column: k + 1, name: h });
      const cell = (rec[k] ?? "").trim();
      if (cell === "") return;
      let value: unknown = cell;
      if (col.type !== "string") {
        const n = Number(cell.replace(/^\+/, ""));
        // A cell that is not a number stays text, so the schema names it with its column.
        if (/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(cell) && Number.isFinite(n)) value = n;
      }
      const path = h.split(".");
      let cur = metadata;
      for (const seg of path.slice(0, -1)) {
        if (!cur[seg] || typeof cur[seg] !== "object") cur[seg] = {};
        cur = cur[seg] as Record<string, unknown>;
      }
      cur[path[path.length - 1]] = value;
    });
    rows.push({ row: r + 1, position: pos, metadata, columnOf });
  }
  if (problems.length) throw ApiError.unprocessable(`The metadata sheet was not read: ${problems.length} problem${problems.length === 1 ? "" : "s"} to fix. Nothing was saved.`, problems);
  if (!rows.length) throw ApiError.unprocessable("The metadata sheet has no network rows.", [{ file: fileName, message: "No rows under the header." }]);
  return rows;
}

function detect(text: string): string {
  const first = text.replace(/^\ufeff/, "").split(/\r?\n/, 1)[0] ?? "";
  const count = (d: string) => first.split(d).length - 1;
  return count(";") > count(",") ? ";" : count("\t") > count(",") ? "\t" : ",";
}

/** The sheet cell a finding is about: the field's own column, else the nearest enclosing one. */
export function cellOf(row: SheetRow, pointer: string): { column: number | null; name: string } {
  for (let p = pointer; p; p = p.slice(0, p.lastIndexOf("/"))) {
    const c = row.columnOf.get(p);
    if (c) return c;
    const child = [...row.columnOf.entries()].find(([k]) => k.startsWith(`${p}/`));
    if (child && p !== pointer) return { column: child[1].column, name: p.slice(1).replace(/\//g, ".") };
  }
  return { column: null, name: pointer.slice(1).replace(/\//g, ".") };
}
