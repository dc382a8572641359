/**
 * Probabilistic degree-based null model ("null model 2" of Bascompte, Jordano, Melián & Olesen 2003,
 * PNAS 100:9383, doi:10.1073/pnas.1633576100): cell (i, j) is a link with probability
 *   p_ij = (k_i / J + d_j / I) / 2,
 * k_i the degree of row i and d_j of column j, so well-linked species keep being well linked on average.
 * Olesen et al. 2007 (PNAS 104:19891) used it to test the modularity of pollination networks.
 *
 * Conditioned on exactly L links (our decision, so that connectance is kept exactly, as every null of the
 * product must): the law of independent cells p_ij given that L of them are links is the conditional
 * Bernoulli (maximum-entropy) design P(A) ∝ Π_{(i,j) ∈ A} w_ij with w_ij = p_ij / (1 − p_ij) (Chen, Dempster
 * & Liu 1994, Biometrika 81:457 — from memory). We sample it with a Metropolis chain (Metropolis et al.
 * 1953; Hastings 1970) started from the observed network: propose moving a uniformly chosen link to a
 * uniformly chosen cell, ignore the proposal when that cell is a link, accept with min(1, w_new / w_old).
 * The proposal is symmetric, so the chain's stationary law is exactly the conditional Bernoulli law
 * (tested by exact enumeration). Cells with p = 1 (a full row meeting a full column) always stay links;
 * cells with p = 0 (an empty row meeting an empty column) never become links.
 *
 * Variants (our decisions, README):
 * - directed one-mode: S × S cells with p_ij = (k_i^out / S + k_j^in / S) / 2 (cannibal cells allowed, as
 *   in C = L/S²).
 * - undirected one-mode: the S(S−1)/2 pairs with p_ij = (k_i / (S−1) + k_j / (S−1)) / 2 (degrees without
 *   self-loops); self-loops stay where they are.
 * - weighted input: the structure is drawn as above, then carries the observed weights in random order
 *   (weights.ts).
 * Keeps: L (hence connectance) exactly, degrees in expectation (approximately, after conditioning).
 * Does not keep: the exact degrees (a nested matrix's perfectly ordered degrees are loosened), totals.
 * Cost: `moves` = max(1000, 30 × L) proposals of O(1) each, plus O(L log L) to sort the result; memory one
 * bit per cell (a hash set beyond 2^28 cells).
 */
import type { Rng } from "../random";
import type { Network } from "../types";
import { marginalTotals } from "../graph";
import { withShuffledWeights } from "./weights";
import { binaryNetworkFromCells } from "./structure";

export interface ProbabilisticOptions {
  /** Number of proposed moves (default max(1000, 30 × L)). */
  moves?: number;
}

export function defaultProbabilisticMoves(links: number): number {
  return Math.max(1000, 30 * links);
}

/** Cell space of one network kind: how many rows/cols, the weight of a cell key and a uniform draw. */
interface CellSpace {
  cols: number;
  size: number;
  weight(key: number): number;
  draw(rng: Rng): number;
}

export function probabilisticNull(net: Network, rng: Rng, options: ProbabilisticOptions = {}): Network {
  const I = net.rowLabels.length;
  const bip = net.kind === "bipartite";
  const J = bip ? net.colLabels.length : I;
  const undirected = !bip && !net.directed;
  const { rows: kr, cols: kc } = marginalTotals(net, true);
  const occupied: number[] = [];
  const loops: number[] = [];
  for (let i = 0; i < I; i++) {
    for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) {
      const j = net.colIdx[p];
      if (undirected) {
        if (j === i) loops.push(i * J + j);
        else if (j > i) occupied.push(i * J + j);
      } else occupied.push(i * J + j);
    }
  }
  let space: CellSpace;
  const odds = (p: number) => (p >= 1 ? Infinity : p / (1 - p));
  if (undirected) {
    const deg = Float64Array.from(kr);
    for (const key of loops) deg[Math.floor(key / J)] -= 1;
    const denom = Math.max(1, I - 1);
    space = {
      cols: J,
      size: (I * (I - 1)) / 2,
      weight: (key) => {
        const i = Math.floor(key / J);
        const j = key - i * J;
        return odds((deg[i] / denom + deg[j] / denom) / 2);
      },
      draw: (r) => {
        let i: number, j: number;
        do {
          i = r.nextInt(I);
          j = r.nextInt(I);
        } while (i === j);
        return i < j ? i * J + j : j * J + i;
      },
    };
  } else {
    space = {
      cols: J,
      size: I * J,
      weight: (key) => {
        const i = Math.floor(key / J);
        const j = key - i * J;
        return odds((kr[i] / J + kc[j] / I) / 2);
      },
      draw: (r) => r.nextInt(I) * J + r.nextInt(J),
    };
  }
  const L = occupied.length;
  const moves = options.moves ?? defaultProbabilisticMoves(L);
  const keys = Float64Array.from(occupied);
  if (L > 0 && L < space.size) {
    const member = memberSet(I * J);
    for (let k = 0; k < L; k++) member.add(keys[k]);
    for (let t = 0; t < moves; t++) {
      const slot = rng.nextInt(L);
      const from = keys[slot];
      const to = space.draw(rng);
      if (member.has(to)) continue;
      const wFrom = space.weight(from);
      const wTo = space.weight(to);
      if (wFrom === Infinity || wTo === 0) continue;
      if (wTo < wFrom && rng.next() * wFrom >= wTo) continue;
      member.delete(from);
      member.add(to);
      keys[slot] = to;
    }
  }
  const all: number[] = [];
  for (let k = 0; k < L; k++) {
    const key = keys[k];
    all.push(key);
    if (undirected) {
      const i = Math.floor(key / J);
      const j = key - i * J;
      all.push(j * J + i);
    }
  }
  for (const key of loops) all.push(key);
  const sorted = Float64Array.from(all).sort();
  return withShuffledWeights(binaryNetworkFromCells(net, I, J, sorted), net, rng);
}

interface KeySet {
  has(k: number): boolean;
  add(k: number): void;
  delete(k: number): void;
}

/** A bitset over [0, size) when it fits in 32 MB, else a hash set. */
export function memberSet(size: number): KeySet {
  if (size <= 2 ** 28) {
    const bits = new Uint8Array(Math.ceil(size / 8));
    return {
      has: (k) => (bits[Math.floor(k / 8)] & (1 << (k % 8))) !== 0,
      add: (k) => void (bits[Math.floor(k / 8)] |= 1 << (k % 8)),
      delete: (k) => void (bits[Math.floor(k / 8)] &= ~(1 << (k % 8))),
    };
  }
  const s = new Set<number>();
  return { has: (k) => s.has(k), add: (k) => void s.add(k), delete: (k) => void s.delete(k) };
}
