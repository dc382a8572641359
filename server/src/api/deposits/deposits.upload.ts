/**
 * Reading an upload into network files: one or more CSV/TSV/.xlsx files, or one zip holding them. A zip
 * is told from a workbook (also a zip container) by its content (shared/network/parse/signature.ts).
 *
 * Zip rules (yauzl, read from memory): files may sit at the top level or inside one single top folder;
 * deeper folders are refused ("nested folders"); names with `..`, absolute paths, drive letters or
 * backslashes are refused (path traversal); files other than .csv/.tsv/.txt are listed as errors; macOS
 * metadata (`__MACOSX/`, `._*`, `.DS_Store`) is skipped. Symbolic links (and any other entry whose Unix
 * mode is not a regular file or folder) are refused by name: their content is a path, never a network. The
 * expanded size is counted while inflating, so a zip bomb stops at the upload limit instead of filling
 * memory. Every problem names the file.
 */
import { open, readFile } from "node:fs/promises";
import yauzl from "yauzl";
import { detectSignature } from "@shared/network/parse/signature";
import type { ErrorDetail } from "../../lib/api-error";
import { ApiError } from "../../lib/api-error";
import type { RequestHandler } from "express";
import { streamUpload } from "../../lib/upload-storage";
import { UPLOAD_FILE_PART } from "./deposits.schemas";

/** A network file of an upload: its bytes (from a zip, or a stored original), or its temporary file. */
export interface UploadedFile {
  name: string;
  bytes?: Buffer;
  path?: string;
}

/** The bytes of an uploaded file (read from its temporary file when needed). */
export async function bytesOf(f: UploadedFile): Promise<Buffer> {
  if (f.bytes) return f.bytes;
  if (f.path) return readFile(f.path);
  return Buffer.alloc(0);
}

/** The first `n` bytes of a file. */
async function headOf(path: string, n = 64 * 1024): Promise<Buffer> {
  const h = await open(path, "r");
  try {
    const buf = Buffer.alloc(n);
    const { bytesRead } = await h.read(buf, 0, n, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await h.close();
  }
}

export const NETWORK_FILE = /\.(csv|tsv|txt|xlsx)$/i;
const JUNK = /(^|\/)(__MACOSX\/|\._[^/]*$|\.DS_Store$)/;

/** A zip of network files: named .zip, or a zip container that is not a workbook or other document. */
export function isZip(name: string, bytes: Buffer): boolean {
  if (/\.zip$/i.test(name)) return true;
  return bytes.length >= 4 && bytes.readUInt32LE(0) === 0x04034b50 && detectSignature(bytes)?.type === "zip";
}

/** Why a file is not accepted: what its name or content says it is. */
export function notANetworkFile(name: string, bytes: Buffer): string {
  const sig = detectSignature(bytes);
  const what = sig ? `${sig.what}` : "not a network file";
  return `"${name}" is ${what}: only .csv, .tsv, .txt or .xlsx files (one network each), or one zip of them, are accepted.`;
}

function unsafeName(name: string): boolean {
  return name.includes("\\") || name.startsWith("/") || /^[a-zA-Z]:/.test(name) || name.split("/").some((seg) => seg === "..");
}

/**
 * What an entry is by the Unix mode in the upper half of its external attributes (zips written on Unix and
 * macOS; others leave it 0): a symbolic link, another special file, or null for a regular file or folder.
 */
export function specialEntry(externalFileAttributes: number): "symbolic link" | "special file" | null {
  const type = (externalFileAttributes >>> 16) & 0o170000;
  if (type === 0 || type === 0o100000 || type === 0o040000) return null;
  return type === 0o120000 ? "symbolic link" : "special file";
}

/** Expands a zip into network files, or throws ApiError 422 listing every problem. */
export async function readZip(zipName: string, bytes: Buffer, limits: { maxBytes: number; maxFiles: number }): Promise<UploadedFile[]> {
  const zip = await new Promise<yauzl.ZipFile>((resolve, reject) =>
    yauzl.fromBuffer(bytes, { lazyEntries: true, decodeStrings: true, validateEntrySizes: true, strictFileNames: false }, (err, z) => (err || !z ? reject(err) : resolve(z))),
  ).catch((err: Error) => {
    throw ApiError.unprocessable(`${zipName} is not a readable zip file: ${err.message}`, [{ file: zipName, message: `Not a readable zip file: ${err.message}` }]);
  });
  const problems: ErrorDetail[] = [];
  const files: UploadedFile[] = [];
  const topFolders = new Set<string>();
  let expanded = 0;
  let tooBig = false;

  const readEntry = (entry: yauzl.Entry) =>
    new Promise<Buffer>((resolve, reject) => {
      zip.openReadStream(entry, (err, stream) => {
        if (err || !stream) return reject(err ?? new Error("cannot open entry"));
        const chunks: Buffer[] = [];
        stream.on("data", (c: Buffer) => {
          expanded += c.length;
          if (expanded > limits.maxBytes) {
            tooBig = true;
            stream.destroy(new Error("expanded size over the limit"));
            return;
          }
          chunks.push(c);
        });
        stream.on("error", reject);
        stream.on("end", () => resolve(Buffer.concat(chunks)));
      });
    });

  try {
    await new Promise<void>((resolve, reject) => {
      zip.on("error", reject);
      zip.on("end", () => resolve());
      zip.on("entry", (entry: yauzl.Entry) => {
        const name = entry.fileName;
        const next = () => zip.readEntry();
        if (unsafeName(name)) {
          problems.push({ file: `${zipName}: ${name}`, message: `Unsafe path "${name}" (absolute, "..", or backslashes); refused.` });
          return next();
        }
        if (JUNK.test(name)) return next();
        const special = specialEntry(entry.externalFileAttributes);
        if (special) {
          problems.push({ file: `${zipName}: ${name}`, message: `"${name}" is a ${special}, not a file: put the network files themselves in the zip; refused.` });
          return next();
        }
        const segs = name.split("/").filter(Boolean);
        const isDir = name.endsWith("/");
        if (isDir) {
          if (segs.length > 1) problems.push({ file: `${zipName}: ${name}`, message: `Nested folder "${name}": put the network files at the top of the zip or in one single folder.` });
          else topFolders.add(segs[0]);
          return next();
        }
        if (segs.length > 2) {
          problems.push({ file: `${zipName}: ${name}`, message: `"${name}" is in a nested folder: put the network files at the top of the zip or in one single folder.` });
          return next();
        }
        if (segs.length === 2) topFolders.add(segs[0]);
        if (!NETWORK_FILE.test(name)) {
          problems.push({ file: `${zipName}: ${name}`, message: `"${name}" is not a network file: only .csv, .tsv, .txt or .xlsx files (one network each) may be in the zip.` });
          return next();
        }
        if (entry.uncompressedSize > limits.maxBytes || expanded + entry.uncompressedSize > limits.maxBytes) {
          tooBig = true;
          return reject(new Error("expanded size over the limit"));
        }
        readEntry(entry)
          .then((buf) => {
            files.push({ name: segs[segs.length - 1], bytes: buf });
            next();
          })
          .catch(reject);
      });
      zip.readEntry();
    });
  } catch (err) {
    zip.close();
    if (tooBig) {
      throw new ApiError(413, "upload_too_large", `${zipName} expands to more than the upload limit of ${limits.maxBytes} bytes.`, [
        { file: zipName, message: `The files in the zip add up to more than ${limits.maxBytes} bytes when expanded.` },
      ]);
    }
    const msg = (err as Error).message;
    if (/absolute path|invalid relative path|invalid characters in fileName/.test(msg)) {
      throw ApiError.unprocessable(`${zipName}: unsafe path in the zip; refused.`, [{ file: zipName, message: `Unsafe path in the zip (${msg}); refused.` }]);
    }
    throw ApiError.unprocessable(`${zipName} could not be read: ${msg}`, [{ file: zipName, message: msg }]);
  }
  if (topFolders.size > 1) problems.push({ file: zipName, message: `The zip has several folders (${[...topFolders].join(", ")}): use at most one folder.` });
  if (!problems.length && !files.length) problems.push({ file: zipName, message: "The zip holds no network files." });
  if (files.length > limits.maxFiles) problems.push({ file: zipName, message: `The zip holds ${files.length} files; at most ${limits.maxFiles} are accepted at once.` });
  const names = new Set<string>();
  for (const f of files) {
    if (names.has(f.name)) problems.push({ file: `${zipName}: ${f.name}`, message: `Two files are named "${f.name}".` });
    names.add(f.name);
  }
  if (problems.length) throw ApiError.unprocessable(`${zipName}: ${problems.length} problem${problems.length === 1 ? "" : "s"} in the zip.`, problems);
  return files;
}

/** The network files of an upload (temporary files of the request): the files themselves, or the content of one zip. */
export async function expandUpload(files: Array<{ originalname: string; path: string }>, limits: { maxBytes: number; maxFiles: number }): Promise<UploadedFile[]> {
  if (!files.length) throw ApiError.badRequest("No file was uploaded: send one or more CSV/TSV files, or one zip, in the field \"files\".", [{ path: "files", message: "No file." }]);
  const heads = await Promise.all(files.map((f) => headOf(f.path)));
  const zipAt = files.map((f, i) => isZip(f.originalname, heads[i]));
  if (zipAt.some(Boolean)) {
    if (files.length > 1) throw ApiError.unprocessable("Upload either one zip or plain network files, not both or several zips.", files.map((f, i) => ({ file: f.originalname, message: zipAt[i] ? "A zip among other files." : "A file next to a zip." })));
    return readZip(files[0].originalname, await readFile(files[0].path), limits);
  }
  const bad = files.map((f, i) => ({ f, head: heads[i] })).filter(({ f }) => !NETWORK_FILE.test(f.originalname));
  if (bad.length) throw ApiError.unprocessable("Only network files (.csv, .tsv, .txt, .xlsx) or one zip may be uploaded.", bad.map(({ f, head }) => ({ file: f.originalname, message: notANetworkFile(f.originalname, head) })));
  return files.map((f) => ({ name: f.originalname, path: f.path }));
}

/**
 * Multipart upload (field "files") streamed to temporary files with the per-file, per-request and count
 * limits (lib/upload-storage.ts). Nothing touches the database until every byte arrived and every file
 * parsed, so an interrupted request leaves nothing behind; the temporary files go when the request ends.
 */
export const uploadFiles: RequestHandler = streamUpload(UPLOAD_FILE_PART, (name, head) =>
  ApiError.unprocessable("Only network files (.csv, .tsv, .txt, .xlsx) or one zip may be uploaded.", [{ file: name, message: notANetworkFile(name, head) }]),
);
