/**
 * Deposits through the API against the real database: drafts, metadata saved as you go, uploads (files and
 * zips) with every bad-file case of the spec, and the guarantees that nothing half-written remains.
 */
import { createHash } from "node:crypto";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { config, resetConfig } from "../../../../server/src/config/env";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { sequelize } from "../../../../server/src/db/sequelize";
import { AuditLog } from "../../../../server/src/models";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { startMailCatcher } from "../../support/stack";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";
import { davisCsv, karateCsv, makeDraft, networkMeta, SMALL_MATRIX, studyMeta, submit } from "../../support/deposit-helpers";
import { makeZip } from "../../support/zip-writer";

let app: ReturnType<typeof createApp>;
let catcher: MailCatcher;
let owner: SignedInAgent;
let other: SignedInAgent;
let curator: SignedInAgent;
let visitor: SignedInAgent;
let unverified: SignedInAgent;

async function count(table: string): Promise<number> {
  const [rows] = (await sequelize().query(`SELECT count(*)::int AS n FROM ${table}`)) as [Array<{ n: number }>, unknown];
  return rows[0].n;
}

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  catcher = await startMailCatcher();
  app = createApp();
  const o = await createUser({ displayName: "Rowan Hale" });
  const x = await createUser();
  const c = await createUser({ role: "curator" });
  const u = await createUser({ verified: false });
  owner = await agentFor(app, o.email);
  other = await agentFor(app, x.email);
  curator = await agentFor(app, c.email);
  unverified = await agentFor(app, u.email);
  visitor = await agentFor(app);
});
afterAll(async () => {
  await catcher.close();
  await shutdownServerResources();
});

describe("drafts", () => {
  it("creates a draft with partial metadata, lists it and shows it to owner and curators only", async () => {
    const res = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({ metadata: { title: "Half-done" } });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ accession: null, version: { number: 1, state: "draft" }, metadata: { title: "Half-done" }, editable: true, networks: [] });
    expect(res.body.findings.study.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(["/description", "/creators", "/licence", "/contactEmail"]));
    const id = res.body.versionId;

    const list = await owner.agent.get("/api/v1/deposits");
    expect(list.status).toBe(200);
    expect(list.body.data).toEqual([expect.objectContaining({ versionId: id, state: "draft", title: "Half-done", networkCount: 0 })]);
    expect(list.body.meta.total).toBe(1);

    expect((await other.agent.get(`/api/v1/deposits/${id}`)).status).toBe(404);
    expect((await other.agent.get("/api/v1/deposits")).body.data).toEqual([]);
    expect((await curator.agent.get(`/api/v1/deposits/${id}`)).status).toBe(200);
    expect((await visitor.agent.get(`/api/v1/deposits/${id}`)).status).toBe(401);
    expect((await unverified.agent.post("/api/v1/deposits").set("x-csrf-token", unverified.csrf).send({})).status).toBe(403);
  });

  it("saves metadata as you go; refuses non-object metadata", async () => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
    const id = c.body.versionId;
    const r = await owner.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: studyMeta() });
    expect(r.status).toBe(200);
    expect(r.body.findings.study).toEqual([]);
    expect(r.body.lockVersion).toBe(1);
    const bad = await owner.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: [1] });
    expect(bad.status).toBe(400);
    expect((await other.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", other.csrf).send({ metadata: {} })).status).toBe(404);
    expect((await curator.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", curator.csrf).send({ metadata: {} })).status).toBe(403);
    const audits = await AuditLog.findAll({ where: { entityId: String(id) } });
    expect(audits.map((a) => a.action)).toEqual(["deposit.create", "deposit.metadata.update"]);
  });

  it("deletes a draft with its networks and files; other people cannot", async () => {
    const { versionId } = await makeDraft(owner, [["only-here.csv", "p,a,b\nx,1,7\ny,2,0\n"]]);
    const files = await count("stored_files");
    expect((await other.agent.delete(`/api/v1/deposits/${versionId}`).set("x-csrf-token", other.csrf)).status).toBe(404);
    const del = await owner.agent.delete(`/api/v1/deposits/${versionId}`).set("x-csrf-token", owner.csrf);
    expect(del.status).toBe(204);
    expect((await owner.agent.get(`/api/v1/deposits/${versionId}`)).status).toBe(404);
    expect(await count("stored_files")).toBe(files - 1);
    const a = await AuditLog.findOne({ where: { action: "deposit.delete", entityId: String(versionId) } });
    expect(a).not.toBeNull();
  });
});

describe("uploads", () => {
  it("stores files byte for byte with SHA-256, parses them and dedupes identical files", async () => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({ metadata: studyMeta() });
    const id = c.body.versionId;
    const davis = davisCsv();
    const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).field("kind", "bipartite").attach("files", davis, "davis.csv").attach("files", Buffer.from(SMALL_MATRIX), "heath.csv");
    expect(res.status).toBe(201);
    expect(res.body.networks.map((n: { position: number }) => n.position)).toEqual([1, 2]);
    const d = res.body.deposit.networks[0];
    // Davis Southern Women: 18 women × 14 events, 89 attendances (tests/fixtures/README.md).
    expect(d).toMatchObject({ originalName: "davis.csv", format: "matrix", kind: "bipartite", nRows: 18, nCols: 14, nNodes: 32, nLinks: 89, weighted: false, size: davis.length });
    expect(d.connectance).toBeCloseTo(89 / 252, 12);
    expect(d.sha256).toBe(createHash("sha256").update(davis).digest("hex"));
    const file = await owner.agent.get(`/api/v1/deposits/${id}/networks/${d.id}/file`);
    expect(file.status).toBe(200);
    expect(Buffer.from(file.text)).toEqual(davis);
    expect(file.headers["content-disposition"]).toContain("davis.csv");
    expect((await other.agent.get(`/api/v1/deposits/${id}/networks/${d.id}/file`)).status).toBe(404);
    const canon = await owner.agent.get(`/api/v1/deposits/${id}/networks/${d.id}/canonical`);
    expect(canon.body).toMatchObject({ v: 1, kind: "bipartite" });
    expect(canon.body.rows).toHaveLength(18);

    const files = await count("stored_files");
    const again = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", davis, "davis-copy.csv");
    expect(again.status).toBe(201);
    expect(await count("stored_files")).toBe(files);
    expect(again.body.deposit.networks.map((n: { position: number; originalName: string }) => `${n.position}:${n.originalName}`)).toEqual(["1:davis.csv", "2:heath.csv", "3:davis-copy.csv"]);
  });

  it("keeps warnings (rows or columns with no links) and accepts a UTF-8 BOM and TSV", async () => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
    const res = await owner.agent.post(`/api/v1/deposits/${c.body.versionId}/networks`).set("x-csrf-token", owner.csrf)
      .attach("files", Buffer.from("\uFEFFplant\tbee\tfly\nHeather\t1\t0\nGorse\t0\t0\n"), "bom.tsv");
    expect(res.status).toBe(201);
    const n = res.body.deposit.networks[0];
    expect(n).toMatchObject({ nRows: 2, nCols: 2, nLinks: 1 });
    expect(n.warnings.map((w: { code: string }) => w.code).sort()).toEqual(["empty-columns", "empty-rows"]);
  });

  it("reparses a stored file when the depositor says how to read it (kind, directed)", async () => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
    const id = c.body.versionId;
    const up = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).field("kind", "unipartite").attach("files", karateCsv(), "karate.csv");
    expect(up.status).toBe(201);
    // Zachary's karate club: 34 members, 78 links (tests/fixtures/README.md).
    expect(up.body.deposit.networks[0]).toMatchObject({ kind: "unipartite", directed: false, format: "edgelist", nNodes: 34, nLinks: 78 });
    const nid = up.body.networks[0].id;
    const patch = (body: object) => owner.agent.patch(`/api/v1/deposits/${id}/networks/${nid}`).set("x-csrf-token", owner.csrf).send(body);
    // Without `kind`, the stored kind decides whether a direction may be given: one-mode here, so it may.
    const dir = await patch({ directed: true });
    expect(dir.status).toBe(200);
    expect(dir.body.networks[0]).toMatchObject({ kind: "unipartite", directed: true, nLinks: 78 });
    // Made bipartite, the network loses its direction.
    const re = await patch({ kind: "bipartite" });
    expect(re.status).toBe(200);
    expect(re.body.networks[0]).toMatchObject({ kind: "bipartite", directed: false, nLinks: 78 });
    const bad = await patch({ kind: "bipartite", directed: true });
    expect(bad.status).toBe(400);
    // A direction for the stored bipartite network is refused too, naming the field, and nothing changes.
    const stored = await patch({ directed: true });
    expect(stored.status).toBe(400);
    expect(stored.body.details).toEqual([expect.objectContaining({ path: "/directed", message: expect.stringMatching(/bipartite network cannot be directed/) })]);
    const after = await owner.agent.get(`/api/v1/deposits/${id}`);
    expect(after.body.networks[0]).toMatchObject({ kind: "bipartite", directed: false, nLinks: 78 });
  });

  const BAD: Array<[string, string, string | Buffer, { code: string; row: number | null; column: number | null }]> = [
    ["non-numeric cell", "a.csv", "p,a,b\nx,1,two\n", { code: "non-numeric", row: 2, column: 3 }],
    ["negative cell", "b.csv", "p,a,b\nx,1,0\ny,-1,1\n", { code: "negative", row: 3, column: 2 }],
    ["ragged row", "c.csv", "p,a,b\nx,1,0\ny,1\n", { code: "ragged-row", row: 3, column: 3 }],
    ["duplicate node name", "d.csv", "p,a,b\nx,1,0\nx,0,1\n", { code: "duplicate-node", row: 3, column: 1 }],
    ["empty file", "e.csv", "", { code: "empty-file", row: null, column: null }],
    ["matrix with no links", "f.csv", "p,a,b\nx,0,0\ny,0,0\n", { code: "no-links", row: null, column: null }],
    ["self-loop in bipartite data", "g.csv", "source,target\nx,a\ny,y\n", { code: "self-loop-bipartite", row: 3, column: 2 }],
    ["UTF-16 encoding", "h.csv", Buffer.from("\uFEFFp,a\nx,1\n", "utf16le"), { code: "not-utf8", row: 1, column: 1 }],
    ["Latin-1 bytes", "i.csv", Buffer.from("p,a\nK\xe4fer,1\n", "latin1"), { code: "not-utf8", row: 2, column: null }],
  ];
  it.each(BAD)("refuses a %s with file, row and column, storing nothing", async (_what, name, content, where) => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
    const id = c.body.versionId;
    const before = { files: await count("stored_files"), nets: await count("networks") };
    const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(SMALL_MATRIX), "good.csv").attach("files", Buffer.from(content), name);
    expect(res.status).toBe(422);
    expect(res.body.details).toHaveLength(1);
    const d = res.body.details[0];
    expect(d.file).toBe(name);
    expect(d.code).toBe(where.code);
    expect(d.row ?? null).toBe(where.row);
    if (where.column !== null) expect(d.column).toBe(where.column);
    expect(d.message).toContain(name);
    expect({ files: await count("stored_files"), nets: await count("networks") }).toEqual(before);
  });

  it("refuses a file over the size limit (413) and too many files", async () => {
    process.env.TB_UPLOAD_MAX_BYTES = "2048";
    process.env.TB_UPLOAD_MAX_FILES = "2";
    resetConfig();
    try {
      const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
      const id = c.body.versionId;
      const nets = await count("networks");
      const big = "p," + Array.from({ length: 600 }, (_, i) => `a${i}`).join(",") + "\nx," + Array(600).fill("1").join(",") + "\n";
      const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(big), "big.csv");
      expect(res.status).toBe(413);
      expect(res.body.code).toBe("upload_rejected");
      const many = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf)
        .attach("files", Buffer.from(SMALL_MATRIX), "1.csv").attach("files", Buffer.from(SMALL_MATRIX), "2.csv").attach("files", Buffer.from(SMALL_MATRIX), "3.csv");
      expect(many.status).toBe(413);
      expect(await count("networks")).toBe(nets);
      // someone else's deposit: refused before the body is read (404 as if absent, not 413)
      const foreign = await other.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", other.csrf).attach("files", Buffer.from(big), "big.csv");
      expect(foreign.status).toBe(404);
    } finally {
      delete process.env.TB_UPLOAD_MAX_BYTES;
      delete process.env.TB_UPLOAD_MAX_FILES;
      resetConfig();
    }
  });

  it("refuses files that are not network files", async () => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
    const res = await owner.agent.post(`/api/v1/deposits/${c.body.versionId}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from("%PDF-1.4"), "paper.pdf");
    expect(res.status).toBe(422);
    expect(res.body.details[0]).toMatchObject({ file: "paper.pdf" });
  });

  it("an upload interrupted half-way leaves no record and no file", async () => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
    const id = c.body.versionId;
    const before = { files: await count("stored_files"), nets: await count("networks"), audit: await count("audit_log") };
    const server = app.listen(0, "127.0.0.1");
    await new Promise((r) => server.once("listening", r));
    const port = (server.address() as AddressInfo).port;
    const cookie = (owner.agent as unknown as { jar: { getCookies: (o: unknown) => Array<{ toValueString: () => string }> } }).jar
      .getCookies({ domain: "127.0.0.1", path: "/", secure: false, script: false })
      .map((x) => x.toValueString())
      .join("; ");
    const boundary = "----tanglebank-test-boundary";
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="half.csv"\r\nContent-Type: text/csv\r\n\r\n`;
    // the server side of the request has ended (its response closed) once the connection is cut
    const serverDone = new Promise<void>((resolve) => server.once("request", (_req: http.IncomingMessage, res: http.ServerResponse) => res.once("close", () => resolve())));
    const closed = new Promise<void>((resolve) => {
      const req = http.request({ host: "127.0.0.1", port, method: "POST", path: `/api/v1/deposits/${id}/networks`, headers: { "content-type": `multipart/form-data; boundary=${boundary}`, "content-length": 1_000_000, "x-csrf-token": owner.csrf, cookie } });
      req.on("error", () => resolve());
      req.on("response", () => resolve());
      // a third of the announced body, then the connection is cut
      req.write(head + "p,a,b\n" + "x,1,0\n".repeat(5000), () => {
        req.destroy();
        resolve();
      });
    });
    await closed;
    await serverDone;
    await new Promise((r) => server.close(() => r(undefined)));
    expect({ files: await count("stored_files"), nets: await count("networks"), audit: await count("audit_log") }).toEqual(before);
  });
});

describe("zip uploads", () => {
  async function upZip(zip: Buffer, name = "networks.zip") {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
    const res = await owner.agent.post(`/api/v1/deposits/${c.body.versionId}/networks`).set("x-csrf-token", owner.csrf).attach("files", zip, name);
    return res;
  }

  it("accepts files at the top level or in one folder, skipping macOS metadata", async () => {
    const res = await upZip(makeZip([
      { name: "study/", data: "" },
      { name: "study/site-a.csv", data: SMALL_MATRIX, deflate: true },
      { name: "study/site-b.tsv", data: "p\ta\nx\t1\ny\t2\n" },
      { name: "__MACOSX/study/._site-a.csv", data: "junk" },
    ]));
    expect(res.status).toBe(201);
    expect(res.body.deposit.networks.map((n: { originalName: string }) => n.originalName)).toEqual(["site-a.csv", "site-b.tsv"]);
  });

  const before = async () => ({ files: await count("stored_files"), nets: await count("networks") });

  it("refuses nested folders", async () => {
    const b = await before();
    const res = await upZip(makeZip([{ name: "a/b/site.csv", data: SMALL_MATRIX }]));
    expect(res.status).toBe(422);
    expect(res.body.details[0].message).toMatch(/nested folder/);
    expect(await before()).toEqual(b);
  });

  it("lists non-network files as errors", async () => {
    const res = await upZip(makeZip([{ name: "site.csv", data: SMALL_MATRIX }, { name: "notes.docx", data: "x" }, { name: "photo.jpg", data: "y" }]));
    expect(res.status).toBe(422);
    expect(res.body.details.map((d: { file: string }) => d.file)).toEqual(["networks.zip: notes.docx", "networks.zip: photo.jpg"]);
  });

  it.each(["../evil.csv", "/etc/evil.csv", "ok/../../evil.csv", "C:/evil.csv"])("refuses the path traversal name %s", async (name) => {
    const b = await before();
    const res = await upZip(makeZip([{ name, data: SMALL_MATRIX }]));
    expect(res.status).toBe(422);
    expect(res.body.details[0].message).toMatch(/Unsafe path/);
    expect(await before()).toEqual(b);
  });

  it("refuses symbolic links in a zip by name, whatever their name ends with, and stores nothing", async () => {
    const b = await before();
    const res = await upZip(makeZip([
      { name: "site.csv", data: SMALL_MATRIX, unixMode: 0o100644 },
      { name: "passwd.csv", data: "/etc/passwd", unixMode: 0o120777 },
    ]));
    expect(res.status).toBe(422);
    expect(res.body.details).toEqual([{ file: "networks.zip: passwd.csv", message: expect.stringMatching(/"passwd\.csv" is a symbolic link, not a file/) }]);
    expect(await before()).toEqual(b);
  });

  it("stops inflating when the expanded size passes the limit (zip bomb), even when the headers lie", async () => {
    process.env.TB_UPLOAD_MAX_BYTES = "50000";
    resetConfig();
    try {
      const big = "p,a\n" + "x,1\n".repeat(60_000);
      const honest = await upZip(makeZip([{ name: "big.csv", data: big, deflate: true }]));
      expect(honest.status).toBe(413);
      expect(honest.body.code).toBe("upload_too_large");
      const liar = await upZip(makeZip([{ name: "big.csv", data: big, deflate: true, declaredSize: 100 }]));
      expect([413, 422]).toContain(liar.status);
      expect(await count("networks")).toBe((await before()).nets);
    } finally {
      delete process.env.TB_UPLOAD_MAX_BYTES;
      resetConfig();
    }
  });

  it("refuses a file that claims to be a zip but is not one", async () => {
    const res = await upZip(Buffer.from("not a zip at all"), "broken.zip");
    expect(res.status).toBe(422);
    expect(res.body.details[0].file).toBe("broken.zip");
  });
});

describe("networks of a draft", () => {
  it("sets metadata, reorders and deletes networks", async () => {
    const { versionId, networkIds } = await makeDraft(owner, [["one.csv", SMALL_MATRIX], ["two.csv", "p,a\nx,1\ny,1\n"], ["three.csv", "p,a,b\nx,1,1\n"]]);
    const order = [networkIds[2], networkIds[0], networkIds[1]];
    const r = await owner.agent.put(`/api/v1/deposits/${versionId}/networks/order`).set("x-csrf-token", owner.csrf).send({ order });
    expect(r.status).toBe(200);
    expect(r.body.networks.map((n: { id: number }) => n.id)).toEqual(order);
    const bad = await owner.agent.put(`/api/v1/deposits/${versionId}/networks/order`).set("x-csrf-token", owner.csrf).send({ order: [networkIds[0]] });
    expect(bad.status).toBe(400);
    const del = await owner.agent.delete(`/api/v1/deposits/${versionId}/networks/${networkIds[0]}`).set("x-csrf-token", owner.csrf);
    expect(del.status).toBe(200);
    expect(del.body.networks.map((n: { id: number; position: number }) => [n.id, n.position])).toEqual([[networkIds[2], 1], [networkIds[1], 2]]);
  });
});

describe("submission", () => {
  it("lists every problem per field and per network, then submits and e-mails the curators", async () => {
    const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({ metadata: studyMeta({ contactEmail: "not-an-address" }) });
    const id = c.body.versionId;
    const empty = await submit(owner, id);
    expect(empty.status).toBe(422);
    expect(empty.body.details.map((d: { path: string }) => d.path)).toEqual(["/study/contactEmail", "/networks"]);

    await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(SMALL_MATRIX), "heath.csv");
    const det = await owner.agent.get(`/api/v1/deposits/${id}`);
    const nid = det.body.networks[0].id;
    await owner.agent.patch(`/api/v1/deposits/${id}/networks/${nid}`).set("x-csrf-token", owner.csrf).send({ metadata: networkMeta({ endDate: "2019-04-01", locality: { placeName: "x", countryCode: "gb", decimalLatitude: 54, decimalLongitude: -3, generalisation: "exact" } }) });
    const bad = await submit(owner, id);
    expect(bad.status).toBe(422);
    const byPath = Object.fromEntries(bad.body.details.map((d: { path: string; message: string }) => [d.path, d.message]));
    expect(Object.keys(byPath).sort()).toEqual(["/networks/1/endDate", "/networks/1/locality/countryCode", "/study/contactEmail"]);
    expect(byPath["/networks/1/locality/countryCode"]).toBe("Network 1 (heath.csv): Locality, country code must be a two-letter ISO 3166-1 code in capitals, e.g. NO.");
    expect(bad.body.details.find((d: { path: string }) => d.path === "/networks/1/endDate")).toMatchObject({ network: 1, field: "/endDate", file: "heath.csv" });

    await owner.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: studyMeta() });
    await owner.agent.patch(`/api/v1/deposits/${id}/networks/${nid}`).set("x-csrf-token", owner.csrf).send({ metadata: networkMeta() });
    expect((await submit(other, id)).status).toBe(404);
    const ok = await submit(owner, id);
    expect(ok.status).toBe(200);
    expect(ok.body.version.state).toBe("submitted");
    expect(ok.body.version.submittedAt).not.toBeNull();
    expect(ok.body.editable).toBe(false);

    const mail = await catcher.waitFor((m) => m.subject.includes("New submission") && m.text.includes(`/review/${id}`));
    expect(mail.to.length).toBeGreaterThanOrEqual(1);
    expect(mail.links).toContain(`${config().publicUrl}/review/${id}`);
    const audit = await AuditLog.findOne({ where: { action: "deposit.submit", entityId: String(id) } });
    expect(audit?.details).toMatchObject({ from: "draft", to: "submitted" });

    // A submitted version cannot be edited, uploaded to, resubmitted or deleted.
    expect((await owner.agent.put(`/api/v1/deposits/${id}/metadata`).set("x-csrf-token", owner.csrf).send({ metadata: studyMeta() })).status).toBe(409);
    expect((await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(SMALL_MATRIX), "x.csv")).status).toBe(409);
    expect((await owner.agent.patch(`/api/v1/deposits/${id}/networks/${nid}`).set("x-csrf-token", owner.csrf).send({ metadata: networkMeta() })).status).toBe(409);
    expect((await owner.agent.delete(`/api/v1/deposits/${id}/networks/${nid}`).set("x-csrf-token", owner.csrf)).status).toBe(409);
    expect((await submit(owner, id)).status).toBe(409);
    expect((await owner.agent.delete(`/api/v1/deposits/${id}`).set("x-csrf-token", owner.csrf)).status).toBe(409);
  });
});
