/**
 * The optional parts of a bundle, chosen with `include` (query or JSON body; a comma-separated list or an
 * array). Without `include` a bundle holds DEFAULT_PARTS; `include=` (empty) holds none of them. The
 * matrices, metrics.csv, networks.csv, CITATIONS.bib, README.txt and datapackage.json are always there.
 *
 * | part        | file                          | one row per                                   |
 * |-------------|-------------------------------|-----------------------------------------------|
 * | partitions  | partitions.csv                | node of every network with current metrics    |
 * | roles       | roles.csv                     | node (within-module degree z, participation P) |
 * | nulls       | null_distribution.csv         | null replicate (model, seed, replicate, Q)    |
 * | edges       | edges.csv                     | link (an undirected one-mode link once)       |
 * | originals   | originals/<ref>/<file name>   | (the deposited file, byte for byte)           |
 *
 * Every table starts with `network_ref` (TB-000042/v2/3), the key that joins it with metrics.csv and
 * networks.csv. Values come from the network's current metric run (the run metrics.csv describes): its
 * partition, roles and null Q values as the pipeline stored them.
 */
import { QueryTypes } from "sequelize";
import type { AnalysisRole } from "@shared/network/analyze";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { deriveSeed } from "@shared/network/random";
import { NULL_STREAM } from "@shared/network/significance";
import { sequelize } from "../../db/sequelize";
import { csvLine, quoteField } from "@shared/csv";
import type { CatalogueEntry } from "../catalogue/catalogue.rows";

export const BUNDLE_PARTS = ["partitions", "roles", "nulls", "edges", "originals"] as const;
export type BundlePart = (typeof BUNDLE_PARTS)[number];
/** What a bundle holds when `include` is not given: the analysis results, not the data twice over. */
export const DEFAULT_PARTS: readonly BundlePart[] = ["partitions", "roles", "nulls"];

export type FieldType = "string" | "integer" | "number" | "boolean" | "date";
export type TableField = [name: string, type: FieldType, description: string];

/** The first column of every table about networks (metrics.csv, networks.csv and the part tables). */
export const REF_FIELD: TableField = ["network_ref", "string", "Network reference: accession/version/network, e.g. TB-000042/v2/3 (joins every table of the bundle)"];
const SIDE = "row (a row node), column (a column node), or node (one-mode network: rows and columns are the same nodes)";

export const PART_TABLES: Record<Exclude<BundlePart, "originals">, { path: string; name: string; title: string; fields: TableField[] }> = {
  partitions: {
    path: "partitions.csv",
    name: "partitions",
    title: "Module of every node in the best partition found (current metrics)",
    fields: [
      REF_FIELD,
      ["objective", "string", "Modularity objective the partition optimises (barber, newman, newman-directed)"],
      ["node", "string", "Node label, as in the network's matrix CSV"],
      ["side", "string", SIDE],
      ["module", "integer", "Module number (0, 1, 2, …; the network pages show it plus one)"],
    ],
  },
  roles: {
    path: "roles.csv",
    name: "roles",
    title: "Node roles: within-module degree z and participation coefficient P (current metrics)",
    fields: [
      REF_FIELD,
      ["node", "string", "Node label, as in the network's matrix CSV"],
      ["side", "string", SIDE],
      ["module", "integer", "Module number (as in partitions.csv)"],
      ["degree", "integer", "Number of links of the node (self-loops left out)"],
      ["z", "number", "Within-module degree z (Guimerà & Amaral 2005); empty when undefined"],
      ["P", "number", "Participation coefficient P = 1 − Σ_s (κ_is / k_i)²; empty for a node without links"],
      ["role", "string", "peripheral, connector, module-hub or network-hub (thresholds z = 2.5, P = 0.62, Olesen et al. 2007)"],
    ],
  },
  nulls: {
    path: "null_distribution.csv",
    name: "null-distribution",
    title: "Optimised modularity of every null replicate (current metrics)",
    fields: [
      REF_FIELD,
      ["null_model", "string", "Null model the replicate was drawn from (er: Erdős–Rényi type, same size and connectance; curveball: fixed degrees; patefield: fixed row and column totals)"],
      ["replicate", "integer", "Replicate number r (0, 1, …)"],
      ["seed", "integer", "Seed of the run (metrics.csv, column seed)"],
      ["replicate_seed", "integer", "Seed of the replicate's random generator, derived from the run's seed and r (README.txt)"],
      ["Q", "number", "Best modularity found on the null network, optimised like the observed one; empty when undefined"],
    ],
  },
  edges: {
    path: "edges.csv",
    name: "edges",
    title: "Every link of every network (edge-list form of the matrices)",
    fields: [
      REF_FIELD,
      ["source", "string", "Row node of the link (one-mode directed networks: the link goes from source to target)"],
      ["target", "string", "Column node of the link"],
      ["weight", "number", "Weight of the link (1 for binary networks)"],
    ],
  },
};

/** Reads `include` (a list, or a comma-separated string: bundles.schemas.ts checked its parts) out of a bundle request; the rest is the selection. */
export function takeParts(input: Record<string, unknown>): { parts: Set<BundlePart>; rest: Record<string, unknown> } {
  const { include, ...rest } = input;
  if (include === undefined) return { parts: new Set(DEFAULT_PARTS), rest };
  const list = (Array.isArray(include) ? include : [include]).flatMap((v) => String(v).split(",")).map((s) => s.trim()).filter(Boolean);
  return { parts: new Set(list as BundlePart[]), rest };
}

export interface NetworkParts {
  /** Node labels of the stored network (rows; columns of a bipartite network, else null). */
  rows?: string[];
  cols?: string[] | null;
  objective?: string | null;
  partition?: Record<string, number> | null;
  roles?: AnalysisRole[] | null;
  seed?: number | null;
  /** Q of every null replicate per null model, the primary model first. */
  nulls?: Array<{ model: string; qs: Array<number | null> }>;
  canonical?: CanonicalNetworkJson | null;
  original?: { name: string; sha256: string; bytes: Buffer } | null;
}

/**
 * What the chosen parts need of a batch of networks, in one or two queries: the current run's results
 * (partition, roles, null Q values) and the node labels, the canonical form (edges) and the original file.
 */
export async function fetchParts(entries: CatalogueEntry[], parts: ReadonlySet<BundlePart>): Promise<Map<number, NetworkParts>> {
  const out = new Map<number, NetworkParts>();
  if (!entries.length) return out;
  const get = (id: number) => {
    let p = out.get(id);
    if (!p) out.set(id, (p = {}));
    return p;
  };
  const analysis = parts.has("partitions") || parts.has("roles") || parts.has("nulls");
  const runIds = entries.map((e) => e.runId).filter((id): id is number => id !== null);
  if (analysis && runIds.length) {
    const rows = await sequelize().query<{
      network_id: number;
      objective: string | null;
      seed: string | number | null;
      partition: Record<string, number> | null;
      roles: AnalysisRole[] | null;
      null_qs: Array<number | null> | null;
      by_model: Record<string, Array<number | null>> | null;
      null_model: string | null;
      rows: string[] | null;
      cols: string[] | null;
    }>(
      `SELECT r.network_id, r.objective, r.seed,
              ${parts.has("partitions") ? "r.results->'analysis'->'modularity'->'partition'" : "NULL::jsonb"} AS partition,
              ${parts.has("roles") ? "r.results->'analysis'->'roles'->'nodes'" : "NULL::jsonb"} AS roles,
              ${parts.has("nulls") ? "COALESCE(r.results->'nullQs', r.results->'analysis'->'nullQs')" : "NULL::jsonb"} AS null_qs,
              ${parts.has("nulls") ? "r.results->'nullQsByModel'" : "NULL::jsonb"} AS by_model,
              r.results->'analysis'->'null'->>'model' AS null_model,
              n.canonical->'rows' AS rows, n.canonical->'cols' AS cols
         FROM metric_runs r JOIN networks n ON n.id = r.network_id
        WHERE r.id IN (:runIds) AND r.status = 'succeeded'`,
      { replacements: { runIds }, type: QueryTypes.SELECT },
    );
    for (const r of rows) {
      Object.assign(get(r.network_id), {
        rows: r.rows ?? [],
        cols: r.cols,
        objective: r.objective,
        partition: r.partition,
        roles: Array.isArray(r.roles) ? r.roles : null,
        seed: r.seed === null ? null : Number(r.seed),
        nulls: nullsOf(r.null_model, r.null_qs, r.by_model),
      });
    }
  }
  const ids = entries.map((e) => e.networkId);
  if (parts.has("edges") || parts.has("originals")) {
    const rows = await sequelize().query<{ id: number; canonical: string | null; original_name: string | null; sha256: string | null; bytes: Buffer | null }>(
      `SELECT n.id, ${parts.has("edges") ? "n.canonical::text" : "NULL"} AS canonical,
              n.original_name, ${parts.has("originals") ? "f.sha256, f.bytes" : "NULL AS sha256, NULL::bytea AS bytes"}
         FROM networks n JOIN stored_files f ON f.id = n.file_id WHERE n.id IN (:ids)`,
      { replacements: { ids }, type: QueryTypes.SELECT },
    );
    for (const r of rows) {
      const p = get(r.id);
      if (r.canonical !== null) p.canonical = JSON.parse(r.canonical) as CanonicalNetworkJson;
      if (r.bytes !== null && r.sha256 !== null) p.original = { name: r.original_name ?? "file", sha256: r.sha256.trim(), bytes: r.bytes };
    }
  }
  return out;
}

/**
 * The null Q values of a run per model: every model's (results.nullQsByModel, runs with several null
 * models) with the primary first, else the one model of older runs (results.nullQs and the analysis's model).
 */
function nullsOf(primary: string | null, qs: unknown, byModel: Record<string, unknown> | null): Array<{ model: string; qs: Array<number | null> }> {
  const list = (v: unknown) => (Array.isArray(v) ? (v as unknown[]).map((q) => (typeof q === "number" ? q : null)) : null);
  if (byModel && typeof byModel === "object") {
    const models = Object.keys(byModel).sort((a, b) => Number(b === primary) - Number(a === primary));
    return models.flatMap((model) => {
      const q = list(byModel[model]);
      return q ? [{ model, qs: q }] : [];
    });
  }
  const q = list(qs);
  return primary && q ? [{ model: primary, qs: q }] : [];
}

/** The engine's labels of a network's nodes (a bipartite column sharing a row's label is "label (column)"). */
function engineKeys(rows: string[], cols: string[] | null): { rowKeys: string[]; colKeys: string[] | null } {
  if (!cols) return { rowKeys: rows, colKeys: null };
  const rowSet = new Set(rows);
  return { rowKeys: rows, colKeys: cols.map((l) => (rowSet.has(l) ? `${l} (column)` : l)) };
}

/** partitions.csv lines of one network (none when its run has no partition, or it does not fit the network). */
export function partitionLines(ref: string, p: NetworkParts): string[] {
  if (!p.partition || !p.rows) return [];
  const { rowKeys, colKeys } = engineKeys(p.rows, p.cols ?? null);
  const lines: string[] = [];
  const side = colKeys ? "row" : "node";
  for (let i = 0; i < rowKeys.length; i++) {
    const m = p.partition[rowKeys[i]];
    if (m === undefined) return [];
    lines.push(csvLine([ref, p.objective, p.rows[i], side, m]));
  }
  if (colKeys) {
    for (let j = 0; j < colKeys.length; j++) {
      const m = p.partition[colKeys[j]];
      if (m === undefined) return [];
      lines.push(csvLine([ref, p.objective, p.cols![j], "column", m]));
    }
  }
  return lines;
}

/** roles.csv lines: the engine lists every node in node order (rows, then columns). */
export function roleLines(ref: string, p: NetworkParts): string[] {
  if (!p.roles || !p.rows) return [];
  const I = p.rows.length;
  const n = I + (p.cols ? p.cols.length : 0);
  if (p.roles.length !== n) return [];
  return p.roles.map((r, v) =>
    csvLine([ref, v < I ? p.rows![v] : p.cols![v - I], p.cols ? (v < I ? "row" : "column") : "node", r.module, r.degree, r.z, r.participation, r.role]),
  );
}

/** null_distribution.csv lines: one per replicate of each null model, with the model and seeds. */
export function nullLines(ref: string, p: NetworkParts): string[] {
  if (!p.nulls?.length || p.seed === null || p.seed === undefined) return [];
  const seed = p.seed;
  return p.nulls.flatMap(({ model, qs }) => qs.map((q, r) => csvLine([ref, model, r, seed, deriveSeed(seed, NULL_STREAM, r), q])));
}

/** edges.csv lines from the canonical form: every stored link, an undirected one-mode link once. */
export function edgeLines(ref: string, c: CanonicalNetworkJson): string[] {
  const rows = c.rows.map((r) => quoteField(r));
  const cols = c.kind === "bipartite" && c.cols ? c.cols.map((r) => quoteField(r)) : rows;
  const undirected = c.kind !== "bipartite" && !c.directed;
  const prefix = quoteField(ref) + ",";
  const lines: string[] = [];
  for (let i = 0; i < rows.length; i++) {
    for (let q = c.ptr[i]; q < c.ptr[i + 1]; q++) {
      const j = c.idx[q];
      if (undirected && j < i) continue;
      lines.push(`${prefix}${rows[i]},${cols[j]},${c.w ? c.w[q] : 1}`);
    }
  }
  return lines;
}

/** Path of a network's original file in the bundle: originals/<ACCESSION_vN_P>/<its name, made safe>. */
export function originalPath(ref: string, name: string): string {
  // eslint-disable-next-line no-control-regex -- control characters are exactly what a file name must not hold
  const safe = name.replace(/[\\/:*?"<>|\u0000-\u001f]/g, "_").replace(/^\.+/, "_").slice(0, 200) || "file";
  return `originals/${ref.replace(/\//g, "_")}/${safe}`;
}

/** Frictionless format of an original file, from its name. */
export function formatOf(name: string): string {
  const ext = /\.([A-Za-z0-9]+)$/.exec(name)?.[1]?.toLowerCase();
  return ext ?? "bin";
}

export const MEDIATYPES: Record<string, string> = { csv: "text/csv", tsv: "text/tab-separated-values", txt: "text/plain", zip: "application/zip" };
