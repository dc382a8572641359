/**
 * Streams a bundle as a zip: README.txt, datapackage.json (Frictionless Data Package with a Table Schema
 * per CSV), one matrix CSV per network, metrics.csv, networks.csv, CITATIONS.bib, and the optional parts
 * chosen (bundles.parts.ts: partitions, node roles, null distributions, edge lists, original files). Memory
 * stays flat whatever the number of networks: networks are read from the database in batches
 * (bundles.batches.ts), each batch is appended only when the archive has consumed the previous one (which
 * waits for the HTTP response to drain, bundles.zip.ts), and the large files are streamed from async
 * generators. A client that disconnects stops the work (no further batches are read).
 *
 * The pieces: bundles.batches.ts (which networks, read ahead in batches) → this file (each network's
 * matrix CSV, original file and table rows) → bundles.tables.ts (metrics.csv, networks.csv, the part
 * tables), bundles.datapackage.ts (datapackage.json), bundles.readme.ts (README.txt),
 * bundles.citations.ts (CITATIONS.bib) → bundles.zip.ts (the zip as it streams, with its progress).
 */
import { rm, mkdtemp } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { Writable } from "node:stream";
import { ENGINE_VERSION } from "@shared/network/version";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { csvLine } from "@shared/csv";
import { config } from "../../config/env";
import { getPipelineSettings, settingsHash } from "../../pipeline/settings";
import { matrixCsvPieces } from "../../lib/matrix-csv";
import type { CatalogueEntry } from "../catalogue/catalogue.rows";
import { fileNameOf, matrixCells, type SelectedNetwork } from "./bundles.selection";
import { bundleReadme } from "./bundles.readme";
import { bundleMatrixCsv, MATRIX_CSV_CORNER, MATRIX_CSV_MAX_CELLS } from "./bundles.stored-csv";
import { DEFAULT_PARTS, edgeLines, formatOf, nullLines, originalPath, partitionLines, roleLines, type BundlePart, type NetworkParts } from "./bundles.parts";
import { BatchReader, DEFAULT_BATCH, type MatrixRow } from "./bundles.batches";
import { BundleZip } from "./bundles.zip";
import { METRICS_FIELDS, NETWORK_FIELDS, TableFiles } from "./bundles.tables";
import { datapackageChunks, networkResource, numberFields, numberFieldsOfCsv, originalResource, registeredDois } from "./bundles.datapackage";
import { citations } from "./bundles.citations";

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

/** What every network of one bundle is written with. */
interface BundleContext {
  zip: BundleZip;
  tables: TableFiles;
  parts: ReadonlySet<BundlePart>;
  /** The date of every zip entry. */
  generated: Date;
  publicUrl: string;
  /** Registered DOIs of the dataset versions ("TB-000042/2" → DOI). */
  versionDois: Map<string, string>;
  /** Licences seen so far (the package's licences). */
  licences: Set<string>;
}

/**
 * Appends one network to the bundle: its matrix CSV (copied from the stored one, written from its canonical
 * JSON, or for a large matrix streamed row by row), its original file when chosen, its datapackage
 * resources, its rows of metrics.csv and networks.csv, and its rows of the chosen part tables.
 */
function appendNetwork(ctx: BundleContext, net: SelectedNetwork, r: MatrixRow, e: CatalogueEntry, extra: NetworkParts | undefined): void {
  const { zip, tables, parts, generated } = ctx;
  const path = fileNameOf(net.ref);
  let fields: string;
  if (r.csv !== null || matrixCells(net) <= MATRIX_CSV_MAX_CELLS) {
    const csv = r.csv !== null ? Buffer.from(r.csv, "utf8") : bundleMatrixCsv(r.canonical);
    zip.add(csv, path, generated);
    fields = numberFieldsOfCsv(csv);
  } else {
    // a large matrix is streamed row by row, never held whole; a damaged one throws here (checks) or
    // aborts the bundle from its stream (a column index found out of range while writing)
    const canon = JSON.parse(r.canonical ?? "null") as CanonicalNetworkJson;
    const { pieces } = matrixCsvPieces(canon, MATRIX_CSV_CORNER);
    zip.add(
      zip.fromGenerator(
        (async function* () {
          yield* pieces;
        })(),
      ),
      path,
      generated,
    );
    fields = numberFields((canon?.kind === "bipartite" ? canon.cols : canon?.rows) ?? []);
  }
  const licence = e.licence || "unknown";
  ctx.licences.add(licence);
  const source = { net, licence, doi: ctx.versionDois.get(`${net.accession}/${net.version}`), publicUrl: ctx.publicUrl };
  tables.resource(networkResource(source, e, path, fields));
  tables.entryRows(csvLine(METRICS_FIELDS.map((f) => f[3](e))), csvLine(NETWORK_FIELDS.map((f) => f[3](e))));
  if (!extra) return;
  if (parts.has("partitions")) tables.partRows("partitions", partitionLines(net.ref, extra));
  if (parts.has("roles")) tables.partRows("roles", roleLines(net.ref, extra));
  if (parts.has("nulls")) tables.partRows("nulls", nullLines(net.ref, extra));
  if (parts.has("edges") && extra.canonical) tables.partRows("edges", edgeLines(net.ref, extra.canonical));
  if (parts.has("originals") && extra.original) {
    const o = extra.original;
    const opath = originalPath(net.ref, o.name);
    zip.add(o.bytes, opath, generated);
    tables.resource(originalResource(source, o, opath, formatOf(o.name)));
  }
}

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
  const store = (opts.compression ?? "fast") === "fast";
  const parts: ReadonlySet<BundlePart> = opts.parts ?? new Set(DEFAULT_PARTS);
  const zip = new BundleZip(out, signal, store);
  const reader = new BatchReader(networks, opts.batchSize ?? DEFAULT_BATCH, parts);
  reader.refill(); // the first batches are read while the temporary files are made
  const [settings, dir] = await Promise.all([getPipelineSettings(), mkdtemp(join(tmpdir(), "tanglebank-bundle-"))]);
  const generated = new Date();
  const publicUrl = config().publicUrl;
  const versionDois = await registeredDois(networks);
  const tables = await TableFiles.open(dir, parts);
  try {
    zip.add(
      bundleReadme({ settings, settingsHash: settingsHash(settings), engineVersion: ENGINE_VERSION, count: networks.length, generated, publicUrl, title: opts.title, compression: store ? "fast" : "small", parts }),
      "README.txt",
      generated,
    );
    await tables.writeHeaders();
    const ctx: BundleContext = { zip, tables, parts, generated, publicUrl, versionDois, licences: new Set<string>() };

    while (reader.pending && !zip.halted) {
      const { batch, rows, entries, extras } = await reader.next();
      const byId = new Map(rows.map((r) => [r.network_id, r]));
      const entryOf = new Map(entries.map((e) => [e.networkId, e]));
      await zip.waitForEntries(batch.to - batch.from);
      await zip.waitForClient();
      if (zip.halted) break;
      for (const net of networks.slice(batch.from, batch.to)) {
        const r = byId.get(net.networkId);
        const e = entryOf.get(net.networkId);
        if (!r || !e) continue; // withdrawn since the selection was read
        byId.delete(net.networkId);
        appendNetwork(ctx, net, r, e, extras.get(net.networkId));
      }
      await tables.flush();
    }
    await reader.settle();
    await tables.close();
    if (zip.failure) throw zip.failure;
    if (signal.aborted) return { aborted: true, bytes: zip.bytes() };

    for (const [source, name] of tables.entries()) zip.add(source, name, generated);
    // datapackage.json: header, the tables' resources, then the networks' resources gathered above
    const pkg = { title: opts.title, count: networks.length, generated, publicUrl, licences: ctx.licences, partTables: tables.partTables, hasNetworkResources: tables.hasResources };
    zip.add(zip.fromGenerator(datapackageChunks({ ...pkg, networkResources: () => tables.resourcesStream() })), "datapackage.json", generated);
    // CITATIONS.bib: one @dataset entry per dataset version, followed by its source publication's entry
    zip.add(zip.fromGenerator(citations(networks, signal, generated, publicUrl)), "CITATIONS.bib", generated);

    await zip.finish();
    if (zip.failure) throw zip.failure;
    return { aborted: signal.aborted, bytes: zip.bytes() };
  } catch (err) {
    zip.abort(); // nothing more is read or written for this bundle
    throw err;
  } finally {
    zip.release();
    await tables.close().catch(() => undefined);
    await rm(dir, { recursive: true, force: true }).catch(() => undefined);
  }
}
