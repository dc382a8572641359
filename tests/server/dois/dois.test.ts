/**
 * DOIs through DataCite's REST API, against the local DataCite stand-in on an ephemeral port and the real
 * job queue: payloads checked against the fields DataCite requires (DataCite Metadata Schema 4.6, the
 * mandatory properties), registration after publishing with a retry when the stand-in fails first,
 * registered once however often the job runs, concept and version DOIs, a new version, and withdrawal
 * (the DOI keeps resolving, to the tombstone).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import { createApp } from "../../../server/src/app";
import { resetConfig } from "../../../server/src/config/env";
import { shutdownServerResources } from "../../../server/src/index";
import { sequelize } from "../../../server/src/db/sequelize";
import { DataciteStandIn } from "../../../server/src/lib/datacite/stand-in";
import { DataciteClient, DataciteError } from "../../../server/src/lib/datacite/client";
import { DATACITE_SCHEMA_VERSION } from "../../../server/src/lib/datacite/required-fields";
import { startDoiWorker, stopDoiWorker, syncDatasetDois } from "../../../server/src/dois/dois";
import { stopQueue } from "../../../server/src/pipeline/queue";
import type { MailCatcher } from "../../../server/src/lib/mail-catcher";
import { resetDatabase } from "../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../support/accounts";
import { startMailCatcher } from "../support/stack";
import { decide, makeDraft, studyMeta, submit } from "../support/deposit-helpers";
import { waitFor } from "../support/wait";
import { binaryParser, unzip } from "../support/unzip";
import { datasetHtmlRenderer } from "../../../server/src/api/datasets/datasets.html";

const PUBLIC_URL = "http://tanglebank.test:3000";
let app: ReturnType<typeof createApp>;
let catcher: MailCatcher;
let datacite: DataciteStandIn;
let owner: SignedInAgent;
let curator: SignedInAgent;

async function publishNew(): Promise<{ accession: string; datasetId: number }> {
  const { versionId } = await makeDraft(owner);
  expect((await submit(owner, versionId)).status).toBe(200);
  const r = await decide(curator, versionId, { decision: "publish" });
  expect(r.status).toBe(200);
  return { accession: r.body.accession, datasetId: r.body.id };
}

const attrs = (doi: string) => datacite.dois.get(doi)?.attributes as unknown as Record<string, unknown> & { state: string; url: string };

beforeAll(async () => {
  process.env.PUBLIC_URL = PUBLIC_URL;
  datacite = new DataciteStandIn({ repositoryId: "TEST.TANGLEBANK", password: "stand-in-secret", prefix: "10.5072" });
  await datacite.listen(0);
  Object.assign(process.env, { TB_DATACITE_API_URL: datacite.url, TB_DATACITE_REPOSITORY_ID: "TEST.TANGLEBANK", TB_DATACITE_PASSWORD: "stand-in-secret", TB_DOI_RETRY_DELAY_SECONDS: "1" });
  resetConfig();
  await resetDatabase();
  catcher = await startMailCatcher();
  app = createApp();
  const o = await createUser({ displayName: "Rowan Hale" });
  const c = await createUser({ role: "curator" });
  owner = await agentFor(app, o.email);
  curator = await agentFor(app, c.email);
});

afterAll(async () => {
  await stopDoiWorker();
  await stopQueue({ graceful: false });
  await catcher.close();
  await datacite.close();
  for (const k of ["TB_DATACITE_API_URL", "TB_DATACITE_REPOSITORY_ID", "TB_DATACITE_PASSWORD", "TB_DOI_RETRY_DELAY_SECONDS"]) delete process.env[k];
  resetConfig();
  await shutdownServerResources();
});

describe(`the DataCite stand-in checks the fields DataCite requires (Metadata Schema ${DATACITE_SCHEMA_VERSION})`, () => {
  const client = () => new DataciteClient({ apiUrl: datacite.url, repositoryId: "TEST.TANGLEBANK", password: "stand-in-secret" });
  const complete = {
    doi: "10.5072/tb-check.1",
    event: "publish",
    url: "http://tanglebank.test/datasets/TB-000999",
    creators: [{ name: "Hale, Rowan" }],
    titles: [{ title: "Check" }],
    publisher: { name: "Tanglebank" },
    publicationYear: 2026,
    types: { resourceTypeGeneral: "Dataset" },
  };

  it("refuses a findable DOI without each mandatory property, naming it", async () => {
    for (const field of ["creators", "titles", "publisher", "publicationYear", "types", "url"] as const) {
      const { [field]: _drop, ...rest } = complete;
      void _drop;
      const err = await client().create({ ...rest, doi: `10.5072/tb-missing-${field.toLowerCase()}` }).catch((e: unknown) => e);
      expect(err, field).toBeInstanceOf(DataciteError);
      expect((err as DataciteError).status).toBe(422);
      expect((err as DataciteError).errors.map((e) => e.source)).toContain(field);
    }
    const bad = await client().create({ ...complete, doi: "10.5072/tb-bad-type", types: { resourceTypeGeneral: "Spreadsheet" } }).catch((e: unknown) => e);
    expect((bad as DataciteError).errors[0]).toMatchObject({ source: "types.resourceTypeGeneral" });
    const empty = await client().create({ ...complete, doi: "10.5072/tb-no-creator", creators: [] }).catch((e: unknown) => e);
    expect((empty as DataciteError).errors[0]).toMatchObject({ source: "creators", title: "can't be blank" });
  });

  it("needs the repository's credentials and prefix, and never creates a DOI twice", async () => {
    const wrong = new DataciteClient({ apiUrl: datacite.url, repositoryId: "TEST.TANGLEBANK", password: "nope" });
    expect(((await wrong.create(complete).catch((e: unknown) => e)) as DataciteError).status).toBe(401);
    expect(((await client().create({ ...complete, doi: "10.1234/tb-x" }).catch((e: unknown) => e)) as DataciteError).status).toBe(403);
    expect((await client().create(complete)).attributes.state).toBe("findable");
    const again = (await client().create(complete).catch((e: unknown) => e)) as DataciteError;
    expect(again.status).toBe(422);
    expect(again.errors[0].title).toMatch(/already been taken/);
    expect(await client().get("10.5072/tb-unknown")).toBeNull();
  });
});

describe("registration after publishing", () => {
  let accession: string;
  let datasetId: number;
  let conceptDoi: string;
  let v1Doi: string;

  it("publishing reserves the DOIs and shows them pending; the job registers them, retrying when DataCite fails first", async () => {
    datacite.failNext(1); // the first write is refused (an outage)
    ({ accession, datasetId } = await publishNew());
    conceptDoi = `10.5072/${accession.toLowerCase()}`;
    v1Doi = `${conceptDoi}.v1`;
    const pending = await request(app).get(`/api/v1/datasets/${accession}`);
    expect(pending.body.dois).toEqual({
      version: { doi: v1Doi, state: "pending", url: `https://doi.org/${v1Doi}` },
      concept: { doi: conceptDoi, state: "pending", url: `https://doi.org/${conceptDoi}` },
    });

    await startDoiWorker({ pollingIntervalSeconds: 0.5 });
    await waitFor(async () => {
      const r = await request(app).get(`/api/v1/datasets/${accession}`);
      return r.body.dois.version.state === "registered" && r.body.dois.concept.state === "registered";
    }, "DOIs registered", 30_000);
    expect(datacite.writes.filter((w) => w.status === 503)).toHaveLength(1); // the outage happened, then a retry
    expect(datacite.creations.get(v1Doi)).toBe(1);
    expect(datacite.creations.get(conceptDoi)).toBe(1);

    const v = attrs(v1Doi);
    expect(v).toMatchObject({
      state: "findable",
      url: `${PUBLIC_URL}/datasets/${accession}/v/1`,
      version: "1",
      publisher: { name: "Tanglebank" },
      types: { resourceTypeGeneral: "Dataset" },
      titles: [{ title: "Flower visitors of the Verrin Hills heath" }],
      rightsList: [{ rightsIdentifier: "cc-by-4.0", rightsIdentifierScheme: "SPDX" }],
      subjects: [{ subject: "pollination" }, { subject: "heath" }],
    });
    expect(v.creators).toEqual([
      {
        name: "Hale, Rowan",
        nameType: "Personal",
        givenName: "Rowan",
        familyName: "Hale",
        nameIdentifiers: [{ nameIdentifier: "https://orcid.org/0000-0002-1825-0097", nameIdentifierScheme: "ORCID", schemeUri: "https://orcid.org" }],
        affiliation: [{ name: "Verrin Hills Ecology Group" }],
      },
    ]);
    expect(v.relatedIdentifiers).toEqual([{ relatedIdentifier: conceptDoi, relatedIdentifierType: "DOI", relationType: "IsVersionOf" }]);
    expect(attrs(conceptDoi)).toMatchObject({ state: "findable", url: `${PUBLIC_URL}/datasets/${accession}`, relatedIdentifiers: [{ relatedIdentifier: v1Doi, relationType: "HasVersion" }] });
    expect(attrs(conceptDoi).version).toBeUndefined();
  });

  it("a retried job sends nothing again, and a job that failed after DataCite stored the DOI updates instead of creating", async () => {
    const writes = datacite.writes.length;
    // the job's handler run again, as a retried or duplicate job would
    expect(await syncDatasetDois(datasetId)).toEqual({ created: [], updated: [], unchanged: [v1Doi, conceptDoi] });
    // as if the job had died between DataCite's answer and our commit
    await sequelize().query(`UPDATE dataset_dois SET state = 'pending', sent_hash = NULL, synced_at = NULL WHERE dataset_id = :datasetId`, { replacements: { datasetId } });
    const r = await syncDatasetDois(datasetId);
    expect(r.created).toEqual([]);
    expect(r.updated.sort()).toEqual([conceptDoi, v1Doi].sort());
    expect(datacite.creations.get(v1Doi)).toBe(1);
    expect(datacite.writes.slice(writes).every((w) => w.method === "PUT" && w.status === 200)).toBe(true);
  });

  it("the citation chain carries the registered DOI: JSON-LD, API, network page, bundle CITATIONS.bib and datapackage.json, the publication e-mail", async () => {
    const html = await datasetHtmlRenderer(`/datasets/${accession}/v/1`, "<html><head><title>x</title></head><body></body></html>");
    const ld = JSON.parse(/<script type="application\/ld\+json">([\s\S]*?)<\/script>/.exec(html!)![1]) as Record<string, unknown>;
    expect((ld.identifier as unknown[])[0]).toEqual({ "@type": "PropertyValue", propertyID: "DOI", value: v1Doi, url: `https://doi.org/${v1Doi}` });
    expect(ld.sameAs).toBe(`https://doi.org/${v1Doi}`);
    expect(ld.citation).toContain(`https://doi.org/${v1Doi}`);

    const view = await request(app).get(`/api/v1/network-views/${accession}/1/1`);
    expect(view.body.doi).toEqual({ doi: v1Doi, state: "registered", url: `https://doi.org/${v1Doi}` });

    const zip = await request(app)
      .get("/api/v1/bundles")
      .query({ refs: `${accession}/v1/1` })
      .buffer(true)
      .parse(binaryParser);
    expect(zip.status).toBe(200);
    const files = await unzip(zip.body as Buffer);
    expect(files.get("CITATIONS.bib")).toContain(`doi = {${v1Doi}}`);
    const pkg = JSON.parse(files.get("datapackage.json")!) as { resources: Array<{ path: string; sources: Array<{ title: string; path: string }> }> };
    expect(pkg.resources.find((r) => r.path.startsWith("networks/"))!.sources).toContainEqual({ title: `DOI ${v1Doi}`, path: `https://doi.org/${v1Doi}` });

    const mail = await catcher.waitFor((m) => m.subject.startsWith(`Published: ${accession}`));
    expect(mail.text).toContain(`DOI of this version: ${v1Doi}`);
    expect(mail.text).toContain(conceptDoi);
  });

  it("a new version gets its own DOI; the concept DOI lists both and follows the latest version", async () => {
    const nv = await owner.agent.post(`/api/v1/datasets/${accession}/versions`).set("x-csrf-token", owner.csrf).send({});
    expect(nv.status).toBe(201);
    const v2 = nv.body.versionId as number;
    await owner.agent.put(`/api/v1/deposits/${v2}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: { ...nv.body.metadata, title: "Flower visitors of the Verrin Hills heath, second season" } });
    expect((await submit(owner, v2)).status).toBe(200);
    expect((await decide(curator, v2, { decision: "publish" })).status).toBe(200);
    const v2Doi = `${conceptDoi}.v2`;
    await waitFor(async () => attrs(conceptDoi)?.titles && (attrs(conceptDoi).titles as Array<{ title: string }>)[0].title.endsWith("second season") && attrs(v2Doi)?.state === "findable", "v2 DOI and concept update", 30_000);
    expect(attrs(v2Doi).relatedIdentifiers).toEqual([
      { relatedIdentifier: conceptDoi, relatedIdentifierType: "DOI", relationType: "IsVersionOf" },
      { relatedIdentifier: v1Doi, relatedIdentifierType: "DOI", relationType: "IsNewVersionOf" },
    ]);
    await waitFor(async () => (attrs(v1Doi).relatedIdentifiers as unknown[]).length === 2, "v1 points to v2");
    expect(attrs(v1Doi).relatedIdentifiers).toContainEqual({ relatedIdentifier: v2Doi, relatedIdentifierType: "DOI", relationType: "IsPreviousVersionOf" });
    expect(attrs(conceptDoi).relatedIdentifiers).toEqual([
      { relatedIdentifier: v1Doi, relatedIdentifierType: "DOI", relationType: "HasVersion" },
      { relatedIdentifier: v2Doi, relatedIdentifierType: "DOI", relationType: "HasVersion" },
    ]);
    expect(datacite.creations.get(conceptDoi)).toBe(1);
    const page = await request(app).get(`/api/v1/datasets/${accession}/versions/1`);
    expect(page.body.dois.version).toMatchObject({ doi: v1Doi, state: "registered" });
  });

  it("a curator's correction of published metadata reaches the version DOI and the concept DOI", async () => {
    const versionId = (await curator.agent.get(`/api/v1/reviews?state=published&q=${accession}`)).body.data.find((i: { number: number }) => i.number === 2)?.versionId as number;
    expect(versionId).toBeGreaterThan(0);
    const corrected = "Flower visitors of the Verrin Hills heath, second season (corrected)";
    const r = await curator.agent.put(`/api/v1/reviews/${versionId}/metadata`).set("x-csrf-token", curator.csrf).send({ metadata: studyMeta({ title: corrected }) });
    expect(r.status).toBe(200);
    const titleOf = (doi: string) => (attrs(doi).titles as Array<{ title: string }>)[0].title;
    await waitFor(async () => titleOf(`${conceptDoi}.v2`) === corrected && titleOf(conceptDoi) === corrected, "the corrected title in the DOI metadata", 30_000);
    expect(datacite.creations.get(`${conceptDoi}.v2`)).toBe(1);
  });

  it("withdrawal keeps every DOI findable and resolving to the tombstone page, with the reason in its metadata", async () => {
    const w = await curator.agent.post(`/api/v1/datasets/${accession}/withdraw`).set("x-csrf-token", curator.csrf).send({ reason: "Transcription error in the field sheets." });
    expect(w.status).toBe(200);
    await waitFor(async () => (attrs(`${conceptDoi}.v2`).descriptions as Array<{ descriptionType: string }>).some((d) => d.descriptionType === "Other"), "withdrawal in the DOI metadata", 30_000);
    for (const doi of [v1Doi, `${conceptDoi}.v2`]) {
      expect(attrs(doi).state).toBe("findable");
      expect(attrs(doi).dates).toContainEqual({ date: expect.stringMatching(/^\d{4}-\d{2}-\d{2}$/), dateType: "Withdrawn" });
      expect(JSON.stringify(attrs(doi).descriptions)).toContain("Transcription error in the field sheets.");
    }
    const resolved = await fetch(`${datacite.url}/resolve/${v1Doi}`, { redirect: "manual" });
    expect(resolved.status).toBe(302);
    const target = new URL(resolved.headers.get("location")!);
    expect(target.href).toBe(`${PUBLIC_URL}/datasets/${accession}/v/1`);
    // that address answers with the tombstone
    const tomb = await request(app).get(`/api/v1/network-views/${accession}/1/1`);
    expect(tomb.status).toBe(410);
    expect(tomb.body).toMatchObject({ accession, reason: "Transcription error in the field sheets." });
    expect(datacite.creations.get(v1Doi)).toBe(1);
  });
});
