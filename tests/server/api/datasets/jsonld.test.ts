/**
 * The HTML served at dataset addresses carries schema.org/Dataset JSON-LD and meta tags for crawlers that
 * run no script; withdrawn versions get a tombstone description; drafts and unknown accessions get the
 * plain app shell. The JSON-LD is read back with JSON.parse, and its citation checked against the
 * BibTeX-independent text format; the HTML escaping is checked with a title that tries to close the script.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import type { Express } from "express";
import { createApp } from "../../../../server/src/app";
import { CLIENT_DIST } from "../../../../server/src/config/paths";
import { shutdownServerResources } from "../../../../server/src/index";
import { datasetHtmlRenderer, jsonForScript } from "../../../../server/src/api/datasets/datasets.html";
import { resetDatabase } from "../../../setup/db";
import { createFixtureDataset, DAVIS_CSV } from "../../support/published-fixture";

let app: Express;
const shell = existsSync(join(CLIENT_DIST, "index.html"))
  ? readFileSync(join(CLIENT_DIST, "index.html"), "utf8")
  : readFileSync(join(process.cwd(), "client", "index.html"), "utf8");

function jsonLdBlocks(html: string): unknown[] {
  return [...html.matchAll(/<script type="application\/ld\+json">([\s\S]*?)<\/script>/g)].map((m) => JSON.parse(m[1]));
}

function meta(html: string, attr: "name" | "property", key: string): string | null {
  const m = new RegExp(`<meta ${attr}="${key.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}" content="([^"]*)">`).exec(html);
  return m ? m[1] : null;
}

beforeAll(async () => {
  await resetDatabase();
  app = createApp();
  await createFixtureDataset({ accession: "TB-000001" });
  await createFixtureDataset({
    accession: "TB-000002",
    study: { title: "Evil </script><script>alert(1)</script> & co", keywords: ["a<b"] },
    networks: [{ text: DAVIS_CSV, metrics: false }],
  });
  await createFixtureDataset({ accession: "TB-000003", state: "withdrawn", withdrawalReason: "Duplicate of TB-000001." });
  await createFixtureDataset({ accession: "TB-000004", state: "draft" });
  await createFixtureDataset({
    accession: "TB-000005",
    study: { title: "Dollar $` and $' and $& in a title", description: "A description with replacement patterns $` $' $& $$ that must stay literal text in the page head." },
    networks: [{ text: DAVIS_CSV, metrics: false }],
  });
});
afterAll(async () => {
  await shutdownServerResources();
});

/** The few things read from a page head (title, meta content, canonical link), by pattern. */
class JSDOMLike {
  constructor(private html: string) {}
  title() {
    return /<title>([^<]*)<\/title>/.exec(this.html)?.[1].replace(/&amp;/g, "&") ?? null;
  }
  meta(name: string) {
    return new RegExp(`<meta (?:name|property)="${name}" content="([^"]*)"`).exec(this.html)?.[1].replace(/&amp;/g, "&") ?? null;
  }
  canonical() {
    return /<link rel="canonical" href="([^"]*)"/.exec(this.html)?.[1] ?? null;
  }
}

describe("dataset page HTML", () => {
  it("carries schema.org/Dataset JSON-LD with name, description, identifier, creator, license and citation", async () => {
    const html = await datasetHtmlRenderer("/datasets/TB-000001", shell);
    expect(html).not.toBeNull();
    const blocks = jsonLdBlocks(html!);
    expect(blocks).toHaveLength(1);
    const ld = blocks[0] as Record<string, unknown>;
    expect(ld["@context"]).toBe("https://schema.org/");
    expect(ld["@type"]).toBe("Dataset");
    expect(ld.name).toBe("Flower visitors of the Verrin Hills meadows");
    expect(String(ld.description).length).toBeGreaterThanOrEqual(50);
    expect(ld.identifier).toContain("TB-000001");
    expect((ld.identifier as string[]).some((i) => i.endsWith("/datasets/TB-000001/v/1"))).toBe(true);
    expect(ld.version).toBe("1");
    expect(ld.license).toBe("https://spdx.org/licenses/CC-BY-4.0.html");
    const creators = ld.creator as Array<Record<string, unknown>>;
    expect(creators[0]).toEqual({
      "@type": "Person",
      name: "Rowan Hale",
      affiliation: { "@type": "Organization", name: "Northmoor Field Station" },
      sameAs: "https://orcid.org/0000-0002-1825-0097",
    });
    const citation = ld.citation as string[];
    expect(citation[0]).toMatch(/^Hale R, Okafor I \(2025\) Flower visitors of the Verrin Hills meadows\. Version 1\. Tanglebank\. TB-000001\. http/);
    expect(citation[1]).toContain("https://doi.org/10.5555/tb.demo.1");
    expect(ld.keywords).toEqual(["pollination", "meadow", "modularity"]);
    expect(ld.datePublished).toBe("2025-03-14");
    expect(ld.temporalCoverage).toBe("2021-06-01/2021-08-31");
    // generalised to the 0.1° grid: the exact 61.23456, 8.98765 never appears
    expect(ld.spatialCoverage).toEqual([
      { "@type": "Place", name: "Verrin Hills, NO", geo: { "@type": "GeoCoordinates", latitude: 61.2, longitude: 9, elevation: 900 } },
    ]);
    expect(html).not.toContain("61.23456");
    const dist = ld.distribution as Array<Record<string, unknown>>;
    expect(dist).toHaveLength(2);
    expect(dist[0]).toMatchObject({ "@type": "DataDownload", encodingFormat: "text/csv" });
    expect(String(dist[0].contentUrl)).toMatch(/\/api\/v1\/networks\/TB-000001\/v1\/1\/data\.csv$/);
    expect(String(dist[1].contentUrl)).toMatch(/\/api\/v1\/datasets\/TB-000001\/versions\/1\/networks\/1\/file$/);

    expect(html).toContain("<title>Flower visitors of the Verrin Hills meadows (TB-000001 v1) · Tanglebank</title>");
    expect(meta(html!, "property", "og:title")).toBe("Flower visitors of the Verrin Hills meadows (TB-000001 v1) · Tanglebank");
    expect(meta(html!, "name", "description")).toMatch(/^Plant–pollinator interactions/);
    expect(meta(html!, "property", "og:description")).toMatch(/^Plant–pollinator interactions/);
    expect(html!.match(/<meta name="description"/g)).toHaveLength(1);
  });

  it("is what the server sends for the latest version, a numbered version and a network view address", async () => {
    if (!existsSync(join(CLIENT_DIST, "index.html"))) return expect.fail("build the client first (npx vite build)");
    for (const path of ["/datasets/TB-000001", "/datasets/TB-000001/v/1", "/datasets/TB-000001/v/1/networks/1"]) {
      const res = await request(app).get(path);
      expect(res.status).toBe(200);
      expect(res.headers["content-type"]).toMatch(/text\/html/);
      const ld = jsonLdBlocks(res.text)[0] as Record<string, unknown>;
      expect(ld.name).toBe("Flower visitors of the Verrin Hills meadows");
      // the app itself still loads
      expect(res.text).toContain('<div id="root">');
    }
    // the advertised downloads answer
    const ld = jsonLdBlocks((await request(app).get("/datasets/TB-000001")).text)[0] as { distribution: Array<{ contentUrl: string }> };
    for (const d of ld.distribution) {
      const res = await request(app).get(new URL(d.contentUrl).pathname);
      expect(res.status, d.contentUrl).toBe(200);
    }
  });

  it("escapes values so that nothing can close the script element or the meta attribute", async () => {
    const html = (await datasetHtmlRenderer("/datasets/TB-000002", shell))!;
    expect(html).not.toContain("</script><script>alert(1)");
    const ld = jsonLdBlocks(html)[0] as Record<string, unknown>;
    expect(ld.name).toBe("Evil </script><script>alert(1)</script> & co");
    expect(ld.keywords).toEqual(["a<b"]);
    expect(html).toContain("<title>Evil &lt;/script&gt;&lt;script&gt;alert(1)&lt;/script&gt; &amp; co (TB-000002 v1) · Tanglebank</title>");
    expect(jsonForScript({ a: "</script>\u2028" })).toBe('{"a":"\\u003c/script\\u003e\\u2028"}');
  });

  it("keeps $`, $' and $& in depositor text literal (no copies of the page spliced into the head)", async () => {
    const html = (await datasetHtmlRenderer("/datasets/TB-000005", shell))!;
    expect(html.match(/<\/head>/gi)).toHaveLength(1);
    expect(html.match(/<title>/gi)).toHaveLength(1);
    expect(html).toContain("<title>Dollar $` and $&#39; and $&amp; in a title (TB-000005 v1) · Tanglebank</title>");
    const blocks = jsonLdBlocks(html);
    expect(blocks).toHaveLength(1);
    const ld = blocks[0] as Record<string, unknown>;
    expect(ld.name).toBe("Dollar $` and $' and $& in a title");
    expect(ld.description).toBe("A description with replacement patterns $` $' $& $$ that must stay literal text in the page head.");
    expect(meta(html, "name", "description")).toBe("A description with replacement patterns $` $&#39; $&amp; $$ that must stay literal text in the page head.");
  });

  it("gives a withdrawn version a tombstone description with the reason and citation, no Dataset markup, and noindex", async () => {
    const html = (await datasetHtmlRenderer("/datasets/TB-000003", shell))!;
    expect(jsonLdBlocks(html)).toEqual([]);
    expect(html).toContain("<title>Withdrawn: TB-000003 v1 · Tanglebank</title>");
    const desc = meta(html, "name", "description")!;
    expect(desc).toContain("Reason: Duplicate of TB-000001.");
    expect(desc).toContain("TB-000003");
    expect(html).toContain('<meta name="robots" content="noindex">');
  });

  it("answers HTTP 404 (with noindex) for unknown accessions, versions and networks and for drafts; 200 for real pages", async () => {
    if (!existsSync(join(CLIENT_DIST, "index.html"))) return expect.fail("build the client first (npx vite build)");
    for (const path of ["/datasets/TB-000099", "/datasets/TB-000001/v/7", "/datasets/TB-000001/v/1/networks/9", "/datasets/TB-000004"]) {
      const res = await request(app).get(path);
      expect(res.status, path).toBe(404);
      expect(res.text, path).toContain('<meta name="robots" content="noindex">');
      expect(res.text, path).toContain('<div id="root">'); // the app shows its own not-found page
    }
    expect((await request(app).get("/datasets/TB-000001/v/1/networks/1")).status).toBe(200);
    expect((await request(app).get("/catalogue")).status).toBe(200);
  });

  it("gives a network page its own title, description and canonical link", async () => {
    const html = (await datasetHtmlRenderer("/datasets/TB-000001/v/1/networks/1", shell))!;
    const doc = new JSDOMLike(html);
    expect(doc.title()).toBe("Upper meadow (TB-000001/v1/1) · Tanglebank");
    expect(doc.meta("og:title")).toBe("Upper meadow (TB-000001/v1/1) · Tanglebank");
    expect(doc.meta("description")).toMatch(/^Upper meadow \(TB-000001\/v1\/1\): a pollination network of \d+ plants × \d+ pollinators, \d+ links at Verrin Hills/);
    expect(doc.canonical()).toMatch(/\/datasets\/TB-000001\/v\/1\/networks\/1$/);
    // the dataset page keeps its own
    const ds = new JSDOMLike((await datasetHtmlRenderer("/datasets/TB-000001/v/1", shell))!);
    expect(ds.canonical()).toMatch(/\/datasets\/TB-000001\/v\/1$/);
    expect(ds.title()).not.toContain("Upper meadow");
  });

  it("leaves drafts, unknown accessions and other addresses to the app shell", async () => {
    expect(await datasetHtmlRenderer("/datasets/TB-000004", shell)).toBeNull();
    expect(await datasetHtmlRenderer("/datasets/TB-000099", shell)).toBeNull();
    expect(await datasetHtmlRenderer("/datasets/TB-000001/v/7", shell)).toBeNull();
    expect(await datasetHtmlRenderer("/catalogue", shell)).toBeNull();
    expect(await datasetHtmlRenderer("/datasets/TB-000001/extra", shell)).toBeNull();
  });
});
