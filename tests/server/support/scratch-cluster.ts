/**
 * Fault tests need a PostgreSQL they may stop, restart and fill without disturbing the other test files:
 * a scratch cluster of its own (scripts/lib.sh's pg_up, as `npm start` and `npm test` create theirs) on a
 * free port, and the real server started against it as a child process (tests/server/support/fault-server.ts).
 */
import { execFile, spawn, type ChildProcess } from "node:child_process";
import { rmSync } from "node:fs";
import { createServer } from "node:net";
import { join } from "node:path";
import { promisify } from "node:util";

const run = promisify(execFile);
export const ROOT = join(import.meta.dirname, "..", "..", "..");

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const addr = s.address();
      const port = typeof addr === "object" && addr ? addr.port : 0;
      s.close(() => resolve(port));
    });
  });
}

async function lib(script: string, ...args: string[]): Promise<void> {
  await run("bash", ["-c", `source scripts/lib.sh; ${script}`, "lib", ...args], { cwd: ROOT });
}

export interface ScratchCluster {
  port: number;
  databaseUrl: string;
  /** Fast shutdown (`pg_ctl -m fast stop`): every connection is closed by the server. */
  stop(): Promise<void>;
  start(): Promise<void>;
  destroy(): Promise<void>;
}

export async function startScratchCluster(name: string): Promise<ScratchCluster> {
  const port = await freePort();
  const home = join(ROOT, `.pg-fault-${name}-${process.pid}`);
  const db = `tanglebank_test_${name.replace(/-/g, "_")}`;
  await lib(`pg_up "$1" "$2" && pg_createdb "$2" "$3"`, home, String(port), db);
  return {
    port,
    databaseUrl: `postgres://postgres@127.0.0.1:${port}/${db}`,
    stop: () => lib(`pg_down "$1"`, home),
    start: () => lib(`pg_up "$1" "$2"`, home, String(port)),
    destroy: async () => {
      await lib(`pg_down "$1"`, home).catch(() => undefined);
      rmSync(home, { recursive: true, force: true });
    },
  };
}

export interface SpawnedServer {
  url: string;
  child: ChildProcess;
  /** Everything the server wrote to stderr (a crash leaves its reason here). */
  stderr(): string;
  exited(): boolean;
  kill(signal?: NodeJS.Signals): Promise<void>;
}

/** Starts the server (fault-server.ts: migrations, web server, catalogue listener, metrics worker). */
export async function spawnServer(databaseUrl: string, env: Record<string, string> = {}): Promise<SpawnedServer> {
  const child = spawn(process.execPath, ["--import", "tsx", "tests/server/support/fault-server.ts"], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: "test", DATABASE_URL: databaseUrl, LOG_LEVEL: "warn", PORT: "0", TB_METRICS_THREADS: "1", TB_MAIL_PORT: "0", ...env },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let err = "";
  child.stderr!.on("data", (d: Buffer) => {
    err += d.toString();
  });
  const url = await new Promise<string>((resolve, reject) => {
    let out = "";
    child.stdout!.on("data", (d: Buffer) => {
      out += d.toString();
      const m = /READY (http:\/\/\S+)/.exec(out);
      if (m) resolve(m[1]);
    });
    child.once("exit", (code) => reject(new Error(`the server exited with ${code} before it was ready:\n${err}`)));
  });
  return {
    url,
    child,
    stderr: () => err,
    exited: () => child.exitCode !== null || child.signalCode !== null,
    kill: async (signal = "SIGKILL") => {
      if (child.exitCode !== null || child.signalCode !== null) return;
      const gone = new Promise((r) => child.once("exit", r));
      child.kill(signal);
      await gone;
    },
  };
}
