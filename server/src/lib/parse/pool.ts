/**
 * The parse processes: uploaded network files are read in child processes, never on the web server's
 * thread, so the server keeps answering while a large file is parsed. Each file gets a time limit
 * (TB_PARSE_TIMEOUT_MS, counted from when its process starts on it) and each process a heap limit
 * (TB_PARSE_MAX_MEMORY_MB, V8's --max-old-space-size); a file over either is refused with a message naming
 * it, and the process that ran it is ended and replaced. At most TB_PARSE_THREADS files are parsed at once
 * (default 1, so uploads never take more than one core from the web server and the metrics pipeline);
 * others wait their turn.
 *
 * Why processes and not worker threads with resourceLimits: a worker thread that passes its heap limit
 * inside one large allocation (splitting a huge string, say) ends the whole process with V8's fatal
 * out-of-memory error — one hostile file would stop the server. A child process that does so dies alone.
 */
import { fork, type ChildProcess } from "node:child_process";
import { fileURLToPath } from "node:url";
import { config } from "../../config/env";
import { ApiError } from "../api-error";
import { logger } from "../logger";
import type { ParseTask, ParseTaskResult } from "./task";

interface Slot {
  child: ChildProcess;
  ready: Promise<void>;
  busy: boolean;
  idle?: NodeJS.Timeout;
  /** The end of what the process wrote to stderr (V8's out-of-memory report). */
  stderr: string;
}

const IDLE_MS = 60_000;
// From the source: ./parse-process.mjs (loads the .ts through tsx); compiled: dist/server/parse-process.mjs.
const ENTRY = fileURLToPath(new URL("./parse-process.mjs", import.meta.url));
let slots: Slot[] = [];
let waiting: Array<(s: Slot) => void> = [];
let nextId = 1;

function spawnSlot(): Slot {
  const cfg = config();
  const child = fork(ENTRY, [], {
    execArgv: [`--max-old-space-size=${cfg.parseMaxMemoryMb}`],
    serialization: "advanced",
    stdio: ["ignore", "inherit", "pipe", "ipc"],
  });
  const slot: Slot = { child, busy: false, stderr: "", ready: Promise.resolve() };
  child.stderr?.on("data", (c: Buffer) => {
    slot.stderr = (slot.stderr + c.toString()).slice(-4000);
  });
  slot.ready = new Promise<void>((resolve, reject) => {
    const onMsg = (m: { ready?: boolean }) => {
      if (m?.ready) {
        child.off("message", onMsg);
        child.off("exit", onExit);
        resolve();
      }
    };
    const onExit = (code: number | null, signal: string | null) => reject(new Error(`the parse process stopped while starting (${signal ?? code}): ${slot.stderr.slice(-300)}`));
    child.on("message", onMsg);
    child.once("exit", onExit);
  });
  slot.ready.catch(() => undefined);
  child.once("exit", () => {
    slots = slots.filter((s) => s !== slot);
  });
  child.on("error", (err) => logger.warn({ err: err.message }, "parse process error"));
  slots.push(slot);
  return slot;
}

function acquire(): Promise<Slot> {
  const free = slots.find((s) => !s.busy);
  const take = (s: Slot) => {
    s.busy = true;
    if (s.idle) clearTimeout(s.idle);
    s.child.ref();
    s.child.channel?.ref();
    (s.child.stderr as unknown as { ref?: () => void } | null)?.ref?.();
    return s;
  };
  if (free) return Promise.resolve(take(free));
  if (slots.length < config().parseThreads) return Promise.resolve(take(spawnSlot()));
  return new Promise((resolve) => waiting.push((s) => resolve(take(s))));
}

function release(slot: Slot, alive: boolean): void {
  slot.busy = false;
  const next = waiting.shift();
  if (next) {
    next(alive ? slot : spawnSlot());
    return;
  }
  if (alive) {
    slot.idle = setTimeout(() => slot.child.kill(), IDLE_MS);
    slot.idle.unref();
    // an idle parse process does not keep a script (the demo seeder, a test run) from ending
    slot.child.unref();
    slot.child.channel?.unref();
    (slot.child.stderr as unknown as { unref?: () => void } | null)?.unref?.();
  }
}

function timeLimitError(name: string, ms: number): ApiError {
  const secs = Math.round(ms / 100) / 10;
  return ApiError.unprocessable(`"${name}" could not be read within the time limit of ${secs} s per file; nothing was stored.`, [
    { file: name, code: "parse-time-limit", message: `Reading "${name}" took longer than the limit of ${secs} s per file. Split it into smaller networks or check that it is a plain table.` },
  ]);
}

function memoryLimitError(name: string, mb: number): ApiError {
  return ApiError.unprocessable(`"${name}" needs more memory to read than the limit of ${mb} MB per file; nothing was stored.`, [
    { file: name, code: "parse-memory-limit", message: `Reading "${name}" needs more than the limit of ${mb} MB of memory. Split it into smaller networks or check that it is a plain table.` },
  ]);
}

/** Parses one file in a parse process; a file over the time or memory limit is an ApiError 422 naming it. */
export async function parseInThread(task: ParseTask): Promise<ParseTaskResult> {
  const cfg = config();
  const name = task.options.fileName;
  const slot = await acquire();
  let alive = true;
  try {
    await slot.ready;
    const id = nextId++;
    return await new Promise<ParseTaskResult>((resolve, reject) => {
      const timer = setTimeout(() => {
        cleanup();
        alive = false;
        slot.child.kill("SIGKILL");
        reject(timeLimitError(name, cfg.parseTimeoutMs));
      }, cfg.parseTimeoutMs);
      const onMsg = (m: { id?: number; result?: ParseTaskResult; error?: string }) => {
        if (m?.id !== id) return;
        cleanup();
        if (m.error !== undefined) reject(new Error(`parsing "${name}" failed: ${m.error}`));
        else resolve(m.result as ParseTaskResult);
      };
      const onExit = (code: number | null, signal: string | null) => {
        cleanup();
        alive = false;
        if (/heap out of memory|allocation failed|invalid array length|Reached heap limit/i.test(slot.stderr) || signal === "SIGABRT" || code === 134) reject(memoryLimitError(name, cfg.parseMaxMemoryMb));
        else reject(new Error(`the parse process stopped while reading "${name}" (${signal ?? code})`));
      };
      function cleanup() {
        clearTimeout(timer);
        slot.child.off("message", onMsg);
        slot.child.off("exit", onExit);
      }
      slot.child.on("message", onMsg);
      slot.child.once("exit", onExit);
      slot.child.send({ id, task });
    });
  } catch (err) {
    if (!(err instanceof ApiError)) alive = alive && slot.child.exitCode === null && !slot.child.killed;
    throw err;
  } finally {
    release(slot, alive && slot.child.exitCode === null && !slot.child.killed);
  }
}

/** Ends every parse process (tests, shutdown). */
export async function closeParsePool(): Promise<void> {
  const all = slots;
  slots = [];
  waiting = [];
  await Promise.all(
    all.map(
      (s) =>
        new Promise<void>((resolve) => {
          if (s.idle) clearTimeout(s.idle);
          if (s.child.exitCode !== null || s.child.signalCode !== null) return resolve();
          s.child.once("exit", () => resolve());
          s.child.kill("SIGKILL");
        }),
    ),
  );
}
