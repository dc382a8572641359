/**
 * Optimized modularity: the best partition over R seeded restarts of the Leiden-style optimizer
 * (leiden.ts; Traag, Waltman & van Eck 2019, doi:10.1038/s41598-019-41695-z), then, on small networks,
 * a simulated-annealing refinement of the best one (annealing.ts; Guimerà & Amaral 2005,
 * doi:10.1038/nature03288), then a last Leiden pass from the annealed partition.
 *
 * Objectives (quality-graph.ts): "newman" (Newman & Girvan 2004; weighted Newman 2004), "newman-directed"
 * (Leicht & Newman 2008) and "barber" (Barber 2007; weighted with marginal totals). Default: Barber for a
 * bipartite network, the directed form for a directed one-mode network, Newman–Girvan otherwise.
 *
 * Reproducibility: restart r draws all its random numbers from createRng(deriveSeed(seed, r)); the
 * annealing from createRng(deriveSeed(seed, ANNEALING_STREAM)). Restarts are independent, ties between
 * restarts go to the lowest r, and the returned partition is numbered 0..K−1 in order of first appearance
 * over the nodes (bipartite: rows first, then columns). Same input + settings + seed → same partition.
 *
 * Annealing bound: "auto" anneals when the network has at most ANNEALING_MAX_NODES = 200 nodes with
 * links. A temperature costs f·S² single-node moves (40,000 at S = 200) and a run takes a hundred to a few
 * hundred temperatures, i.e. about 0.2 s at S = 200 and growing as S²; every null replicate is optimized the
 * same way, so beyond this size annealing would dominate the cost of a significance test while Leiden
 * restarts alone already reach the optimum of test networks of that size.
 *
 * Edge cases: a network without links (or with total weight 0) has no defined modularity (m = 0 in the
 * denominators): Q is null with a reason, every node is its own module. Nodes without links cannot
 * change Q; each stays in a module of its own (counted in `modules`). Self-loops count as links inside
 * their node's module (and in the degrees, as in the objective's formula).
 */
import type { Network, Partition } from "../types";
import { createRng, deriveSeed } from "../random";
import { ENGINE_VERSION } from "../version";
import { anneal, ANNEALING_DEFAULTS } from "./annealing";
import { createWorkspace, leiden, LEVEL_CAP, PASS_CAP, REFINEMENT_THETA } from "./leiden";
import {
  buildQualityGraph,
  graphQuality,
  renumber,
  splitDisconnected,
  type OptimizerObjective,
} from "./quality-graph";

export const OPTIMIZER_NAME = "leiden-modularity+annealing";
export const DEFAULT_RESTARTS = 20;
export const DEFAULT_SEED = 1;
export const ANNEALING_MAX_NODES = 200;
/** Seed-path element of the annealing stream ("anne"), distinct from restart numbers in practice. */
export const ANNEALING_STREAM = 0x616e6e65;

export type AnnealingMode = "auto" | "on" | "off";

export interface OptimizeOptions {
  objective?: OptimizerObjective;
  restarts?: number;
  seed?: number;
  annealing?: AnnealingMode;
  /** Called after each restart with its number and Q (progress reports, benchmarks). */
  onRestart?: (restart: number, Q: number) => void;
}

export interface RestartSpread {
  n: number;
  /** Q of each Leiden restart, in restart order. */
  qs: number[];
  min: number | null;
  median: number | null;
  max: number | null;
  /** Share of restarts whose Q equals the best restart's Q (within 1e-10). */
  bestShare: number | null;
  /** Leiden passes of each restart, in restart order (the last pass of each raised Q no further). */
  passes: number[];
}

/**
 * Whether every Leiden run (restarts and the pass after annealing) ran until a whole pass no longer
 * raised Q. `capped` counts runs stopped by a safety cap instead (PASS_CAP passes or LEVEL_CAP levels in
 * a pass); it is 0 unless something is wrong, and a stored result that says otherwise should be looked at.
 */
export interface Convergence {
  converged: boolean;
  capped: number;
  passCap: number;
  levelCap: number;
}

export interface ModularityResult {
  objective: OptimizerObjective;
  /** Null when modularity is undefined (see `undefinedReason`). */
  Q: number | null;
  undefinedReason?: string;
  modules: number;
  partition: Partition;
  restarts: RestartSpread;
  convergence: Convergence;
  algorithm: {
    name: string;
    version: string;
    seed: number;
    parameters: {
      restarts: number;
      annealing: AnnealingMode;
      annealed: boolean;
      refinementTheta: number;
      /** Passes repeat until one no longer raises Q; these caps only guard against a defect. */
      passCap: number;
      levelCap: number;
      annealingF: number;
      annealingCooling: number;
      annealingMaxNodes: number;
    };
  };
}

export function defaultOptimizerObjective(net: Network): OptimizerObjective {
  if (net.kind === "bipartite") return "barber";
  return net.directed ? "newman-directed" : "newman";
}

function checkOptions(restarts: number, seed: number, annealing: string) {
  if (!Number.isInteger(restarts) || restarts < 1 || restarts > 100000) {
    throw new RangeError(`restarts must be an integer from 1 to 100000, got ${restarts}`);
  }
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) {
    throw new RangeError(`seed must be an integer from 0 to 4294967295, got ${seed}`);
  }
  if (annealing !== "auto" && annealing !== "on" && annealing !== "off") {
    throw new RangeError(`annealing must be "auto", "on" or "off", got ${String(annealing)}`);
  }
}

function convergence(capped: number): Convergence {
  return { converged: capped === 0, capped, passCap: PASS_CAP, levelCap: LEVEL_CAP };
}

function median(xs: number[]): number {
  const s = [...xs].sort((x, y) => x - y);
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}

/** Nodes with at least one link (a self-loop counts). */
function linkedNodes(net: Network): number {
  const R = net.rowLabels.length;
  const n = net.kind === "bipartite" ? R + net.colLabels.length : R;
  const off = net.kind === "bipartite" ? R : 0;
  const linked = new Uint8Array(n);
  for (let i = 0; i < R; i++) {
    if (net.rowPtr[i + 1] > net.rowPtr[i]) linked[i] = 1;
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) linked[net.colIdx[e] + off] = 1;
  }
  let count = 0;
  for (let v = 0; v < n; v++) count += linked[v];
  return count;
}

/**
 * Whether the annealing pass runs for `net` under `mode`: always for "on", never for "off", and for
 * "auto" when the network has at most ANNEALING_MAX_NODES linked nodes. Null replicates take the
 * decision of the observed network, so both get the same effort.
 */
export function annealingApplies(net: Network, mode: AnnealingMode = "auto"): boolean {
  return mode === "on" || (mode === "auto" && linkedNodes(net) <= ANNEALING_MAX_NODES);
}

export function optimizeModularity(net: Network, options: OptimizeOptions = {}): ModularityResult {
  const objective = options.objective ?? defaultOptimizerObjective(net);
  const restarts = options.restarts ?? DEFAULT_RESTARTS;
  const seed = options.seed ?? DEFAULT_SEED;
  const annealing = options.annealing ?? "auto";
  checkOptions(restarts, seed, annealing);
  const g = buildQualityGraph(net, objective);

  const algorithm = (annealed: boolean) => ({
    name: OPTIMIZER_NAME,
    version: ENGINE_VERSION,
    seed,
    parameters: {
      restarts,
      annealing,
      annealed,
      refinementTheta: REFINEMENT_THETA,
      passCap: PASS_CAP,
      levelCap: LEVEL_CAP,
      annealingF: ANNEALING_DEFAULTS.f,
      annealingCooling: ANNEALING_DEFAULTS.cooling,
      annealingMaxNodes: ANNEALING_MAX_NODES,
    },
  });

  if (!(g.totalW > 0) || !Number.isFinite(g.totalW)) {
    const partition = new Int32Array(g.n);
    for (let i = 0; i < g.n; i++) partition[i] = i;
    return {
      objective,
      Q: null,
      undefinedReason: "the network has no links (total weight 0), so modularity is undefined (division by m = 0)",
      modules: g.n,
      partition,
      restarts: { n: 0, qs: [], min: null, median: null, max: null, bestShare: null, passes: [] },
      convergence: convergence(0),
      algorithm: algorithm(false),
    };
  }

  const ws = createWorkspace(g.n);
  const qs: number[] = [];
  const passes: number[] = [];
  let capped = 0;
  let best: Int32Array | null = null;
  let bestQ = -Infinity;
  for (let r = 0; r < restarts; r++) {
    const res = leiden(g, createRng(deriveSeed(seed, r)), { workspace: ws });
    qs.push(res.Q);
    passes.push(res.passes);
    if (!res.converged) capped++;
    options.onRestart?.(r, res.Q);
    if (res.Q > bestQ + 1e-12) {
      bestQ = res.Q;
      best = res.membership;
    }
  }
  let memb = best!;
  let qMax = -Infinity;
  let qMin = Infinity;
  for (const q of qs) {
    if (q > qMax) qMax = q;
    if (q < qMin) qMin = q;
  }
  const tolShare = 1e-10;
  const bestShare = qs.filter((q) => q >= qMax - tolShare).length / qs.length;

  const doAnneal = annealingApplies(net, annealing);
  if (doAnneal) {
    const rng = createRng(deriveSeed(seed, ANNEALING_STREAM));
    const annealed = anneal(g, memb, rng);
    const polished = leiden(g, rng, { initial: annealed.membership, workspace: ws });
    if (!polished.converged) capped++;
    if (polished.Q > bestQ + 1e-12) memb = polished.membership;
  }
  memb = memb.slice();
  splitDisconnected(g, memb);
  const modules = renumber(memb);
  return {
    objective,
    Q: graphQuality(g, memb),
    modules,
    partition: memb,
    restarts: { n: restarts, qs, min: qMin, median: median(qs), max: qMax, bestShare, passes },
    convergence: convergence(capped),
    algorithm: algorithm(doAnneal),
  };
}
