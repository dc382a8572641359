/**
 * The one CSV writer (shared/csv): its quoting rule against RFC 4180 and against the definition of outer
 * white space in ECMAScript (String.prototype.trim, the reference here), and its files read back by
 * csv-parse (an independent RFC 4180 reader from the npm registry) to the same values.
 */
import { describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import { csvCell, csvLine, csvText, needsQuotes, quoteField, type CsvDelimiter } from "@shared/csv";

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
