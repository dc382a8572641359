/**
 * Streams a bundle as a zip (archiver 8 ZipArchive): README.txt, datapackage.json (Frictionless Data
 * Package with a Table Schema per CSV), one matrix CSV per network, metrics.csv, networks.csv and
 * CITATIONS.bib. Memory stays flat whatever the number of networks: networks are read from the database
 * in batches, each batch is appended only when the archive has consumed the previous one (which waits
 * for the HTTP response to drain), and the large files are streamed from async generators. A client
 * that disconnects stops the work (no further batches are read).
 */
import { Readable } from "node:stream";
import type { Writable } from "node:stream";
import { ZipArchive } from "archiver";
import { QueryTypes } from "sequelize";
import { ENGINE_VERSION } from "../../../../shared/network/version";
import { deserializeNetwork, networkToMatrixCsv } from "../../../../shared/network";
import { licenceUrl, toBibTeX } from "../../../../shared/citation";
import type { StudyMetadata } from "../../../../shared/types/dataset";
import { config } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { getPipelineSettings, settingsHash } from "../../jobs/settings";
import { loadCatalogueRows, type CatalogueEntry } from "../catalogue/catalogue.rows";
import { fileNameOf, type SelectedNetwork } from "./bundles.selection";
import { bundleReadme } from "./bundles.readme";

const BATCH = 100;

export const METRICS_FIELDS: Array<[string, "string" | "integer" | "number", string, (e: CatalogueEntry) => unknown]> = [
  ["accession", "string", "Dataset accession", (e) => e.accession],
  ["version", "integer", "Dataset version number", (e) => e.version],
  ["network", "integer", "Network number within the version", (e) => e.position],
  ["kind", "string", "bipartite or unipartite (directed or not)", (e) => (e.kind === "unipartite" ? (e.directed ? "unipartite-directed" : "unipartite") : "bipartite")],
  ["S", "integer", "Number of nodes", (e) => e.nNodes],
  ["I", "integer", "Rows (lower level) of a bipartite network", (e) => e.nRows],
  ["J", "integer", "Columns (higher level) of a bipartite network", (e) => e.nCols],
  ["L", "integer", "Number of links (non-zero cells; an undirected link once)", (e) => e.nLinks],
  ["C", "number", "Connectance", (e) => e.connectance],
  ["Q", "number", "Optimised modularity of the best partition found", (e) => e.q],
  ["modules", "integer", "Number of modules in the best partition", (e) => e.modules],
  ["objective", "string", "Modularity objective (newman, newman-directed, barber)", (e) => e.objective],
  ["null_model", "string", "Null model of the significance test", (e) => e.nullModel],
  ["null_n", "integer", "Null replicates", (e) => e.nullN],
  ["null_mean", "number", "Mean Q of the null replicates", (e) => e.nullMean],
  ["null_sd", "number", "Standard deviation of Q of the null replicates", (e) => e.nullSd],
  ["z", "number", "z = (Q − null mean) / null sd", (e) => e.z],
  ["Q_rel", "number", "Q_rel = (Q − null mean) / null mean", (e) => e.qRel],
  ["p", "number", "Share of null replicates with Q ≥ observed Q ((k+1)/(n+1))", (e) => e.p],
  ["NODF", "number", "Nestedness (NODF, 0–100)", (e) => e.nodf],
  ["algorithm", "string", "Algorithm name and version", (e) => (e.algorithmName ? `${e.algorithmName} ${e.algorithmVersion ?? ""}`.trim() : null)],
  ["seed", "integer", "Random seed of the run", (e) => e.seed],
  ["settings_hash", "string", "Pipeline settings hash of the run", (e) => e.settingsHash],
];

export const NETWORK_FIELDS: Array<[string, "string" | "integer" | "number" | "boolean" | "date", string, (e: CatalogueEntry) => unknown]> = [
  ["accession", "string", "Dataset accession", (e) => e.accession],
  ["version", "integer", "Dataset version number", (e) => e.version],
  ["network", "integer", "Network number within the version", (e) => e.position],
  ["file", "string", "Path of the network's CSV in this bundle", (e) => fileNameOf(e.ref)],
  ["name", "string", "Network name", (e) => e.name],
  ["title", "string", "Dataset title", (e) => e.title],
  ["licence", "string", "Licence (SPDX identifier)", (e) => e.licence],
  ["interaction_type", "string", "Interaction type", (e) => e.interactionType],
  ["kind", "string", "bipartite or unipartite", (e) => e.kind],
  ["directed", "boolean", "Directed links", (e) => e.directed],
  ["weighted", "boolean", "Weighted links", (e) => e.weighted],
  ["weight_meaning", "string", "What the weights mean", (e) => e.weightMeaning],
  ["row_level", "string", "Bipartite: name of the row level", (e) => e.rowLevel],
  ["col_level", "string", "Bipartite: name of the column level", (e) => e.colLevel],
  ["habitat", "string", "Habitat", (e) => e.habitat],
  ["country_code", "string", "Country (ISO 3166-1 alpha-2)", (e) => e.countryCode],
  ["locality", "string", "Place name", (e) => e.placeName],
  ["decimal_latitude", "number", "Latitude (WGS84), generalised to the locality's public grid", (e) => e.latitude],
  ["decimal_longitude", "number", "Longitude (WGS84), generalised to the locality's public grid", (e) => e.longitude],
  ["coordinate_generalisation", "string", "Grid the public coordinates were rounded to (degrees) or exact", (e) => e.generalisation],
  ["elevation", "number", "Elevation (m)", (e) => e.elevation],
  ["start_date", "date", "First day of sampling", (e) => e.startDate],
  ["end_date", "date", "Last day of sampling", (e) => e.endDate],
  ["sampling_protocol", "string", "Sampling protocol", (e) => e.samplingProtocol],
  ["sampling_effort", "number", "Sampling effort", (e) => e.samplingEffortValue],
  ["sampling_effort_unit", "string", "Unit of the sampling effort", (e) => e.samplingEffortUnit],
  ["taxonomic_resolution", "string", "Taxonomic resolution", (e) => e.taxonomicResolution],
];

export function csvCell(v: unknown): string {
  if (v === null || v === undefined) return "";
  const s = typeof v === "number" ? String(v) : String(v);
  return /[",\n\r]/.test(s) || s !== s.trim() ? `"${s.replace(/"/g, '""')}"` : s;
}

function tableSchema(fields: Array<[string, string, string, unknown]>) {
  return { fields: fields.map(([name, type, description]) => ({ name, type, description })), missingValues: [""] };
}

function resourceName(path: string): string {
  return path.replace(/^networks\//, "network-").replace(/\.csv$/, "").toLowerCase().replace(/[^a-z0-9._-]/g, "-");
}

export interface BundleOptions {
  networks: SelectedNetwork[];
  /** A short title, e.g. "Selection of 12 networks" */
  title: string;
  signal: AbortSignal;
  /** zlib level (1 = fast; bundles are mostly zeros, which compress well even at level 1). */
  level?: number;
}

interface LightRow {
  network_id: number;
  rows: string[];
  cols: string[] | null;
  licence: string | null;
  title: string | null;
  accession: string;
  number: number;
}

/** Streams the bundle into `out` (an HTTP response). Resolves when the zip is finished or aborted. */
export async function writeBundle(out: Writable, opts: BundleOptions): Promise<{ aborted: boolean; bytes: number }> {
  const { networks, signal } = opts;
  const archive = new ZipArchive({ zlib: { level: opts.level ?? 1 } });
  let processed = 0;
  let wake: (() => void) | null = null;
  const poke = () => {
    const w = wake;
    wake = null;
    w?.();
  };
  archive.on("entry", () => {
    processed++;
    poke();
  });
  let failure = null as Error | null;
  let stop: () => void = () => undefined;
  const stopped = new Promise<void>((r) => (stop = r));
  archive.on("error", (err: Error) => {
    failure = err;
    poke();
    stop();
  });
  signal.addEventListener("abort", () => {
    archive.abort();
    poke();
    stop();
  });
  const waitFor = async (n: number) => {
    while (processed < n && !signal.aborted && !failure) await new Promise<void>((r) => (wake = r));
  };
  archive.pipe(out);
  /** A stream entry from an async generator; a failure (e.g. the database) aborts the whole bundle. */
  const fromGenerator = (gen: AsyncGenerator<string>) =>
    Readable.from(
      (async function* () {
        try {
          yield* gen;
        } catch (err) {
          failure = err as Error;
          archive.abort();
          poke();
          stop();
        }
      })(),
    );

  const ids = networks.map((n) => n.networkId);
  const settings = await getPipelineSettings();
  const generated = new Date();
  const publicUrl = config().publicUrl;
  let appended = 0;
  const add = (source: string | Readable, name: string) => {
    archive.append(source, { name, date: generated });
    appended++;
  };

  // 1. README (how every metric was computed)
  add(bundleReadme({ settings, settingsHash: settingsHash(settings), engineVersion: ENGINE_VERSION, count: networks.length, generated, publicUrl, title: opts.title }), "README.txt");

  // 2. datapackage.json, streamed: one resource per network CSV (its Table Schema lists the columns)
  async function* datapackage() {
    const lic = await sequelize().query<{ licence: string | null }>(
      `SELECT DISTINCT v.metadata ->> 'licence' AS licence FROM networks n JOIN dataset_versions v ON v.id = n.version_id WHERE n.id IN (:ids)`,
      { replacements: { ids }, type: QueryTypes.SELECT },
    );
    const licences = lic.map((l) => l.licence ?? "unknown").sort();
    const licenseObj = (l: string) => ({ name: l, path: licenceUrl(l), title: l === "CC0-1.0" ? "CC0 1.0 Universal" : l === "CC-BY-4.0" ? "Creative Commons Attribution 4.0" : l });
    const head = {
      profile: "tabular-data-package",
      name: `tanglebank-bundle-${generated.toISOString().slice(0, 10)}`,
      title: `Tanglebank bundle: ${opts.title}`,
      description: `${networks.length} interaction networks from Tanglebank with their metadata and metrics. See README.txt for how the metrics were computed.`,
      created: generated.toISOString(),
      homepage: publicUrl,
      licenses: licences.map(licenseObj),
      sources: [{ title: "Tanglebank", path: publicUrl }],
    };
    const headJson = JSON.stringify(head, null, 2);
    yield headJson.slice(0, -2) + ',\n  "resources": [\n';
    const fixed = [
      { path: "metrics.csv", name: "metrics", title: "Current metrics of every network", schema: tableSchema(METRICS_FIELDS) },
      { path: "networks.csv", name: "networks", title: "Metadata of every network", schema: tableSchema(NETWORK_FIELDS) },
    ].map((r) => ({ ...r, profile: "tabular-data-resource", format: "csv", mediatype: "text/csv", encoding: "utf-8", licenses: licences.map(licenseObj), sources: head.sources }));
    yield fixed.map((r) => "    " + JSON.stringify(r)).join(",\n");
    for (let i = 0; i < ids.length && !signal.aborted; i += BATCH * 2) {
      const rows = await sequelize().query<LightRow>(
        `SELECT n.id AS network_id, n.canonical -> 'rows' AS rows, n.canonical -> 'cols' AS cols,
                v.metadata ->> 'licence' AS licence, v.metadata ->> 'title' AS title, d.accession, v.number
         FROM networks n JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id
         WHERE n.id IN (:ids) AND v.state = 'published'`,
        { replacements: { ids: ids.slice(i, i + BATCH * 2) }, type: QueryTypes.SELECT },
      );
      const byId = new Map(rows.map((r) => [r.network_id, r]));
      const parts: string[] = [];
      for (const net of networks.slice(i, i + BATCH * 2)) {
        const r = byId.get(net.networkId);
        if (!r) continue;
        const cols = r.cols ?? r.rows;
        const path = fileNameOf(net.ref);
        const licence = r.licence ?? "unknown";
        parts.push(
          "    " +
            JSON.stringify({
              path,
              name: resourceName(path),
              title: `${net.ref}: ${r.title ?? ""}`.trim(),
              profile: "tabular-data-resource",
              format: "csv",
              mediatype: "text/csv",
              encoding: "utf-8",
              licenses: [licenseObj(licence)],
              sources: [{ title: `${r.accession} version ${r.number}`, path: `${publicUrl}/datasets/${r.accession}/v/${r.number}` }],
              schema: {
                fields: [{ name: "node", type: "string", description: net.kind === "bipartite" ? "Row (lower level) node" : "Node (row: source of a link)" }, ...cols.map((c) => ({ name: c, type: "number" }))],
                primaryKey: ["node"],
              },
            }),
        );
      }
      if (parts.length) yield ",\n" + parts.join(",\n");
    }
    yield "\n  ]\n}\n";
  }
  add(fromGenerator(datapackage()), "datapackage.json");

  // 3. One matrix CSV per network, in batches (each batch appended once the archive consumed the last)
  for (let i = 0; i < ids.length && !signal.aborted && !failure; i += BATCH) {
    const batch = networks.slice(i, i + BATCH);
    const rows = await sequelize().query<{ network_id: number; canonical: unknown }>(
      `SELECT n.id AS network_id, n.canonical FROM networks n JOIN dataset_versions v ON v.id = n.version_id
       WHERE n.id IN (:ids) AND v.state = 'published'`,
      { replacements: { ids: batch.map((b) => b.networkId) }, type: QueryTypes.SELECT },
    );
    const byId = new Map(rows.map((r) => [r.network_id, r.canonical]));
    await waitFor(appended - BATCH / 2);
    if (signal.aborted) break;
    for (const net of batch) {
      const canonical = byId.get(net.networkId);
      if (canonical === undefined) continue;
      byId.delete(net.networkId);
      add("node" + networkToMatrixCsv(deserializeNetwork(canonical)), fileNameOf(net.ref));
    }
  }

  // 4. metrics.csv and networks.csv, streamed from batches of catalogue rows
  async function* table(fields: Array<[string, string, string, (e: CatalogueEntry) => unknown]>) {
    yield fields.map((f) => f[0]).join(",") + "\n";
    for (let i = 0; i < ids.length && !signal.aborted; i += BATCH * 5) {
      const rows = await loadCatalogueRows({ networkIds: ids.slice(i, i + BATCH * 5), anyPublishedVersion: true });
      const byId = new Map(rows.map((r) => [r.networkId, r]));
      const lines: string[] = [];
      for (const id of ids.slice(i, i + BATCH * 5)) {
        const e = byId.get(id);
        if (e) lines.push(fields.map((f) => csvCell(f[3](e))).join(","));
      }
      if (lines.length) yield lines.join("\n") + "\n";
    }
  }
  if (!signal.aborted) add(fromGenerator(table(METRICS_FIELDS)), "metrics.csv");
  if (!signal.aborted) add(fromGenerator(table(NETWORK_FIELDS)), "networks.csv");

  // 5. CITATIONS.bib: one entry per dataset version
  async function* citations() {
    const versions = [...new Set(networks.map((n) => `${n.accession}/${n.version}`))];
    for (let i = 0; i < versions.length && !signal.aborted; i += 500) {
      const chunk = versions.slice(i, i + 500);
      const rows = await sequelize().query<{ accession: string; number: number; metadata: StudyMetadata; published_at: Date | null }>(
        `SELECT d.accession, v.number, v.metadata, v.published_at FROM dataset_versions v JOIN datasets d ON d.id = v.dataset_id
         WHERE (d.accession || '/' || v.number) IN (:keys) ORDER BY d.accession, v.number`,
        { replacements: { keys: chunk }, type: QueryTypes.SELECT },
      );
      yield rows
        .map((r) =>
          toBibTeX({
            metadata: { ...r.metadata, title: r.metadata.title ?? r.accession, creators: Array.isArray(r.metadata.creators) ? r.metadata.creators : [] },
            accession: r.accession,
            version: r.number,
            year: (r.published_at ? new Date(r.published_at) : generated).getUTCFullYear(),
            url: `${publicUrl}/datasets/${r.accession}/v/${r.number}`,
          }),
        )
        .join("\n");
    }
  }
  if (!signal.aborted) add(fromGenerator(citations()), "CITATIONS.bib");

  if (failure) throw failure;
  if (signal.aborted) return { aborted: true, bytes: archive.pointer() };
  await Promise.race([archive.finalize(), stopped]);
  if (failure) throw failure;
  return { aborted: signal.aborted, bytes: archive.pointer() };
}
