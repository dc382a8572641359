/**
 * The body of a metrics worker thread (piscina). Each thread lowers its own scheduling priority by
 * TB_METRICS_THREAD_NICE (default 5; on Linux the nice value is per thread), so the web server's thread
 * keeps answering quickly while every core computes.
 *
 * piscina starts `metrics-thread.mjs` beside the module that creates the pool: from the source, the
 * plain module of that name here loads this file through tsx; `npm run build` compiles this file to
 * dist/server/metrics-thread.mjs, beside the compiled server.
 */
import { setPriority } from "node:os";
import { jobSettings } from "../config/env";
import { runTask, type MetricsTask } from "./compute";

const nice = jobSettings().metricsThreadNice;
try {
  if (nice > 0) setPriority(nice);
} catch {
  // Not permitted on this system: run at normal priority.
}

export default function run(task: MetricsTask): ReturnType<typeof runTask> {
  return runTask(task);
}
