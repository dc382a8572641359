/**
 * Link-preview images: dataset and network pages name a 1200 × 630 PNG in og:image; the image decodes
 * (pngjs) to that size and carries the colour of every module of the network's stored partition (the
 * module strip under the matrix); it is cached (304 for a known ETag); withdrawn versions answer 410,
 * drafts 404 for everyone but their owner, unknown addresses 404.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import { PNG } from "pngjs";
import type { Express } from "express";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { datasetHtmlRenderer } from "../../../../server/src/api/datasets/datasets.html";
import { getNetworkView } from "../../../../server/src/api/network-views/network-views.service";
import { moduleRgb } from "@shared/plots/palette";
import { resetDatabase } from "../../../setup/db";
import { agentFor } from "../../support/accounts";
import { createFixtureDataset, DAVIS_CSV, FIXTURE_PASSWORD, fixtureUser } from "../../support/published-fixture";
import type { User } from "../../../../server/src/models";

let app: Express;
let owner: User;

beforeAll(async () => {
  await resetDatabase();
  app = createApp();
  owner = await fixtureUser();
  await createFixtureDataset({ accession: "TB-000001", networks: [{ text: DAVIS_CSV }, { text: DAVIS_CSV, metrics: false }] });
  await createFixtureDataset({ accession: "TB-000003", state: "withdrawn", withdrawalReason: "Duplicate of TB-000001." });
  await createFixtureDataset({ accession: "TB-000004", state: "draft", owner });
});
afterAll(async () => {
  await shutdownServerResources();
});

function decode(body: Buffer): PNG {
  return PNG.sync.read(body);
}

function hasColour(png: PNG, [r, g, b]: [number, number, number]): boolean {
  for (let o = 0; o < png.data.length; o += 4) if (png.data[o] === r && png.data[o + 1] === g && png.data[o + 2] === b) return true;
  return false;
}

const png = (res: request.Response) => res.body as Buffer;

describe("preview images", () => {
  it("draws a network's card with the colour of every module of its stored partition", async () => {
    const res = await request(app).get("/api/v1/previews/TB-000001/v1/1.png").buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("image/png");
    expect(res.headers["cache-control"]).toMatch(/public/);
    const img = decode(png(res));
    expect([img.width, img.height]).toEqual([1200, 630]);
    const view = await getNetworkView("TB-000001", 1, 1, undefined);
    const modules = new Set([...(view.rowModules ?? []), ...(view.colModules ?? [])]);
    expect(modules.size).toBeGreaterThan(1);
    for (const m of modules) expect(hasColour(img, moduleRgb(m)), `module ${m}`).toBe(true);
    // the same card again: not modified
    const again = await request(app).get("/api/v1/previews/TB-000001/v1/1.png").set("If-None-Match", res.headers.etag);
    expect(again.status).toBe(304);
  });

  it("draws a network without figures in plain ink, and a dataset's card from its networks", async () => {
    const plain = decode(png(await request(app).get("/api/v1/previews/TB-000001/v1/2.png").buffer(true)));
    expect(hasColour(plain, [0x44, 0x40, 0x3c])).toBe(true);
    expect(hasColour(plain, moduleRgb(1))).toBe(false);
    const ds = await request(app).get("/api/v1/previews/TB-000001/v1.png").buffer(true);
    expect(ds.status).toBe(200);
    const img = decode(png(ds));
    expect([img.width, img.height]).toEqual([1200, 630]);
    expect(hasColour(img, moduleRgb(0))).toBe(true);
    expect(hasColour(img, [0x44, 0x40, 0x3c])).toBe(true);
  });

  it("answers 410 for a withdrawn version, 404 for drafts (but not for their owner) and unknown addresses", async () => {
    expect((await request(app).get("/api/v1/previews/TB-000003/v1.png")).status).toBe(410);
    expect((await request(app).get("/api/v1/previews/TB-000004/v1.png")).status).toBe(404);
    expect((await request(app).get("/api/v1/previews/TB-000099/v1.png")).status).toBe(404);
    expect((await request(app).get("/api/v1/previews/TB-000001/v1/9.png")).status).toBe(404);
    const badVersion = await request(app).get("/api/v1/previews/TB-000001/vx/1.png");
    expect(badVersion.status).toBe(404);
    expect(badVersion.body.message).toBe('No such version "vx": versions are written v1, v2, …');
    const badPosition = await request(app).get("/api/v1/previews/TB-000001/v1/0.png");
    expect(badPosition.body).toEqual({ code: "not_found", message: 'No such network "0": networks are numbered 1, 2, …' });
    expect((await request(app).get("/api/v1/previews/TB-1/v1.png")).body.message).toBe('No such dataset "TB-1": accessions look like TB-000042.');
    const a = await agentFor(app, owner.email, FIXTURE_PASSWORD);
    const own = await a.agent.get("/api/v1/previews/TB-000004/v1.png").buffer(true);
    expect(own.status).toBe(200);
    expect(own.headers["cache-control"]).toMatch(/no-store/);
  });

  it("is named in the og:image tags of dataset and network pages", async () => {
    const shell = "<html><head><title>x</title></head><body></body></html>";
    const ds = (await datasetHtmlRenderer("/datasets/TB-000001", shell))!;
    expect(ds).toMatch(/<meta property="og:image" content="http[^"]*\/api\/v1\/previews\/TB-000001\/v1\.png">/);
    expect(ds).toContain('<meta property="og:image:width" content="1200">');
    const net = (await datasetHtmlRenderer("/datasets/TB-000001/v/1/networks/1", shell))!;
    expect(net).toMatch(/<meta property="og:image" content="http[^"]*\/api\/v1\/previews\/TB-000001\/v1\/1\.png">/);
    expect(net).toMatch(/<meta property="og:image:alt" content="Interaction matrix of [^"]+">/);
    // a withdrawn version's tombstone page has no preview image
    expect(await datasetHtmlRenderer("/datasets/TB-000003", shell)).not.toContain("og:image");
  });
});
