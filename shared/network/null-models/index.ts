/**
 * Null models for the significance of modularity: one entry point, `generateNull(model, net, rng)`, the
 * registry of what each model keeps and does not keep (`NULL_MODEL_INFO`), which models apply to a network
 * (`nullModelProblem`), and the standard set computed for each kind of data with its primary null
 * (`standardNullModels`). Each call draws one independent replicate from the injected seeded `Rng`
 * (random.ts); seed replicate r with `createRng(deriveSeed(runSeed, r))` so replicates can run on any
 * thread and still match a single-threaded run.
 *
 * A null network is the same kind of object as the observed one: weighted data gets weighted nulls
 * (structural models carry the observed weights in random order, weights.ts), binary data binary nulls,
 * and every model keeps at least the number of links. Models (one file each, opening with its definition,
 * what it keeps, its cost and its source):
 * - "curveball": fixed degrees — curveball for bipartite networks (./curveball.ts), the configuration model
 *   on simple graphs for one-mode networks (./configuration.ts). The primary null of every kind of data.
 * - "probabilistic": cell probability (k_i/J + d_j/I)/2 given exactly L links (./probabilistic.ts).
 * - "er": Erdős–Rényi type, exactly L links placed uniformly (./er.ts): keeps connectance only.
 * - "totals-connectance": fixed row and column totals and L, integer counts (./totals-connectance.ts).
 * - "patefield": fixed row and column totals of an integer matrix, connectance NOT kept (./patefield.ts).
 * - "weight-shuffle": the observed links with their weights in random order (./weight-shuffle.ts).
 * Every output is a valid canonical `Network` (sorted column indices, positive weights) with the input's
 * labels, kind and direction. An edge-less input is refused with `NetworkEngineError("no-links")`; a model
 * that does not fit the network with `NetworkEngineError("unsupported" | "non-integer-weights")`.
 */
import { NetworkEngineError } from "../errors";
import type { Rng } from "../random";
import type { Network } from "../types";
import { configurationNull } from "./configuration";
import { curveballNull, type CurveballOptions } from "./curveball";
import { erdosRenyiNull } from "./er";
import { patefieldNull, type PatefieldOptions } from "./patefield";
import { probabilisticNull, type ProbabilisticOptions } from "./probabilistic";
import { totalsConnectanceNull, type TotalsConnectanceOptions } from "./totals-connectance";
import { weightShuffleNull } from "./weight-shuffle";
import { withShuffledWeights } from "./weights";

export { curveballNull, defaultCurveballTrades, type CurveballOptions } from "./curveball";
export { configurationNull } from "./configuration";
export { erdosRenyiNull } from "./er";
export { patefieldNull, type PatefieldOptions } from "./patefield";
export { probabilisticNull, defaultProbabilisticMoves, type ProbabilisticOptions } from "./probabilistic";
export { totalsConnectanceNull, defaultTotalsConnectanceMoves, type TotalsConnectanceOptions } from "./totals-connectance";
export { weightShuffleNull } from "./weight-shuffle";
export { linkWeights, withShuffledWeights } from "./weights";

export type NullModelName = "curveball" | "probabilistic" | "er" | "totals-connectance" | "patefield" | "weight-shuffle";

export const NULL_MODELS: readonly NullModelName[] = ["curveball", "probabilistic", "er", "totals-connectance", "patefield", "weight-shuffle"];

export function isNullModelName(v: unknown): v is NullModelName {
  return typeof v === "string" && (NULL_MODELS as readonly string[]).includes(v);
}

export interface NullModelInfo {
  name: NullModelName;
  /** Short name shown beside every figure. */
  title: string;
  keeps: string;
  doesNotKeep: string;
  /**
   * True when the model calls some non-modular networks modular (measured in `npm run bench:significance`
   * and the calibration tests): it then never is a primary null, and `caution` says where it fails.
   */
  liberal: boolean;
  caution: string;
  source: string;
}

export const NULL_MODEL_INFO: Readonly<Record<NullModelName, NullModelInfo>> = {
  curveball: {
    name: "curveball",
    title: "fixed degrees",
    keeps: "every node's degree and the number of links (connectance); weighted data: the weight multiset, shuffled over the links",
    doesNotKeep: "node strengths of weighted data; anything beyond degrees",
    liberal: false,
    caution: "a network that is the only one with its degrees (e.g. perfectly nested) has no randomisation: z is undefined and p = 1",
    source: "curveball, Strona et al. 2014 (bipartite); configuration model on simple graphs, Carstens, Berger & Strona 2018 (one-mode)",
  },
  probabilistic: {
    name: "probabilistic",
    title: "probabilistic degrees",
    keeps: "the number of links exactly; degrees on average (cell probability (k_i/J + d_j/I)/2)",
    doesNotKeep: "the exact degrees (a perfectly nested matrix is loosened); strengths",
    liberal: true,
    caution: "nested matrices look modular against it (their exact degree order is not kept)",
    source: "Bascompte, Jordano, Melián & Olesen 2003 (null model 2), conditioned on L links",
  },
  er: {
    name: "er",
    title: "connectance only (Erdős–Rényi)",
    keeps: "the size and the number of links (connectance); weighted data: the weight multiset",
    doesNotKeep: "degrees and strengths",
    liberal: true,
    caution: "networks with uneven degrees, nested ones above all, look modular against it",
    source: "Erdős & Rényi 1959, G(n, L)",
  },
  "totals-connectance": {
    name: "totals-connectance",
    title: "fixed totals and connectance",
    keeps: "every row and column total, the number of links (connectance), integer counts",
    doesNotKeep: "degrees; which cells are links; the distribution of counts",
    liberal: true,
    caution: "overdispersed counts (a few large counts among many small ones) look modular against it, since its tables spread counts like independent units",
    source: "constraint set of Dormann et al. 2009 and Vázquez et al. 2007; Patefield's law conditioned on L",
  },
  patefield: {
    name: "patefield",
    title: "fixed totals (Patefield)",
    keeps: "every row and column total of an integer matrix",
    doesNotKeep: "connectance",
    liberal: true,
    caution: "it fills far more cells than a sparse count web, so count webs look modular against it",
    source: "Patefield 1981, AS 159",
  },
  "weight-shuffle": {
    name: "weight-shuffle",
    title: "shuffled weights",
    keeps: "every link (structure, degrees, connectance) and the weight multiset",
    doesNotKeep: "node strengths",
    liberal: false,
    caution: "it cannot detect modules that are in the structure itself: it only asks whether strong links sit within modules",
    source: "observed structure with permuted weights (Dormann et al. 2009)",
  },
};

/** "curveball (fixed degrees)" etc.: how a figure names its null model. */
export function nullModelLabel(model: NullModelName): string {
  const info = NULL_MODEL_INFO[model];
  return info ? `${info.title} (${model})` : String(model);
}

/** The kinds of data that have a standard set of null models. */
export type NullDataKind = "binary-bipartite" | "integer-bipartite" | "real-bipartite" | "one-mode-undirected" | "directed";

export const NULL_DATA_KIND_LABEL: Record<NullDataKind, string> = {
  "binary-bipartite": "binary bipartite",
  "integer-bipartite": "weighted bipartite, integer counts",
  "real-bipartite": "weighted bipartite, non-integer weights",
  "one-mode-undirected": "one-mode undirected",
  directed: "one-mode directed",
};

function allIntegers(net: Network): boolean {
  for (let e = 0; e < net.weights.length; e++) if (!Number.isInteger(net.weights[e])) return false;
  return true;
}

export function nullDataKind(net: Network): NullDataKind {
  if (net.kind === "unipartite") return net.directed ? "directed" : "one-mode-undirected";
  if (!net.weighted) return "binary-bipartite";
  return allIntegers(net) ? "integer-bipartite" : "real-bipartite";
}

/**
 * The standard set of null models the pipeline computes for a network, primary first (README "Null
 * models: the standard sets"). The primary controls for degrees and compares weighted with weighted; the
 * set always holds one model that keeps connectance only ("er", labelled liberal). Fixed degrees is the
 * primary of every kind: it is the one model that kept the false-positive rate at about 5 % on every
 * non-modular class (random binary, lognormal weights, integer counts, perfectly nested), see README.
 */
export function standardNullModels(net: Network): { primary: NullModelName; models: NullModelName[] } {
  const models: NullModelName[] = ["curveball"];
  switch (nullDataKind(net)) {
    case "binary-bipartite":
      models.push("probabilistic");
      break;
    case "integer-bipartite":
      models.push("totals-connectance");
      break;
    case "real-bipartite":
      models.push("weight-shuffle");
      break;
    case "directed":
      if (net.weighted && allIntegers(net)) models.push("totals-connectance");
      break;
    case "one-mode-undirected":
      break;
  }
  models.push("er");
  return { primary: models[0], models };
}

/** Why `model` does not fit `net` (a sentence), or null when it does. Edge-less networks are not judged here. */
export function nullModelProblem(model: NullModelName, net: Network): string | null {
  const undirected = net.kind === "unipartite" && !net.directed;
  switch (model) {
    case "curveball":
    case "probabilistic":
    case "er":
      return null;
    case "weight-shuffle":
      return net.weighted ? null : "it is binary: there are no weights to shuffle";
    case "patefield":
    case "totals-connectance":
      if (undirected) return "it is one-mode and undirected: a table with fixed totals would not stay symmetric";
      if (!net.weighted) {
        return model === "patefield"
          ? "it is binary: Patefield's tables hold counts, and binary Q needs binary nulls"
          : "it is binary: with every count 1 this is the fixed-degree null (curveball)";
      }
      if (!allIntegers(net)) return "its weights are not integers (interaction counts)";
      return null;
    default:
      return `"${String(model)}" is not a null model`;
  }
}

export type NullModelOptions = CurveballOptions & PatefieldOptions & ProbabilisticOptions & TotalsConnectanceOptions;

export function generateNull(model: NullModelName, net: Network, rng: Rng, options: NullModelOptions = {}): Network {
  if (net.rowPtr[net.rowLabels.length] === 0) {
    throw new NetworkEngineError("no-links", "A null model of a network with no links is undefined");
  }
  if (!isNullModelName(model)) throw new NetworkEngineError("bad-option", `Unknown null model ${String(model)}`);
  const problem = nullModelProblem(model, net);
  if (problem && !(model === "patefield" && options.allowRounding && net.weighted)) {
    throw new NetworkEngineError(problem.includes("integers") ? "non-integer-weights" : "unsupported", `The ${nullModelLabel(model)} null model does not fit this network: ${problem}`);
  }
  switch (model) {
    case "er":
      return withShuffledWeights(erdosRenyiNull(net, rng), net, rng);
    case "curveball":
      return net.kind === "unipartite" ? configurationNull(net, rng, options) : withShuffledWeights(curveballNull(net, rng, options), net, rng);
    case "probabilistic":
      return probabilisticNull(net, rng, options);
    case "totals-connectance":
      return totalsConnectanceNull(net, rng, options);
    case "patefield":
      return patefieldNull(net, rng, options);
    case "weight-shuffle":
      return weightShuffleNull(net, rng);
  }
}
