/**
 * Erdős–Rényi-type null model with the size and connectance of the observed network (Erdős & Rényi 1959,
 * Publ Math Debrecen 6:290; the "fixed number of links" form G(n, L)): exactly L links placed uniformly at
 * random among the possible cells, every placement equally likely. Output is binary (`weighted: false`).
 *
 * - bipartite: the same I rows and J columns; L links among the I·J cells.
 * - directed one-mode: the same S nodes; L links among the S² cells (cannibal links allowed, matching
 *   C = L/S², Martinez 1992).
 * - undirected one-mode: the same S nodes; the observed number of self-loops is placed among the S
 *   diagonal cells and the other L − loops links among the S(S−1)/2 node pairs, so L, the loop count and
 *   C = 2L'/(S(S−1)) are all kept.
 * Empty rows and columns (zero-degree nodes): the dimensions are kept; which nodes end up empty is left to
 * chance (observed empty nodes may receive links and others may end up empty). Zero-degree nodes add
 * nothing to Q or Q_B, so they need no special treatment (our decision, README).
 *
 * Sampling: rejection into a bitset (L ≤ half the cells) or its complement (L > half), so the expected
 * number of draws is below 2L; cost O(L log L) (sort), memory one bit per cell.
 */
import { NetworkEngineError } from "../errors";
import type { Rng } from "../random";
import type { Network } from "../types";
import { basicMetrics } from "../metrics/basic";
import { binaryNetworkFromCells } from "./structure";

export function erdosRenyiNull(net: Network, rng: Rng): Network {
  const I = net.rowLabels.length;
  if (net.kind === "bipartite") {
    const J = net.colLabels.length;
    const L = net.rowPtr[I];
    const cells = sampleCells(I, J, L, () => rng.nextInt(I) * J + rng.nextInt(J), null);
    return binaryNetworkFromCells(net, I, J, cells);
  }
  const S = I;
  if (net.directed) {
    const L = net.rowPtr[S];
    const cells = sampleCells(S, S, L, () => rng.nextInt(S) * S + rng.nextInt(S), null);
    return binaryNetworkFromCells(net, S, S, cells);
  }
  const m = basicMetrics(net);
  const loops = m.selfLoops;
  const pairs = m.links - loops;
  // Off-diagonal pairs keyed by i*S + j with i < j.
  const pairCells = sampleCells(S, S, pairs, () => {
    let i: number, j: number;
    do {
      i = rng.nextInt(S);
      j = rng.nextInt(S);
    } while (i === j);
    return i < j ? i * S + j : j * S + i;
  }, (key) => Math.floor(key / S) < key % S, (S * (S - 1)) / 2);
  const loopCells = sampleCells(S, S, loops, () => {
    const i = rng.nextInt(S);
    return i * S + i;
  }, (key) => Math.floor(key / S) === key % S, S);
  const all: number[] = [];
  for (const k of pairCells) {
    const i = Math.floor(k / S);
    const j = k % S;
    all.push(i * S + j, j * S + i);
  }
  for (const k of loopCells) all.push(k);
  const sorted = Float64Array.from(all).sort();
  return binaryNetworkFromCells(net, S, S, sorted);
}

/**
 * Draws `count` distinct cell keys (row * cols + col) with `draw` (uniform over the candidate keys) and
 * returns them sorted. `isCandidate`/`candidates` describe a restricted key set (null = every cell).
 */
function sampleCells(
  rows: number,
  cols: number,
  count: number,
  draw: () => number,
  isCandidate: ((key: number) => boolean) | null,
  candidates = rows * cols,
): Float64Array {
  if (count > candidates) {
    throw new NetworkEngineError("bad-network", `Cannot place ${count} links in ${candidates} possible cells`);
  }
  const total = rows * cols;
  const out = new Float64Array(count);
  if (count === 0) return out;
  const useBitset = total <= 2 ** 30;
  if (count <= candidates / 2 || !useBitset) {
    if (useBitset) {
      const bits = new Uint8Array(Math.ceil(total / 8));
      let n = 0;
      while (n < count) {
        const k = draw();
        const byte = k >>> 3;
        const bit = 1 << (k & 7);
        if (bits[byte] & bit) continue;
        bits[byte] |= bit;
        out[n++] = k;
      }
    } else {
      const seen = new Set<number>();
      let n = 0;
      while (n < count) {
        const k = draw();
        if (seen.has(k)) continue;
        seen.add(k);
        out[n++] = k;
      }
    }
    return out.sort();
  }
  // Dense: choose the cells to leave out, then list the others in order.
  const bits = new Uint8Array(Math.ceil(total / 8));
  let excluded = 0;
  const toExclude = candidates - count;
  while (excluded < toExclude) {
    const k = draw();
    const byte = k >>> 3;
    const bit = 1 << (k & 7);
    if (bits[byte] & bit) continue;
    bits[byte] |= bit;
    excluded++;
  }
  let n = 0;
  for (let k = 0; k < total && n < count; k++) {
    if (bits[k >>> 3] & (1 << (k & 7))) continue;
    if (isCandidate && !isCandidate(k)) continue;
    out[n++] = k;
  }
  return out;
}
