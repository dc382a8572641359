/**
 * The command-line tool reads files as the upload does (tests/fixtures/shapes/README.md describes each
 * file): workbooks, with the sheet chosen by --sheet when several hold data; cells such as NA only once
 * --missing says what they mean; a workbook saved under a .csv name.
 */
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { main } from "../../scripts/analyze";

const ROOT = fileURLToPath(new URL("../../", import.meta.url));
const SHAPES = join(ROOT, "tests/fixtures/shapes");

/** The tool's exported main in this process (tests/shared/optimizer/cli.test.ts also runs it as a child). */
async function analyze(args: string[]) {
  let stdout = "";
  let stderr = "";
  const code = await main(args, { out: (t) => (stdout += t), err: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

describe("npm run analyze on the files depositors have", async () => {
  it("asks for the sheet of a workbook with two, then for the meaning of its NA cell, then reads it", async () => {
    const file = join(SHAPES, "two-sheets.xlsx");
    const noSheet = await analyze([file, "--nulls", "0"]);
    expect(noSheet.code).toBe(1);
    expect(noSheet.stderr).toContain('the workbook has 2 sheets with data ("Lowland 2021", "Upland 2021")');
    expect(noSheet.stderr).toContain("give --sheet NAME");
    const noMeaning = await analyze([file, "--sheet", "Upland 2021", "--nulls", "0"]);
    expect(noMeaning.code).toBe(1);
    expect(noMeaning.stderr).toContain('(sheet "Upland 2021"), row 3, column 2');
    expect(noMeaning.stderr).toContain("give --missing no-interaction or --missing not-observed");
    const ok = await analyze([file, "--sheet", "Upland 2021", "--missing", "not-observed", "--nulls", "0", "--restarts", "2", "--json"]);
    expect(ok.code).toBe(0);
    const out = JSON.parse(ok.stdout);
    // "Upland 2021": 2 × 2 with one NA typed as text, so 3 links (make-fixtures.ts writes it)
    expect(out).toMatchObject({ rows: 2, cols: 2, links: 3, workbook: { sheet: "Upland 2021", sheets: ["Lowland 2021", "Upland 2021"] } });
    expect(out.missing).toMatchObject({ markers: ["NA"], markerCells: 1, markerMeaning: "not-observed" });
    const text = await analyze([file, "--sheet", "Lowland 2021", "--nulls", "0", "--restarts", "2"]);
    expect(text.code).toBe(0);
    expect(text.stdout).toContain('workbook: sheet "Lowland 2021" (of "Lowland 2021", "Upland 2021")');
    expect(text.stdout).toContain("rows 3, columns 3");
  });

  it("reads a workbook saved under a .csv name, saying so", async () => {
    const r = await analyze([join(SHAPES, "workbook-renamed.csv"), "--nulls", "0", "--restarts", "2", "--json"]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.workbook.sheets).toHaveLength(1);
    expect(out.warnings.join(" ")).toContain("it was read as a workbook");
  });
});
