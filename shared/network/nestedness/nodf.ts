/**
 * Nestedness NODF (Almeida-Neto, Guimarães, Guimarães, Loyola & Ulrich 2008, Oikos 117:1227,
 * doi:10.1111/j.0030-1299.2008.16644.x), on presence/absence (every non-zero cell counts 1).
 *
 * Empty rows and columns are removed first. Rows are compared pairwise: for rows i, j with marginal totals
 * MT_i > MT_j (the pair in decreasing-total order), N_paired = 100 · |row_i ∩ row_j| / MT_j (the percentage
 * of the smaller row's presences found in the larger row); ties in marginal totals (MT_i = MT_j) give
 * N_paired = 0, as the definition requires ("decreasing fill"). Columns likewise.
 *   N_rows = mean of N_paired over all I(I−1)/2 row pairs;  N_cols over all J(J−1)/2 column pairs;
 *   NODF = (Σ row-pair values + Σ column-pair values) / (I(I−1)/2 + J(J−1)/2), in 0..100.
 * Comparing each pair by totals is the same as sorting by decreasing totals and taking upper-vs-lower
 * pairs, so no sort is needed and the result does not depend on the tie order.
 *
 * One-mode networks (our decision, README): the S × S adjacency matrix is treated as an incidence matrix
 * (rows = out-links, columns = in-links); for an undirected network N_rows = N_cols.
 * Returns null when fewer than two non-empty rows or columns remain (NODF undefined: no pairs on one side).
 * Overlaps come from a sparse product A·Aᵀ accumulated one row at a time: cost O(Σ_j d_j² + I²).
 */
import type { Network } from "../types";

export interface NodfResult {
  nodf: number;
  rows: number;
  cols: number;
}

export function nodf(net: Network): NodfResult | null {
  const I = net.rowLabels.length;
  const J = net.kind === "bipartite" ? net.colLabels.length : I;
  const { rowPtr, colIdx } = net;
  // Transpose (column -> rows), binary.
  const colPtr = new Uint32Array(J + 1);
  for (let p = 0; p < rowPtr[I]; p++) colPtr[colIdx[p] + 1]++;
  for (let j = 0; j < J; j++) colPtr[j + 1] += colPtr[j];
  const colRows = new Uint32Array(rowPtr[I]);
  const fill = colPtr.slice(0, J);
  for (let i = 0; i < I; i++) for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) colRows[fill[colIdx[p]]++] = i;

  const side = (ptrA: Uint32Array, idxA: Uint32Array, nA: number, ptrB: Uint32Array, idxB: Uint32Array): { sum: number; pairs: number } | null => {
    const keep: number[] = [];
    for (let a = 0; a < nA; a++) if (ptrA[a + 1] > ptrA[a]) keep.push(a);
    const n = keep.length;
    if (n < 2) return null;
    const rank = new Int32Array(nA).fill(-1);
    keep.forEach((a, r) => (rank[a] = r));
    const overlap = new Float64Array(n);
    let sum = 0;
    for (let r = 0; r < n; r++) {
      const a = keep[r];
      const da = ptrA[a + 1] - ptrA[a];
      for (let p = ptrA[a]; p < ptrA[a + 1]; p++) {
        const b = idxA[p];
        for (let q = ptrB[b]; q < ptrB[b + 1]; q++) {
          const other = rank[idxB[q]];
          if (other > r) overlap[other]++;
        }
      }
      for (let r2 = r + 1; r2 < n; r2++) {
        const o = overlap[r2];
        if (o === 0) continue;
        overlap[r2] = 0;
        const a2 = keep[r2];
        const d2 = ptrA[a2 + 1] - ptrA[a2];
        if (da === d2) continue;
        sum += (100 * o) / Math.min(da, d2);
      }
    }
    return { sum, pairs: (n * (n - 1)) / 2 };
  };
  const rowSide = side(rowPtr, colIdx, I, colPtr, colRows);
  const colSide = side(colPtr, colRows, J, rowPtr, colIdx);
  if (!rowSide || !colSide) return null;
  return {
    nodf: (rowSide.sum + colSide.sum) / (rowSide.pairs + colSide.pairs),
    rows: rowSide.sum / rowSide.pairs,
    cols: colSide.sum / colSide.pairs,
  };
}
