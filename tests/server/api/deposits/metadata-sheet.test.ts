/**
 * The metadata sheet round trip: download (header from the schema, pre-filled), fill in a spreadsheet,
 * upload back; structural problems refuse it whole, value problems are saved and named per cell (row,
 * column, field, message). And "apply this block to all networks".
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parse as csvParse } from "csv-parse/sync";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { Network } from "../../../../server/src/models";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { makeDraft, networkMeta } from "../../support/deposit-helpers";
import { csvText } from "@shared/csv";

let owner: SignedInAgent;
let other: SignedInAgent;
const M = "plant,bee A,bee B\nHeather,1,0\nGorse,2,1\n";

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  const app = createApp();
  owner = await agentFor(app, (await createUser()).email);
  other = await agentFor(app, (await createUser()).email);
});
afterAll(async () => {
  await shutdownServerResources();
});

const toCsv = (rows: string[][]) => csvText(rows);

describe("metadata sheet", () => {
  it("downloads a sheet whose header comes from the schema, pre-filled from what was entered", async () => {
    const { versionId } = await makeDraft(owner, [["site-a.csv", M], ["site-b.csv", M], ["site-c.csv", M]]);
    const res = await owner.agent.get(`/api/v1/deposits/${versionId}/metadata-sheet`).buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers["content-disposition"]).toContain(`deposit-${versionId}-network-metadata.csv`);
    const rows = csvParse(res.text.replace(/^\ufeff/, "")) as string[][];
    expect(rows[0].slice(0, 6)).toEqual(["network", "file", "name", "interactionType", "weightMeaning", "rowLevel"]);
    expect(rows[0]).toEqual(expect.arrayContaining(["locality.placeName", "locality.decimalLatitude", "samplingEffort.value", "notRecorded.habitat", "notRecorded.dates"]));
    expect(rows[0]).not.toContain("missingValues.blankCells");
    expect(rows).toHaveLength(4);
    const col = (name: string) => rows[0].indexOf(name);
    expect(rows[1][col("network")]).toBe("1");
    expect(rows[1][col("file")]).toBe("site-a.csv");
    expect(rows[2][col("locality.placeName")]).toBe("Crook Heath");
    expect(rows[3][col("locality.decimalLatitude")]).toBe("54.43127");
    expect((await other.agent.get(`/api/v1/deposits/${versionId}/metadata-sheet`)).status).toBe(404);
  });

  it("uploads the sheet back: every network filled in one go, value problems named per cell and saved", async () => {
    const { versionId, networkIds } = await makeDraft(owner, [["a.csv", M], ["b.csv", M], ["c.csv", M]]);
    const dl = await owner.agent.get(`/api/v1/deposits/${versionId}/metadata-sheet`).buffer(true);
    const rows = csvParse(dl.text.replace(/^\ufeff/, "")) as string[][];
    const col = (name: string) => rows[0].indexOf(name);
    // A spreadsheet session: new names, one latitude typed wrong, one network's habitat unknown.
    rows[1][col("name")] = "Site A 2021";
    rows[2][col("name")] = "Site B 2021";
    rows[2][col("locality.decimalLatitude")] = "54,43N";
    rows[3][col("habitat")] = "";
    rows[3][col("notRecorded.habitat")] = "Not described in the source.";
    const up = await owner.agent.put(`/api/v1/deposits/${versionId}/metadata-sheet`).set("x-csrf-token", owner.csrf).send({ csv: toCsv(rows) });
    expect(up.status).toBe(200);
    expect(up.body.rows).toBe(3);
    expect(up.body.cells).toEqual([
      { row: 3, column: col("locality.decimalLatitude") + 1, columnName: "locality.decimalLatitude", field: "/locality/decimalLatitude", network: 2, message: "Locality, latitude must be a number." },
    ]);
    const nets = await Network.findAll({ where: { versionId }, order: [["position", "ASC"]] });
    expect(nets.map((n) => n.metadata.name)).toEqual(["Site A 2021", "Site B 2021", "Crook Heath 2019"]);
    expect(nets[2].metadata.habitat).toBeUndefined();
    expect(nets[2].metadata.notRecorded).toEqual({ habitat: "Not described in the source." });
    expect(up.body.deposit.findings.networks.map((n: { findings: unknown[] }) => n.findings.length)).toEqual([0, 1, 0]);
    expect(networkIds).toHaveLength(3);
  });

  it("refuses a sheet with an unknown column or network, saving nothing", async () => {
    const { versionId } = await makeDraft(owner, [["a.csv", M]]);
    const before = (await Network.findOne({ where: { versionId } }))!.metadata;
    const bad = await owner.agent.put(`/api/v1/deposits/${versionId}/metadata-sheet`).set("x-csrf-token", owner.csrf).send({ csv: "network,name,habitatt\n1,X,heath\n7,Y,heath\n" });
    expect(bad.status).toBe(422);
    expect(bad.body.details).toEqual([
      expect.objectContaining({ row: 1, column: 3, field: "habitatt", message: expect.stringContaining('"habitatt" is not a column of the metadata sheet') }),
      expect.objectContaining({ row: 3, column: 1, field: "network", message: expect.stringContaining('"7" is not the number of a network of this deposit (1)') }),
    ]);
    expect((await Network.findOne({ where: { versionId } }))!.metadata).toEqual(before);
    expect((await other.agent.put(`/api/v1/deposits/${versionId}/metadata-sheet`).set("x-csrf-token", other.csrf).send({ csv: "network\n1\n" })).status).toBe(404);
    const none = await owner.agent.put(`/api/v1/deposits/${versionId}/metadata-sheet`).set("x-csrf-token", owner.csrf).send({ text: "network\n1\n" });
    expect(none.status).toBe(400);
    expect(none.body.details).toEqual([
      { path: "/csv", message: "csv is required: it must be text of 1 to 5000000 characters, not only spaces." },
      { path: "/text", message: "text is not a field of this request (fields: csv)." },
    ]);
  });
});

describe("apply a block to all networks", () => {
  it("copies locality (with what is not recorded) and sampling from one network to the others", async () => {
    const { versionId, networkIds } = await makeDraft(owner, [["a.csv", M], ["b.csv", M]]);
    const source = networkMeta({ locality: { placeName: "Lake Osk basin", countryCode: "NO" }, samplingProtocol: "Net sweeps along transects.", samplingEffort: { value: 12, unit: "transect walks" }, notRecorded: { coordinates: "Only the basin is named." } });
    await owner.agent.patch(`/api/v1/deposits/${versionId}/networks/${networkIds[0]}`).set("x-csrf-token", owner.csrf).send({ metadata: source });
    const res = await owner.agent.post(`/api/v1/deposits/${versionId}/networks/apply`).set("x-csrf-token", owner.csrf).send({ from: networkIds[0], blocks: ["locality", "sampling"] });
    expect(res.status).toBe(200);
    const b = res.body.networks[1].metadata;
    expect(b.locality).toEqual({ placeName: "Lake Osk basin", countryCode: "NO" });
    expect(b.notRecorded).toEqual({ coordinates: "Only the basin is named." });
    expect(b.samplingEffort).toEqual({ value: 12, unit: "transect walks" });
    expect(b.habitat).toBe("upland heath");
    const bad = await owner.agent.post(`/api/v1/deposits/${versionId}/networks/apply`).set("x-csrf-token", owner.csrf).send({ from: networkIds[0], blocks: ["everything"] });
    expect(bad.status).toBe(400);
  });
});
