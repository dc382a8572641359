/**
 * The zip of a bundle as it streams (archiver 8 ZipArchive) into an HTTP response, and its progress: how
 * many appended entries archiver has taken in, whether the client has taken what was sent (backpressure),
 * and the first failure (archiver's, or a streamed entry's). An aborted request aborts the archive; no
 * further entry is then read. The checksum is native (bundles.crc.ts).
 */
import { Readable, Transform } from "node:stream";
import type { Writable } from "node:stream";
import { ZipArchive } from "archiver";
import { useNativeCrc32 } from "./bundles.crc";

useNativeCrc32();

/** zlib level of compression=small (zlib's default). */
const SMALL_LEVEL = 6;

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

export class BundleZip {
  /** The first failure of the archive or of a streamed entry; the bundle stops at it. */
  failure: Error | null = null;
  /** Resolves when the archive fails or the request is aborted (a finalize still waiting is then left). */
  readonly stopped: Promise<void>;
  private readonly archive: ZipArchive;
  private appended = 0;
  private processed = 0;
  private wake: (() => void) | null = null;
  private stop: () => void = () => undefined;
  private readonly onAbort = () => {
    this.archive.abort();
    this.poke();
    this.stop();
  };

  /** `store`: entries stored uncompressed (compression "fast"), else deflated at zlib level 6. */
  constructor(
    private readonly out: Writable,
    private readonly signal: AbortSignal,
    store: boolean,
  ) {
    this.archive = store ? new ZipArchive({ store: true }) : new ZipArchive({ zlib: { level: SMALL_LEVEL } });
    this.archive.on("entry", () => {
      this.processed++;
      this.poke();
    });
    this.stopped = new Promise<void>((r) => (this.stop = r));
    this.archive.on("error", (err: Error) => {
      this.failure = err;
      this.poke();
      this.stop();
    });
    signal.addEventListener("abort", this.onAbort);
    this.archive.pipe(coalescer()).pipe(out);
  }

  private poke(): void {
    const w = this.wake;
    this.wake = null;
    w?.();
  }

  /** True once the request is aborted or the archive failed: nothing more should be read. */
  get halted(): boolean {
    return this.signal.aborted || this.failure !== null;
  }

  /** Appends an entry (archiver reads a stream entry when its turn comes). */
  add(source: string | Buffer | Readable, name: string, date: Date): void {
    this.archive.append(source, { name, date });
    this.appended++;
  }

  /** A stream entry from an async generator; a failure (e.g. the database) aborts the whole bundle. */
  fromGenerator(gen: AsyncGenerator<string | Buffer>): Readable {
    return Readable.from(this.guarded(gen));
  }

  private async *guarded(gen: AsyncGenerator<string | Buffer>): AsyncGenerator<string | Buffer> {
    try {
      yield* gen;
    } catch (err) {
      this.failure = err as Error;
      this.archive.abort();
      this.poke();
      this.stop();
    }
  }

  /** Waits until archiver has taken in all but `behind` of the entries appended so far. */
  async waitForEntries(behind: number): Promise<void> {
    const n = this.appended - behind;
    while (this.processed < n && !this.halted) await new Promise<void>((r) => (this.wake = r));
  }

  /**
   * Archiver consumes entries whether or not its output is read, so the socket's backpressure is checked
   * here: no new batch is read while the client has not taken what was already sent.
   */
  async waitForClient(): Promise<void> {
    const { out, signal } = this;
    while (!this.halted && (out.writableNeedDrain || this.archive.readableLength > 4 * 1024 * 1024)) {
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
  }

  /** Writes the zip's central directory once every entry is written (or stops early at a failure or abort). */
  finish(): Promise<unknown> {
    return Promise.race([this.archive.finalize(), this.stopped]);
  }

  /** Stops the archive: nothing more is read or written. */
  abort(): void {
    this.archive.abort();
  }

  /** Bytes of zip written so far. */
  bytes(): number {
    return this.archive.pointer();
  }

  /** Stops listening to the request's abort signal. */
  release(): void {
    this.signal.removeEventListener("abort", this.onAbort);
  }
}
