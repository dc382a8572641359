/**
 * Public API of the optimizer and what builds on it: optimized modularity (optimize.ts), significance
 * against null replicates (../significance.ts), the full analysis of a network (../analyze.ts) and the
 * engine version (../version.ts). Internals (working graph, Leiden steps, annealing) stay private.
 */
export {
  optimizeModularity,
  annealingApplies,
  defaultOptimizerObjective,
  OPTIMIZER_NAME,
  DEFAULT_RESTARTS,
  DEFAULT_SEED,
  ANNEALING_MAX_NODES,
  type AnnealingMode,
  type OptimizeOptions,
  type ModularityResult,
  type RestartSpread,
  type Convergence,
} from "./optimize";
export * from "../significance";
export * from "../analyze";
export * from "../version";
