/**
 * Weighted data meets weighted nulls: the observed link weights, shuffled over the links of a null
 * structure. Used by every structural null model (Erdős–Rényi type, curveball, probabilistic) when the
 * observed network is weighted, so that weighted Q is compared with weighted nulls and binary Q with
 * binary nulls (our rule; README "Null models").
 *
 * Definition: take the multiset of observed link weights (an undirected one-mode link counted once,
 * self-loops included), put it in a uniformly random order (Fisher–Yates; Knuth, TAOCP vol. 2, §3.4.2)
 * and give it to the null structure's links in CSR order. Keeps: the weight multiset exactly, hence the
 * number of links, the total weight and the weight distribution. Does not keep: which weight sits on
 * which link, hence node strengths (marginal totals). Cost O(L log d) (the mirror of an undirected link is
 * found by binary search in its row).
 */
import { NetworkEngineError } from "../errors";
import type { Rng } from "../random";
import type { Network } from "../types";

/** Weight of each link: every stored cell, except that an undirected link i–j (i ≠ j) counts once. */
export function linkWeights(net: Network): Float64Array {
  const I = net.rowLabels.length;
  const undirected = net.kind === "unipartite" && !net.directed;
  const out: number[] = [];
  for (let i = 0; i < I; i++) {
    for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) {
      if (undirected && net.colIdx[p] < i) continue;
      out.push(net.weights[p]);
    }
  }
  return Float64Array.from(out);
}

/** Uniformly random permutation in place (Fisher–Yates). */
export function shuffleInPlace(a: Float64Array | Uint32Array, rng: Rng): void {
  for (let k = a.length - 1; k > 0; k--) {
    const r = rng.nextInt(k + 1);
    const t = a[k];
    a[k] = a[r];
    a[r] = t;
  }
}

/**
 * `structure` (a binary null of `observed`, with the same number of links) carrying the observed weights
 * in random order. A binary observed network returns `structure` unchanged.
 */
export function withShuffledWeights(structure: Network, observed: Network, rng: Rng): Network {
  if (!observed.weighted) return structure;
  const w = linkWeights(observed);
  const I = structure.rowLabels.length;
  const undirected = structure.kind === "unipartite" && !structure.directed;
  const { rowPtr, colIdx } = structure;
  const out = new Float64Array(colIdx.length);
  let links = 0;
  for (let i = 0; i < I; i++) for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) if (!(undirected && colIdx[p] < i)) links++;
  if (links !== w.length) {
    throw new NetworkEngineError("bad-network", `internal error: the null structure has ${links} links, the observed network ${w.length}`);
  }
  shuffleInPlace(w, rng);
  let k = 0;
  for (let i = 0; i < I; i++) {
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) if (!(undirected && colIdx[p] < i)) out[p] = w[k++];
  }
  if (undirected) {
    for (let i = 0; i < I; i++) {
      for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
        const j = colIdx[p];
        if (j < i) out[p] = out[cellPosition(rowPtr, colIdx, j, i)];
      }
    }
  }
  let weighted = false;
  for (let p = 0; p < out.length; p++) if (out[p] !== 1) { weighted = true; break; }
  return { ...structure, weighted, weights: out };
}

function cellPosition(rowPtr: Uint32Array, colIdx: Uint32Array, i: number, j: number): number {
  let lo = rowPtr[i];
  let hi = rowPtr[i + 1] - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    if (colIdx[mid] === j) return mid;
    if (colIdx[mid] < j) lo = mid + 1;
    else hi = mid - 1;
  }
  throw new NetworkEngineError("bad-network", `internal error: undirected null is not symmetric at (${i}, ${j})`);
}
