/**
 * Uploads under hostile or careless input: bytes stream to temporary files with per-file and per-request
 * limits, names are checked as each part starts, temporary files are removed whatever happens, files are
 * parsed in a parse process with time and memory limits, and broken multipart bodies get a 400 that says
 * what is wrong. Every refusal names the file or the limit, and stores nothing.
 */
import http from "node:http";
import { mkdtempSync, readdirSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetConfig } from "../../../../server/src/config/env";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { closeParsePool } from "../../../../server/src/lib/parse/pool";
import { sequelize } from "../../../../server/src/db/sequelize";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { SMALL_MATRIX } from "../../support/deposit-helpers";

let app: ReturnType<typeof createApp>;
let owner: SignedInAgent;
let server: http.Server;
let port: number;
const tmp = mkdtempSync(join(tmpdir(), "tb-upload-test-"));

async function count(table: string): Promise<number> {
  const [rows] = (await sequelize().query(`SELECT count(*)::int AS n FROM ${table}`)) as [Array<{ n: number }>, unknown];
  return rows[0].n;
}
const stored = async () => ({ files: await count("stored_files"), nets: await count("networks") });

/** The temporary upload folder once the last request's folder is gone (removed as its response closes). */
async function settledLeftovers(): Promise<string[]> {
  for (let k = 0; k < 100 && leftovers().length; k++) await new Promise((r) => setTimeout(r, 20));
  return leftovers();
}

/** Entries left in the temporary upload folder (request folders and their files). */
function leftovers(): string[] {
  const out: string[] = [];
  for (const d of readdirSync(tmp)) {
    out.push(d);
    for (const f of readdirSync(join(tmp, d))) out.push(`${d}/${f}`);
  }
  return out;
}

async function withEnv<T>(vars: Record<string, string>, fn: () => Promise<T>): Promise<T> {
  for (const [k, v] of Object.entries(vars)) process.env[k] = v;
  resetConfig();
  await closeParsePool();
  try {
    return await fn();
  } finally {
    for (const k of Object.keys(vars)) delete process.env[k];
    resetConfig();
    await closeParsePool();
  }
}

async function draft(): Promise<number> {
  const c = await owner.agent.post("/api/v1/deposits").set("x-csrf-token", owner.csrf).send({});
  return c.body.versionId as number;
}

function cookieOf(a: SignedInAgent): string {
  return (a.agent as unknown as { jar: { getCookies: (o: unknown) => Array<{ toValueString: () => string }> } }).jar
    .getCookies({ domain: "127.0.0.1", path: "/", secure: false, script: false })
    .map((x) => x.toValueString())
    .join("; ");
}

/** A raw request to the listening server; resolves with status and JSON body (or null when cut). */
function raw(path: string, headers: Record<string, string | number>, body: string | Buffer | null, opts: { end?: boolean } = {}): { done: Promise<{ status: number; body: Record<string, unknown> } | null>; req: http.ClientRequest } {
  const req = http.request({ host: "127.0.0.1", port, method: "POST", path, headers: { cookie: cookieOf(owner), "x-csrf-token": owner.csrf, ...headers } });
  const done = new Promise<{ status: number; body: Record<string, unknown> } | null>((resolve) => {
    req.on("error", () => resolve(null));
    req.on("response", (res) => {
      let text = "";
      res.on("data", (c: Buffer) => (text += c.toString()));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, body: text ? (JSON.parse(text) as Record<string, unknown>) : {} }));
      res.on("error", () => resolve(null));
    });
  });
  if (body !== null) req.write(body);
  if (opts.end !== false) req.end();
  return { done, req };
}

beforeAll(async () => {
  process.env.TB_UPLOAD_TMP_DIR = tmp;
  resetConfig();
  await resetDatabase();
  await resetRateLimits();
  app = createApp();
  const o = await createUser({ displayName: "Ines Varga" });
  owner = await agentFor(app, o.email);
  server = app.listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  port = (server.address() as AddressInfo).port;
});
afterAll(async () => {
  await new Promise((r) => server.close(() => r(undefined)));
  delete process.env.TB_UPLOAD_TMP_DIR;
  resetConfig();
  await shutdownServerResources();
  rmSync(tmp, { recursive: true, force: true });
});

describe("byte limits while streaming", () => {
  it("refuses files that together pass the per-request limit, naming the file where it stopped and the limit", async () => {
    await withEnv({ TB_UPLOAD_MAX_REQUEST_BYTES: "4096", TB_UPLOAD_MAX_BYTES: "8192" }, async () => {
      const id = await draft();
      const before = await stored();
      const part = "p," + Array.from({ length: 600 }, (_, i) => `b${i}`).join(",") + "\nx," + Array(600).fill("1").join(",") + "\n"; // about 4 KB
      const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(part), "first.csv").attach("files", Buffer.from(part), "second.csv");
      expect(res.status).toBe(413);
      expect(res.body.code).toBe("upload_too_large");
      expect(res.body.message).toContain("4 KB per request");
      expect(res.body.message).toContain('"second.csv"');
      expect(await stored()).toEqual(before);
    });
    expect(await settledLeftovers()).toEqual([]);
  });

  it("refuses a declared body over the per-request limit before reading it", async () => {
    const id = await draft();
    // 10 GB declared, a few bytes sent: the answer comes at once, without waiting for the body.
    const { done, req } = raw(`/api/v1/deposits/${id}/networks`, { "content-type": "multipart/form-data; boundary=x", "content-length": 10 * 1024 ** 3 }, "--x\r\n", { end: false });
    const res = await done;
    req.destroy();
    expect(res?.status).toBe(413);
    expect(res?.body.message).toMatch(/over the limit of 200 MB per request/);
  });

  it("names the file and the per-file limit, and the count limit", async () => {
    await withEnv({ TB_UPLOAD_MAX_BYTES: "2048", TB_UPLOAD_MAX_FILES: "2" }, async () => {
      const id = await draft();
      const big = "p," + Array.from({ length: 600 }, (_, i) => `a${i}`).join(",") + "\nx," + Array(600).fill("1").join(",") + "\n";
      const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(big), "big-meadow.csv");
      expect(res.status).toBe(413);
      expect(res.body.message).toBe('"big-meadow.csv" is larger than the limit of 2 KB per file. Nothing was stored.');
      expect(res.body.details[0].file).toBe("big-meadow.csv");
      const many = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf)
        .attach("files", Buffer.from(SMALL_MATRIX), "1.csv").attach("files", Buffer.from(SMALL_MATRIX), "2.csv").attach("files", Buffer.from(SMALL_MATRIX), "3.csv");
      expect(many.status).toBe(413);
      expect(many.body.message).toMatch(/Too many files: at most 2 files per upload/);
    });
    expect(await settledLeftovers()).toEqual([]);
  });

  it("streams the body to a temporary file and removes it when the client goes away", async () => {
    const id = await draft();
    const before = await stored();
    const boundary = "----tb-stream";
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="half.csv"\r\nContent-Type: text/csv\r\n\r\n`;
    const { done, req } = raw(`/api/v1/deposits/${id}/networks`, { "content-type": `multipart/form-data; boundary=${boundary}`, "content-length": 5_000_000 }, head + "p,a,b\n" + "x,1,0\n".repeat(50_000), { end: false });
    // the bytes so far are on disk, in this request's folder
    let parts: string[] = [];
    for (let k = 0; k < 100 && !parts.some((p) => p.endsWith(".part") && statSync(join(tmp, p)).size > 100_000); k++) {
      await new Promise((r) => setTimeout(r, 20));
      parts = leftovers();
    }
    expect(parts.some((p) => /^req-.*\/0\.part$/.test(p))).toBe(true);
    req.destroy();
    await done;
    expect(await settledLeftovers()).toEqual([]);
    expect(await stored()).toEqual(before);
  });
});

describe("names checked as each file starts", () => {
  /** A multipart body with one file part whose Content-Disposition is given as is. */
  function onePart(disposition: string): { body: string; type: string } {
    const b = "tb-names";
    return { type: `multipart/form-data; boundary=${b}`, body: `--${b}\r\nContent-Disposition: form-data; name="files"; ${disposition}\r\nContent-Type: text/csv\r\n\r\n${SMALL_MATRIX}\r\n--${b}--\r\n` };
  }
  async function send(disposition: string) {
    const id = await draft();
    const p = onePart(disposition);
    return (await raw(`/api/v1/deposits/${id}/networks`, { "content-type": p.type, "content-length": Buffer.byteLength(p.body) }, p.body).done)!;
  }

  it.each([
    ["a bell (percent-encoded)", "filename*=UTF-8''meadow%07.csv", /control character \(U\+0007\)/],
    ["an escape sequence (percent-encoded)", "filename*=UTF-8''%1B%5B2Jwipe.csv", /control character \(U\+001B\)/],
    ["a NUL (percent-encoded)", "filename*=UTF-8''site%00.csv", /control character \(U\+0000\)/],
    ["300 characters", `filename="${"n".repeat(296)}.csv"`, /300 characters long; at most 255/],
  ])("refuses a file name with %s (422, nothing stored)", async (_what, disposition, message) => {
    const before = await stored();
    const res = await send(disposition);
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    expect(res.body.code).toBe("bad_file_name");
    expect(res.body.message).toMatch(message);
    expect(await stored()).toEqual(before);
  });

  it("a raw control character in the part header is a malformed body (400), not a server error", async () => {
    const res = await send(`filename="meadow\u0007.csv"`);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/malformed/);
  });

  it("a file with another extension: read only far enough to say what it is", async () => {
    const id = await draft();
    const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(300_000, 7)]);
    const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", png, "site-photo.png");
    expect(res.status).toBe(422);
    expect(res.body.details[0]).toMatchObject({ file: "site-photo.png" });
    expect(res.body.details[0].message).toMatch(/is a PNG image/);
    expect(await settledLeftovers()).toEqual([]);
  });

  it("stores UTF-8 file names as sent (not read as Latin-1)", async () => {
    const id = await draft();
    const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(SMALL_MATRIX), "Vérrinia-prés-été.csv");
    expect(res.status).toBe(201);
    expect(res.body.networks[0].originalName).toBe("Vérrinia-prés-été.csv");
    expect(res.body.deposit.networks[0].metadata?.name ?? res.body.deposit.networks[0].name).toBe("Vérrinia-prés-été");
    expect(await settledLeftovers()).toEqual([]);
  });
});

describe("parsing in a parse process, with limits", () => {
  // An edge list of 40,000 lines (about 0.6 MB): far more than 10 ms of parsing.
  const edges = "source,target\n" + Array.from({ length: 40_000 }, (_, i) => `plant ${i % 997},visitor ${i % 1499}`).join("\n") + "\n";

  it("refuses a file over the time limit by name; the thread is replaced and the next upload is read", async () => {
    const id = await draft();
    const before = await stored();
    await withEnv({ TB_PARSE_TIMEOUT_MS: "10" }, async () => {
      const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(edges), "long-survey.csv");
      expect(res.status).toBe(422);
      expect(res.body.details[0]).toMatchObject({ file: "long-survey.csv", code: "parse-time-limit" });
      expect(res.body.message).toMatch(/"long-survey.csv" could not be read within the time limit of 0 s per file/);
    });
    expect(await stored()).toEqual(before);
    const ok = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(SMALL_MATRIX), "short-survey.csv");
    expect(ok.status).toBe(201);
    expect(ok.body.networks.map((n: { originalName: string }) => n.originalName)).toEqual(["short-survey.csv"]);
  });

  it("refuses a file over the memory limit by name", async () => {
    const id = await draft();
    const before = await stored();
    // 300,000 distinct long names (about 14 MB of text) need far more than 16 MB of heap.
    const wide = "source,target\n" + Array.from({ length: 150_000 }, (_, i) => `plant species number ${i} of the upper meadow,visitor species number ${i} of the upper meadow`).join("\n") + "\n";
    await withEnv({ TB_PARSE_MAX_MEMORY_MB: "16", TB_UPLOAD_MAX_BYTES: String(200 * 1024 * 1024) }, async () => {
      const res = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(wide), "huge-names.csv");
      expect(res.status).toBe(422);
      expect(res.body.details[0]).toMatchObject({ file: "huge-names.csv", code: "parse-memory-limit" });
      expect(res.body.message).toContain("16 MB");
      // the limit leaves room for an ordinary file: it is the file that was refused, not the process start
      const small = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(SMALL_MATRIX), "small.csv");
      expect(small.status).toBe(201);
    });
    expect((await stored()).nets).toBe(before.nets + 1);
  });

  it("refuses node names with control characters or over 500 characters, naming file, row and column", async () => {
    const id = await draft();
    const esc = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from("source,target\nHeather,bee\nGorse,\u001b[31mfly\n"), "visits.csv");
    expect(esc.status).toBe(422);
    expect(esc.body.details[0]).toMatchObject({ file: "visits.csv", code: "bad-label", row: 3, column: 2 });
    expect(esc.body.details[0].message).toMatch(/control character \(U\+001B/);
    const long = await owner.agent.post(`/api/v1/deposits/${id}/networks`).set("x-csrf-token", owner.csrf).attach("files", Buffer.from(`plant,bee\n${"Erica ".repeat(100)},1\n`), "open-quote.csv");
    expect(long.status).toBe(422);
    expect(long.body.details[0]).toMatchObject({ file: "open-quote.csv", code: "bad-label", row: 2, column: 1 });
    expect(long.body.details[0].message).toMatch(/599 characters long; at most 500/);
  });
});

describe("broken multipart bodies", () => {
  it("a missing boundary is a 400 that says so", async () => {
    const id = await draft();
    const { done } = raw(`/api/v1/deposits/${id}/networks`, { "content-type": "multipart/form-data" }, "whatever");
    const res = await done;
    expect(res?.status).toBe(400);
    expect(res?.body.message).toMatch(/no boundary/);
  });

  it("a body cut short is a 400, and nothing is stored", async () => {
    const id = await draft();
    const before = await stored();
    const boundary = "tb-cut";
    const body = `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="cut.csv"\r\nContent-Type: text/csv\r\n\r\n${SMALL_MATRIX}`;
    const { done } = raw(`/api/v1/deposits/${id}/networks`, { "content-type": `multipart/form-data; boundary=${boundary}`, "content-length": Buffer.byteLength(body) }, body);
    const res = await done;
    expect(res?.status).toBe(400);
    expect(res?.body.message).toMatch(/ended before the whole body arrived/);
    expect(await stored()).toEqual(before);
  });

  it("a malformed part header is a 400", async () => {
    const id = await draft();
    const boundary = "tb-bad";
    const body = `--${boundary}\r\nthis is not a header\r\n\r\nx\r\n--${boundary}--\r\n`;
    const { done } = raw(`/api/v1/deposits/${id}/networks`, { "content-type": `multipart/form-data; boundary=${boundary}`, "content-length": Buffer.byteLength(body) }, body);
    const res = await done;
    expect(res?.status).toBe(400);
    expect(String(res?.body.message)).toMatch(/malformed|No file was uploaded/);
  });
});
