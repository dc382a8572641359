/**
 * The computations of one metrics job, as pure functions over the network's canonical JSON. They run in
 * the worker-thread pool (pool.ts, thread entry metrics-thread.mjs), never on the web server's thread:
 *   - "observed": the full analysis of the network without null replicates (optimized modularity with
 *     partition and restart spread, basic metrics, roles, NODF);
 *   - "nulls": the best Q of a chunk of null replicates (significance.ts `nullReplicateQ`; replicate r
 *     depends only on network, settings, seed and r, so any chunking gives the single-threaded numbers);
 * and `combineAnalysis` joins them into exactly the object `analyzeNetwork` returns for the same settings
 * (tests/server/pipeline-compute.test.ts checks the equality).
 */
import { analyzeNetwork, defaultNullModel, type AnalysisResult } from "../../../shared/network/analyze";
import type { NullModelName } from "../../../shared/network/null-models/index";
import { deserializeNetwork } from "../../../shared/network/parse/index";
import { nullReplicateQ, summarizeNulls } from "../../../shared/network/significance";
import type { OptimizerObjective } from "../../../shared/network/optimizer/quality-graph";
import type { PipelineSettings } from "../../../shared/types/pipeline";

export interface ObservedTask {
  kind: "observed";
  canonical: unknown;
  settings: PipelineSettings;
}
export interface NullsTask {
  kind: "nulls";
  canonical: unknown;
  settings: PipelineSettings;
  nullModel: NullModelName;
  objective: OptimizerObjective;
  replicates: number[];
}
export type MetricsTask = ObservedTask | NullsTask;

export interface ObservedResult {
  /** analyzeNetwork's output with no null replicates. */
  analysis: AnalysisResult;
  /** The null model the settings resolve to for this network. */
  nullModel: NullModelName;
}

export function engineSettings(s: PipelineSettings) {
  return {
    objective: s.objective === "auto" ? undefined : s.objective,
    restarts: s.restarts,
    seed: s.seed,
    annealing: s.annealing,
  };
}

export function observedAnalysis(canonical: unknown, s: PipelineSettings): ObservedResult {
  const net = deserializeNetwork(canonical);
  const nullModel = s.nullModel === "auto" ? defaultNullModel(net) : s.nullModel;
  const analysis = analyzeNetwork(net, { ...engineSettings(s), nulls: 0, nullModel });
  return { analysis, nullModel };
}

/** Null Q of each replicate in `replicates` (null when the replicate's modularity is undefined). */
export function nullChunk(task: Omit<NullsTask, "kind">): Array<number | null> {
  const net = deserializeNetwork(task.canonical);
  const annealing = task.settings.annealing;
  return task.replicates.map((replicate) =>
    nullReplicateQ(net, {
      model: task.nullModel,
      seed: task.settings.seed,
      replicate,
      restarts: task.settings.restarts,
      objective: task.objective,
      annealing,
    }),
  );
}

/**
 * The full analysis from the observed one and the null Qs of replicates 0..nulls−1 (in replicate order),
 * as analyzeNetwork builds it; `elapsedMs` is the caller's.
 */
export function combineAnalysis(observed: ObservedResult, nulls: number, nullQs: ReadonlyArray<number | null>, elapsedMs: number): AnalysisResult {
  const a = observed.analysis;
  const out: AnalysisResult = {
    ...a,
    algorithm: {
      ...a.algorithm,
      parameters: { ...a.algorithm.parameters, nulls, nullModel: nulls > 0 ? observed.nullModel : null },
    },
    elapsedMs,
  };
  delete out.null;
  delete out.nullSkippedReason;
  if (nulls > 0) {
    if (a.modularity.Q === null) {
      out.null = null;
      out.nullSkippedReason = "modularity is undefined for this network, so its significance is too";
    } else {
      const qs = nullQs.filter((q): q is number => q !== null);
      out.null = { model: observed.nullModel, ...summarizeNulls(a.modularity.Q, qs) };
    }
  }
  return out; // same key order as analyzeNetwork's object (null parts after elapsedMs)
}

export function runTask(task: MetricsTask): ObservedResult | Array<number | null> {
  if (task.kind === "observed") return observedAnalysis(task.canonical, task.settings);
  return nullChunk(task);
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
