/**
 * Reading a bundle's networks in batches: at most 50 networks and about 4 MB of matrix CSV a batch, and up
 * to three batches (about 12 MB) read ahead, so the database works while the zip is written and memory holds
 * a few batches whatever the bundle's size. A batch brings each network's stored matrix CSV (or its
 * canonical JSON to write one from), its catalogue entry and the optional parts chosen.
 */
import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { loadCatalogueRows, type CatalogueEntry } from "../catalogue/catalogue.rows";
import { catalogueStore } from "../catalogue/catalogue.store";
import { matrixCells, matrixCsvBytes, type SelectedNetwork } from "./bundles.selection";
import { MATRIX_CSV_FORMAT, MATRIX_CSV_MAX_CELLS } from "./bundles.stored-csv";
import { fetchParts, type BundlePart, type NetworkParts } from "./bundles.parts";

/**
 * Networks read from the database at a time, and how many such batches are read ahead. Small batches
 * keep few objects alive between garbage collections (the server's time per network went down from 200
 * to 50); reading ahead lets the database work while this process writes.
 */
export const DEFAULT_BATCH = 50;
/** …and at most about this many bytes of matrix CSV per batch (a batch holds at least one network). */
const BATCH_BYTES = 4 * 1024 * 1024;
const PREFETCH = 3;
/** …and batches read ahead hold at most about this many bytes (a large streamed network is one batch). */
const PREFETCH_BYTES = 12 * 1024 * 1024;

export interface MatrixRow {
  network_id: number;
  /** The stored matrix CSV (bundles.stored-csv.ts), or null when there is none of the current format. */
  csv: string | null;
  /** Otherwise the canonical JSON text, parsed only just before its CSV is written. */
  canonical: string | null;
}

/** [from, to) indices into the bundle's networks, and about how many bytes the batch holds. */
export interface Batch {
  from: number;
  to: number;
  bytes: number;
}

/** A batch as read: the networks still published with their matrices, their catalogue entries and parts. */
export interface BatchData {
  batch: Batch;
  rows: MatrixRow[];
  entries: CatalogueEntry[];
  extras: Map<number, NetworkParts>;
}

/**
 * About how many bytes a batch holds for a network, for sizing batches: its matrix CSV, or for a matrix too
 * large to be stored, which is streamed, its canonical JSON.
 */
function heldBytesOf(n: SelectedNetwork): number {
  return matrixCells(n) <= MATRIX_CSV_MAX_CELLS ? matrixCsvBytes(n) : 30 * ((n.nRows ?? n.nNodes) + (n.nCols ?? n.nNodes)) + 16 * n.nLinks;
}

/**
 * Batches of at most `batchSize` networks and about BATCH_BYTES of CSV (so a few large networks do not
 * fill memory).
 */
export function planBatches(networks: SelectedNetwork[], batchSize: number): Batch[] {
  const batches: Batch[] = [];
  for (let i = 0; i < networks.length; ) {
    const from = i;
    let bytes = 0;
    while (i < networks.length && i - from < batchSize && (i === from || bytes + heldBytesOf(networks[i]) <= BATCH_BYTES)) bytes += heldBytesOf(networks[i++]);
    batches.push({ from, to: i, bytes });
  }
  return batches;
}

/**
 * One batch from the database and the catalogue. Metadata and metrics come from the catalogue in memory,
 * brought up to date first (`catalogueReady`, so metrics.csv holds the runs finished before the bundle
 * started); networks of older published versions, which the catalogue does not list, are read from the
 * database. Whether a network is still published is always checked in the database, with its matrix.
 */
async function fetchBatch(batch: Batch, networks: SelectedNetwork[], parts: ReadonlySet<BundlePart>, catalogueReady: Promise<unknown>): Promise<BatchData> {
  const batchIds = networks.slice(batch.from, batch.to).map((n) => n.networkId);
  const [rows, { entries, extras }] = await Promise.all([
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
  return { batch, rows, entries, extras };
}

/**
 * Reads the batches in order, up to PREFETCH batches and about PREFETCH_BYTES ahead (at least the next
 * batch). `refill` starts reading; `next` waits for the oldest batch read ahead and reads further.
 */
export class BatchReader {
  private readonly batches: Batch[];
  private readonly catalogueReady: Promise<unknown>;
  private readonly ahead: Array<{ data: Promise<BatchData>; bytes: number }> = [];
  private aheadBytes = 0;
  private fetched = 0;

  constructor(
    private readonly networks: SelectedNetwork[],
    batchSize: number,
    private readonly parts: ReadonlySet<BundlePart>,
  ) {
    this.batches = planBatches(networks, batchSize);
    this.catalogueReady = catalogueStore.current();
    this.catalogueReady.catch(() => undefined); // awaited with the first batch
  }

  refill(): void {
    while (this.fetched < this.batches.length && (this.ahead.length === 0 || (this.ahead.length < PREFETCH && this.aheadBytes + this.batches[this.fetched].bytes <= PREFETCH_BYTES))) {
      const batch = this.batches[this.fetched++];
      const p = fetchBatch(batch, this.networks, this.parts, this.catalogueReady);
      p.catch(() => undefined); // awaited in next(); a failure while another batch is awaited is not unhandled
      this.ahead.push({ data: p, bytes: batch.bytes });
      this.aheadBytes += batch.bytes;
    }
  }

  /** True while a batch is read ahead (so another can be taken with `next`). */
  get pending(): boolean {
    return this.ahead.length > 0;
  }

  async next(): Promise<BatchData> {
    const next = this.ahead.shift()!;
    this.aheadBytes -= next.bytes;
    const data = await next.data;
    this.refill();
    return data;
  }

  /** Waits for the batches still read ahead, whatever their outcome (before the bundle's files are closed). */
  async settle(): Promise<void> {
    await Promise.all(this.ahead.map((a) => a.data.catch(() => undefined)));
  }
}
