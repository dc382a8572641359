// Entry of the metrics worker threads (piscina). Node 20 cannot start a worker from a .ts file, so this
// plain module loads the TypeScript computations through tsx's API. Each thread lowers its own scheduling
// priority by TB_METRICS_THREAD_NICE (default 5; on Linux the nice value is per thread), so the web server's thread keeps answering quickly
// while every core computes.
import { setPriority } from "node:os";
import process from "node:process";
import { tsImport } from "tsx/esm/api";

const nice = Number(process.env.TB_METRICS_THREAD_NICE ?? 5);
try {
  if (Number.isInteger(nice) && nice > 0) setPriority(Math.min(19, nice));
} catch {
  // Not permitted on this system: run at normal priority.
}
const compute = await tsImport("./compute.ts", import.meta.url);

export default function run(task) {
  return compute.runTask(task);
}
