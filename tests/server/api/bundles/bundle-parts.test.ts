/**
 * The optional parts of a bundle (partitions, node roles, null distributions, edge lists, original files)
 * and its citations, against their Table Schemas, the database and outside references:
 * - Q recomputed from the bundled partition and the bundled matrix equals the stored Q: Barber's Q_B for
 *   Davis's Southern Women (computed here straight from Barber 2007's definition), Newman–Girvan Q for
 *   Zachary's karate club (graphology-metrics' modularity, an npm reference library, on the bundled edge list);
 * - the null distribution's mean and sample sd equal the stored null mean and sd;
 * - original files are the deposited bytes, with the SHA-256 datapackage.json states;
 * - CITATIONS.bib read by @retorquere/bibtex-parser: a @dataset entry per version and its source publication.
 * Networks: tests/fixtures (Davis Southern Women, karate club; sources in tests/fixtures/README.md);
 * metadata invented.
 */
import { createHash } from "node:crypto";
import request from "supertest";
import { parse as parseCsv } from "csv-parse/sync";
import { parse as parseBibTeX } from "@retorquere/bibtex-parser";
import Graph from "graphology";
import graphologyModularity from "graphology-metrics/graph/modularity";
import { QueryTypes } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { sequelize } from "../../../../server/src/db/sequelize";
import { catalogueStore } from "../../../../server/src/api/catalogue/catalogue.store";
import { resetDatabase } from "../../../setup/db";
import { binaryParser, unzipBuffers } from "../../support/unzip";
import { createFixtureDataset, DAVIS_CSV, KARATE_CSV } from "../../support/published-fixture";

const app = createApp();
let accession: string;
let files: Map<string, Buffer>;
const text = (name: string) => {
  const b = files.get(name);
  if (!b) throw new Error(`${name} is not in the bundle`);
  return b.toString("utf8");
};
const table = (name: string) => parseCsv(text(name), { columns: true }) as Array<Record<string, string>>;


async function bundle(query: Record<string, string>): Promise<Map<string, Buffer>> {
  const res = await request(app).get("/api/v1/bundles").query(query).buffer(true).parse(binaryParser);
  expect(res.status, res.status !== 200 ? JSON.stringify(res.body) : "").toBe(200);
  return unzipBuffers(res.body as Buffer);
}

beforeAll(async () => {
  await resetDatabase();
  catalogueStore.reset();
  const ds = await createFixtureDataset({
    networks: [
      { text: DAVIS_CSV, fileName: "upper-meadow.csv" },
      { text: KARATE_CSV, fileName: "club.csv", kind: "unipartite", metadata: { name: "Club", interactionType: "other", rowLevel: undefined, colLevel: undefined } },
    ],
  });
  accession = ds.dataset.accession!;
  files = await bundle({ refs: `${accession}/v1/1,${accession}/v1/2`, include: "partitions,roles,nulls,edges,originals" });
});
afterAll(shutdownServerResources);

interface StoredRun {
  position: number;
  q: number;
  null_mean: number;
  null_sd: number;
  seed: string;
  sha256: string;
  original_name: string;
}

async function storedRuns(): Promise<StoredRun[]> {
  return sequelize().query<StoredRun>(
    `SELECT n.position, r.q, r.null_mean, r.null_sd, r.seed, f.sha256, n.original_name
       FROM networks n JOIN stored_files f ON f.id = n.file_id
       JOIN metric_runs r ON r.network_id = n.id AND r.status = 'succeeded'
      ORDER BY n.position`,
    { type: QueryTypes.SELECT },
  );
}

/** Barber's bipartite modularity from its definition: Q_B = (1/m) Σ_ij (A_ij − k_i d_j / m) δ(g_i, h_j). */
function barberQ(matrix: number[][], rowModule: number[], colModule: number[]): number {
  const k = matrix.map((r) => r.reduce((s, x) => s + x, 0));
  const d = matrix[0].map((_, j) => matrix.reduce((s, r) => s + r[j], 0));
  const m = k.reduce((s, x) => s + x, 0);
  let q = 0;
  for (let i = 0; i < matrix.length; i++) for (let j = 0; j < d.length; j++) if (rowModule[i] === colModule[j]) q += matrix[i][j] - (k[i] * d[j]) / m;
  return q / m;
}

describe("bundle parts", () => {
  it("describes every file in datapackage.json; each table's Table Schema names its header and every per-network table carries network_ref", () => {
    const dp = JSON.parse(text("datapackage.json"));
    const paths = dp.resources.map((r: { path: string }) => r.path);
    // every data file is a resource (the package's own description, README and citations are not data)
    expect([...files.keys()].filter((n) => !["datapackage.json", "README.txt", "CITATIONS.bib"].includes(n)).sort()).toEqual([...paths].sort());
    for (const name of ["partitions.csv", "roles.csv", "null_distribution.csv", "edges.csv", "metrics.csv", "networks.csv"]) {
      const r = dp.resources.find((x: { path: string }) => x.path === name);
      const header = parseCsv(text(name), { to_line: 1 })[0] as string[];
      expect(r.schema.fields.map((f: { name: string }) => f.name), name).toEqual(header);
      expect(header[0], name).toBe("network_ref");
    }
    expect(dp.resources.find((x: { path: string }) => x.path === "metrics.csv").schema.primaryKey).toBe("network_ref");
    // the corner cell of every matrix is named "node", as in the API's data.csv
    for (const p of paths.filter((x: string) => x.startsWith("networks/"))) expect(text(p).startsWith("node,"), p).toBe(true);
    expect(text("README.txt")).toMatch(/header's first cell is "node"/);
    expect(text("README.txt")).not.toMatch(/lower level|higher level/);
  });

  it("Q recomputed from the bundled partition equals the stored Q (Davis: Barber's Q_B by its definition; karate: graphology-metrics' modularity)", async () => {
    const runs = await storedRuns();
    const parts = table("partitions.csv");

    // Davis, bipartite: the bundled matrix and partition
    const ref1 = `${accession}/v1/1`;
    const rows = parseCsv(text(`networks/${accession}_v1_1.csv`)) as string[][];
    const colLabels = rows[0].slice(1);
    const matrix = rows.slice(1).map((r) => r.slice(1).map(Number));
    const moduleOf = new Map(parts.filter((p) => p.network_ref === ref1).map((p) => [`${p.side}:${p.node}`, Number(p.module)]));
    expect(moduleOf.size).toBe(matrix.length + colLabels.length);
    const qB = barberQ(
      matrix,
      rows.slice(1).map((r) => moduleOf.get(`row:${r[0]}`)!),
      colLabels.map((c) => moduleOf.get(`column:${c}`)!),
    );
    expect(qB).toBeCloseTo(runs[0].q, 12);
    expect(parts.find((p) => p.network_ref === ref1)!.objective).toBe("barber");

    // karate, one-mode: the bundled edge list and partition into graphology
    const ref2 = `${accession}/v1/2`;
    const g = new Graph({ type: "undirected" });
    for (const p of parts.filter((x) => x.network_ref === ref2)) {
      expect(p.side).toBe("node");
      g.addNode(p.node, { community: Number(p.module) });
    }
    const edges = table("edges.csv").filter((e) => e.network_ref === ref2);
    expect(edges).toHaveLength(78); // Zachary's club: 78 ties
    for (const e of edges) g.addEdge(e.source, e.target);
    expect(graphologyModularity(g, { getNodeCommunity: "community" })).toBeCloseTo(runs[1].q, 12);
  });

  it("roles and null distributions match the stored run: null mean and sd recomputed from the replicates", async () => {
    const runs = await storedRuns();
    const nulls = table("null_distribution.csv");
    // every null model the pipeline computed, each with the mean and sd stored for it (metric_run_nulls)
    const figures = await sequelize().query<{ position: number; model: string; is_primary: boolean; mean: number; sd: number }>(
      `SELECT n.position, f.model, f.is_primary, f.mean, f.sd FROM metric_run_nulls f
         JOIN metric_runs r ON r.id = f.run_id AND r.status = 'succeeded' JOIN networks n ON n.id = r.network_id`,
      { type: QueryTypes.SELECT },
    );
    expect(figures.length).toBeGreaterThanOrEqual(runs.length);
    for (const run of runs) {
      const ref = `${accession}/v1/${run.position}`;
      const mine = nulls.filter((n) => n.network_ref === ref);
      const models = figures.filter((f) => f.position === run.position);
      // the primary model first, as metrics.csv's null_mean and null_sd describe it
      expect(mine[0].null_model).toBe(models.find((f) => f.is_primary)!.model);
      for (const f of models) {
        const qs = mine.filter((n) => n.null_model === f.model);
        expect(qs, f.model).toHaveLength(30); // the fixture's pipeline settings: 30 replicates
        expect(qs.map((n) => Number(n.replicate))).toEqual(Array.from({ length: 30 }, (_, r) => r));
        expect(new Set(qs.map((n) => n.seed))).toEqual(new Set([String(run.seed)]));
        expect(new Set(qs.map((n) => n.replicate_seed)).size).toBe(30);
        const values = qs.map((n) => Number(n.Q));
        const mean = values.reduce((s, x) => s + x, 0) / values.length;
        const sd = Math.sqrt(values.reduce((s, x) => s + (x - mean) ** 2, 0) / (values.length - 1));
        expect(mean, f.model).toBeCloseTo(f.mean, 12);
        expect(sd, f.model).toBeCloseTo(f.sd, 12);
        if (f.is_primary) {
          expect(mean).toBeCloseTo(run.null_mean, 12);
          expect(sd).toBeCloseTo(run.null_sd, 12);
        }
      }
    }
    const roles = table("roles.csv");
    const parts = table("partitions.csv");
    // one role row per node, in the same module as the partition says
    expect(roles.length).toBe(parts.length);
    const moduleOf = new Map(parts.map((p) => [`${p.network_ref}|${p.side}|${p.node}`, p.module]));
    for (const r of roles) {
      expect(r.module).toBe(moduleOf.get(`${r.network_ref}|${r.side}|${r.node}`));
      expect(["peripheral", "connector", "module-hub", "network-hub", ""]).toContain(r.role);
      if (r.P !== "") expect(Number(r.P)).toBeGreaterThanOrEqual(0);
    }
  });

  it("edge lists hold every link of the matrix; originals are the deposited bytes with their SHA-256", async () => {
    const edges = table("edges.csv").filter((e) => e.network_ref === `${accession}/v1/1`);
    const rows = parseCsv(text(`networks/${accession}_v1_1.csv`)) as string[][];
    const linked = rows.slice(1).flatMap((r) => r.slice(1).flatMap((w, j) => (Number(w) ? [`${r[0]}|${rows[0][j + 1]}|${Number(w)}`] : [])));
    expect(edges.map((e) => `${e.source}|${e.target}|${Number(e.weight)}`).sort()).toEqual(linked.sort());

    const dp = JSON.parse(text("datapackage.json"));
    for (const run of await storedRuns()) {
      const path = `originals/${accession}_v1_${run.position}/${run.original_name}`;
      const bytes = files.get(path)!;
      expect(bytes.equals(Buffer.from(run.position === 1 ? DAVIS_CSV : KARATE_CSV, "utf8"))).toBe(true);
      const sha = createHash("sha256").update(bytes).digest("hex");
      expect(sha).toBe(run.sha256.trim());
      const r = dp.resources.find((x: { path: string }) => x.path === path);
      expect(r.hash).toBe(`sha256:${sha}`);
      expect(r.bytes).toBe(bytes.length);
    }
  });

  it("CITATIONS.bib: a @dataset entry per version and its source publication, read by an outside BibTeX parser", () => {
    const parsed = parseBibTeX(text("CITATIONS.bib"), { sentenceCase: false });
    expect(parsed.errors).toEqual([]);
    expect(parsed.entries.map((e) => [e.type, e.key])).toEqual([
      ["dataset", `${accession}-v1`],
      ["misc", `${accession}-v1-source`],
    ]);
    const [ds, src] = parsed.entries;
    expect(ds.fields.title).toBe("Flower visitors of the Verrin Hills meadows");
    expect(ds.fields.related).toBe(`${accession}-v1-source`);
    expect(src.fields.doi).toBe("10.5555/tb.demo.1");
    expect(src.fields.title).toBe("Hale R, Okafor I (2022) Meadow modules. Journal of Invented Ecology 1:1–10.");
  });

  it("include chooses the optional parts (none with an empty list); an unknown part is refused naming it", async () => {
    const bare = await bundle({ refs: `${accession}/v1/1`, include: "" });
    expect([...bare.keys()].sort()).toEqual(["CITATIONS.bib", "README.txt", "datapackage.json", "metrics.csv", "networks.csv", `networks/${accession}_v1_1.csv`]);
    expect(bare.get("README.txt")!.toString()).toMatch(/left out: partitions, roles, nulls, edges, originals/);
    const bad = await request(app).get("/api/v1/bundles").query({ refs: `${accession}/v1/1`, include: "roles,pictures" });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toEqual([{ path: "include", message: expect.stringContaining('"pictures"') }]);
  });
});
