/**
 * Reading a deposit's network files: every file is parsed in a parse process (the engine's parser,
 * lib/parse/pool.ts), every file's problem (file, row, column) collected before an upload is refused.
 * A parsed file becomes a network's columns (format, kind, counts, canonical form, warnings, how it was
 * read) and its metadata's `missingValues`; the bytes are stored once per SHA-256.
 */
import { QueryTypes, type Transaction } from "sequelize";
import type { BasicMetrics } from "@shared/network";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { parseInThread } from "../../lib/parse/pool";
import type { ParsedFile } from "../../lib/parse/task";
import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { sequelize } from "../../db/sequelize";
import { config } from "../../config/env";
import type { NetworkReadOptions } from "../../models/network.model";
import type { UploadedFile } from "./deposits.upload";

export interface UploadOptions {
  kind: "bipartite" | "unipartite";
  directed: boolean;
  format: "auto" | "matrix" | "edgelist";
  /** Workbook sheet and meaning of cells without a number, for every file… */
  read?: NetworkReadOptions;
  /** …or per file name (overrides `read`). */
  perFile?: Record<string, NetworkReadOptions>;
}

export interface ParsedUpload {
  file: UploadedFile;
  sha256: string;
  parsed: ParsedFile;
  canonical: CanonicalNetworkJson;
  metrics: BasicMetrics;
  read: NetworkReadOptions;
}

/**
 * Parses every file in the parse processes (lib/parse/pool.ts: off the web server's thread, with time and
 * memory limits); collects every file's problem (file, row, column) before refusing.
 */
export async function parseUploads(files: UploadedFile[], opts: UploadOptions): Promise<ParsedUpload[]> {
  const problems: ErrorDetail[] = [];
  const out: ParsedUpload[] = [];
  const maxBytes = config().uploadMaxBytes;
  for (const file of files) {
    const read: NetworkReadOptions = { ...opts.read, ...opts.perFile?.[file.name] };
    const res = await parseInThread({
      ...(file.bytes ? { bytes: new Uint8Array(file.bytes.buffer, file.bytes.byteOffset, file.bytes.byteLength) } : { path: file.path }),
      options: {
        fileName: file.name,
        format: opts.format,
        kind: opts.kind,
        directed: opts.kind === "unipartite" ? opts.directed : false,
        maxBytes,
        ...read,
      },
    });
    if (res.ok) {
      const parsed = res.parsed;
      // Keep only the answers that applied, so a later reading does not carry a meaningless choice.
      const kept: NetworkReadOptions = {};
      if (parsed.workbook) kept.sheet = parsed.workbook.sheet;
      if (parsed.missing.markerCells > 0 && read.missing) kept.missing = read.missing;
      if (parsed.missing.blankCells > 0 && read.blank) kept.blank = read.blank;
      out.push({ file, sha256: res.sha256, parsed, canonical: res.canonical, metrics: res.metrics, read: kept });
    } else {
      const err = res.problem;
      problems.push({
        file: file.name,
        ...(err.file && err.file !== file.name ? { where: err.file } : {}),
        ...(err.row !== null ? { row: err.row } : {}),
        ...(err.column !== null ? { column: err.column } : {}),
        code: err.code,
        message: err.message,
        ...(err.extra ? { extra: err.extra } : {}),
      });
    }
  }
  if (problems.length) {
    throw ApiError.unprocessable(
      problems.length === 1 ? `The upload was refused: ${problems[0].message}` : `The upload was refused: ${problems.length} files have problems. Nothing was stored.`,
      problems,
    );
  }
  return out;
}

/** Stores a file's bytes once per SHA-256 (an identical file already stored is reused); returns its id. */
export async function storeFile(bytes: Buffer, sha256: string, t: Transaction): Promise<number> {
  const rows = (await sequelize().query(
    `INSERT INTO stored_files (sha256, size, bytes, created_at, updated_at) VALUES ($1, $2, $3, now(), now())
     ON CONFLICT (sha256) DO UPDATE SET updated_at = stored_files.updated_at RETURNING id`,
    { bind: [sha256, bytes.length, bytes], type: QueryTypes.SELECT, transaction: t },
  )) as Array<{ id: number }>;
  return rows[0].id;
}

/** The network columns a parsed file sets. */
export function networkColumns(p: ParsedUpload) {
  const net = p.parsed.network;
  const m = p.metrics;
  return {
    format: p.parsed.format,
    kind: net.kind,
    directed: net.directed,
    weighted: net.weighted,
    canonical: p.canonical,
    nNodes: m.nodes,
    nRows: m.rows,
    nCols: m.cols,
    nLinks: m.links,
    totalWeight: m.totalWeight,
    connectance: m.connectance,
    parseWarnings: p.parsed.warnings.map((w) => ({ code: w.code, message: w.message, row: w.row, column: w.column, count: w.count })),
    readOptions: p.read,
  };
}

/** `meta` with the stored metadata's `missingValues` (which follows the file, never the form). */
export function withMissingValuesOf(meta: Record<string, unknown>, stored: Record<string, unknown>): Record<string, unknown> {
  const { missingValues: _given, ...rest } = meta;
  void _given;
  return stored.missingValues !== undefined ? { ...rest, missingValues: stored.missingValues } : rest;
}

/**
 * The network metadata's record of how cells without a number were read (`missingValues`, schema
 * network.schema.json), from the parse; absent when every cell held a number.
 */
export function withMissingValues(meta: Record<string, unknown>, p: ParsedUpload): Record<string, unknown> {
  const m = p.parsed.missing;
  const { missingValues: _old, ...rest } = meta;
  void _old;
  if (m.markerCells === 0 && m.blankCells === 0) return rest;
  return {
    ...rest,
    missingValues: {
      ...(m.markerCells > 0 ? { markers: m.markers, markerCells: m.markerCells, markerMeaning: m.markerMeaning ?? "no-interaction" } : {}),
      blankCells: m.blankCells,
      blankMeaning: m.blankMeaning,
    },
  };
}

/** Deletes stored files no network refers to any more (after network rows were removed). */
export async function deleteOrphanFiles(fileIds: number[], t: Transaction): Promise<void> {
  if (!fileIds.length) return;
  await sequelize().query(`DELETE FROM stored_files f WHERE f.id IN (:ids) AND NOT EXISTS (SELECT 1 FROM networks n WHERE n.file_id = f.id)`, { replacements: { ids: fileIds }, transaction: t });
}
