/**
 * "Not recorded" as a real answer, through the deposit → review → publish flow and every reader: the
 * schema and cross-field rules (draft findings, submission), the API, the catalogue facets, the map,
 * the JSON-LD of the dataset page and the bundle's networks.csv. Also DOIs pasted in their usual forms.
 */
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { CLIENT_DIST } from "../../../../server/src/config/paths";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { catalogueStore } from "../../../../server/src/api/catalogue/catalogue.store";
import { datasetHtmlRenderer } from "../../../../server/src/api/datasets/datasets.html";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { decide, makeDraft, networkMeta, submit } from "../../support/deposit-helpers";
import { unzip } from "../../support/unzip";
import { startMailCatcher } from "../../support/stack";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";

let app: ReturnType<typeof createApp>;
let owner: SignedInAgent;
let curator: SignedInAgent;
let catcher: MailCatcher;
let accession = "";
const REASON = "Not given in the source publication (a literature-derived web).";

function binaryParser(res: request.Response, cb: (err: Error | null, body: Buffer) => void) {
  const parts: Buffer[] = [];
  res.on("data", (c: Buffer) => parts.push(c));
  res.on("end", () => cb(null, Buffer.concat(parts)));
}

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  catalogueStore.reset();
  catcher = await startMailCatcher();
  app = createApp();
  owner = await agentFor(app, (await createUser()).email);
  curator = await agentFor(app, (await createUser({ role: "curator" })).email);
});
afterAll(async () => {
  await catcher.close();
  await shutdownServerResources();
});

const unknownSite = () =>
  networkMeta({
    locality: { placeName: "Osk basin (from a 1970s survey)", countryCode: "NO" },
    habitat: undefined,
    startDate: undefined,
    endDate: undefined,
    notRecorded: { coordinates: REASON, dates: REASON, habitat: REASON, samplingEffort: "Effort was not reported." },
  });

describe("the rules", () => {
  it("draft findings: a missing field asks for a value or a reason; a placeholder value and a value given twice are refused", async () => {
    const { versionId, networkIds } = await makeDraft(owner);
    const patch = (metadata: Record<string, unknown>) => owner.agent.patch(`/api/v1/deposits/${versionId}/networks/${networkIds[0]}`).set("x-csrf-token", owner.csrf).send({ metadata });
    const findings = (body: { findings: { networks: Array<{ findings: Array<{ path: string; message: string }> }> } }) => body.findings.networks[0].findings;

    const missing = findings((await patch(networkMeta({ habitat: undefined, startDate: undefined, endDate: undefined }))).body);
    expect(missing).toEqual(expect.arrayContaining([
      { path: "/habitat", message: "Habitat is required: give it, or mark habitat as not recorded with the reason." },
      { path: "/startDate", message: "Start date is required: give it, or mark sampling dates as not recorded with the reason." },
    ]));
    const placeholder = findings((await patch(networkMeta({ habitat: "n/a" }))).body);
    expect(placeholder).toContainEqual({ path: "/habitat", message: '"n/a" is not a habitat: mark the habitat as not recorded and give the reason instead.' });
    const both = findings((await patch(networkMeta({ notRecorded: { habitat: REASON } }))).body);
    expect(both).toContainEqual({ path: "/notRecorded/habitat", message: "Habitat is given and also marked not recorded: keep the value or the reason, not both." });
    const noGrid = findings((await patch(networkMeta({ locality: { placeName: "Crook Heath", countryCode: "GB", decimalLatitude: 54.4, decimalLongitude: -2.9 } }))).body);
    expect(noGrid.map((f) => f.path)).toContain("/locality/generalisation");
    expect(findings((await patch(unknownSite())).body)).toEqual([]);
  });

  it("DOIs are accepted as 10.x/…, doi:10.x/… or a resolver link and stored bare; 'not available' is named at once", async () => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({ metadata: {} });
    const id = c.body.versionId;
    const save = (doi: string) => owner.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: { title: "DOI forms", publication: { citation: "Hale, R. (2021). Heath visitors. Journal of Invented Ecology 3:1–9.", doi } } });
    for (const [given, stored] of [
      ["10.5281/zenodo.1234567", "10.5281/zenodo.1234567"],
      ["doi:10.5281/zenodo.1234567", "10.5281/zenodo.1234567"],
      ["https://doi.org/10.1111/j.1461-0248.2009.01355.x", "10.1111/j.1461-0248.2009.01355.x"],
      ["http://dx.doi.org/10.1371%2Fjournal.pone.0000001", "10.1371/journal.pone.0000001"],
      ["  DOI: 10.1234/ABC.5  ", "10.1234/ABC.5"],
    ]) {
      const r = await save(given);
      expect(r.body.metadata.publication.doi, given).toBe(stored);
      expect(r.body.findings.study.map((f: { path: string }) => f.path)).not.toContain("/publication/doi");
    }
    const bad = await save("not available");
    expect(bad.body.findings.study).toContainEqual(expect.objectContaining({ path: "/publication/doi", message: expect.stringContaining("leave it empty when the publication has none") }));
  });
});

describe("published with fields not recorded", () => {
  beforeAll(async () => {
    const { versionId, networkIds } = await makeDraft(owner, [["osk-1974.csv", "plant,bee A,bee B\nHeather,1,0\nGorse,2,1\n"], ["crook-2019.csv", "plant,bee A,fly C\nHeather,3,0\nBilberry,0,1\n"]]);
    const p = await owner.agent.patch(`/api/v1/deposits/${versionId}/networks/${networkIds[0]}`).set("x-csrf-token", owner.csrf).send({ metadata: unknownSite() });
    expect(p.body.findings.networks[0].findings).toEqual([]);
    expect((await submit(owner, versionId)).status).toBe(200);
    const d = await decide(curator, versionId, { decision: "publish" });
    expect(d.status, JSON.stringify(d.body)).toBe(200);
    accession = d.body.accession;
  });

  it("the API gives the reasons and no coordinates, dates or habitat", async () => {
    const r = await request(app).get(`/api/v1/networks/${accession}/1/1`);
    expect(r.status).toBe(200);
    const md = r.body.metadata ?? r.body.network?.metadata;
    expect(md.notRecorded).toEqual(unknownSite().notRecorded);
    expect(md.habitat).toBeUndefined();
    expect(md.startDate).toBeUndefined();
    expect(md.locality.decimalLatitude ?? null).toBeNull();
    const ds = await request(app).get(`/api/v1/datasets/${accession}`);
    expect(ds.body.networks[0].metadata.notRecorded.coordinates).toBe(REASON);
  });

  it("the catalogue lists habitat 'not recorded' and counts the fields; the map leaves the network out", async () => {
    const c = await request(app).get("/api/v1/catalogue");
    expect(c.status).toBe(200);
    expect(c.body.meta.facets.habitat).toEqual(expect.arrayContaining([{ value: "not recorded", count: 1 }, { value: "upland heath", count: 1 }]));
    expect(c.body.meta.facets.notRecorded).toEqual([
      { value: "coordinates", count: 1 },
      { value: "dates", count: 1 },
      { value: "habitat", count: 1 },
      { value: "samplingEffort", count: 1 },
    ]);
    const row = c.body.data.find((x: { position: number }) => x.position === 1);
    expect(row).toMatchObject({ habitat: "not recorded", startYear: null });
    const map = await request(app).get("/api/v1/network-views/map");
    expect(map.body.meta).toEqual({ total: 2, placed: 1 });
    expect(map.body.data.map((p: { ref: string }) => p.ref)).toEqual([`${accession}/v1/2`]);
  });

  it("the dataset page's JSON-LD says what is not recorded and invents no coordinates or dates", async () => {
    const shell = existsSync(join(CLIENT_DIST, "index.html")) ? readFileSync(join(CLIENT_DIST, "index.html"), "utf8") : readFileSync(join(process.cwd(), "client", "index.html"), "utf8");
    const html = await datasetHtmlRenderer(`/datasets/${accession}`, shell);
    const ld = JSON.parse(/<script type="application\/ld\+json">([\s\S]*?)<\/script>/.exec(html!)![1]) as { spatialCoverage: Array<Record<string, unknown>>; temporalCoverage: string };
    const osk = ld.spatialCoverage.find((p) => String(p.name).startsWith("Osk basin"))!;
    expect(osk.geo).toBeUndefined();
    expect(osk.description).toContain(`Coordinates not recorded: ${REASON}`);
    expect(osk.description).toContain(`Sampling dates not recorded: ${REASON}`);
    // the other network's dates only
    expect(ld.temporalCoverage).toBe("2019-05-01/2019-08-31");
  });

  it("the bundle's networks.csv leaves the fields empty and says why in not_recorded", async () => {
    const res = await request(app).get("/api/v1/bundles").query({ refs: `${accession}/v1/1` }).buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    const files = await unzip(res.body as Buffer);
    const csv = files.get("networks.csv")!;
    const [header, row] = csv.trim().split(/\r?\n/);
    const cols = header.split(",");
    const cells = row.match(/("([^"]|"")*"|[^,]*)(,|$)/g)!.map((c) => c.replace(/,$/, "").replace(/^"|"$/g, "").replace(/""/g, '"'));
    const at = (name: string) => cells[cols.indexOf(name)];
    expect(at("habitat")).toBe("not recorded");
    expect(at("decimal_latitude")).toBe("");
    expect(at("start_date")).toBe("");
    expect(at("not_recorded")).toBe(`Coordinates: ${REASON}; Sampling dates: ${REASON}; Habitat: ${REASON}; Sampling effort: Effort was not reported.`);
  });
});
