/**
 * The worker-thread pool that runs the engine for the metrics pipeline (piscina), sized to the cores
 * (`os.availableParallelism()`, or TB_METRICS_THREADS). One pool per process, created on first use.
 */
import { Piscina } from "piscina";
import { jobSettings } from "../config/env";
import { ConfigurationError, isConfigurationFailure, type MetricsTask, type ObservedResult } from "./compute";
import type { NullReplicate } from "@shared/network/significance";

let pool: Piscina | undefined;

export function poolThreads(): number {
  return jobSettings().metricsThreads;
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

/** Runs a task; a configuration error of the thread is thrown as ConfigurationError (never retried). */
async function runChecked<T>(task: MetricsTask): Promise<T> {
  const res = (await metricsPool().run(task)) as unknown;
  if (isConfigurationFailure(res)) throw new ConfigurationError(res.configurationError);
  return res as T;
}

export function runObserved(task: Omit<Extract<MetricsTask, { kind: "observed" }>, "kind">): Promise<ObservedResult> {
  return runChecked<ObservedResult>({ ...task, kind: "observed" });
}

export function runNulls(task: Omit<Extract<MetricsTask, { kind: "nulls" }>, "kind">): Promise<Array<NullReplicate | null>> {
  return runChecked<Array<NullReplicate | null>>({ ...task, kind: "nulls" });
}

export async function closePool(): Promise<void> {
  if (pool) {
    const p = pool;
    pool = undefined;
    await p.destroy();
  }
}
