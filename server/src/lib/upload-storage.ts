/**
 * Multipart uploads streamed to temporary files, never held whole in memory:
 * - Before the body is read: a declared Content-Length over the per-request limit is refused (413).
 * - As each file part starts: its name is checked (present, at most 255 characters, no control
 *   characters); a name whose extension is not one the upload reads gets only its first 64 KiB read, to
 *   say what the file is, and the request is refused (422) without storing the rest.
 * - While the bytes stream in: the per-file limit (multer's fileSize) and the per-request limit (counted
 *   here over every file) stop the upload as soon as they are passed; the count of files is multer's.
 * - Temporary files live in one folder per request under TB_UPLOAD_TMP_DIR, removed when the response
 *   ends or the connection closes, whatever happened; folders left by a killed server are removed when the
 *   next one starts (sweepUploadTmp).
 * - File names are read as UTF-8 (multer's default is Latin-1, which garbles "Vérrinia" as "VÃ©rrinia").
 * - Broken multipart (no boundary, a malformed part header, a body cut short) is a 400 saying so.
 */
import { randomBytes } from "node:crypto";
import { createWriteStream } from "node:fs";
import { mkdir, readdir, rm, stat } from "node:fs/promises";
import { join } from "node:path";
import type { Request, RequestHandler } from "express";
import multer, { MulterError, type StorageEngine } from "multer";
import { config } from "../config/env";
import { ApiError } from "./api-error";
import { logger } from "./logger";
import { bodyProblem } from "../middlewares/body";

/** Extensions the upload reads: network tables, workbooks and zips of them. */
export const ACCEPTED_UPLOAD = /\.(csv|tsv|txt|xlsx|zip)$/i;
export const MAX_FILE_NAME_CHARS = 255;
const PEEK_BYTES = 64 * 1024;
/** Allowance for multipart boundaries, part headers and form fields above the file bytes. */
const MULTIPART_OVERHEAD = 1024 * 1024;

/** A stored part: multer's file object plus where its bytes are. */
export interface TempFile {
  originalname: string;
  path: string;
  size: number;
  /** Files with a name the upload does not read: their first bytes only (to say what they are). */
  head?: Buffer;
}

interface UploadState {
  dir: string;
  made: boolean;
  /**
   * The request's folder being made. Every part awaits this one promise, so the parts go on in the order they
   * arrived (awaits of one promise resume in order), and the per-request count names the file that crossed it.
   */
  making?: Promise<void>;
  total: number;
  n: number;
}

const STATE = Symbol("uploadState");
type WithState = Request & { [STATE]?: UploadState };

export function formatBytes(n: number): string {
  if (n >= 1024 * 1024 && n % (1024 * 1024) === 0) return `${n / (1024 * 1024)} MB`;
  if (n >= 1024 * 1024) return `${(n / (1024 * 1024)).toFixed(1)} MB`;
  if (n >= 1024 && n % 1024 === 0) return `${n / 1024} KB`;
  if (n >= 1024) return `${(n / 1024).toFixed(1)} KB`;
  return `${n} bytes`;
}

/** The first control character of a text (C0, DEL, C1), or null. */
export function controlCharacter(s: string): string | null {
  // eslint-disable-next-line no-control-regex
  const m = /[\u0000-\u001f\u007f-\u009f]/.exec(s);
  return m ? `U+${m[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}` : null;
}

/** Why a file name is refused, or null. Names are shown JSON-quoted so invisible characters show. */
export function fileNameProblem(name: string): string | null {
  if (!name.trim()) return "A file has no name: give every file a name ending in .csv, .tsv, .txt, .xlsx or .zip.";
  const cc = controlCharacter(name);
  if (cc) return `The file name ${JSON.stringify(name)} contains a control character (${cc}): rename the file.`;
  if ([...name].length > MAX_FILE_NAME_CHARS) return `The file name "${name.slice(0, 40)}…" is ${[...name].length} characters long; at most ${MAX_FILE_NAME_CHARS} are accepted.`;
  return null;
}

function stateOf(req: Request): UploadState {
  const r = req as WithState;
  r[STATE] ??= { dir: join(config().uploadTmpDir, `req-${Date.now()}-${randomBytes(6).toString("hex")}`), made: false, total: 0, n: 0 };
  return r[STATE];
}

/**
 * multer storage engine: one temporary file per part, counting the request's bytes across files. A file
 * whose name the upload does not read keeps only its first bytes and ends the upload with `onForeign`'s
 * error (the caller says what the file is from those bytes).
 */
function tempFileStorage(onForeign: (name: string, head: Buffer) => Error): StorageEngine {
  return {
    _handleFile(req, file, cb) {
      const st = stateOf(req);
      const limit = config().uploadMaxRequestBytes;
      const stream = file.stream;
      if (!ACCEPTED_UPLOAD.test(file.originalname)) {
        const chunks: Buffer[] = [];
        let have = 0;
        let done = false;
        const finish = () => {
          if (done) return;
          done = true;
          stream.removeListener("data", onData);
          stream.resume();
          cb(onForeign(file.originalname, Buffer.concat(chunks).subarray(0, PEEK_BYTES)));
        };
        const onData = (c: Buffer) => {
          chunks.push(c);
          have += c.length;
          if (have >= PEEK_BYTES) finish();
        };
        stream.on("data", onData);
        stream.on("end", finish);
        return;
      }
      const go = async () => {
        st.making ??= mkdir(st.dir, { recursive: true, mode: 0o700 }).then(() => {
          st.made = true;
        });
        await st.making;
        const path = join(st.dir, `${st.n++}.part`);
        const out = createWriteStream(path, { flags: "wx", mode: 0o600 });
        let size = 0;
        let failed = false;
        const fail = (err: Error) => {
          if (failed) return;
          failed = true;
          stream.unpipe(out);
          stream.resume();
          out.destroy();
          void rm(path, { force: true });
          cb(err);
        };
        stream.on("data", (c: Buffer) => {
          size += c.length;
          st.total += c.length;
          if (st.total > limit) {
            fail(new ApiError(413, "upload_too_large", `The upload is larger than the limit of ${formatBytes(limit)} per request (all files together); it stopped at "${file.originalname}". Nothing was stored.`, [
              { file: file.originalname, message: `The files of one upload may add up to at most ${formatBytes(limit)}; upload the rest separately.` },
            ]));
          }
        });
        out.on("error", fail);
        out.on("finish", () => {
          if (!failed) cb(null, { path, size });
        });
        stream.pipe(out);
      };
      go().catch((err: Error) => cb(err));
    },
    _removeFile(_req, file, cb) {
      if (!file.path) return cb(null);
      rm(file.path, { force: true }).then(() => cb(null), cb);
    },
  };
}

/** Plain errors of the multipart reader (busboy) as 400s that say what is wrong with the body. */
function multipartError(err: unknown): unknown {
  if (err instanceof ApiError || err instanceof MulterError) return err;
  const msg = (err as Error)?.message ?? "";
  if (/boundary not found/i.test(msg)) return ApiError.badRequest("The multipart body has no boundary: send multipart/form-data with its boundary in the Content-Type header (as a browser or curl -F does).");
  if (/unexpected end of (form|file)|request (aborted|closed)/i.test(msg)) return ApiError.badRequest("The upload ended before the whole body arrived (the connection was cut or the body is truncated); nothing was stored. Send it again.");
  if (/malformed (part )?header|malformed/i.test(msg)) return ApiError.badRequest("The multipart body is malformed (a part header could not be read); nothing was stored.");
  if (/unsupported content type/i.test(msg)) return ApiError.badRequest("Send the files as multipart/form-data.");
  return err;
}

/**
 * Express middleware: reads a multipart upload of field `fieldName` into temporary files
 * (req.files: TempFile[]; req.body: the text fields, a null-prototype object).
 */
export function streamUpload(fieldName: string, onForeign: (name: string, head: Buffer) => Error): RequestHandler {
  return (req, res, next) => {
    const cfg = config();
    const declared = Number(req.headers["content-length"]);
    if (Number.isFinite(declared) && declared > cfg.uploadMaxRequestBytes + MULTIPART_OVERHEAD) {
      // Refused before a byte of the body is read; the connection closes so the rest is never sent.
      res.set("Connection", "close");
      next(new ApiError(413, "upload_too_large", `The upload is ${formatBytes(declared)}, over the limit of ${formatBytes(cfg.uploadMaxRequestBytes)} per request (all files together). Nothing was read or stored.`));
      return;
    }
    const st = stateOf(req);
    res.on("close", () => {
      if (st.made) rm(st.dir, { recursive: true, force: true }).catch((err: Error) => logger.warn({ err: err.message, dir: st.dir }, "upload: could not remove a temporary folder"));
    });
    const mw = multer({
      storage: tempFileStorage(onForeign),
      defParamCharset: "utf8",
      limits: { fileSize: cfg.uploadMaxBytes, files: cfg.uploadMaxFiles, fields: 20, parts: cfg.uploadMaxFiles + 20, fieldSize: 1024 * 1024, fieldNameSize: 100 },
      fileFilter: (_req, file, cb) => {
        const problem = fileNameProblem(file.originalname ?? "");
        if (problem) cb(new ApiError(422, "bad_file_name", problem, [{ file: file.originalname ?? "", message: problem }]));
        else cb(null, true);
      },
    }).array(fieldName, cfg.uploadMaxFiles);
    mw(req, res, (err?: unknown) => next(err ? multipartError(err) : (bodyProblem(req.body) ?? undefined)));
  };
}

/** Removes temporary upload folders older than `maxAgeMs` (left by a server that was killed mid-upload). */
export async function sweepUploadTmp(maxAgeMs = 3600_000): Promise<number> {
  const root = config().uploadTmpDir;
  let names: string[];
  try {
    names = await readdir(root);
  } catch {
    return 0;
  }
  let removed = 0;
  for (const n of names) {
    if (!n.startsWith("req-")) continue;
    const p = join(root, n);
    try {
      const s = await stat(p);
      if (Date.now() - s.mtimeMs > maxAgeMs) {
        await rm(p, { recursive: true, force: true });
        removed++;
      }
    } catch {
      // gone already
    }
  }
  return removed;
}
