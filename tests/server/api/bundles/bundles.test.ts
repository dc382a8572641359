/**
 * Bundles: the zip is opened with yauzl (an independent zip reader) and checked: every datapackage
 * resource exists in the zip, every network CSV parses back (engine parser) to the stored network,
 * metrics.csv rows equal the database, withdrawn networks are absent, coordinates are generalised, limits
 * and bad references are refused, and the estimate counts what the bundle holds.
 */
import request from "supertest";
import yauzl from "yauzl";
import { parse as parseCsv } from "csv-parse/sync";
import { QueryTypes } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { sequelize } from "../../../../server/src/db/sequelize";
import { catalogueStore } from "../../../../server/src/api/catalogue/catalogue.store";
import { deserializeNetwork, parseNetworkText, serializeNetwork } from "@shared/network/index";
import { resetDatabase } from "../../../setup/db";
import { binaryParser, unzip } from "../../support/unzip";
import { publishDataset, type PublishedFixture } from "../../support/catalogue-fixtures";
import { Writable } from "node:stream";
import { resolveSelection } from "../../../../server/src/api/bundles/bundles.selection";
import { writeBundle } from "../../../../server/src/api/bundles/bundles.stream";
import { bundleMatrixCsv, fillStoredMatrixCsvs, MATRIX_CSV_FORMAT, MATRIX_CSV_MAX_CELLS } from "../../../../server/src/api/bundles/bundles.stored-csv";
import zlib from "node:zlib";

const app = createApp();
let a: PublishedFixture;
let b: PublishedFixture;
let withdrawn: PublishedFixture;

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  a = await publishDataset({
    study: { title: "Heath visitors", licence: "CC0-1.0" },
    networks: [
      { seed: 1, rows: 5, cols: 6, metrics: { q: 0.41, z: 2.5, qRel: 0.3, p: 0.01, nodf: 40.5 } },
      { seed: 2, rows: 4, cols: 4, weighted: true, metrics: { q: 0.33, z: 1.2, qRel: 0.1, p: 0.2 } },
      { seed: 3, rows: 6, kind: "unipartite", metrics: null },
    ],
  });
  b = await publishDataset({
    study: { title: "Coastal dispersal", licence: "CC-BY-4.0" },
    networks: [{ seed: 4, rows: 7, cols: 5, meta: { interactionType: "seed-dispersal", locality: { placeName: "Tallow Coast", countryCode: "SE", decimalLatitude: 57.6789, decimalLongitude: 11.2345, generalisation: "1" } }, metrics: { q: 0.5, z: 3.3 } }],
  });
  withdrawn = await publishDataset({ state: "withdrawn", study: { title: "Withdrawn" }, networks: [{ seed: 5, metrics: { q: 0.2, z: 0.1 } }] });
});
afterAll(shutdownServerResources);



/** CRC-32 (IEEE 802.3, reflected polynomial 0xEDB88320) bit by bit, straight from its definition. */
function crc32Reference(buf: Buffer): number {
  let c = 0xffffffff;
  for (const byte of buf) {
    c ^= byte;
    for (let k = 0; k < 8; k++) c = c & 1 ? (c >>> 1) ^ 0xedb88320 : c >>> 1;
  }
  return (c ^ 0xffffffff) >>> 0;
}

interface ZipEntryInfo {
  method: number;
  crc: number;
  content: Buffer;
}

/** Every entry with its compression method (0 stored, 8 deflated), recorded CRC-32 and content. */
async function zipEntries(buf: Buffer): Promise<Map<string, ZipEntryInfo>> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(buf, { lazyEntries: true }, (err, zip) => {
      if (err || !zip) return reject(err);
      const out = new Map<string, ZipEntryInfo>();
      zip.on("entry", (entry: yauzl.Entry) => {
        zip.openReadStream(entry, (e, stream) => {
          if (e || !stream) return reject(e);
          const parts: Buffer[] = [];
          stream.on("data", (c: Buffer) => parts.push(c));
          stream.on("end", () => {
            out.set(entry.fileName, { method: entry.compressionMethod, crc: entry.crc32, content: Buffer.concat(parts) });
            zip.readEntry();
          });
        });
      });
      zip.on("end", () => resolve(out));
      zip.on("error", reject);
      zip.readEntry();
    });
  });
}

async function download(query: Record<string, string>): Promise<Map<string, string>> {
  const res = await request(app).get("/api/v1/bundles").query(query).buffer(true).parse(binaryParser);
  expect(res.status, res.status !== 200 ? JSON.stringify(res.body) : "").toBe(200);
  expect(res.headers["content-type"]).toBe("application/zip");
  return unzip(res.body as Buffer);
}

describe("bundle contents", () => {
  it("a filter bundle holds every datapackage resource, CSVs equal to the stored networks and metrics equal to the database", async () => {
    const files = await download({});
    const names = [...files.keys()].sort();
    const dp = JSON.parse(files.get("datapackage.json")!);
    expect(dp.profile).toBe("tabular-data-package");
    expect(dp.licenses.map((l: { name: string }) => l.name).sort()).toEqual(["CC-BY-4.0", "CC0-1.0"]);
    const paths = dp.resources.map((r: { path: string }) => r.path);
    for (const p of paths) expect(names).toContain(p);
    for (const r of dp.resources) {
      expect(r.format).toBe("csv");
      expect(r.mediatype).toBe("text/csv");
      expect(r.licenses.length).toBeGreaterThan(0);
      expect(r.sources.length).toBeGreaterThan(0);
      // the Table Schema names exactly the CSV's header
      const header = parseCsv(files.get(r.path)!, { to_line: 1 })[0] as string[];
      expect(r.schema.fields.map((f: { name: string }) => f.name)).toEqual(header);
    }
    // the default optional parts (partitions, roles, null distributions) come with every bundle
    expect(names).toEqual(
      [
        "CITATIONS.bib",
        "README.txt",
        "datapackage.json",
        "metrics.csv",
        "networks.csv",
        "partitions.csv",
        "roles.csv",
        "null_distribution.csv",
        ...[...a.networkIds.map((_, i) => `networks/${a.accession}_v1_${i + 1}.csv`), `networks/${b.accession}_v1_1.csv`],
      ].sort(),
    );
    // withdrawn: absent everywhere
    for (const content of files.values()) expect(content).not.toContain(withdrawn.accession);

    // each network CSV parses back to the stored canonical network
    const stored = await sequelize().query<{ id: number; canonical: unknown; accession: string; position: number; kind: "bipartite" | "unipartite"; directed: boolean }>(
      `SELECT n.id, n.canonical, d.accession, n.position, n.kind, n.directed FROM networks n JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id WHERE v.state = 'published'`,
      { type: QueryTypes.SELECT },
    );
    for (const s of stored) {
      const text = files.get(`networks/${s.accession}_v1_${s.position}.csv`)!;
      const { network } = parseNetworkText(text, { fileName: "x.csv", kind: s.kind, directed: s.directed });
      expect(serializeNetwork(network)).toEqual(serializeNetwork(deserializeNetwork(s.canonical)));
    }

    // metrics.csv equals the database (current runs)
    const metrics = parseCsv(files.get("metrics.csv")!, { columns: true }) as Array<Record<string, string>>;
    const db = await sequelize().query<{ accession: string; position: number; n_nodes: number; n_links: number; connectance: number; q: number | null; z: number | null; q_rel: number | null; p: number | null; nodf: number | null }>(
      `SELECT d.accession, n.position, n.n_nodes, n.n_links, n.connectance, r.q, r.z, r.q_rel, r.p, r.nodf
       FROM networks n JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id
       LEFT JOIN metric_runs r ON r.network_id = n.id AND r.status = 'succeeded'
       WHERE v.state = 'published' ORDER BY d.accession, n.position`,
      { type: QueryTypes.SELECT },
    );
    expect(metrics.length).toBe(db.length);
    const num = (s: string) => (s === "" ? null : Number(s));
    db.forEach((row, i) => {
      const m = metrics[i];
      expect([m.accession, Number(m.network)]).toEqual([row.accession, row.position]);
      expect(Number(m.S)).toBe(row.n_nodes);
      expect(Number(m.L)).toBe(row.n_links);
      expect(Number(m.C)).toBeCloseTo(row.connectance, 12);
      expect(num(m.Q)).toBe(row.q);
      expect(num(m.curveball_z)).toBe(row.z);
      expect(m.primary_null_model).toBe(row.q === null ? "" : "curveball");
      expect(m.er_z).toBe(""); // a model the run did not compute stays empty, never borrowed from another
      expect(num(m.curveball_Q_rel)).toBe(row.q_rel);
      expect(num(m.curveball_p)).toBe(row.p);
      expect(num(m.NODF)).toBe(row.nodf);
    });
    expect(Object.keys(metrics[0])).toEqual(expect.arrayContaining(["network_ref", "accession", "version", "network", "kind", "S", "I", "J", "L", "C", "Q", "modules", "primary_null_model", "curveball_mean", "curveball_sd", "curveball_z", "curveball_z_se", "curveball_Q_rel", "curveball_p", "curveball_p_at_floor", "er_z", "totals_connectance_p", "NODF", "algorithm", "seed", "settings_current"]));
    for (const m of metrics) expect(m.network_ref).toBe(`${m.accession}/v${m.version}/${m.network}`);

    // networks.csv: public coordinates only (1° grid for the coastal site)
    const nets = parseCsv(files.get("networks.csv")!, { columns: true }) as Array<Record<string, string>>;
    const coast = nets.find((n) => n.accession === b.accession)!;
    expect([Number(coast.decimal_latitude), Number(coast.decimal_longitude)]).toEqual([58, 11]);
    expect(files.get("networks.csv")).not.toContain("57.6789");

    expect(files.get("CITATIONS.bib")).toContain(`@dataset{${a.accession}-v1`);
    expect(files.get("README.txt")).toMatch(/Raw Q depends on network size/);
    expect(files.get("README.txt")).not.toMatch(/compare z or Q_rel|null_model = auto|null model auto/);
    expect(files.get("README.txt")).toMatch(/curveball_z/);
    expect(files.get("README.txt")).toMatch(/null replicates/);
  });

  it("stored matrix CSVs: a network without one, or with one from another writer version, gets the same file written from its canonical form; the fill writes them back", async () => {
    const refs = [...a.networkIds.map((_, i) => `${a.accession}/v1/${i + 1}`), `${b.accession}/v1/1`].join(",");
    const before = await download({ refs });
    const stored = async (id: number) =>
      (await sequelize().query<{ matrix_csv: string | null; matrix_csv_format: number | null; canonical: unknown }>(`SELECT matrix_csv, matrix_csv_format, canonical FROM networks WHERE id = :id`, { replacements: { id }, type: QueryTypes.SELECT }))[0];
    // every published fixture network has its CSV stored, as publishing writes it
    for (const id of [...a.networkIds, ...b.networkIds]) {
      const r = await stored(id);
      expect(r.matrix_csv_format).toBe(MATRIX_CSV_FORMAT);
      expect(r.matrix_csv).toBe(before.get(`networks/${id === b.networkIds[0] ? `${b.accession}_v1_1` : `${a.accession}_v1_${a.networkIds.indexOf(id) + 1}`}.csv`));
    }
    const draft = await publishDataset({ state: "draft", networks: [{ seed: 9 }] });
    expect((await stored(draft.networkIds[0])).matrix_csv).toBeNull();

    await sequelize().query(`UPDATE networks SET matrix_csv = NULL, matrix_csv_format = NULL WHERE id = :id`, { replacements: { id: a.networkIds[0] } });
    await sequelize().query(`UPDATE networks SET matrix_csv = 'node,stale\nx,1\n', matrix_csv_format = :old WHERE id = :id`, { replacements: { id: a.networkIds[1], old: MATRIX_CSV_FORMAT - 1 } });
    const after = await download({ refs });
    const networkFiles = (m: Map<string, string>) => [...m].filter(([k]) => k.startsWith("networks/")).sort();
    expect(networkFiles(after)).toEqual(networkFiles(before));
    expect(JSON.parse(after.get("datapackage.json")!).resources).toEqual(JSON.parse(before.get("datapackage.json")!).resources);
    for (const content of after.values()) expect(content).not.toContain("stale");

    // the fill (run at server start) writes the missing and the stale ones within the size limit, never drafts:
    // 5 × 6 = 30 cells is over a limit of 20, 4 × 4 = 16 is not
    expect(await fillStoredMatrixCsvs({ maxCells: 20 })).toBe(1);
    expect((await stored(a.networkIds[0])).matrix_csv).toBeNull();
    expect((await stored(a.networkIds[1])).matrix_csv).toBe(before.get(`networks/${a.accession}_v1_2.csv`));
    expect(await fillStoredMatrixCsvs()).toBe(1);
    const first = await stored(a.networkIds[0]);
    expect([first.matrix_csv, first.matrix_csv_format]).toEqual([bundleMatrixCsv(first.canonical).toString("utf8"), MATRIX_CSV_FORMAT]);
    expect(await fillStoredMatrixCsvs()).toBe(0);
    expect((await stored(draft.networkIds[0])).matrix_csv).toBeNull();
    await sequelize().query(`DELETE FROM dataset_versions WHERE id = :v; DELETE FROM datasets WHERE id = :d`, { replacements: { v: draft.versionId, d: draft.datasetId } });
  });

  it("a stored CSV follows its network's canonical form: changing the form (by any writer) clears it", async () => {
    const id = a.networkIds[2];
    const read = async () =>
      (await sequelize().query<{ canonical: unknown; matrix_csv: string | null }>(`SELECT canonical, matrix_csv FROM networks WHERE id = :id`, { replacements: { id }, type: QueryTypes.SELECT }))[0];
    const before = await read();
    expect(before.matrix_csv).not.toBeNull();
    await sequelize().query(`UPDATE networks SET canonical = canonical WHERE id = :id`, { replacements: { id } });
    expect((await read()).matrix_csv).toBe(before.matrix_csv); // the same form: kept
    await sequelize().query(`UPDATE networks SET canonical = jsonb_set(canonical, '{rows,0}', '"renamed"') WHERE id = :id`, { replacements: { id } });
    expect((await read()).matrix_csv).toBeNull();
    await sequelize().query(`UPDATE networks SET canonical = :c::jsonb WHERE id = :id`, { replacements: { id, c: JSON.stringify(before.canonical) } });
    expect(await fillStoredMatrixCsvs()).toBe(1);
    expect((await read()).matrix_csv).toBe(before.matrix_csv);
  });

  it("compression: fast (default) stores every file, small deflates them; both hold the same files with correct CRC-32s", async () => {
    // check value of CRC-32 for "123456789": 0xCBF43926 (the standard check value of this CRC)
    expect(crc32Reference(Buffer.from("123456789"))).toBe(0xcbf43926);
    const get = async (query: Record<string, string>) => {
      const res = await request(app).get("/api/v1/bundles").query(query).buffer(true).parse(binaryParser);
      expect(res.status).toBe(200);
      return { size: (res.body as Buffer).length, entries: await zipEntries(res.body as Buffer) };
    };
    const fast = await get({});
    const fastNamed = await get({ compression: "fast" });
    const small = await get({ compression: "small" });
    expect([...fast.entries.keys()].sort()).toEqual([...small.entries.keys()].sort());
    expect([...fastNamed.entries.keys()].sort()).toEqual([...fast.entries.keys()].sort());
    for (const [name, f] of fast.entries) {
      const sm = small.entries.get(name)!;
      expect(f.method, name).toBe(0);
      expect(sm.method, name).toBe(8);
      expect(f.crc, name).toBe(crc32Reference(f.content));
      expect(sm.crc, name).toBe(crc32Reference(sm.content));
      // the same bytes, except the generation time (datapackage.json) and README.txt, which says how it was packed
      const strip = (x: Buffer) => x.toString("utf8").replace(/\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z/g, "T");
      if (name !== "README.txt") expect(strip(sm.content), name).toBe(strip(f.content));
    }
    expect(fast.entries.get("README.txt")!.content.toString()).toMatch(/stored uncompressed \(compression=fast/);
    expect(small.entries.get("README.txt")!.content.toString()).toMatch(/deflated \(compression=small\)/);
    expect(small.size).toBeLessThan(fast.size / 2);

    const bad = await request(app).get("/api/v1/bundles").query({ compression: "zstd" });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toEqual([{ path: "compression", message: "compression must be one of fast, small." }]);
    const agent = request.agent(app);
    const s = await agent.get("/api/v1/auth/session");
    const post = await agent.post("/api/v1/bundles").set("x-csrf-token", s.body.csrfToken).send({ refs: [`${b.accession}/v1/1`], compression: "small" }).buffer(true).parse(binaryParser);
    expect(post.status).toBe(200);
    const posted = await zipEntries(post.body as Buffer);
    expect(posted.get(`networks/${b.accession}_v1_1.csv`)!.method).toBe(8);
  });

  it("a selection bundle holds exactly the chosen networks; a filter bundle only the matching ones", async () => {
    const files = await download({ refs: `${b.accession}/v1/1,${a.accession}/v1/2` });
    expect([...files.keys()].filter((n) => n.startsWith("networks/")).sort()).toEqual([`networks/${a.accession}_v1_2.csv`, `networks/${b.accession}_v1_1.csv`].sort());
    const metrics = parseCsv(files.get("metrics.csv")!, { columns: true }) as Array<Record<string, string>>;
    expect(metrics.map((m) => `${m.accession}/v${m.version}/${m.network}`)).toEqual([`${b.accession}/v1/1`, `${a.accession}/v1/2`]);
    const filtered = await download({ interactionType: "seed-dispersal" });
    expect([...filtered.keys()].filter((n) => n.startsWith("networks/"))).toEqual([`networks/${b.accession}_v1_1.csv`]);
  });

  it("refuses withdrawn and unknown references, bad references and too many networks", async () => {
    const res = await request(app).get("/api/v1/bundles").query({ refs: `${withdrawn.accession}/v1/1,TB-999999/v1/1` });
    expect(res.status).toBe(422);
    expect(res.body.details).toEqual([
      { path: "refs/0", message: `${withdrawn.accession}/v1/1 was withdrawn and cannot be bundled.` },
      { path: "refs/1", message: "TB-999999/v1/1 is not a published network." },
    ]);
    // the estimate lists them instead (the page offers to drop them) and counts the others
    const agent0 = request.agent(app);
    const s0 = await agent0.get("/api/v1/auth/session");
    const est = await agent0.post("/api/v1/bundles/estimate").set("x-csrf-token", s0.body.csrfToken).send({ refs: [`${withdrawn.accession}/v1/1`, `${b.accession}/v1/1`, "TB-999999/v1/1"] });
    expect(est.status).toBe(200);
    expect(est.body.count).toBe(1);
    expect(est.body.unavailable.map((u: { ref: string; reason: string }) => [u.ref, u.reason])).toEqual([
      [`${withdrawn.accession}/v1/1`, "withdrawn"],
      ["TB-999999/v1/1", "not_published"],
    ]);
    const bad = await request(app).get("/api/v1/bundles").query({ refs: `${b.accession}/v1/1,TB-1/v1` });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toEqual([{ path: "refs", message: 'refs: "TB-1/v1" must be a network reference such as TB-000042/v2/3.' }]);
    const many = Array.from({ length: 5001 }, (_, i) => `TB-000001/v1/${i + 1}`);
    const agent = request.agent(app);
    const s = await agent.get("/api/v1/auth/session");
    const big2 = await agent.post("/api/v1/bundles").set("x-csrf-token", s.body.csrfToken).send({ refs: many });
    expect(big2.status).toBe(413);
    expect(big2.body.code).toBe("bundle_too_large");
  });

  it("refuses unknown filter keys by name (400) instead of selecting the whole catalogue", async () => {
    const est = await request(app).post("/api/v1/bundles/estimate").send({ filter: { contry: "NO" } });
    expect(est.status).toBe(400);
    expect(est.body.details).toEqual([expect.objectContaining({ path: "/filter/contry", message: expect.stringMatching(/Unknown parameter "contry"/) })]);
    const get = await request(app).get("/api/v1/bundles").query({ interactiontype: "pollination" });
    expect(get.status).toBe(400);
    expect(get.body.details[0].path).toBe("interactiontype");
    // paging is not part of a bundle's selection: refused by name, not ignored
    const paged = await request(app).get("/api/v1/bundles").query({ interactionType: "pollination", page: 2 });
    expect(paged.body.details).toEqual([expect.objectContaining({ path: "page", message: expect.stringMatching(/^Unknown parameter "page"/) })]);
    const agent = request.agent(app);
    const s = await agent.get("/api/v1/auth/session");
    const body = await agent.post("/api/v1/bundles").set("x-csrf-token", s.body.csrfToken).send({ filter: { nodesMin: "x" }, include: "roles,pictures" });
    expect(body.status).toBe(400);
    expect(body.body.details).toEqual([{ path: "/include", message: "include must list parts of a bundle from partitions, roles, nulls, edges, originals (or none)." }]);
    const filter = await agent.post("/api/v1/bundles").set("x-csrf-token", s.body.csrfToken).send({ filter: { nodesMin: "x" } });
    expect(filter.body.details).toEqual([{ path: "/filter/nodesMin", message: "nodesMin must be a whole number of at least 0." }]);
  });

  it("estimates count and size before download", async () => {
    const agent = request.agent(app);
    const s = await agent.get("/api/v1/auth/session");
    const est = await agent.post("/api/v1/bundles/estimate").set("x-csrf-token", s.body.csrfToken).send({ filter: { country: "NO" } });
    expect(est.status).toBe(200);
    expect(est.body.count).toBe(3);
    const res = await request(app).get("/api/v1/bundles").query({ country: "NO" }).buffer(true).parse(binaryParser);
    const files = await unzip(res.body as Buffer);
    let total = 0;
    for (const c of files.values()) total += Buffer.byteLength(c);
    // the estimate is of the uncompressed files: within a factor of 3 of the truth on small networks
    expect(est.body.estimatedBytes).toBeGreaterThan(total / 3);
    expect(est.body.estimatedBytes).toBeLessThan(total * 3);
  });

  it("stops reading networks when the client goes away", async () => {
    const big = await publishDataset({ study: { title: "Many plots" }, networks: Array.from({ length: 150 }, (_, i) => ({ seed: 1000 + i, rows: 30, cols: 60, density: 0.5, weighted: true })) });
    const nets = await resolveSelection({ kind: "refs", refs: big.networkIds.map((_, i) => `${big.accession}/v1/${i + 1}`) });
    const sink = () => {
      let bytes = 0;
      return { w: new Writable({ write(c: Buffer, _e, cb) { bytes += c.length; cb(); } }), bytes: () => bytes };
    };
    const full = sink();
    const done = await writeBundle(full.w, { networks: nets, title: "all", signal: new AbortController().signal });
    expect(done.aborted).toBe(false);
    // the client stops reading (its socket never drains), then goes away: the bundle stops where it was
    const ctrl = new AbortController();
    let bytes = 0;
    const stalled = new Writable({
      highWaterMark: 1,
      write(c: Buffer) {
        bytes += c.length; // never acknowledged: backpressure all the way up to the database reads
      },
    });
    setTimeout(() => ctrl.abort(), 300);
    const cut = await writeBundle(stalled, { networks: nets, title: "cut", signal: ctrl.signal, batchSize: 10 });
    expect(cut.aborted).toBe(true);
    expect(bytes).toBeLessThan(full.bytes());
  });
});

describe("large networks", () => {
  it("a matrix too large to be stored is streamed row by row into the bundle: the same bytes, a correct CRC-32, fields matching its header", async () => {
    const big = await publishDataset({ study: { title: "Large sparse web" }, networks: [{ seed: 11, rows: 1001, cols: 1000, density: 0.002, weighted: true, metrics: { q: 0.7, z: 9 } }] });
    const [row] = await sequelize().query<{ canonical: unknown; matrix_csv: string | null; cells: number }>(`SELECT canonical, matrix_csv, n_rows * n_cols AS cells FROM networks WHERE id = :id`, {
      replacements: { id: big.networkIds[0] },
      type: QueryTypes.SELECT,
    });
    expect(row.cells).toBeGreaterThan(MATRIX_CSV_MAX_CELLS);
    expect(row.matrix_csv).toBeNull(); // over the limit: never stored
    const res = await request(app).get("/api/v1/bundles").query({ refs: `${big.accession}/v1/1,${b.accession}/v1/1` }).buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    const entries = await zipEntries(res.body as Buffer);
    const file = entries.get(`networks/${big.accession}_v1_1.csv`)!;
    const expected = bundleMatrixCsv(row.canonical);
    expect(expected.length).toBeGreaterThan(2_000_000);
    expect(file.content.equals(expected)).toBe(true);
    expect(file.crc).toBe(zlib.crc32(file.content));
    const dp = JSON.parse(entries.get("datapackage.json")!.content.toString("utf8"));
    const resource = dp.resources.find((r: { path: string }) => r.path === `networks/${big.accession}_v1_1.csv`);
    const header = parseCsv(file.content.subarray(0, file.content.indexOf(10) + 1), { to_line: 1 })[0] as string[];
    expect(resource.schema.fields.map((f: { name: string }) => f.name)).toEqual(header);
    expect(header).toHaveLength(1001);
  });

  it("a damaged large network cuts its bundle and download short, and the server goes on: found by the checks, or while its rows are written", async () => {
    const big = await publishDataset({ study: { title: "Damaged web" }, networks: [{ seed: 41, rows: 1001, cols: 1000, density: 0.002 }] });
    const id = big.networkIds[0];
    const ref = `${big.accession}/v1/1`;
    const original = (await sequelize().query<{ c: string }>(`SELECT canonical::text AS c FROM networks WHERE id = :id`, { replacements: { id }, type: QueryTypes.SELECT }))[0].c;
    /** The bundle's bytes, or null when the answer was cut short (a zip that does not open, or a broken connection). */
    const bundleOf = async (): Promise<Map<string, ZipEntryInfo> | null> => {
      try {
        const res = await request(app).get("/api/v1/bundles").query({ refs: `${ref},${b.accession}/v1/1` }).buffer(true).parse(binaryParser);
        return await zipEntries(res.body as Buffer);
      } catch {
        return null;
      }
    };
    expect(await bundleOf()).not.toBeNull();
    // while writing: the last link's column is out of range, which is seen only when its row is written
    await sequelize().query(`UPDATE networks SET canonical = jsonb_set(canonical, '{idx,-1}', '5000') WHERE id = :id`, { replacements: { id } });
    expect(await bundleOf()).toBeNull();
    const download = await request(app).get(`/api/v1/networks/${ref}/data.csv`).then(
      (r) => r.text.length,
      () => -1,
    );
    expect(download).not.toBe(Buffer.byteLength(bundleMatrixCsv(JSON.parse(original))));
    // by the checks: the row pointers do not start at 0
    await sequelize().query(`UPDATE networks SET canonical = jsonb_set(:c::jsonb, '{ptr,0}', '7') WHERE id = :id`, { replacements: { id, c: original } });
    expect(await bundleOf()).toBeNull();
    // the single download refuses before sending anything, with a named server-side error (never a crash)
    const refused = await request(app).get(`/api/v1/networks/${ref}/data.csv`);
    expect(refused.status).toBe(500);
    expect(refused.body).toEqual({ code: "network_damaged", message: `The stored data of network ${ref} are damaged and cannot be written as CSV. This is a fault on our side and has been logged.` });
    // the server is still here
    expect((await request(app).get("/api/v1/health")).status).toBe(200);
    await sequelize().query(`UPDATE networks SET canonical = :c::jsonb WHERE id = :id`, { replacements: { id, c: original } });
    expect(await bundleOf()).not.toBeNull();
  });

  it("the fill passes over a network whose stored form is damaged and writes the others", async () => {
    const ds = await publishDataset({ study: { title: "Two plots" }, networks: [{ seed: 31 }, { seed: 32 }], storeMatrixCsvs: false });
    // the last test of this file: the damaged network stays
    await sequelize().query(`UPDATE networks SET canonical = '{"v":1,"kind":"bipartite","rows":["a"],"cols":["b"],"ptr":[0,5],"idx":[]}' WHERE id = :id`, { replacements: { id: ds.networkIds[0] } });
    expect(await fillStoredMatrixCsvs()).toBe(1);
    const rows = await sequelize().query<{ id: number; matrix_csv: string | null }>(`SELECT id, matrix_csv FROM networks WHERE id IN (:ids) ORDER BY id`, { replacements: { ids: ds.networkIds }, type: QueryTypes.SELECT });
    expect(rows.map((r) => r.matrix_csv === null)).toEqual([true, false]);
  });
});
