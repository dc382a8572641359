/**
 * The worker-thread pool that runs the engine for the metrics pipeline (piscina), sized to the cores
 * (`os.availableParallelism()`, or TB_METRICS_THREADS). One pool per process, created on first use.
 */
import { availableParallelism } from "node:os";
import { Piscina } from "piscina";
import type { MetricsTask, ObservedResult } from "./compute";

let pool: Piscina | undefined;

export function poolThreads(): number {
  const raw = process.env.TB_METRICS_THREADS;
  const n = raw ? Number(raw) : availableParallelism();
  return Number.isInteger(n) && n >= 1 ? n : availableParallelism();
}

function metricsPool(): Piscina {
  pool ??= new Piscina({
    filename: new URL("./metrics-thread.mjs", import.meta.url).href,
    minThreads: 1,
    maxThreads: poolThreads(),
    idleTimeout: 60_000,
  });
  return pool;
}

export function runObserved(task: Omit<Extract<MetricsTask, { kind: "observed" }>, "kind">): Promise<ObservedResult> {
  return metricsPool().run({ ...task, kind: "observed" }) as Promise<ObservedResult>;
}

export function runNulls(task: Omit<Extract<MetricsTask, { kind: "nulls" }>, "kind">): Promise<Array<number | null>> {
  return metricsPool().run({ ...task, kind: "nulls" }) as Promise<Array<number | null>>;
}

export async function closePool(): Promise<void> {
  if (pool) {
    const p = pool;
    pool = undefined;
    await p.destroy();
  }
}
