/**
 * Basic size and density figures of a network.
 *
 * - nodes S: I + J for bipartite networks, else the number of nodes; rows I and cols J (bipartite only).
 * - links L: number of non-zero cells. An undirected one-mode link i–j (stored twice in the symmetric CSR)
 *   counts once; a self-loop (cannibal link) counts once. `selfLoops` reports how many there are.
 * - totalWeight: sum of the non-zero cells, undirected links counted once (equals L when unweighted).
 * - connectance (each as used in the ecological literature):
 *   bipartite C = L / (I·J);
 *   directed one-mode (food web) C = L / S², cannibal links counted (Martinez 1992, Am Nat 139:1208,
 *   doi:10.1086/285382);
 *   undirected one-mode C = 2L' / (S(S−1)), where L' = L − selfLoops: the S(S−1)/2 possible links of a
 *   simple graph exclude loops, so C stays in [0, 1] (our decision; self-loops are still counted in L).
 *   C is null when the denominator is 0 (no rows or no columns; S = 0; undirected S < 2).
 * - isolated: nodes with no link at all (bipartite: empty rows plus empty columns; one-mode: no in- or
 *   out-link; a node whose only link is a self-loop is not isolated).
 */
import type { Network } from "../types";

export interface BasicMetrics {
  nodes: number;
  rows: number | null;
  cols: number | null;
  links: number;
  totalWeight: number;
  connectance: number | null;
  isolated: number;
  /** Self-loops / cannibal links (always 0 for bipartite networks). */
  selfLoops: number;
}

export function basicMetrics(net: Network): BasicMetrics {
  const { rowPtr, colIdx, weights } = net;
  const I = net.rowLabels.length;
  const nnz = rowPtr[I];
  if (net.kind === "bipartite") {
    const J = net.colLabels.length;
    const colSeen = new Uint8Array(J);
    let total = 0;
    let emptyRows = 0;
    for (let i = 0; i < I; i++) if (rowPtr[i + 1] === rowPtr[i]) emptyRows++;
    for (let p = 0; p < nnz; p++) {
      colSeen[colIdx[p]] = 1;
      total += weights[p];
    }
    let emptyCols = 0;
    for (let j = 0; j < J; j++) if (!colSeen[j]) emptyCols++;
    return {
      nodes: I + J,
      rows: I,
      cols: J,
      links: nnz,
      totalWeight: total,
      connectance: I > 0 && J > 0 ? nnz / (I * J) : null,
      isolated: emptyRows + emptyCols,
      selfLoops: 0,
    };
  }
  const S = I;
  const touched = new Uint8Array(S);
  let loops = 0;
  let loopWeight = 0;
  let total = 0;
  for (let i = 0; i < S; i++) {
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const j = colIdx[p];
      touched[i] = 1;
      touched[j] = 1;
      total += weights[p];
      if (j === i) {
        loops++;
        loopWeight += weights[p];
      }
    }
  }
  let isolated = 0;
  for (let i = 0; i < S; i++) if (!touched[i]) isolated++;
  if (net.directed) {
    return {
      nodes: S,
      rows: null,
      cols: null,
      links: nnz,
      totalWeight: total,
      connectance: S > 0 ? nnz / (S * S) : null,
      isolated,
      selfLoops: loops,
    };
  }
  const offDiagonalLinks = (nnz - loops) / 2;
  return {
    nodes: S,
    rows: null,
    cols: null,
    links: offDiagonalLinks + loops,
    totalWeight: (total - loopWeight) / 2 + loopWeight,
    connectance: S > 1 ? (2 * offDiagonalLinks) / (S * (S - 1)) : null,
    isolated,
    selfLoops: loops,
  };
}
