/**
 * Hostile and careless request bodies through HTTP: each gets a 400/415/422 that says what is wrong and
 * where, never a 500, and nothing is written (the drafts and network counts stay as they were).
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../server/src/app";
import { shutdownServerResources } from "../../../server/src/index";
import { resetRateLimits } from "../../../server/src/middlewares/rate-limit";
import { sequelize } from "../../../server/src/db/sequelize";
import { resetDatabase } from "../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../support/accounts";
import { SMALL_MATRIX } from "../support/deposit-helpers";

let app: ReturnType<typeof createApp>;
let owner: SignedInAgent;

async function count(table: string): Promise<number> {
  const [rows] = (await sequelize().query(`SELECT count(*)::int AS n FROM ${table}`)) as [Array<{ n: number }>, unknown];
  return rows[0].n;
}
const rows = async () => ({ versions: await count("dataset_versions"), nets: await count("networks"), files: await count("stored_files") });

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  app = createApp();
  owner = await agentFor(app, (await createUser({ displayName: "Tamsin Oduya" })).email);
});
afterAll(async () => {
  await shutdownServerResources();
});

const post = (path: string) => owner.agent.post(`/api/v1${path}`).set("x-csrf-token", owner.csrf);
const put = (path: string) => owner.agent.put(`/api/v1${path}`).set("x-csrf-token", owner.csrf);

describe("JSON bodies", () => {
  it.each([
    ["a __proto__ key", '{"metadata":{"title":"Heath","__proto__":{"admin":true}}}', /"__proto__" is not accepted.*\/metadata\/__proto__/],
    ["a constructor key deep inside", '{"metadata":{"creators":[{"name":"Hale","constructor":{"prototype":1}}]}}', /"constructor" is not accepted.*\/metadata\/creators\/0\/constructor/],
    ["a NUL in a string", '{"metadata":{"title":"Heath\\u0000 2019"}}', /NUL character at \/metadata\/title/],
    ["a NUL in a key", '{"metadata":{"ti\\u0000tle":"Heath"}}', /key of the request body holds a NUL/],
    ["an array at the top", '[{"metadata":{"title":"Heath"}}]', /must be a JSON object \(\{…\}\), not an array/],
    ["malformed JSON", '{"metadata": {"title": "Heath"', /not valid JSON/],
  ])("refuses %s (400) and creates no draft", async (_what, body, message) => {
    const before = await rows();
    const res = await post("/deposits").set("content-type", "application/json").send(body);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(message);
    expect(await rows()).toEqual(before);
  });

  it("refuses JSON nested 100,000 levels deep (400, not a crash)", async () => {
    const before = await rows();
    const deep = '{"metadata":' + "[".repeat(100_000) + "]".repeat(100_000) + "}";
    const res = await post("/deposits").set("content-type", "application/json").send(deep);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/nested more than 32 levels/);
    expect(await rows()).toEqual(before);
  });

  it("refuses an XML or form body with 415 instead of creating an empty draft", async () => {
    const before = await rows();
    const xml = await post("/deposits").set("content-type", "application/xml").send("<metadata><title>Heath</title></metadata>");
    expect(xml.status).toBe(415);
    expect(xml.body.message).toMatch(/reads JSON bodies.*"application\/xml"/);
    const form = await post("/deposits").set("content-type", "application/x-www-form-urlencoded").send("metadata=x");
    expect(form.status).toBe(415);
    expect(await rows()).toEqual(before);
  });

  it("a draft's metadata update with a prototype key is refused and the draft still opens", async () => {
    const c = await post("/deposits").send({ metadata: { title: "Heath" } });
    expect(c.status).toBe(201);
    const id = c.body.versionId as number;
    const bad = await put(`/deposits/${id}/metadata`).set("content-type", "application/json").send('{"metadata":{"title":"Heath","__proto__":{"x":1}}}');
    expect(bad.status).toBe(400);
    const open = await owner.agent.get(`/api/v1/deposits/${id}`);
    expect(open.status).toBe(200);
    expect(open.body.metadata).toEqual({ title: "Heath" });
    const submitted = await post(`/deposits/${id}/submit`);
    expect(submitted.status).toBe(422); // incomplete metadata: listed, not a 500
  });
});

describe("multipart fields", () => {
  it("refuses a NUL in a form field and a prototype key in fileOptions", async () => {
    const c = await post("/deposits").send({});
    const id = c.body.versionId as number;
    const before = await rows();
    const nul = await post(`/deposits/${id}/networks`).field("sheet", "Low\u0000land").attach("files", Buffer.from(SMALL_MATRIX), "heath.csv");
    expect(nul.status).toBe(400);
    expect(nul.body.message).toMatch(/NUL character at \/sheet/);
    const proto = await post(`/deposits/${id}/networks`).field("fileOptions", '{"__proto__":{"sheet":"x"}}').attach("files", Buffer.from(SMALL_MATRIX), "heath.csv");
    expect(proto.status).toBe(400);
    expect(proto.body.message).toMatch(/"__proto__" is not accepted/);
    expect(await rows()).toEqual(before);
  });

  it("a NUL inside a network file is named for what it makes the file (422 with the file), not a database error", async () => {
    const c = await post("/deposits").send({});
    const res = await post(`/deposits/${c.body.versionId}/networks`).attach("files", Buffer.from("source,target\nHea\u0000ther,bee\n"), "nul.csv");
    expect(res.status).toBe(422);
    expect(res.body.details[0].file).toBe("nul.csv");
  });
});

describe("CSRF only where a session cookie could be forged", () => {
  it("a script without cookies may ask for a bundle estimate; sign-in routes and cookie-bearing requests still need the token", async () => {
    const anon = await request(app).post("/api/v1/bundles/estimate").send({ refs: [] });
    expect(anon.body.code).not.toBe("csrf_failed");
    expect(anon.status).toBeLessThan(500);
    const signOut = await request(app).post("/api/v1/auth/sign-out").send({});
    expect(signOut.status).toBe(403);
    const withCookie = await owner.agent.post("/api/v1/bundles/estimate").send({ refs: [] });
    expect(withCookie.status).toBe(403);
    expect(withCookie.body.code).toBe("csrf_failed");
    const draft = await request(app).post("/api/v1/deposits").send({ metadata: {} });
    expect(draft.status).toBe(401); // no cookie, no session: not signed in, nothing to forge
  });
});
