/**
 * Reads every entry of a zip (with yauzl) into a map of file name → bytes, or → UTF-8 text; `binaryParser`
 * makes supertest keep a download's body as bytes (`.buffer(true).parse(binaryParser)`).
 */
import type { Response } from "supertest";
import yauzl from "yauzl";

/** supertest body parser: the response's bytes, as they came. */
export function binaryParser(res: Response, cb: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  res.on("data", (c: Buffer) => chunks.push(c));
  res.on("end", () => cb(null, Buffer.concat(chunks)));
}

export function unzipBuffers(buf: Buffer): Promise<Map<string, Buffer>> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(buf, { lazyEntries: true }, (err, zip) => {
      if (err || !zip) return reject(err ?? new Error("not a zip"));
      const out = new Map<string, Buffer>();
      zip.on("entry", (entry: yauzl.Entry) => {
        zip.openReadStream(entry, (e, stream) => {
          if (e || !stream) return reject(e ?? new Error(`cannot read ${entry.fileName}`));
          const parts: Buffer[] = [];
          stream.on("data", (c: Buffer) => parts.push(c));
          stream.on("end", () => {
            out.set(entry.fileName, Buffer.concat(parts));
            zip.readEntry();
          });
        });
      });
      zip.on("end", () => resolve(out));
      zip.on("error", reject);
      zip.readEntry();
    });
  });
}

export async function unzip(buf: Buffer): Promise<Map<string, string>> {
  const files = await unzipBuffers(buf);
  return new Map([...files].map(([name, bytes]) => [name, bytes.toString("utf8")]));
}
