/**
 * Modularity of a given partition: the quality functions the optimizer maximises and the pipeline reports.
 *
 * Definitions (A adjacency or incidence, weights ≥ 0; δ = 1 when two nodes share a module):
 * - "newman" — Newman–Girvan Q (Newman & Girvan 2004, Phys Rev E 69:026113, doi:10.1103/PhysRevE.69.026113;
 *   weighted form with strengths, Newman 2004, Phys Rev E 70:056131, doi:10.1103/PhysRevE.70.056131):
 *     Q = (1/2m) Σ_ij [A_ij − k_i k_j / 2m] δ(c_i, c_j) = Σ_c [ in_c / 2m − (K_c / 2m)² ],
 *   computed as the right-hand side: in_c = Σ_{i,j∈c} A_ij, K_c = Σ_{i∈c} k_i, 2m = Σ_ij A_ij.
 *   Self-loops of undirected networks follow the usual convention A_ii = 2w (a loop adds 2w to its node's
 *   degree and w to m), so Σ_ij A_ij = 2m still holds (as in networkx and graphology).
 *   On a directed network "newman" ignores direction: it evaluates B = A + Aᵀ (k_i = out + in strength).
 *   On a bipartite network it treats rows and columns as I + J nodes of one one-mode graph (a different
 *   number from Barber's Q_B — always store which objective was used).
 * - "newman-directed" — Leicht & Newman 2008, Phys Rev Lett 100:118703, doi:10.1103/PhysRevLett.100.118703:
 *     Q_d = (1/m) Σ_ij [A_ij − k_i^out k_j^in / m] δ(c_i, c_j) = Σ_c [ L_c/m − K_c^out K_c^in / m² ],
 *   m = Σ_ij A_ij (stored cells, cannibal links A_ii included once). On an undirected network this equals
 *   "newman" when there are no self-loops. On a bipartite network oriented rows → columns it equals Q_B.
 * - "barber" — Barber 2007, Phys Rev E 76:066102, doi:10.1103/PhysRevE.76.066102; weighted (quantitative)
 *   form with marginal totals as in Dormann & Strauss 2014, Methods Ecol Evol 5:90, doi:10.1111/2041-210X.12139
 *   and Beckett 2016, R Soc Open Sci 3:140536 (eq. 8), doi:10.1098/rsos.140536:
 *     Q_B = (1/m) Σ_i Σ_j [A_ij − k_i d_j / m] δ(g_i, h_j) = Σ_s [ L_s/m − K_s^R K_s^C / m² ],
 *   i over rows, j over columns, k_i row totals, d_j column totals, m total weight (or links). Bipartite only.
 *
 * Variant choices: weights are used when the network is weighted unless `{ weighted: false }` (then every
 * non-zero cell counts 1: the binary form). Partition: one module number per node; bipartite rows first,
 * then columns (length I + J). Cost O(L + N) with typed arrays.
 *
 * Edge cases (see README): an edge-less network (m = 0) has undefined Q — a `NetworkEngineError` with code
 * "no-links" is thrown, which the pipeline stores as null with that reason. A single module gives Q = 0
 * exactly (Σ K_c = 2m). Isolated nodes contribute nothing, wherever they are placed.
 */
import { NetworkEngineError } from "../errors";
import { checkPartition } from "../graph";
import type { Network, Partition } from "../types";

export type Objective = "newman" | "newman-directed" | "barber";

export interface ModularityOptions {
  /** Use stored weights (default true). `false` gives the binary form (every non-zero cell counts 1). */
  weighted?: boolean;
}

/** The objective the pipeline uses by default: Barber's Q_B for bipartite, Leicht–Newman for directed, else Newman–Girvan. */
export function defaultObjective(net: Network): Objective {
  if (net.kind === "bipartite") return "barber";
  return net.directed ? "newman-directed" : "newman";
}

/** Human-readable name of an objective with its source, for reports. */
export function objectiveLabel(objective: Objective): string {
  switch (objective) {
    case "newman":
      return "Newman–Girvan Q (Newman & Girvan 2004; weighted: Newman 2004)";
    case "newman-directed":
      return "Directed Q (Leicht & Newman 2008)";
    case "barber":
      return "Bipartite Q_B (Barber 2007; weighted: Dormann & Strauss 2014)";
  }
}

/** Modularity of `partition` under `objective` (default `defaultObjective(net)`). See the file header. */
export function modularity(
  net: Network,
  partition: Partition | ArrayLike<number>,
  objective: Objective = defaultObjective(net),
  options: ModularityOptions = {},
): number {
  const slots = checkPartition(net, partition);
  const useWeights = options.weighted !== false && net.weighted;
  const colOffset = net.kind === "bipartite" ? net.rowLabels.length : 0;
  switch (objective) {
    case "barber":
      if (net.kind !== "bipartite") {
        throw new NetworkEngineError(
          "objective-mismatch",
          "Barber's bipartite modularity needs a bipartite network (rows and columns are different node kinds)",
        );
      }
      return directedKernel(net, partition, slots, colOffset, useWeights);
    case "newman-directed":
      return directedKernel(net, partition, slots, colOffset, useWeights);
    case "newman":
      if (net.kind === "unipartite" && !net.directed) return symmetricKernel(net, partition, slots, useWeights);
      return undirectedViewKernel(net, partition, slots, colOffset, useWeights);
    default:
      throw new NetworkEngineError("bad-option", `Unknown objective ${String(objective)}`);
  }
}

function noLinks(): never {
  throw new NetworkEngineError("no-links", "Modularity is undefined for a network with no links (total weight 0)");
}

/** Σ_c [L_c/m − K_c^out K_c^in/m²] over stored cells: Leicht–Newman, and Barber with colOffset = I. */
function directedKernel(
  net: Network,
  part: ArrayLike<number>,
  slots: number,
  colOffset: number,
  useWeights: boolean,
): number {
  const outTot = new Float64Array(slots);
  const inTot = new Float64Array(slots);
  const { rowPtr, colIdx, weights } = net;
  const I = net.rowLabels.length;
  let m = 0;
  let inside = 0;
  for (let i = 0; i < I; i++) {
    const ci = part[i];
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const w = useWeights ? weights[p] : 1;
      const cj = part[colIdx[p] + colOffset];
      m += w;
      outTot[ci] += w;
      inTot[cj] += w;
      if (ci === cj) inside += w;
    }
  }
  if (m === 0) noLinks();
  let expected = 0;
  for (let c = 0; c < slots; c++) expected += outTot[c] * inTot[c];
  return inside / m - expected / (m * m);
}

/** Newman Q of an undirected one-mode network stored symmetrically (self-loops once, counted as A_ii = 2w). */
function symmetricKernel(net: Network, part: ArrayLike<number>, slots: number, useWeights: boolean): number {
  const tot = new Float64Array(slots);
  const { rowPtr, colIdx, weights } = net;
  const S = net.rowLabels.length;
  let twoM = 0;
  let inside = 0;
  for (let i = 0; i < S; i++) {
    const ci = part[i];
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const j = colIdx[p];
      const w0 = useWeights ? weights[p] : 1;
      const a = j === i ? 2 * w0 : w0;
      twoM += a;
      tot[ci] += a;
      if (ci === part[j]) inside += a;
    }
  }
  if (twoM === 0) noLinks();
  let expected = 0;
  for (let c = 0; c < slots; c++) expected += tot[c] * tot[c];
  return inside / twoM - expected / (twoM * twoM);
}

/** Newman Q of B = A + Aᵀ where every stored cell is one undirected link (directed one-mode, or bipartite). */
function undirectedViewKernel(
  net: Network,
  part: ArrayLike<number>,
  slots: number,
  colOffset: number,
  useWeights: boolean,
): number {
  const tot = new Float64Array(slots);
  const { rowPtr, colIdx, weights } = net;
  const I = net.rowLabels.length;
  let twoM = 0;
  let inside = 0;
  for (let i = 0; i < I; i++) {
    const ci = part[i];
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const w = useWeights ? weights[p] : 1;
      const cj = part[colIdx[p] + colOffset];
      twoM += 2 * w;
      tot[ci] += w;
      tot[cj] += w;
      if (ci === cj) inside += 2 * w;
    }
  }
  if (twoM === 0) noLinks();
  let expected = 0;
  for (let c = 0; c < slots; c++) expected += tot[c] * tot[c];
  return inside / twoM - expected / (twoM * twoM);
}
