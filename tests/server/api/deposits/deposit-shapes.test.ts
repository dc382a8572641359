/**
 * The upload route with files as depositors have them (tests/fixtures/shapes): R output with NA cells, a
 * spreadsheet's CSV export, a workbook with two sheets, a workbook and a picture renamed .csv, a two-mode
 * edge list sent as one-mode. Asserts the answer, the stored network and the metadata record.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { Network } from "../../../../server/src/models";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { FIXTURES, studyMeta } from "../../support/deposit-helpers";

let owner: SignedInAgent;
const shape = (name: string) => readFileSync(join(FIXTURES, "shapes", name));

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  const app = createApp();
  owner = await agentFor(app, (await createUser()).email);
});
afterAll(async () => {
  await shutdownServerResources();
});

async function draft(): Promise<number> {
  const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({ metadata: studyMeta() });
  return c.body.versionId as number;
}

function upload(id: number, files: string[], fields: Record<string, string> = {}) {
  let req = owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf);
  for (const [k, v] of Object.entries({ kind: "bipartite", ...fields })) req = req.field(k, v);
  for (const f of files) req = req.attach("files", shape(f), f);
  return req;
}

describe("uploads of R and spreadsheet files", () => {
  it("R write.csv with NA: refused with the markers named until the depositor says what they mean; the answer is kept in the metadata", async () => {
    const id = await draft();
    const refused = await upload(id, ["r-write-csv.csv"]);
    expect(refused.status).toBe(422);
    expect(refused.body.details[0]).toMatchObject({ file: "r-write-csv.csv", row: 2, column: 4, code: "missing-values", extra: { markers: ["NA"], cells: 3 } });
    expect(await Network.count({ where: { versionId: id } })).toBe(0);

    const ok = await upload(id, ["r-write-csv.csv"], { missing: "not-observed" });
    expect(ok.status).toBe(201);
    const n = ok.body.deposit.networks[0];
    expect(n).toMatchObject({ nRows: 4, nCols: 4, nLinks: 7 });
    expect(n.metadata.missingValues).toEqual({ markers: ["NA"], markerCells: 3, markerMeaning: "not-observed", blankCells: 0, blankMeaning: "no-interaction" });
    expect((await Network.findByPk(n.id))!.readOptions).toEqual({ missing: "not-observed" });

    // Saving the form without the record keeps it: it follows the file.
    const saved = await owner.agent.patch(`/api/v1/deposits/${id}/networks/${n.id}`).set("x-csrf-token", owner.csrf).send({ metadata: { name: "Crook Heath" } });
    expect(saved.body.networks[0].metadata).toEqual({ name: "Crook Heath", missingValues: n.metadata.missingValues });
    // Reading the file again with the other answer updates the record.
    const again = await owner.agent.patch(`/api/v1/deposits/${id}/networks/${n.id}`).set("x-csrf-token", owner.csrf).send({ missing: "no-interaction" });
    expect(again.status).toBe(200);
    expect(again.body.networks[0].metadata.missingValues.markerMeaning).toBe("no-interaction");
  });

  it("R write.table (no corner, spaces), tab-separated write.table and a spreadsheet CSV export in one upload", async () => {
    const id = await draft();
    const res = await upload(id, ["r-write-table.txt", "r-write-table.tsv", "excel-export.csv"], {
      fileOptions: JSON.stringify({ "r-write-table.txt": { missing: "no-interaction" }, "excel-export.csv": { missing: "not-observed" } }),
    });
    expect(res.status).toBe(201);
    const [a, b, c] = res.body.deposit.networks;
    for (const n of [a, b, c]) expect(n).toMatchObject({ nRows: 3, nCols: 3 });
    expect(a.warnings.map((w: { code: string }) => w.code)).toContain("header-without-corner");
    expect(b.warnings.map((w: { code: string }) => w.code)).toContain("header-without-corner");
    expect(c.warnings.map((w: { code: string }) => w.code)).toEqual(expect.arrayContaining(["dropped-empty-rows", "dropped-empty-columns", "missing-values"]));
    expect(c.metadata.missingValues).toMatchObject({ markers: ["-"], markerCells: 1, markerMeaning: "not-observed", blankCells: 3 });
  });
});

describe("workbooks and files that are not tables", () => {
  it("an .xlsx with two sheets: asks for the sheet (listing both), then reads it; the original is served as a workbook", async () => {
    const id = await draft();
    const ask = await upload(id, ["two-sheets.xlsx"]);
    expect(ask.status).toBe(422);
    expect(ask.body.details[0]).toMatchObject({ file: "two-sheets.xlsx", code: "choose-sheet", extra: { sheets: ["Lowland 2021", "Upland 2021"] } });
    const res = await upload(id, ["two-sheets.xlsx"], { sheet: "Upland 2021", missing: "not-observed" });
    expect(res.status).toBe(201);
    const n = res.body.deposit.networks[0];
    expect(n).toMatchObject({ originalName: "two-sheets.xlsx", nRows: 2, nCols: 2, nLinks: 3, metadata: { name: "Upland 2021" } });
    expect((await Network.findByPk(n.id))!.readOptions).toEqual({ sheet: "Upland 2021", missing: "not-observed" });
    const file = await owner.agent.get(`/api/v1/deposits/${id}/networks/${n.id}/file`).buffer(true);
    expect(file.headers["content-type"]).toContain("spreadsheetml");
    // Reading again as one-mode keeps the sheet and the answer (and fails on this non-square sheet).
    const again = await owner.agent.patch(`/api/v1/deposits/${id}/networks/${n.id}`).set("x-csrf-token", owner.csrf).send({ kind: "unipartite" });
    expect(again.status).toBe(422);
    expect(again.body.details[0].where).toBe('two-sheets.xlsx (sheet "Upland 2021")');
  });

  it("a workbook renamed .csv is read as a workbook; a PNG renamed .csv and a PDF are named for what they are", async () => {
    const id = await draft();
    const wb = await upload(id, ["workbook-renamed.csv"]);
    expect(wb.status).toBe(201);
    expect(wb.body.deposit.networks[0].warnings[0].message).toContain("an Excel workbook (.xlsx) although its name does not end in .xlsx");
    const png = await upload(id, ["picture-renamed.csv"]);
    expect(png.status).toBe(422);
    expect(png.body.details[0]).toMatchObject({ code: "not-a-table", file: "picture-renamed.csv" });
    expect(png.body.message).toContain("a PNG image, not a table of text");
    expect(png.body.message).not.toMatch(/Latin-1|UTF-8/);
    const pdf = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from("%PDF-1.7\n%…"), "methods.pdf");
    expect(pdf.status).toBe(422);
    expect(pdf.body.details[0].message).toBe('"methods.pdf" is a PDF document: only .csv, .tsv, .txt or .xlsx files (one network each), or one zip of them, are accepted.');
  });

  it("a two-mode edge list sent as one-mode is stored with the warning; reading it as bipartite removes it", async () => {
    const id = await draft();
    const res = await upload(id, ["two-mode-edgelist.csv"], { kind: "unipartite" });
    expect(res.status).toBe(201);
    const n = res.body.deposit.networks[0];
    expect(n.warnings.find((w: { code: string }) => w.code === "two-mode")?.message).toContain("read it as bipartite");
    const b = await owner.agent.patch(`/api/v1/deposits/${id}/networks/${n.id}`).set("x-csrf-token", owner.csrf).send({ kind: "bipartite" });
    expect(b.status).toBe(200);
    expect(b.body.networks[0]).toMatchObject({ kind: "bipartite", nRows: 3, nCols: 3, nLinks: 5 });
    expect(b.body.networks[0].warnings.map((w: { code: string }) => w.code)).not.toContain("two-mode");
  });
});
