/**
 * Curveball null model: a random binary network with exactly the observed row and column degrees
 * (Strona, Nappo, Boccacci, Fattorini & San-Miguel-Ayanz 2014, Nat Commun 5:4114, doi:10.1038/ncomms5114).
 *
 * One trade: pick two distinct rows a, b uniformly; the columns both contain stay; the columns only one of
 * them contains (A−B and B−A) are pooled, shuffled, and dealt back, |A−B| to a and |B−A| to b. Every row
 * and column degree is unchanged. A chain of `trades` trades starts from the observed network; each call
 * is one independent chain (one replicate), so replicates seeded with `deriveSeed(seed, r)` are independent
 * and can run on any thread.
 *
 * Variants (our decisions, README):
 * - bipartite: rows of the incidence matrix, as in Strona et al. 2014.
 * - directed one-mode: rows of the adjacency matrix (out-neighbour sets); in a trade of rows a and b the
 *   columns a and b never move, so no cannibal link is created or removed (the loop count is kept) and
 *   every in- and out-degree is kept. Directed curveball with a fixed diagonal (Carstens, Berger & Strona
 *   2018, MethodsX 5:773, doi:10.1016/j.mex.2018.06.018); as they note, with a forbidden diagonal the
 *   chain may not reach every graph with the degree sequence (rare triangle reversals), a stated limitation.
 * - undirected one-mode: the symmetric trade of Carstens et al. 2018: neighbour sets N(a) \ {a, b} and
 *   N(b) \ {a, b}; a neighbour x that moves from a to b has a replaced by b in its own list. Degrees and
 *   self-loops are kept.
 * - weighted input: presence/absence is randomised; the output is binary (`weighted: false`).
 * - burn-in: `trades` defaults to max(1000, 5 × number of rows) (5 × S for one-mode networks).
 * Empty rows and columns keep degree 0. Cost O(trades × mean degree).
 */
import type { Rng } from "../random";
import type { Network } from "../types";
import { binaryNetwork } from "./structure";

export interface CurveballOptions {
  /** Number of trades in the chain (default max(1000, 5 × rows)). */
  trades?: number;
}

export function defaultCurveballTrades(net: Network): number {
  return Math.max(1000, 5 * net.rowLabels.length);
}

export function curveballNull(net: Network, rng: Rng, options: CurveballOptions = {}): Network {
  const I = net.rowLabels.length;
  const J = net.kind === "bipartite" ? net.colLabels.length : I;
  const trades = options.trades ?? defaultCurveballTrades(net);
  const rowPtr = net.rowPtr.slice();
  const slots = net.colIdx.slice(); // fixed slots per row: degrees never change
  const inA = new Int32Array(J).fill(-1);
  const inB = new Int32Array(J).fill(-1);
  const maxDeg = maxRowDegree(rowPtr, I);
  const pool = new Uint32Array(2 * maxDeg);
  const undirected = net.kind === "unipartite" && !net.directed;
  const oneMode = net.kind === "unipartite";

  if (I >= 2) {
    for (let t = 0; t < trades; t++) {
      const a = rng.nextInt(I);
      let b = rng.nextInt(I - 1);
      if (b >= a) b++;
      const a0 = rowPtr[a], a1 = rowPtr[a + 1], b0 = rowPtr[b], b1 = rowPtr[b + 1];
      if (a1 === a0 || b1 === b0) continue; // nothing to exchange
      for (let p = a0; p < a1; p++) inA[slots[p]] = t;
      for (let p = b0; p < b1; p++) inB[slots[p]] = t;
      let nA = 0;
      for (let p = a0; p < a1; p++) {
        const c = slots[p];
        if (inB[c] !== t && !(oneMode && (c === a || c === b))) pool[nA++] = c;
      }
      let nPool = nA;
      for (let p = b0; p < b1; p++) {
        const c = slots[p];
        if (inA[c] !== t && !(oneMode && (c === a || c === b))) pool[nPool++] = c;
      }
      if (nA === 0 || nPool === nA) continue; // one side has nothing exclusive: trade changes nothing
      // Partial Fisher–Yates: the first nA positions become a's new exclusive columns.
      for (let k = 0; k < nA; k++) {
        const r = k + rng.nextInt(nPool - k);
        const tmp = pool[k];
        pool[k] = pool[r];
        pool[r] = tmp;
      }
      // Record old membership before rewriting (inA/inB still describe the old rows).
      let q = 0;
      for (let p = a0; p < a1; p++) {
        const c = slots[p];
        if (inB[c] !== t && !(oneMode && (c === a || c === b))) slots[p] = pool[q++];
      }
      for (let p = b0; p < b1; p++) {
        const c = slots[p];
        if (inA[c] !== t && !(oneMode && (c === a || c === b))) slots[p] = pool[q++];
      }
      if (undirected) {
        // Neighbours that changed side must point to their new partner.
        for (let k = 0; k < nA; k++) {
          const x = pool[k];
          if (inA[x] !== t) replaceInRow(slots, rowPtr, x, b, a); // x moved from b to a
        }
        for (let k = nA; k < nPool; k++) {
          const x = pool[k];
          if (inB[x] !== t) replaceInRow(slots, rowPtr, x, a, b); // x moved from a to b
        }
      }
    }
  }
  for (let i = 0; i < I; i++) slots.subarray(rowPtr[i], rowPtr[i + 1]).sort();
  return binaryNetwork(net, rowPtr, slots);
}

function maxRowDegree(rowPtr: Uint32Array, I: number): number {
  let m = 0;
  for (let i = 0; i < I; i++) m = Math.max(m, rowPtr[i + 1] - rowPtr[i]);
  return m;
}

function replaceInRow(slots: Uint32Array, rowPtr: Uint32Array, row: number, from: number, to: number): void {
  for (let p = rowPtr[row]; p < rowPtr[row + 1]; p++) {
    if (slots[p] === from) {
      slots[p] = to;
      return;
    }
  }
  throw new Error(`curveball: internal error, ${from} not found in row ${row}`);
}
