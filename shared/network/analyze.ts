/**
 * The engine's full analysis of one network, as one plain JSON-ready object: the metrics pipeline of the
 * server and the command-line tool (`npm run analyze -- FILE --json`) both produce exactly this.
 *
 * Contents: size and connectance (metrics/basic.ts), optimized modularity with its partition and the spread
 * over restarts (optimizer/), significance against N null replicates (significance.ts), node roles
 * (roles/roles.ts) of the best partition and nestedness NODF (nestedness/nodf.ts), the algorithm, version
 * and seed, and the elapsed time.
 *
 * Defaults (exposed as ANALYZE_DEFAULTS): 20 restarts, 100 null replicates per null model, seed 1,
 * annealing "auto", objective by network kind (Barber's Q_B for bipartite, Leicht–Newman for directed,
 * Newman–Girvan otherwise). Null models: the standard set of the network's kind of data with its primary
 * null first (null-models/index.ts `standardNullModels`; README "Null models"), or the models asked for
 * (`nullModels`, the first is the primary; `nullModel` for one). A model that does not fit the network is
 * refused with NetworkEngineError (a configuration error: retrying cannot help). The output keeps `null`
 * (the primary null's figures, with its `model`) and lists every model's figures in `nulls`, each with its
 * model name; NODF is compared with the same null networks.
 *
 * Reported choices (README "Decisions"): when the best Q is 0 (within 1e-12) — a complete bipartite
 * matrix, a complete graph, any tie at Q = 0 — the partition is one module of all linked nodes, not one
 * module per node; `modules` counts modules holding at least one linked node (isolated nodes each sit
 * alone in the partition and are counted apart in `isolatedNodes`); `restarts.bestShare` is the share of
 * restarts that reached the reported Q (after annealing), so it can be 0 when annealing found a better
 * partition than every restart; roles use strengths when the network is weighted (the weights the
 * partition was optimized with), and a node whose z is undefined gets no role.
 *
 * Partition in the output: node label → module number (0-based, numbered in order of first appearance,
 * rows first). In a bipartite network a label used by both a row node and a column node (two different
 * nodes) appears as "label" for the row and "label (column)" for the column.
 *
 * Pure: no I/O. `nullQs` lets a caller that computed the replicates elsewhere (worker threads calling
 * nullReplicateQ) pass them in; the result is then identical to computing them here.
 */
import { basicMetrics, type BasicMetrics } from "./metrics/basic";
import { nodf } from "./nestedness/nodf";
import { NetworkEngineError } from "./errors";
import {
  NULL_MODEL_INFO, isNullModelName, nullDataKind, nullModelProblem, nullModelLabel, standardNullModels,
  type NullDataKind, type NullModelName,
} from "./null-models/index";
import { optimizeModularity, type AnnealingMode, type Convergence, DEFAULT_RESTARTS, DEFAULT_SEED } from "./optimizer/optimize";
import type { OptimizerObjective } from "./optimizer/quality-graph";
import { nodeRoles, ROLE_THRESHOLDS, type NodeRole, type NodeRoleName } from "./roles/roles";
import { nullReplicateStats, summarizeNodf, summarizeNulls, type NodfNullSummary, type NullReplicate, type NullSummary } from "./significance";
import type { Network } from "./types";
import { ENGINE_VERSION } from "./version";

export const ANALYZE_DEFAULTS = {
  restarts: DEFAULT_RESTARTS,
  nulls: 100,
  seed: DEFAULT_SEED,
  annealing: "auto" as AnnealingMode,
};

export interface AnalyzeSettings {
  objective?: OptimizerObjective;
  restarts?: number;
  nulls?: number;
  /** One null model only (the primary). */
  nullModel?: NullModelName;
  /** The null models to compute, primary first (default: the standard set of the network's kind). */
  nullModels?: readonly NullModelName[];
  seed?: number;
  annealing?: AnnealingMode;
  /** Replicates 0..N−1 of each model computed elsewhere with the same settings (see nullReplicateStats). */
  nullReplicates?: Partial<Record<NullModelName, ReadonlyArray<NullReplicate | null>>>;
}

/** The figures of one null model: modularity against its nulls, and NODF against the same nulls. */
export interface NullFigures extends NullSummary {
  model: NullModelName;
  /** What the model is, in a few words (e.g. "fixed degrees"). */
  title: string;
  primary: boolean;
  /** Calls some non-modular networks modular (NULL_MODEL_INFO[model].caution says which). */
  liberal: boolean;
  nodf: NodfNullSummary | null;
  /** Null networks whose optimization stopped at a safety cap instead of converging (0 normally). */
  cappedNulls: number;
}

export interface NullModelChoice {
  dataKind: NullDataKind;
  primary: NullModelName;
  models: NullModelName[];
  /** True when these are the standard set of the kind, false when asked for. */
  standard: boolean;
}

/**
 * The null models for a network: the standard set, or the models asked for (primary first). Throws
 * NetworkEngineError("unsupported" | "non-integer-weights") naming the model and why when one does not fit.
 */
export function resolveNullModels(net: Network, settings: Pick<AnalyzeSettings, "nullModel" | "nullModels"> = {}): NullModelChoice {
  const asked = settings.nullModels ?? (settings.nullModel ? [settings.nullModel] : null);
  const dataKind = nullDataKind(net);
  if (!asked) {
    const std = standardNullModels(net);
    return { dataKind, primary: std.primary, models: std.models, standard: true };
  }
  const models: NullModelName[] = [];
  for (const m of asked) {
    if (!isNullModelName(m)) throw new RangeError(`unknown null model "${String(m)}"`);
    if (!models.includes(m)) models.push(m);
  }
  if (!models.length) throw new RangeError("at least one null model is needed");
  for (const m of models) {
    const problem = nullModelProblem(m, net);
    if (problem) {
      throw new NetworkEngineError(problem.includes("integers") ? "non-integer-weights" : "unsupported", `The ${nullModelLabel(m)} null model does not fit this network: ${problem}`);
    }
  }
  return { dataKind, primary: models[0], models, standard: false };
}

/** Figures of every model from its replicates (replicate order), primary first. */
export function buildNullFigures(
  Q: number,
  observedNodf: number | null,
  choice: NullModelChoice,
  replicates: Partial<Record<NullModelName, ReadonlyArray<NullReplicate | null>>>,
): NullFigures[] {
  return choice.models.map((model) => {
    const reps = (replicates[model] ?? []).filter((r): r is NullReplicate => r !== null);
    const info = NULL_MODEL_INFO[model];
    return {
      model,
      title: info.title,
      primary: model === choice.primary,
      liberal: info.liberal,
      ...summarizeNulls(Q, reps.map((r) => r.q)),
      nodf: summarizeNodf(observedNodf, reps.map((r) => r.nodf)),
      cappedNulls: reps.filter((r) => r.capped).length,
    };
  });
}

/** The `null` object of the output: the primary's figures in the fields the first engine had, plus the new ones. */
export function primaryNull(figures: NullFigures[]): (NullSummary & { model: NullModelName }) | null {
  const p = figures.find((f) => f.primary) ?? figures[0];
  if (!p) return null;
  const { title: _t, primary: _p, liberal: _l, nodf: _n, cappedNulls: _c, ...rest } = p;
  return rest;
}

/** A node's role as the analysis reports it: the role without the engine's node number. */
export type AnalysisRole = Omit<NodeRole, "node">;

/** The figures of one network: its basic counts (metrics/basic.ts) with modularity, significance, NODF and roles. */
export interface AnalysisResult extends BasicMetrics {
  kind: Network["kind"];
  directed: boolean;
  weighted: boolean;
  modularity: {
    objective: OptimizerObjective;
    Q: number | null;
    undefinedReason?: string;
    /** Modules holding at least one linked node (isolated nodes are not counted). */
    modules: number;
    /** Nodes without links: each sits alone in the partition and is not counted in `modules`. */
    isolatedNodes: number;
    partition: Record<string, number>;
    restarts: { n: number; min: number | null; median: number | null; max: number | null; bestShare: number | null; qs: number[]; passes: number[] };
    /** Whether every optimizer run stopped because a pass no longer raised Q (not at a safety cap). */
    convergence: Convergence;
  };
  /** Present when nulls > 0: the primary null model's figures; null (with nullSkippedReason) when modularity is undefined. */
  null?: (NullSummary & { model: NullModelName }) | null;
  /** Present when nulls > 0: every null model's figures, primary first (empty when modularity is undefined). */
  nulls?: NullFigures[];
  /** The data kind, the null models and the primary (present when nulls > 0). */
  nullModels?: NullModelChoice;
  nullSkippedReason?: string;
  nodf: number | null;
  nodfRows: number | null;
  nodfCols: number | null;
  roles: {
    thresholds: { z: number; p: number };
    counts: Record<NodeRoleName, number>;
    nodes: AnalysisRole[];
  } | null;
  algorithm: {
    name: string;
    version: string;
    seed: number;
    parameters: Record<string, unknown>;
  };
  elapsedMs: number;
}

function checkSettings(s: AnalyzeSettings, nulls: number) {
  if (!Number.isInteger(nulls) || nulls < 0 || nulls > 100000) {
    throw new RangeError(`nulls must be an integer from 0 to 100000, got ${nulls}`);
  }
  if (s.nullModel !== undefined && !isNullModelName(s.nullModel)) {
    throw new RangeError(`unknown null model "${String(s.nullModel)}"`);
  }
  for (const [model, reps] of Object.entries(s.nullReplicates ?? {})) {
    if (reps && reps.length !== nulls) throw new RangeError(`nullReplicates.${model} has ${reps.length} values but nulls is ${nulls}`);
  }
}

function nodeLabels(net: Network): string[] {
  if (net.kind !== "bipartite") return net.rowLabels;
  const rowSet = new Set(net.rowLabels);
  return [...net.rowLabels, ...net.colLabels.map((l) => (rowSet.has(l) ? `${l} (column)` : l))];
}

function now(): number {
  return typeof performance !== "undefined" ? performance.now() : Date.now();
}

export function analyzeNetwork(net: Network, settings: AnalyzeSettings = {}): AnalysisResult {
  const t0 = now();
  const restarts = settings.restarts ?? ANALYZE_DEFAULTS.restarts;
  const givenCounts = Object.values(settings.nullReplicates ?? {}).map((r) => r?.length ?? 0);
  const nulls = settings.nulls ?? (givenCounts.length ? givenCounts[0] : ANALYZE_DEFAULTS.nulls);
  const seed = settings.seed ?? ANALYZE_DEFAULTS.seed;
  const annealing = settings.annealing ?? ANALYZE_DEFAULTS.annealing;
  checkSettings(settings, nulls);
  const choice = nulls > 0 ? resolveNullModels(net, settings) : null;

  const basic = basicMetrics(net);
  const opt = optimizeModularity(net, { objective: settings.objective, restarts, seed, annealing });
  const labels = nodeLabels(net);
  const reported = reportedPartition(net, opt.partition, opt.Q);
  const partition: Record<string, number> = {};
  for (let v = 0; v < labels.length; v++) partition[labels[v]] = reported.partition[v];
  const nest = nodf(net);

  let nullFigures: NullFigures[] = [];
  let nullSkippedReason: string | undefined;
  if (choice) {
    if (opt.Q === null) {
      nullSkippedReason = "modularity is undefined for this network, so its significance is too";
    } else {
      const reps: Partial<Record<NullModelName, ReadonlyArray<NullReplicate | null>>> = {};
      for (const model of choice.models) {
        const given = settings.nullReplicates?.[model];
        if (given) reps[model] = given;
        else {
          const list: Array<NullReplicate | null> = [];
          for (let r = 0; r < nulls; r++) {
            list.push(nullReplicateStats(net, { model, seed, replicate: r, restarts, objective: opt.objective, annealing }));
          }
          reps[model] = list;
        }
      }
      nullFigures = buildNullFigures(opt.Q, nest ? nest.nodf : null, choice, reps);
    }
  }

  let roles: AnalysisResult["roles"] = null;
  if (opt.Q !== null) {
    const counts: Record<NodeRoleName, number> = { peripheral: 0, connector: 0, "module-hub": 0, "network-hub": 0 };
    const nodes = nodeRoles(net, reported.partition, { weighted: net.weighted }).map((r) => {
      if (r.role) counts[r.role]++;
      return {
        label: labels[r.node],
        level: r.level,
        module: r.module,
        degree: r.degree,
        z: r.z,
        participation: r.participation,
        role: r.role,
      };
    });
    roles = { thresholds: { z: ROLE_THRESHOLDS.z, p: ROLE_THRESHOLDS.p }, counts, nodes };
  }

  const result: AnalysisResult = {
    kind: net.kind,
    directed: net.directed,
    weighted: net.weighted,
    nodes: basic.nodes,
    rows: basic.rows,
    cols: basic.cols,
    links: basic.links,
    totalWeight: basic.totalWeight,
    connectance: basic.connectance,
    isolated: basic.isolated,
    selfLoops: basic.selfLoops,
    modularity: {
      objective: opt.objective,
      Q: opt.Q,
      ...(opt.undefinedReason ? { undefinedReason: opt.undefinedReason } : {}),
      modules: reported.modules,
      isolatedNodes: reported.isolated,
      partition,
      restarts: {
        n: opt.restarts.n,
        min: opt.restarts.min,
        median: opt.restarts.median,
        max: opt.restarts.max,
        bestShare: shareReaching(opt.restarts.qs, opt.Q),
        qs: opt.restarts.qs,
        passes: opt.restarts.passes,
      },
      convergence: opt.convergence,
    },
    nodf: nest ? nest.nodf : null,
    nodfRows: nest ? nest.rows : null,
    nodfCols: nest ? nest.cols : null,
    roles,
    algorithm: {
      name: opt.algorithm.name,
      version: ENGINE_VERSION,
      seed,
      parameters: { ...opt.algorithm.parameters, nulls, nullModels: choice ? choice.models : [], primaryNull: choice ? choice.primary : null },
    },
    elapsedMs: 0,
  };
  if (choice) {
    result.null = primaryNull(nullFigures);
    result.nulls = nullFigures;
    result.nullModels = choice;
    if (nullSkippedReason) result.nullSkippedReason = nullSkippedReason;
  }
  result.elapsedMs = Math.round(now() - t0);
  return result;
}

/** Share of restarts whose Q reached the reported Q (within 1e-10·max(1, |Q|)); null without restarts. */
export function shareReaching(qs: readonly number[], Q: number | null): number | null {
  if (Q === null || qs.length === 0) return null;
  const tol = 1e-10 * Math.max(1, Math.abs(Q));
  let k = 0;
  for (const q of qs) if (q >= Q - tol) k++;
  return k / qs.length;
}

/** Tolerance under which a best Q counts as 0 (a tie with the one-module partition). */
export const ZERO_Q_TOLERANCE = 1e-12;

/**
 * The partition as reported: when the best Q is 0 (a tie with one module), all linked nodes form one
 * module; isolated nodes keep a module of their own. Modules are numbered in order of first appearance.
 * `modules` counts modules holding a linked node.
 */
export function reportedPartition(net: Network, part: ArrayLike<number>, Q: number | null): { partition: Int32Array; modules: number; isolated: number } {
  const n = part.length;
  const I = net.rowLabels.length;
  const linked = new Uint8Array(n);
  const bip = net.kind === "bipartite";
  for (let i = 0; i < I; i++) {
    for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) {
      linked[i] = 1;
      linked[bip ? I + net.colIdx[p] : net.colIdx[p]] = 1;
    }
  }
  const oneModule = Q !== null && Math.abs(Q) <= ZERO_Q_TOLERANCE;
  const out = new Int32Array(n);
  const renum = new Map<number, number>();
  let next = 0;
  const linkedModules = new Set<number>();
  let isolated = 0;
  for (let v = 0; v < n; v++) {
    if (!linked[v]) isolated++;
    const key = oneModule && linked[v] ? -1 : part[v];
    let m = renum.get(key);
    if (m === undefined) {
      m = next++;
      renum.set(key, m);
    }
    out[v] = m;
    if (linked[v]) linkedModules.add(m);
  }
  return { partition: out, modules: linkedModules.size, isolated };
}
