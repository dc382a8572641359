/**
 * The computations of one metrics job, as pure functions over the network's canonical JSON. They run in
 * the worker-thread pool (pool.ts, thread body metrics-thread.ts), never on the web server's thread:
 *   - "observed": the full analysis of the network without null replicates (optimized modularity with
 *     partition and restart spread, basic metrics, roles, NODF) and the null models it gets (the standard
 *     set of its kind, or the models of the settings; a model that does not fit throws a
 *     NetworkEngineError, a configuration error the worker does not retry);
 *   - "nulls": Q and NODF of a chunk of null replicates of one model (significance.ts `nullReplicateStats`;
 *     replicate r depends only on network, settings, model, seed and r, so any chunking gives the
 *     single-threaded numbers);
 * and `combineAnalysis` joins them into exactly the object `analyzeNetwork` returns for the same settings
 * (tests/server/pipeline/pipeline-compute.test.ts checks the equality).
 */
import { analyzeNetwork, buildNullFigures, primaryNull, resolveNullModels, type AnalysisResult, type NullModelChoice } from "@shared/network/analyze";
import type { NullModelName } from "@shared/network/null-models/index";
import { NetworkEngineError } from "@shared/network/errors";
import { deserializeNetwork } from "@shared/network/parse/index";
import { nullReplicateStats, type NullReplicate } from "@shared/network/significance";
import type { OptimizerObjective } from "@shared/network/optimizer/quality-graph";
import type { PipelineSettings } from "@shared/types/pipeline";

export interface ObservedTask {
  kind: "observed";
  canonical: unknown;
  settings: PipelineSettings;
}
export interface NullsTask {
  kind: "nulls";
  canonical: unknown;
  settings: PipelineSettings;
  model: NullModelName;
  objective: OptimizerObjective;
  replicates: number[];
}
export type MetricsTask = ObservedTask | NullsTask;

export interface ObservedResult {
  /** analyzeNetwork's output with no null replicates. */
  analysis: AnalysisResult;
  /** The null models of this network (primary first) under the settings. */
  nullChoice: NullModelChoice;
}

export type NullReplicatesByModel = Partial<Record<NullModelName, Array<NullReplicate | null>>>;

export function engineSettings(s: PipelineSettings) {
  return {
    objective: s.objective === "auto" ? undefined : s.objective,
    restarts: s.restarts,
    seed: s.seed,
    annealing: s.annealing,
  };
}

/** The engine's null-model options for pipeline settings. */
export function nullModelSettings(s: PipelineSettings): { nullModels?: NullModelName[] } {
  return s.nullModels === "standard" ? {} : { nullModels: s.nullModels };
}

export function observedAnalysis(canonical: unknown, s: PipelineSettings): ObservedResult {
  const net = deserializeNetwork(canonical);
  const nullChoice = resolveNullModels(net, nullModelSettings(s));
  const analysis = analyzeNetwork(net, { ...engineSettings(s), nulls: 0 });
  return { analysis, nullChoice };
}

/** Q and NODF of each replicate in `replicates` of one model (null when the replicate's modularity is undefined). */
export function nullChunk(task: Omit<NullsTask, "kind">): Array<NullReplicate | null> {
  const net = deserializeNetwork(task.canonical);
  return task.replicates.map((replicate) =>
    nullReplicateStats(net, {
      model: task.model,
      seed: task.settings.seed,
      replicate,
      restarts: task.settings.restarts,
      objective: task.objective,
      annealing: task.settings.annealing,
    }),
  );
}

/**
 * The full analysis from the observed one and each model's replicates 0..nulls−1 (in replicate order), as
 * analyzeNetwork builds it; `elapsedMs` is the caller's.
 */
export function combineAnalysis(observed: ObservedResult, nulls: number, replicates: NullReplicatesByModel, elapsedMs: number): AnalysisResult {
  const a = observed.analysis;
  const choice = observed.nullChoice;
  const out: AnalysisResult = {
    ...a,
    algorithm: {
      ...a.algorithm,
      parameters: { ...a.algorithm.parameters, nulls, nullModels: nulls > 0 ? choice.models : [], primaryNull: nulls > 0 ? choice.primary : null },
    },
    elapsedMs,
  };
  delete out.null;
  delete out.nulls;
  delete out.nullModels;
  delete out.nullSkippedReason;
  if (nulls > 0) {
    const figures = a.modularity.Q === null ? [] : buildNullFigures(a.modularity.Q, a.nodf, choice, replicates);
    out.null = primaryNull(figures);
    out.nulls = figures;
    out.nullModels = choice;
    if (a.modularity.Q === null) out.nullSkippedReason = "modularity is undefined for this network, so its significance is too";
  }
  return out; // same key order as analyzeNetwork's object (null parts after elapsedMs)
}

/**
 * A setting that does not fit the network (a null model or objective that does not apply to it): the same
 * input fails the same way every time, so the run fails at once and is never retried.
 */
export class ConfigurationError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ConfigurationError";
  }
}

const CONFIGURATION_CODES = new Set(["unsupported", "non-integer-weights", "objective-mismatch"]);

/** What a thread returns instead of throwing a configuration error (errors lose their class between threads). */
export interface ConfigurationFailure {
  configurationError: string;
}

export function isConfigurationFailure(v: unknown): v is ConfigurationFailure {
  return !!v && typeof v === "object" && typeof (v as ConfigurationFailure).configurationError === "string";
}

export function runTask(task: MetricsTask): ObservedResult | Array<NullReplicate | null> | ConfigurationFailure {
  try {
    if (task.kind === "observed") return observedAnalysis(task.canonical, task.settings);
    return nullChunk(task);
  } catch (err) {
    if (err instanceof NetworkEngineError && CONFIGURATION_CODES.has(err.code)) return { configurationError: err.message };
    throw err;
  }
}

/** Splits replicates 0..n−1 into about `parts` contiguous chunks. */
export function chunkReplicates(n: number, parts: number): number[][] {
  const chunks: number[][] = [];
  const size = Math.max(1, Math.ceil(n / Math.max(1, parts)));
  for (let start = 0; start < n; start += size) {
    chunks.push(Array.from({ length: Math.min(size, n - start) }, (_, i) => start + i));
  }
  return chunks;
}
