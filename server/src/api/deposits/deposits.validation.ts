/** Request checks of the deposit routes (400 with a JSON-pointer detail on bad input). */
import type { RequestHandler } from "express";
import { streamUpload } from "../../lib/upload-storage";
import { checkBodyValue } from "../../middlewares/body";
import { notANetworkFile } from "./deposits.upload";
import { ApiError } from "../../lib/api-error";
import type { UploadOptions } from "./deposits.files";
import type { NetworkReadOptions } from "../../models/network.model";

const MEANINGS = ["no-interaction", "not-observed"];

/** Sheet and meaning of missing/blank cells from a body (multipart fields or JSON); `where` prefixes paths. */
function readOptions(b: Record<string, unknown>, where = ""): NetworkReadOptions {
  const out: NetworkReadOptions = {};
  for (const k of ["missing", "blank"] as const) {
    const v = b[k];
    if (v === undefined || v === "") continue;
    if (!MEANINGS.includes(String(v))) throw ApiError.badRequest(`${k} must be "no-interaction" or "not-observed".`, [{ path: `${where}/${k}`, message: 'Choose "no-interaction" or "not-observed".' }]);
    out[k] = v as NetworkReadOptions["missing"];
  }
  if (b.sheet !== undefined && b.sheet !== "") {
    if (typeof b.sheet !== "string" || b.sheet.length > 200) throw ApiError.badRequest("sheet must be a sheet name.", [{ path: `${where}/sheet`, message: "The name of a sheet of the workbook." }]);
    out.sheet = b.sheet;
  }
  return out;
}

export function idParam(raw: unknown, name = "id"): number {
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw ApiError.notFound(`No such ${name}.`);
  return n;
}

/**
 * Multipart upload (field "files") streamed to temporary files with the per-file, per-request and count
 * limits (lib/upload-storage.ts). Nothing touches the database until every byte arrived and every file
 * parsed, so an interrupted request leaves nothing behind; the temporary files go when the request ends.
 */
export const uploadFiles: RequestHandler = streamUpload("files", (name, head) =>
  ApiError.unprocessable("Only network files (.csv, .tsv, .txt, .xlsx) or one zip may be uploaded.", [{ file: name, message: notANetworkFile(name, head) }]),
);

export function uploadOptions(body: Record<string, unknown> | undefined): UploadOptions {
  const b = body ?? {};
  const kind = b.kind ?? "bipartite";
  if (kind !== "bipartite" && kind !== "unipartite") throw ApiError.badRequest('kind must be "bipartite" or "unipartite".', [{ path: "/kind", message: 'Choose "bipartite" or "unipartite".' }]);
  const format = b.format ?? "auto";
  if (format !== "auto" && format !== "matrix" && format !== "edgelist") throw ApiError.badRequest('format must be "auto", "matrix" or "edgelist".', [{ path: "/format", message: 'Choose "auto", "matrix" or "edgelist".' }]);
  const d = b.directed;
  const directed = d === true || d === "true" || d === "1" || d === "on";
  if (d !== undefined && !directed && !(d === false || d === "false" || d === "0" || d === "")) throw ApiError.badRequest("directed must be true or false.", [{ path: "/directed", message: "true or false" }]);
  if (kind === "bipartite" && directed) throw ApiError.badRequest("A bipartite network cannot be directed.", [{ path: "/directed", message: "Only one-mode networks can be directed." }]);
  const read = readOptions(b);
  let perFile: Record<string, NetworkReadOptions> | undefined;
  if (b.fileOptions !== undefined && b.fileOptions !== "") {
    let parsed: unknown;
    try {
      parsed = typeof b.fileOptions === "string" ? JSON.parse(b.fileOptions) : b.fileOptions;
    } catch {
      parsed = null;
    }
    if (!parsed || typeof parsed !== "object" || Array.isArray(parsed)) throw ApiError.badRequest("fileOptions must be a JSON object keyed by file name.", [{ path: "/fileOptions", message: 'e.g. {"web.xlsx": {"sheet": "Lowland", "missing": "not-observed"}}' }]);
    checkBodyValue(parsed);
    perFile = Object.create(null) as Record<string, NetworkReadOptions>;
    for (const [name, o] of Object.entries(parsed as Record<string, unknown>)) {
      if (!o || typeof o !== "object") throw ApiError.badRequest("fileOptions must map file names to objects.", [{ path: `/fileOptions/${name}`, message: "An object." }]);
      perFile[name] = readOptions(o as Record<string, unknown>, `/fileOptions/${name}`);
    }
  }
  return { kind, directed, format, ...(Object.keys(read).length ? { read } : {}), ...(perFile ? { perFile } : {}) };
}

export function networkChanges(body: Record<string, unknown> | undefined): { metadata?: unknown; kind?: UploadOptions["kind"]; directed?: boolean; format?: UploadOptions["format"]; read?: NetworkReadOptions } {
  const b = body ?? {};
  const out: ReturnType<typeof networkChanges> = {};
  if (b.metadata !== undefined) out.metadata = b.metadata;
  const read = readOptions(b);
  if (Object.keys(read).length) out.read = read;
  if (b.kind !== undefined || b.directed !== undefined || b.format !== undefined) {
    const o = uploadOptions({ kind: b.kind, directed: b.directed, format: b.format ?? "auto" });
    if (b.kind !== undefined) out.kind = o.kind;
    if (b.directed !== undefined) out.directed = o.directed;
    if (b.format !== undefined) out.format = o.format;
  }
  if (!Object.keys(out).length) throw ApiError.badRequest("Nothing to change: send metadata, kind, directed, format, sheet, missing or blank.");
  return out;
}
