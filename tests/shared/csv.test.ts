/**
 * The one CSV writer (shared/csv): its quoting rule against RFC 4180 and against the definition of outer
 * white space in ECMAScript (String.prototype.trim, the reference here), and its files read back by
 * csv-parse (an independent RFC 4180 reader from the npm registry) to the same values.
 */
import { describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import { csvCell, csvLine, csvText, looksLikeFormula, needsQuotes, quoteField, spreadsheetSafe, type CsvDelimiter } from "@shared/csv";
import { networkToEdgeListCsv, networkToMatrixCsv, parseNetworkText } from "@shared/network/index";

const PIECES = ["a", "Bombus", ",", '"', "\n", "\r", " ", "\t", "\v", "\f", "\u00a0", "\u1680", "\u2003", "\u2028", "\u2029", "\u202f", "\u205f", "\u3000", "\ufeff", "\u0085", "\u200b", "é", "鳥", ";", "'"];

describe("shared/csv", () => {
  for (const d of [",", ";", "\t"] as CsvDelimiter[]) {
    it(`quotes a field exactly when it holds the delimiter ${JSON.stringify(d)}, a quote, a line break or outer white space`, () => {
      const rule = (x: string) => x.includes(d) || x.includes('"') || x.includes("\n") || x.includes("\r") || x !== x.trim();
      let n = 0;
      const wrong: string[] = [];
      for (const p of PIECES) for (const q of PIECES) for (const r of ["", "x", ...PIECES]) {
        for (const label of [p + q + r, "x" + p + q + "x", p + "mid" + r]) {
          if (needsQuotes(label, d) !== rule(label)) wrong.push(JSON.stringify(label));
          n++;
        }
      }
      expect(wrong).toEqual([]);
      expect(n).toBeGreaterThan(10_000);
    });
  }

  it("doubles quotes inside a quoted field and leaves plain fields as they are", () => {
    expect(quoteField('say "hi"')).toBe('"say ""hi"""');
    expect(quoteField("Bombus terrestris")).toBe("Bombus terrestris");
    expect(quoteField("a;b")).toBe("a;b");
    expect(quoteField("a;b", ";")).toBe('"a;b"');
    expect(quoteField("")).toBe("");
  });

  it("writes empty values empty, numbers in their shortest round-trip form and booleans as words", () => {
    expect([null, undefined, 0, 0.1 + 0.2, 1e21, -3, true, false].map((v) => csvCell(v))).toEqual(["", "", "0", "0.30000000000000004", "1e+21", "-3", "true", "false"]);
    expect(csvLine(["x, y", 2, null, " pad"])).toBe('"x, y",2,," pad"');
  });

  it("writes files that an independent RFC 4180 reader (csv-parse) reads back to the same fields", () => {
    const rows = [["node", "level", "module"], ...PIECES.flatMap((p, k) => [[`${p}x${p}`, p, String(k)], [`"${p}"`, `a${p}b`, ""]])];
    for (const d of [",", ";", "\t"] as CsvDelimiter[]) {
      for (const eol of ["\n", "\r\n"] as const) {
        const text = csvText(rows, { delimiter: d, eol, bom: true });
        expect(text.startsWith("\ufeff")).toBe(true);
        expect(text.endsWith(eol)).toBe(true);
        const back = parse(text, { delimiter: d, bom: true, relax_column_count: false, trim: false }) as string[][];
        expect(back).toEqual(rows);
      }
    }
  });
});

describe("formula-like labels (OWASP 'CSV Injection': cells beginning with =, +, -, @, or tab/CR before them)", () => {
  const FORMULAS = ["=cmd|' /C calc'!A0", "@SUM(A1:A2)", "+Bombus", "-Andrena", "\t=1+1", "\r@x"];
  const PLAIN = ["Bombus", "a=b", "x@y", "'=quoted", " =leading space", "", "Ändern"];

  it("are recognised, and only they", () => {
    for (const s of FORMULAS) expect(looksLikeFormula(s), JSON.stringify(s)).toBe(true);
    for (const s of PLAIN) expect(looksLikeFormula(s), JSON.stringify(s)).toBe(false);
  });

  it("are kept exact by the parser (with a warning) and by the default writers, and get a leading apostrophe only in the spreadsheet-safe form", () => {
    const text = ["node,=cmd|' /C calc'!A0,Apis", "@SUM(A1:A2),1,0", "Bombus,0,2", "-Andrena,1,1"].join("\n") + "\n";
    const { network, warnings } = parseNetworkText(text, { fileName: "f.csv", kind: "bipartite" });
    const w = warnings.find((x) => x.code === "formula-like-labels");
    expect(w?.count).toBe(3);
    expect(w?.labels?.sort()).toEqual(["-Andrena", "=cmd|' /C calc'!A0", "@SUM(A1:A2)"]);
    expect(parse(networkToMatrixCsv(network))).toEqual(parse(text));
    const safe = parse(networkToMatrixCsv(network, { spreadsheetSafe: true })) as string[][];
    expect(safe[0]).toEqual(["node", "'=cmd|' /C calc'!A0", "Apis"]);
    expect(safe.map((r) => r[0])).toEqual(["node", "'@SUM(A1:A2)", "Bombus", "'-Andrena"]);
    // the cells are those of the exact file
    expect(safe.slice(1).map((r) => r.slice(1))).toEqual((parse(text) as string[][]).slice(1).map((r) => r.slice(1)));
    const edges = parse(networkToEdgeListCsv(network, { spreadsheetSafe: true })) as string[][];
    expect(edges.flat().filter((c) => looksLikeFormula(c))).toEqual([]);
    expect(spreadsheetSafe("Bombus")).toBe("Bombus");
  });
});
