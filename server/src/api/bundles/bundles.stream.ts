/**
 * Streams a bundle as a zip (archiver 8 ZipArchive): README.txt, datapackage.json (Frictionless Data
 * Package with a Table Schema per CSV), one matrix CSV per network, metrics.csv, networks.csv,
 * CITATIONS.bib, and the optional parts chosen (bundles.parts.ts: partitions, node roles, null
 * distributions, edge lists, original files). Memory stays flat whatever the number of networks: networks are read from the database
 * in batches, each batch is appended only when the archive has consumed the previous one (which waits
 * for the HTTP response to drain), and the large files are streamed from async generators. A client
 * that disconnects stops the work (no further batches are read).
 */
import { createReadStream } from "node:fs";
import { mkdtemp, open, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Readable, Transform } from "node:stream";
import type { Writable } from "node:stream";
import { ZipArchive } from "archiver";
import { QueryTypes } from "sequelize";
import { ENGINE_VERSION } from "@shared/network/version";
import { datasetBibTeX, doiUrl, licenceUrl } from "@shared/citation";
import { NULL_MODEL_INFO, NULL_MODELS, type NullModelName } from "@shared/network/null-models/index";
import type { StudyMetadata } from "@shared/types/dataset";
import { config } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { getPipelineSettings, settingsHash } from "../../pipeline/settings";
import { loadCatalogueRows, type CatalogueEntry } from "../catalogue/catalogue.rows";
import { catalogueStore } from "../catalogue/catalogue.store";
import { fileNameOf, matrixCells, matrixCsvBytes, type SelectedNetwork } from "./bundles.selection";
import { bundleReadme } from "./bundles.readme";
import { csvHeaderLabels, matrixCsvPieces } from "../../lib/matrix-csv";
import { csvLine } from "@shared/csv";
import { bundleMatrixCsv, MATRIX_CSV_CORNER, MATRIX_CSV_FORMAT, MATRIX_CSV_MAX_CELLS } from "./bundles.stored-csv";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { useNativeCrc32 } from "./bundles.crc";
import {
  DEFAULT_PARTS,
  edgeLines,
  fetchParts,
  formatOf,
  MEDIATYPES,
  nullLines,
  originalPath,
  PART_TABLES,
  partitionLines,
  roleLines,
  type BundlePart,
  type NetworkParts,
  type TableField,
} from "./bundles.parts";

useNativeCrc32();

/**
 * Networks read from the database at a time, and how many such batches are read ahead. Small batches
 * keep few objects alive between garbage collections (the server's time per network went down from 200
 * to 50); reading ahead lets the database work while this process writes.
 */
const DEFAULT_BATCH = 50;
/** …and at most about this many bytes of matrix CSV per batch (a batch holds at least one network). */
const BATCH_BYTES = 4 * 1024 * 1024;
const PREFETCH = 3;
/** …and batches read ahead hold at most about this many bytes (a large streamed network is one batch). */
const PREFETCH_BYTES = 12 * 1024 * 1024;
/** zlib level of compression=small (zlib's default). */
const SMALL_LEVEL = 6;

const REF_FIELD: MetricsField = ["network_ref", "string", "Network reference: accession/version/network, e.g. TB-000042/v2/3 (joins every table of the bundle)", (e) => e.ref];

type MetricsField = [string, "string" | "integer" | "number" | "boolean", string, (e: CatalogueEntry) => unknown];

/**
 * One explicit column set per null model (metrics.csv never mixes models in a column): the model name
 * with "-" as "_" before each figure, e.g. curveball_z, totals_connectance_p. Empty when the network's
 * run did not compute that model (it is not in its kind's standard set, or metrics are pending).
 */
function nullModelColumns(model: NullModelName): MetricsField[] {
  const prefix = model.replaceAll("-", "_");
  const info = NULL_MODEL_INFO[model];
  const of = (e: CatalogueEntry) => e.nulls[model];
  const what = `null model ${model} (${info.title}; keeps ${info.keeps})`;
  return [
    [`${prefix}_n`, "integer", `Null replicates of the ${what}`, (e) => of(e)?.n],
    [`${prefix}_mean`, "number", `Mean Q of the ${model} null replicates`, (e) => of(e)?.mean],
    [`${prefix}_sd`, "number", `Standard deviation (n − 1) of Q of the ${model} null replicates`, (e) => of(e)?.sd],
    [`${prefix}_z`, "number", `z = (Q − null mean) / null sd against the ${model} null model`, (e) => of(e)?.z],
    [`${prefix}_z_se`, "number", `Monte Carlo standard error of ${prefix}_z: sqrt(1/n + z²/(2(n − 1)))`, (e) => of(e)?.zSe],
    [`${prefix}_Q_rel`, "number", `Q_rel = (Q − null mean) / null mean against the ${model} null model`, (e) => of(e)?.qRel],
    [`${prefix}_delta_Q`, "number", `ΔQ = Q − null mean against the ${model} null model`, (e) => of(e)?.deltaQ],
    [`${prefix}_p`, "number", `p = (1 + #{Q_null ≥ Q}) / (n + 1) against the ${model} null model`, (e) => of(e)?.p],
    [`${prefix}_p_at_floor`, "boolean", `true when no ${model} null reached Q: ${prefix}_p is the floor 1/(n + 1), read it as "p ≤"`, (e) => of(e)?.pAtFloor],
  ];
}

export const METRICS_FIELDS: MetricsField[] = [
  REF_FIELD,
  ["accession", "string", "Dataset accession", (e) => e.accession],
  ["version", "integer", "Dataset version number", (e) => e.version],
  ["network", "integer", "Network number within the version", (e) => e.position],
  ["kind", "string", "bipartite or unipartite (directed or not)", (e) => (e.kind === "unipartite" ? (e.directed ? "unipartite-directed" : "unipartite") : "bipartite")],
  ["S", "integer", "Number of nodes", (e) => e.nNodes],
  ["I", "integer", "Row nodes of a bipartite network (what they are: networks.csv, row_nodes)", (e) => e.nRows],
  ["J", "integer", "Column nodes of a bipartite network (what they are: networks.csv, column_nodes)", (e) => e.nCols],
  ["L", "integer", "Number of links (non-zero cells; an undirected link once)", (e) => e.nLinks],
  ["C", "number", "Connectance", (e) => e.connectance],
  ["Q", "number", "Optimised modularity of the best partition found", (e) => e.q],
  ["modules", "integer", "Number of modules in the best partition", (e) => e.modules],
  ["objective", "string", "Modularity objective (newman, newman-directed, barber)", (e) => e.objective],
  ["primary_null_model", "string", "The primary null model of the network's kind (fixed degrees, curveball); its columns are the first to read", (e) => e.primaryNull],
  ...NULL_MODELS.flatMap((m) => nullModelColumns(m)),
  ["NODF", "number", "Nestedness (NODF, 0–100)", (e) => e.nodf],
  ["algorithm", "string", "Algorithm name and version", (e) => (e.algorithmName ? `${e.algorithmName} ${e.algorithmVersion ?? ""}`.trim() : null)],
  ["seed", "integer", "Random seed of the run", (e) => e.seed],
  ["settings_hash", "string", "Pipeline settings hash of the run", (e) => e.settingsHash],
  ["settings_current", "boolean", "true when the run used the current pipeline settings; false: the last successful run of older settings (a newer run failed or is pending)", (e) => (e.runId ? e.currentSettings : null)],
];

export const NETWORK_FIELDS: Array<[string, "string" | "integer" | "number" | "boolean" | "date", string, (e: CatalogueEntry) => unknown]> = [
  REF_FIELD,
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
  ["row_nodes", "string", "Bipartite: what the row nodes of the matrix are (e.g. plants)", (e) => e.rowLevel],
  ["column_nodes", "string", "Bipartite: what the column nodes of the matrix are (e.g. pollinators)", (e) => e.colLevel],
  ["habitat", "string", "Habitat", (e) => e.habitat],
  ["country_code", "string", "Country (ISO 3166-1 alpha-2)", (e) => e.countryCode],
  ["locality", "string", "Place name", (e) => e.placeName],
  ["decimal_latitude", "number", "Latitude (WGS84), generalised to the locality's public grid", (e) => e.latitude],
  ["decimal_longitude", "number", "Longitude (WGS84), generalised to the locality's public grid", (e) => e.longitude],
  ["coordinate_generalisation", "string", "Grid the public coordinates were rounded to (degrees) or exact", (e) => e.generalisation],
  ["elevation", "number", "Elevation (m), rounded with the coordinates on generalised sites (50, 100 or 500 m for the 0.01, 0.1 and 1 degree grids)", (e) => e.elevation],
  ["start_date", "date", "First day of sampling", (e) => e.startDate],
  ["end_date", "date", "Last day of sampling", (e) => e.endDate],
  ["sampling_protocol", "string", "Sampling protocol", (e) => e.samplingProtocol],
  ["sampling_effort", "number", "Sampling effort", (e) => e.samplingEffortValue],
  ["sampling_effort_unit", "string", "Unit of the sampling effort", (e) => e.samplingEffortUnit],
  ["taxonomic_resolution", "string", "Taxonomic resolution", (e) => e.taxonomicResolution],
  ["not_recorded", "string", "Fields the depositor marked not recorded, with the reason (their columns are empty; never a made-up value)", (e) => e.notRecordedText || null],
];

function tableSchema(fields: Array<[string, string, string, unknown]>) {
  return { fields: fields.map(([name, type, description]) => ({ name, type, description })), missingValues: [""] };
}

/** Table Schema of a part's table: its fields, and network_ref pointing at metrics.csv. */
function partSchema(fields: TableField[]) {
  return { ...tableSchema(fields.map((f) => [...f, null])), foreignKeys: [{ fields: "network_ref", reference: { resource: "metrics", fields: "network_ref" } }] };
}

const NODE_FIELD_BIPARTITE = JSON.stringify({ name: "node", type: "string", description: "Row node (the other columns are the column nodes; cells are weights, 0 = no link)" });
const NODE_FIELD_ONE_MODE = JSON.stringify({ name: "node", type: "string", description: "Node (a link goes from the row node to the column node; cells are weights, 0 = no link)" });

/**
 * `,{"name":…,"type":"number"}` for every column of a matrix CSV (its header's labels after the corner
 * cell), as JSON.stringify would write them: a bundle writes hundreds of thousands of these. When the
 * header has no quote at all (so no label was quoted, and a comma always separates two labels) and nothing
 * JSON would escape, the header itself becomes the list with one replace; otherwise label by label.
 */
export function numberFieldsOfCsv(csv: Buffer): string {
  let end = csv.indexOf(0x0a);
  if (end < 0) end = csv.length;
  const header = csv.toString("utf8", 0, end);
  const comma = header.indexOf(",");
  if (comma < 0) return "";
  if (!JSON_SPECIAL.test(header)) return `,{"name":"${header.slice(comma + 1).replaceAll(",", '","type":"number"},{"name":"')}","type":"number"}`;
  return numberFields(csvHeaderLabels(csv));
}

/** A quote, backslash, control character or surrogate (any of which needs a closer look). */
// eslint-disable-next-line no-control-regex -- control characters are exactly what JSON escapes
const JSON_SPECIAL = /["\\\u0000-\u001f\ud800-\udfff]/;

/** The same for a list of labels. */
export function numberFields(cols: string[]): string {
  let out = "";
  for (const c of cols) out += `,{"name":${plainJson(c) ? `"${c}"` : JSON.stringify(c)},"type":"number"}`;
  return out;
}

/** True when JSON.stringify would write the string unchanged between quotes. */
function plainJson(s: string): boolean {
  for (let k = 0; k < s.length; k++) {
    const c = s.charCodeAt(k);
    if (c < 0x20 || c === 0x22 || c === 0x5c || (c >= 0xd800 && c <= 0xdfff)) return false;
  }
  return true;
}

function resourceName(path: string): string {
  return path.replace(/^networks\//, "network-").replace(/\.csv$/, "").toLowerCase().replace(/[^a-z0-9._-]/g, "-");
}

export interface BundleOptions {
  networks: SelectedNetwork[];
  /** A short title, e.g. "Selection of 12 networks" */
  title: string;
  signal: AbortSignal;
  /**
   * How the files are packed:
   * - "fast" (default): stored uncompressed. The zip is about seven times larger (the matrices are mostly
   *   zeros), but the server only copies bytes, so it sends about three times as much content per second.
   * - "small": deflated (zlib level 6): about a seventh of the size, for slow connections, at about three times
   *   the server's time.
   */
  compression?: BundleCompression;
  /** Networks read from the database at a time (default 50; fewer when they are large). */
  batchSize?: number;
  /** Optional parts (bundles.parts.ts); default DEFAULT_PARTS. */
  parts?: ReadonlySet<BundlePart>;
}

export const BUNDLE_COMPRESSIONS = ["fast", "small"] as const;
export type BundleCompression = (typeof BUNDLE_COMPRESSIONS)[number];

interface MatrixRow {
  network_id: number;
  /** The stored matrix CSV (bundles.stored-csv.ts), or null when there is none of the current format. */
  csv: string | null;
  /** Otherwise the canonical JSON text, parsed only just before its CSV is written. */
  canonical: string | null;
}

/**
 * About how many bytes a batch holds for a network, for sizing batches: its matrix CSV, or for a matrix too
 * large to be stored, which is streamed, its canonical JSON.
 */
function heldBytesOf(n: SelectedNetwork): number {
  return matrixCells(n) <= MATRIX_CSV_MAX_CELLS ? matrixCsvBytes(n) : 30 * ((n.nRows ?? n.nNodes) + (n.nCols ?? n.nNodes)) + 16 * n.nLinks;
}

/**
 * Gathers the zip's many small pieces (headers, descriptors, deflate output) into chunks of about 64 kB
 * before they reach the socket: far fewer writes for the same bytes.
 */
function coalescer(size = 64 * 1024): Transform {
  let parts: Buffer[] = [];
  let length = 0;
  return new Transform({
    transform(chunk: Buffer, _enc, cb) {
      parts.push(chunk);
      length += chunk.length;
      if (length >= size) {
        const out = Buffer.concat(parts, length);
        parts = [];
        length = 0;
        cb(null, out);
      } else cb();
    },
    flush(cb) {
      cb(null, length ? Buffer.concat(parts, length) : undefined);
    },
  });
}

const licenseObj = (l: string) => ({ name: l, path: licenceUrl(l), title: l === "CC0-1.0" ? "CC0 1.0 Universal" : l === "CC-BY-4.0" ? "Creative Commons Attribution 4.0" : l });

/**
 * Streams the bundle into `out` (an HTTP response). Resolves when the zip is finished or aborted.
 *
 * One pass over the networks, 50 at a time and at most about 4 MB of CSV per batch (the next three
 * batches are read while this one is written): each network's matrix CSV is copied from the one stored
 * at publication (bundles.stored-csv.ts), or written from its canonical JSON when there is none
 * (lib/matrix-csv.ts), and appended to the archive; its datapackage resource (fields from the CSV's
 * header), metrics row and metadata row are written to small temporary files, which become
 * datapackage.json, metrics.csv and networks.csv at the end. Metadata and metrics come from the catalogue
 * in memory. So every network is read from the database once, and memory holds a few batches whatever
 * the bundle's size.
 *
 * Speed (npm run bench:catalogue, 1,000 networks): stored CSVs are copied (parsing the JSON and writing
 * the matrix was most of the server's time), metadata is not read again from the database, the checksum
 * is native (bundles.crc.ts), and by default nothing is deflated (compression "fast"; see BundleOptions).
 */
export async function writeBundle(out: Writable, opts: BundleOptions): Promise<{ aborted: boolean; bytes: number }> {
  const { networks, signal } = opts;
  const BATCH = opts.batchSize ?? DEFAULT_BATCH;
  const store = (opts.compression ?? "fast") === "fast";
  const parts: ReadonlySet<BundlePart> = opts.parts ?? new Set(DEFAULT_PARTS);
  const archive = store ? new ZipArchive({ store: true }) : new ZipArchive({ zlib: { level: SMALL_LEVEL } });
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
  const onAbort = () => {
    archive.abort();
    poke();
    stop();
  };
  signal.addEventListener("abort", onAbort);
  const waitFor = async (n: number) => {
    while (processed < n && !signal.aborted && !failure) await new Promise<void>((r) => (wake = r));
  };
  /**
   * Archiver consumes entries whether or not its output is read, so the socket's backpressure is checked
   * here: no new batch is read while the client has not taken what was already sent.
   */
  const waitForClient = async () => {
    while (!signal.aborted && !failure && (out.writableNeedDrain || archive.readableLength > 4 * 1024 * 1024)) {
      await new Promise<void>((resolve) => {
        const done = () => {
          out.off("drain", done);
          signal.removeEventListener("abort", done);
          clearTimeout(timer);
          resolve();
        };
        const timer = setTimeout(done, 100);
        out.once("drain", done);
        signal.addEventListener("abort", done);
      });
    }
  };
  archive.pipe(coalescer()).pipe(out);
  /** A stream entry from an async generator; a failure (e.g. the database) aborts the whole bundle. */
  const fromGenerator = (gen: AsyncGenerator<string | Buffer>) =>
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

  // Batches of at most BATCH networks and about BATCH_BYTES of CSV (so a few large networks do not fill
  // memory): [start, end) indices into `networks`.
  const batches: Array<{ from: number; to: number; bytes: number }> = [];
  for (let i = 0; i < networks.length; ) {
    const from = i;
    let bytes = 0;
    while (i < networks.length && i - from < BATCH && (i === from || bytes + heldBytesOf(networks[i]) <= BATCH_BYTES)) bytes += heldBytesOf(networks[i++]);
    batches.push({ from, to: i, bytes });
  }
  // Metadata and metrics come from the catalogue in memory, brought up to date first (so metrics.csv
  // holds the runs finished before the bundle started); networks of older published versions, which the
  // catalogue does not list, are read from the database. Whether a network is still published is always
  // checked in the database, with its matrix.
  const catalogueReady = catalogueStore.current();
  catalogueReady.catch(() => undefined); // awaited with the first batch
  const fetchBatch = ({ from, to }: { from: number; to: number }) => {
    const batchIds = networks.slice(from, to).map((n) => n.networkId);
    return Promise.all([
      // the stored CSV when there is one of the current format, else the canonical form to write it from
      sequelize().query<MatrixRow>(
        `SELECT n.id AS network_id,
                CASE WHEN n.matrix_csv_format = :format THEN n.matrix_csv END AS csv,
                CASE WHEN n.matrix_csv IS NULL OR n.matrix_csv_format IS DISTINCT FROM :format THEN n.canonical::text END AS canonical
           FROM networks n JOIN dataset_versions v ON v.id = n.version_id
          WHERE n.id IN (:ids) AND v.state = 'published'`,
        { replacements: { ids: batchIds, format: MATRIX_CSV_FORMAT }, type: QueryTypes.SELECT },
      ),
      catalogueReady.then(async () => {
        const entries: CatalogueEntry[] = [];
        const older: number[] = [];
        for (const id of batchIds) {
          const e = catalogueStore.get(id);
          if (e) entries.push(e);
          else older.push(id);
        }
        if (older.length) entries.push(...(await loadCatalogueRows({ networkIds: older, anyPublishedVersion: true })));
        // the optional parts of these networks (their current runs' results, edges, original files)
        const extras = parts.size ? await fetchParts(entries, parts) : new Map<number, NetworkParts>();
        return { entries, extras };
      }),
    ]);
  };
  // up to PREFETCH batches and about PREFETCH_BYTES are read ahead (at least the next batch), so the
  // database works while this process writes
  const ahead: Array<{ rows: ReturnType<typeof fetchBatch>; bytes: number }> = [];
  let aheadBytes = 0;
  let fetched = 0;
  const refill = () => {
    while (fetched < batches.length && (ahead.length === 0 || (ahead.length < PREFETCH && aheadBytes + batches[fetched].bytes <= PREFETCH_BYTES))) {
      const batch = batches[fetched++];
      const p = fetchBatch(batch);
      p.catch(() => undefined); // awaited below; a failure while another batch is awaited is not unhandled
      ahead.push({ rows: p, bytes: batch.bytes });
      aheadBytes += batch.bytes;
    }
  };
  refill(); // the first batches are read while the temporary files are made
  const [settings, dir] = await Promise.all([getPipelineSettings(), mkdtemp(join(tmpdir(), "tanglebank-bundle-"))]);
  const generated = new Date();
  const publicUrl = config().publicUrl;
  let appended = 0;
  const add = (source: string | Buffer | Readable, name: string) => {
    archive.append(source, { name, date: generated });
    appended++;
  };
  const addNetwork = (csv: Buffer, name: string) => {
    archive.append(csv, { name, date: generated });
    appended++;
  };
  // registered DOIs of the bundle's dataset versions ("TB-000042/2" → DOI), for datapackage.json's sources
  const versionKeys = [...new Set(networks.map((n) => `${n.accession}/${n.version}`))];
  const versionDois = new Map<string, string>();
  for (let i = 0; i < versionKeys.length; i += 500) {
    const rows = await sequelize().query<{ key: string; doi: string }>(
      `SELECT d.accession || '/' || v.number AS key, x.doi FROM dataset_dois x JOIN dataset_versions v ON v.id = x.version_id JOIN datasets d ON d.id = v.dataset_id
        WHERE x.state = 'registered' AND (d.accession || '/' || v.number) IN (:keys)`,
      { replacements: { keys: versionKeys.slice(i, i + 500) }, type: QueryTypes.SELECT },
    );
    for (const r of rows) versionDois.set(r.key, r.doi);
  }
  const resourcesFile = join(dir, "resources.jsonl");
  const metricsFile = join(dir, "metrics.csv");
  const networksFile = join(dir, "networks.csv");
  const [resources, metricsOut, networksOut] = await Promise.all([open(resourcesFile, "w"), open(metricsFile, "w"), open(networksFile, "w")]);
  // one temporary file per chosen table part (partitions.csv, roles.csv, null_distribution.csv, edges.csv)
  const partTables = (Object.keys(PART_TABLES) as Array<keyof typeof PART_TABLES>).filter((k) => parts.has(k));
  const partOut = new Map(await Promise.all(partTables.map(async (k) => [k, await open(join(dir, PART_TABLES[k].path), "w")] as const)));
  const closeAll = () => Promise.all([resources.close(), metricsOut.close(), networksOut.close(), ...[...partOut.values()].map((f) => f.close())]);
  try {
    add(
      bundleReadme({ settings, settingsHash: settingsHash(settings), engineVersion: ENGINE_VERSION, count: networks.length, generated, publicUrl, title: opts.title, compression: store ? "fast" : "small", parts }),
      "README.txt",
    );
    await Promise.all([
      metricsOut.write(METRICS_FIELDS.map((f) => f[0]).join(",") + "\n"),
      networksOut.write(NETWORK_FIELDS.map((f) => f[0]).join(",") + "\n"),
      ...partTables.map((k) => partOut.get(k)!.write(PART_TABLES[k].fields.map((f) => f[0]).join(",") + "\n")),
    ]);
    const licences = new Set<string>();
    let firstResource = true;

    for (let b = 0; ahead.length && !signal.aborted && !failure; b++) {
      const next = ahead.shift()!;
      aheadBytes -= next.bytes;
      const [rows, { entries, extras }] = await next.rows;
      refill();
      const byId = new Map(rows.map((r) => [r.network_id, r]));
      const partLines = new Map<keyof typeof PART_TABLES, string[]>(partTables.map((k) => [k, []]));
      const entryOf = new Map(entries.map((e) => [e.networkId, e]));
      const { from, to } = batches[b];
      await waitFor(appended - (to - from));
      await waitForClient();
      if (signal.aborted || failure) break;
      const resourceLines: string[] = [];
      const metricLines: string[] = [];
      const networkLines: string[] = [];
      for (const net of networks.slice(from, to)) {
        const r = byId.get(net.networkId);
        const e = entryOf.get(net.networkId);
        if (!r || !e) continue; // withdrawn since the selection was read
        byId.delete(net.networkId);
        const path = fileNameOf(net.ref);
        let fields: string;
        if (r.csv !== null || matrixCells(net) <= MATRIX_CSV_MAX_CELLS) {
          const csv = r.csv !== null ? Buffer.from(r.csv, "utf8") : bundleMatrixCsv(r.canonical);
          addNetwork(csv, path);
          fields = numberFieldsOfCsv(csv);
        } else {
          // a large matrix is streamed row by row, never held whole; a damaged one throws here (checks) or
          // aborts the bundle from its stream (a column index found out of range while writing)
          const canon = JSON.parse(r.canonical ?? "null") as CanonicalNetworkJson;
          const { pieces } = matrixCsvPieces(canon, MATRIX_CSV_CORNER);
          add(
            fromGenerator(
              (async function* () {
                yield* pieces;
              })(),
            ),
            path,
          );
          fields = numberFields((canon?.kind === "bipartite" ? canon.cols : canon?.rows) ?? []);
        }
        const licence = e.licence || "unknown";
        licences.add(licence);
        const doi = versionDois.get(`${net.accession}/${net.version}`);
        resourceLines.push(
          (firstResource ? "" : ",\n") +
            "    " +
            JSON.stringify({
              path,
              name: resourceName(path),
              title: `${net.ref}: ${e.title ?? ""}`.trim(),
              profile: "tabular-data-resource",
              format: "csv",
              mediatype: "text/csv",
              encoding: "utf-8",
              licenses: [licenseObj(licence)],
              sources: [
                { title: `${net.accession} version ${net.version}`, path: `${publicUrl}/datasets/${net.accession}/v/${net.version}` },
                ...(doi ? [{ title: `DOI ${doi}`, path: doiUrl(doi) }] : []),
              ],
            }).slice(0, -1) +
            `,"schema":{"fields":[${e.kind === "bipartite" ? NODE_FIELD_BIPARTITE : NODE_FIELD_ONE_MODE}${fields}],"primaryKey":["node"]}}`,
        );
        firstResource = false;
        metricLines.push(csvLine(METRICS_FIELDS.map((f) => f[3](e))));
        networkLines.push(csvLine(NETWORK_FIELDS.map((f) => f[3](e))));
        const extra = extras.get(net.networkId);
        if (extra) {
          if (parts.has("partitions")) partLines.get("partitions")!.push(...partitionLines(net.ref, extra));
          if (parts.has("roles")) partLines.get("roles")!.push(...roleLines(net.ref, extra));
          if (parts.has("nulls")) partLines.get("nulls")!.push(...nullLines(net.ref, extra));
          if (parts.has("edges") && extra.canonical) partLines.get("edges")!.push(...edgeLines(net.ref, extra.canonical));
          if (parts.has("originals") && extra.original) {
            const o = extra.original;
            const opath = originalPath(net.ref, o.name);
            addNetwork(o.bytes, opath);
            const format = formatOf(o.name);
            resourceLines.push(
              ",\n    " +
                JSON.stringify({
                  path: opath,
                  name: resourceName(opath.replace(/^originals\//, "original-")),
                  title: `${net.ref}: the file as deposited (${o.name})`,
                  profile: "data-resource",
                  format,
                  ...(MEDIATYPES[format] ? { mediatype: MEDIATYPES[format] } : {}),
                  bytes: o.bytes.length,
                  hash: `sha256:${o.sha256}`,
                  licenses: [licenseObj(licence)],
                  sources: [
                    { title: `${net.accession} version ${net.version}`, path: `${publicUrl}/datasets/${net.accession}/v/${net.version}` },
                    ...(doi ? [{ title: `DOI ${doi}`, path: doiUrl(doi) }] : []),
                  ],
                }),
            );
          }
        }
      }
      if (resourceLines.length) {
        await resources.write(resourceLines.join(""));
        await metricsOut.write(metricLines.join("\n") + "\n");
        await networksOut.write(networkLines.join("\n") + "\n");
      }
      for (const [k, lines] of partLines) if (lines.length) await partOut.get(k)!.write(lines.join("\n") + "\n");
    }
    await Promise.all(ahead.map((a) => a.rows.catch(() => undefined)));
    await closeAll();
    if (failure) throw failure;
    if (signal.aborted) return { aborted: true, bytes: archive.pointer() };

    add(createReadStream(metricsFile), "metrics.csv");
    add(createReadStream(networksFile), "networks.csv");
    for (const k of partTables) add(createReadStream(join(dir, PART_TABLES[k].path)), PART_TABLES[k].path);

    // datapackage.json: header, the resources gathered above, then the two tables' resources
    const licenceList = [...licences].sort();
    const head = {
      profile: "tabular-data-package",
      name: `tanglebank-bundle-${generated.toISOString().slice(0, 10)}`,
      title: `Tanglebank bundle: ${opts.title}`,
      description: `${networks.length} interaction networks from Tanglebank with their metadata and metrics. See README.txt for how the metrics were computed.`,
      created: generated.toISOString(),
      homepage: publicUrl,
      licenses: licenceList.map(licenseObj),
      sources: [{ title: "Tanglebank", path: publicUrl }],
    };
    const tables = [
      { path: "metrics.csv", name: "metrics", title: "Current metrics of every network", schema: { ...tableSchema(METRICS_FIELDS), primaryKey: "network_ref" } },
      { path: "networks.csv", name: "networks", title: "Metadata of every network", schema: tableSchema(NETWORK_FIELDS) },
      ...partTables.map((k) => ({ path: PART_TABLES[k].path, name: PART_TABLES[k].name, title: PART_TABLES[k].title, schema: partSchema(PART_TABLES[k].fields) })),
    ].map((t) => ({ ...t, profile: "tabular-data-resource", format: "csv", mediatype: "text/csv", encoding: "utf-8", licenses: licenceList.map(licenseObj), sources: head.sources }));
    add(
      fromGenerator(
        (async function* () {
          yield JSON.stringify(head, null, 2).slice(0, -2) + ',\n  "resources": [\n';
          yield tables.map((t) => "    " + JSON.stringify(t)).join(",\n") + (firstResource ? "" : ",\n");
          for await (const chunk of createReadStream(resourcesFile)) yield chunk as Buffer;
          yield "\n  ]\n}\n";
        })(),
      ),
      "datapackage.json",
    );

    // CITATIONS.bib: one @dataset entry per dataset version, followed by its source publication's entry
    async function* citations() {
      const versions = [...new Set(networks.map((n) => `${n.accession}/${n.version}`))];
      for (let i = 0; i < versions.length && !signal.aborted; i += 500) {
        const rows = await sequelize().query<{ accession: string; number: number; metadata: StudyMetadata; published_at: Date | null; doi: string | null }>(
          `SELECT d.accession, v.number, v.metadata, v.published_at, x.doi FROM dataset_versions v JOIN datasets d ON d.id = v.dataset_id
             LEFT JOIN dataset_dois x ON x.version_id = v.id AND x.state = 'registered'
           WHERE (d.accession || '/' || v.number) IN (:keys) ORDER BY d.accession, v.number`,
          { replacements: { keys: versions.slice(i, i + 500) }, type: QueryTypes.SELECT },
        );
        yield rows
          .map((r) =>
            datasetBibTeX({
              metadata: { ...r.metadata, title: r.metadata.title ?? r.accession, creators: Array.isArray(r.metadata.creators) ? r.metadata.creators : [] },
              accession: r.accession,
              version: r.number,
              year: (r.published_at ? new Date(r.published_at) : generated).getUTCFullYear(),
              url: `${publicUrl}/datasets/${r.accession}/v/${r.number}`,
              doi: r.doi,
            }),
          )
          .join("\n");
      }
    }
    add(fromGenerator(citations()), "CITATIONS.bib");

    await Promise.race([archive.finalize(), stopped]);
    if (failure) throw failure;
    return { aborted: signal.aborted, bytes: archive.pointer() };
  } catch (err) {
    archive.abort(); // nothing more is read or written for this bundle
    throw err;
  } finally {
    signal.removeEventListener("abort", onAbort);
    await closeAll().catch(() => undefined);
    await rm(dir, { recursive: true, force: true }).catch(() => undefined);
  }
}
