/**
 * The engine's full analysis of one network, as one plain JSON-ready object: the metrics pipeline of the
 * server and the command-line tool (`npm run analyze -- FILE --json`) both produce exactly this.
 *
 * Contents: size and connectance (metrics/basic.ts), optimized modularity with its partition and the spread
 * over restarts (optimizer/), significance against N null replicates (significance.ts), node roles
 * (roles/roles.ts) of the best partition and nestedness NODF (nestedness/nodf.ts), the algorithm, version
 * and seed, and the elapsed time.
 *
 * Defaults (exposed as ANALYZE_DEFAULTS): 20 restarts, 100 null replicates, seed 1, annealing "auto",
 * objective by network kind (Barber's Q_B for bipartite, Leicht–Newman for directed, Newman–Girvan
 * otherwise). Default null model: "patefield" (fixed row and column totals) for weighted networks whose
 * weights are all integers (interaction counts) when the model applies (bipartite or directed), so that
 * quantitative Q is compared with quantitative nulls; "er" (same size and connectance, the product's
 * default) for binary networks and for weights Patefield cannot take (non-integer, or an undirected
 * one-mode network).
 *
 * Partition in the output: node label → module number (0-based, numbered in order of first appearance,
 * rows first). In a bipartite network a label used by both a row node and a column node (two different
 * nodes) appears as "label" for the row and "label (column)" for the column.
 *
 * Pure: no I/O. `nullQs` lets a caller that computed the replicates elsewhere (worker threads calling
 * nullReplicateQ) pass them in; the result is then identical to computing them here.
 */
import { basicMetrics } from "./metrics/basic";
import { nodf } from "./nestedness/nodf";
import type { NullModelName } from "./null-models/index";
import { optimizeModularity, type AnnealingMode, DEFAULT_RESTARTS, DEFAULT_SEED } from "./optimizer/optimize";
import type { OptimizerObjective } from "./optimizer/quality-graph";
import { nodeRoles, ROLE_THRESHOLDS, type NodeRoleName } from "./roles/roles";
import { nullReplicateQ, summarizeNulls, type NullSummary } from "./significance";
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
  nullModel?: NullModelName;
  seed?: number;
  annealing?: AnnealingMode;
  /** Null Q values computed elsewhere for replicates 0..N−1 with the same settings (see nullReplicateQ). */
  nullQs?: readonly number[];
}

export interface AnalysisRole {
  label: string;
  level: "row" | "col" | null;
  module: number;
  degree: number;
  z: number | null;
  participation: number | null;
  role: NodeRoleName | null;
}

export interface AnalysisResult {
  kind: Network["kind"];
  directed: boolean;
  weighted: boolean;
  nodes: number;
  rows: number | null;
  cols: number | null;
  links: number;
  totalWeight: number;
  connectance: number | null;
  isolated: number;
  selfLoops: number;
  modularity: {
    objective: OptimizerObjective;
    Q: number | null;
    undefinedReason?: string;
    modules: number;
    partition: Record<string, number>;
    restarts: { n: number; min: number | null; median: number | null; max: number | null; bestShare: number | null; qs: number[] };
  };
  /** Present when nulls > 0; null (with nullSkippedReason) when modularity is undefined. */
  null?: (NullSummary & { model: NullModelName }) | null;
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

/** Default null model for a network (see the file header). */
export function defaultNullModel(net: Network): NullModelName {
  if (!net.weighted) return "er";
  if (net.kind === "unipartite" && !net.directed) return "er";
  for (let e = 0; e < net.weights.length; e++) if (!Number.isInteger(net.weights[e])) return "er";
  return "patefield";
}

function checkSettings(s: AnalyzeSettings, nulls: number) {
  if (!Number.isInteger(nulls) || nulls < 0 || nulls > 100000) {
    throw new RangeError(`nulls must be an integer from 0 to 100000, got ${nulls}`);
  }
  if (s.nullModel !== undefined && !["er", "curveball", "patefield"].includes(s.nullModel)) {
    throw new RangeError(`null model must be "er", "curveball" or "patefield", got ${String(s.nullModel)}`);
  }
  if (s.nullQs !== undefined && s.nullQs.length !== nulls) {
    throw new RangeError(`nullQs has ${s.nullQs.length} values but nulls is ${nulls}`);
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
  const nulls = settings.nulls ?? settings.nullQs?.length ?? ANALYZE_DEFAULTS.nulls;
  const seed = settings.seed ?? ANALYZE_DEFAULTS.seed;
  const annealing = settings.annealing ?? ANALYZE_DEFAULTS.annealing;
  checkSettings(settings, nulls);
  const nullModel = settings.nullModel ?? defaultNullModel(net);

  const basic = basicMetrics(net);
  const opt = optimizeModularity(net, { objective: settings.objective, restarts, seed, annealing });
  const labels = nodeLabels(net);
  const partition: Record<string, number> = {};
  for (let v = 0; v < labels.length; v++) partition[labels[v]] = opt.partition[v];

  let nullPart: AnalysisResult["null"];
  let nullSkippedReason: string | undefined;
  if (nulls > 0) {
    if (opt.Q === null) {
      nullPart = null;
      nullSkippedReason = "modularity is undefined for this network, so its significance is too";
    } else {
      const qs: number[] = [];
      if (settings.nullQs) qs.push(...settings.nullQs);
      else {
        for (let r = 0; r < nulls; r++) {
          const q = nullReplicateQ(net, { model: nullModel, seed, replicate: r, restarts, objective: opt.objective, annealing });
          if (q !== null) qs.push(q);
        }
      }
      nullPart = { model: nullModel, ...summarizeNulls(opt.Q, qs) };
    }
  }

  let roles: AnalysisResult["roles"] = null;
  if (opt.Q !== null) {
    const counts: Record<NodeRoleName, number> = { peripheral: 0, connector: 0, "module-hub": 0, "network-hub": 0 };
    const nodes = nodeRoles(net, opt.partition).map((r) => {
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
  const nest = nodf(net);

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
      modules: opt.modules,
      partition,
      restarts: {
        n: opt.restarts.n,
        min: opt.restarts.min,
        median: opt.restarts.median,
        max: opt.restarts.max,
        bestShare: opt.restarts.bestShare,
        qs: opt.restarts.qs,
      },
    },
    nodf: nest ? nest.nodf : null,
    nodfRows: nest ? nest.rows : null,
    nodfCols: nest ? nest.cols : null,
    roles,
    algorithm: {
      name: opt.algorithm.name,
      version: ENGINE_VERSION,
      seed,
      parameters: { ...opt.algorithm.parameters, nulls, nullModel: nulls > 0 ? nullModel : null },
    },
    elapsedMs: 0,
  };
  if (nulls > 0) {
    result.null = nullPart;
    if (nullSkippedReason) result.nullSkippedReason = nullSkippedReason;
  }
  result.elapsedMs = Math.round(now() - t0);
  return result;
}
