/**
 * Files as depositors have them (tests/fixtures/shapes/README.md): R's write.csv and write.table output,
 * a spreadsheet's CSV export, an .xlsx workbook with two sheets, a picture renamed .csv, a workbook renamed
 * .csv and a two-mode edge list read as one-mode.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { detectSignature, NetworkParseError, parseNetworkFile, parseNetworkText, type ParseOptions } from "@shared/network/index";
import { dense } from "./helpers";

const shape = (name: string) => new Uint8Array(readFileSync(new URL(`../../fixtures/shapes/${name}`, import.meta.url)));
const opts = (fileName: string, extra: Partial<ParseOptions> = {}): ParseOptions => ({ fileName, kind: "bipartite", ...extra });

async function parseError(p: Promise<unknown> | (() => unknown)): Promise<NetworkParseError> {
  try {
    await (typeof p === "function" ? p() : p);
  } catch (e) {
    expect(e).toBeInstanceOf(NetworkParseError);
    return e as NetworkParseError;
  }
  throw new Error("expected a NetworkParseError");
}

const PLANTS = ["Calluna hallii", "Erica moorensis", "Vaccinium quillae"];
const VISITORS = ["Bombus oskensis", "Andrena verrinae", "Eristalis tallowi"];

describe("R output", () => {
  it("write.csv: the quoted empty corner, quoted labels; NA cells are refused until their meaning is given", async () => {
    const e = await parseError(() => parseNetworkText(shape("r-write-csv.csv"), opts("r-write-csv.csv")));
    expect(e.code).toBe("missing-values");
    expect(e).toMatchObject({ file: "r-write-csv.csv", row: 2, column: 4 });
    expect(e.message).toContain('3 cell(s) hold "NA"');
    expect(e.extra).toEqual({ markers: ["NA"], cells: 3 });

    const r = parseNetworkText(shape("r-write-csv.csv"), opts("r-write-csv.csv", { missing: "not-observed" }));
    expect(r.network.rowLabels).toEqual([...PLANTS, "Potentilla brandii"]);
    expect(r.network.colLabels).toEqual([...VISITORS, "Lasioglossum nordi"]);
    expect(dense(r.network)).toEqual([[4, 0, 0, 1], [0, 2, 3, 0], [1, 0, 0, 0], [0, 0, 5, 2]]);
    expect(r.missing).toEqual({ markers: ["NA"], markerCells: 3, markerMeaning: "not-observed", blankCells: 0, blankMeaning: "no-interaction" });
    expect(r.warnings.find((w) => w.code === "missing-values")?.message).toContain("read as not observed");
    const zero = parseNetworkText(shape("r-write-csv.csv"), opts("r-write-csv.csv", { missing: "no-interaction" }));
    expect(zero.missing.markerMeaning).toBe("no-interaction");
    expect(dense(zero.network)).toEqual(dense(r.network));
  });

  it("write.table defaults: space-separated, quoted, the header without a corner cell", () => {
    const r = parseNetworkText(shape("r-write-table.txt"), opts("r-write-table.txt", { missing: "no-interaction" }));
    expect(r.delimiter).toBe(" ");
    expect(r.network.rowLabels).toEqual(PLANTS);
    expect(r.network.colLabels).toEqual(VISITORS);
    expect(dense(r.network)).toEqual([[4, 0, 0], [0, 2, 3], [1, 0, 0]]);
    expect(r.warnings.map((w) => w.code)).toContain("header-without-corner");
    expect(r.missing.markerCells).toBe(2);
  });

  it("write.table with sep = tab and no quotes", () => {
    const r = parseNetworkText(shape("r-write-table.tsv"), opts("r-write-table.tsv"));
    expect(r.delimiter).toBe("\t");
    expect(r.network.colLabels).toEqual(VISITORS);
    expect(dense(r.network)).toEqual([[4, 0, 1], [0, 2, 3], [1, 0, 0]]);
    expect(r.warnings.find((w) => w.code === "header-without-corner")).toMatchObject({ row: 1, column: 1 });
  });
});

describe("spreadsheet CSV export", () => {
  it("drops the empty rows below and the empty columns right of the table, with warnings; '-' needs a meaning", async () => {
    const e = await parseError(() => parseNetworkText(shape("excel-export.csv"), opts("excel-export.csv")));
    expect(e).toMatchObject({ code: "missing-values", row: 4, column: 3 });
    const r = parseNetworkText(shape("excel-export.csv"), opts("excel-export.csv", { missing: "not-observed" }));
    expect(r.network.rowLabels).toEqual(PLANTS);
    expect(r.network.colLabels).toEqual(VISITORS);
    expect(dense(r.network)).toEqual([[4, 0, 1], [0, 2, 3], [1, 0, 0]]);
    const byCode = Object.fromEntries(r.warnings.map((w) => [w.code, w]));
    expect(byCode["dropped-empty-rows"]).toMatchObject({ count: 2, row: 5 });
    expect(byCode["dropped-empty-columns"]).toMatchObject({ count: 2, row: 1, column: 5 });
    expect(r.missing).toMatchObject({ markers: ["-"], markerCells: 1, blankCells: 3, blankMeaning: "no-interaction" });
  });

  it("blank cells are no interaction unless the depositor says not observed; both are counted", () => {
    const text = "x,a,b\nr,1,\ns,,2\n";
    expect(parseNetworkText(text, opts("t.csv")).missing).toMatchObject({ blankCells: 2, blankMeaning: "no-interaction", markerCells: 0, markerMeaning: null });
    const r = parseNetworkText(text, opts("t.csv", { blank: "not-observed" }));
    expect(r.missing.blankMeaning).toBe("not-observed");
    expect(r.warnings.find((w) => w.code === "missing-values")?.message).toContain("2 empty cell(s) were read as not observed");
  });

  it("edge-list weights marked NA need a meaning and record no link", async () => {
    const text = "source,target,weight\na,x,2\nb,y,NA\nb,x,1\n";
    expect((await parseError(() => parseNetworkText(text, opts("e.csv")))).code).toBe("missing-values");
    const r = parseNetworkText(text, opts("e.csv", { missing: "not-observed" }));
    expect(r.network.rowLabels).toEqual(["a", "b"]);
    expect(r.network.colLabels).toEqual(["x", "y"]);
    expect(dense(r.network)).toEqual([[2, 0], [1, 0]]);
  });
});

describe("workbooks", () => {
  it("a workbook with two sheets of data asks for the sheet, then reads the one chosen", async () => {
    const bytes = shape("two-sheets.xlsx");
    const e = await parseError(parseNetworkFile(bytes, opts("two-sheets.xlsx")));
    expect(e.code).toBe("choose-sheet");
    expect(e.extra).toEqual({ sheets: ["Lowland 2021", "Upland 2021"] });
    const low = await parseNetworkFile(bytes, opts("two-sheets.xlsx", { sheet: "Lowland 2021" }));
    expect(low.workbook).toEqual({ sheet: "Lowland 2021", sheets: ["Lowland 2021", "Upland 2021"] });
    expect(low.network.rowLabels).toEqual(PLANTS);
    expect(low.network.colLabels).toEqual(VISITORS);
    expect(dense(low.network)).toEqual([[4, 0, 1], [0, 2, 3], [1, 0, 0]]);
    const upE = await parseError(parseNetworkFile(bytes, opts("two-sheets.xlsx", { sheet: "Upland 2021" })));
    expect(upE).toMatchObject({ code: "missing-values", file: 'two-sheets.xlsx (sheet "Upland 2021")', row: 3, column: 2 });
    const up = await parseNetworkFile(bytes, opts("two-sheets.xlsx", { sheet: "Upland 2021", missing: "not-observed" }));
    expect(dense(up.network)).toEqual([[7, 2], [0, 5]]);
    expect((await parseError(parseNetworkFile(bytes, opts("two-sheets.xlsx", { sheet: "Coast" })))).message).toContain('no sheet "Coast"');
  });

  it("a workbook renamed .csv is recognised by its content and read as a workbook, with a note", async () => {
    const bytes = shape("workbook-renamed.csv");
    expect(detectSignature(bytes)?.type).toBe("xlsx");
    const r = await parseNetworkFile(bytes, opts("workbook-renamed.csv"));
    expect(r.workbook?.sheet).toBe("Sheet1");
    expect(dense(r.network)).toEqual([[4, 0, 1], [0, 2, 3], [1, 0, 0]]);
    expect(r.warnings[0]).toMatchObject({ code: "file-type" });
    expect(r.warnings[0].message).toContain("an Excel workbook (.xlsx) although its name does not end in .xlsx");
    // The text parser alone names it instead of giving encoding advice.
    const e = await parseError(() => parseNetworkText(bytes, opts("workbook-renamed.csv")));
    expect(e.code).toBe("not-a-table");
  });
});

describe("files that are not tables", () => {
  it("a PNG renamed .csv is named as a PNG image, not blamed on the text encoding", async () => {
    const e = await parseError(parseNetworkFile(shape("picture-renamed.csv"), opts("picture-renamed.csv")));
    expect(e.code).toBe("not-a-table");
    expect(e.message).toContain("the file is a PNG image, not a table of text");
    expect(e.message).not.toMatch(/UTF-8|Latin-1/);
  });

  it("signatures: PDF, JPEG, GIF, zip, old Excel, gzip; text has none", () => {
    const b = (...xs: Array<number | string>) => new Uint8Array(xs.flatMap((x) => (typeof x === "string" ? Array.from(x, (c) => c.charCodeAt(0)) : [x])));
    expect(detectSignature(b("%PDF-1.7\n"))?.what).toBe("a PDF document");
    expect(detectSignature(b(0xff, 0xd8, 0xff, 0xe0, 0, 0))?.type).toBe("jpeg");
    expect(detectSignature(b("GIF89a", 1, 0))?.type).toBe("gif");
    expect(detectSignature(b(0x50, 0x4b, 3, 4, "a.csv"))?.type).toBe("zip");
    expect(detectSignature(b(0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1))?.type).toBe("xls");
    expect(detectSignature(b(0x1f, 0x8b, 8, 0))?.type).toBe("gzip");
    expect(detectSignature(b("x,a\nr,1\n"))).toBeNull();
    expect(detectSignature(b(0xef, 0xbb, 0xbf, "x,a\n"))).toBeNull();
  });
});

describe("two-mode data read as one-mode", () => {
  it("an edge list with disjoint sources and targets is flagged with the bipartite reading offered", () => {
    const r = parseNetworkText(shape("two-mode-edgelist.csv"), opts("two-mode-edgelist.csv", { kind: "unipartite" }));
    const w = r.warnings.find((x) => x.code === "two-mode");
    expect(w?.message).toContain("no name appears both as a source and as a target (3 sources, 3 targets)");
    expect(w?.message).toContain("read it as bipartite");
    const b = parseNetworkText(shape("two-mode-edgelist.csv"), opts("two-mode-edgelist.csv"));
    expect(b.warnings.map((x) => x.code)).not.toContain("two-mode");
    expect(b.network.rowLabels).toEqual(PLANTS);
    // A real one-mode edge list (some names on both sides) has no such warning.
    expect(parseNetworkText("source,target\na,b\nb,c\nc,a\nd,a\n", opts("w.csv", { kind: "unipartite" })).warnings.map((x) => x.code)).not.toContain("two-mode");
  });

  it("a one-mode matrix whose row and column names share none says it looks bipartite", async () => {
    const e = await parseError(() => parseNetworkText("x,a,b\nr,1,0\ns,0,1\n", opts("m.csv", { kind: "unipartite" })));
    expect(e.code).toBe("label-mismatch");
    expect(e.message).toContain("looks like a bipartite incidence matrix");
  });
});
