/**
 * archiver's zip writer (compress-commons and crc32-stream) computes every entry's CRC-32 with the
 * pure-JavaScript `crc-32` package. For a bundle stored without compression that checksum is the largest
 * single cost left after writing the CSVs (about a tenth of the server's time). Node (≥ 20.15; the
 * project needs ≥ 20.19) has the same checksum natively as `zlib.crc32(data, previous)`: same polynomial,
 * same continuation value. This module points `crc-32`'s `buf` at it, once, in this process only, after
 * checking on a sample that both give the same answer (if not, or if the package cannot be found, nothing
 * is changed and archiver keeps its own). Zip readers check every entry's CRC, and the bundle tests unzip
 * and compare every file.
 */
import { createRequire } from "node:module";
import zlib from "node:zlib";

interface Crc32Module {
  buf(data: Uint8Array, seed?: number): number;
}

let installed = false;

export function useNativeCrc32(): boolean {
  if (installed) return true;
  try {
    const req = createRequire(import.meta.url);
    // the copy compress-commons itself loads (archiver → zip-stream → compress-commons → crc-32)
    const fromArchiver = createRequire(req.resolve("archiver"));
    const fromZipStream = createRequire(fromArchiver.resolve("zip-stream"));
    const fromCommons = createRequire(fromZipStream.resolve("compress-commons"));
    const crc = fromCommons("crc-32") as Crc32Module;
    const js = crc.buf.bind(crc);
    const native = (data: Uint8Array, seed?: number) => zlib.crc32(data, (seed ?? 0) >>> 0) | 0;
    const sample = Buffer.from("node,a,b\nx,0,1\ny,12.5,0\n", "utf8");
    const first = sample.subarray(0, 7);
    const rest = sample.subarray(7);
    if (native(sample) !== js(sample) || native(rest, native(first) >>> 0) !== js(rest, js(first) >>> 0)) return false;
    crc.buf = native;
    installed = true;
  } catch {
    return false;
  }
  return installed;
}
