/**
 * Fixed totals and connectance: a random table of non-negative integers (interaction counts) with exactly
 * the observed row and column totals AND exactly the observed number of non-zero cells (links), so that
 * neither the species' totals nor connectance can explain a difference in Q. Quantitative webs need both:
 * Patefield's fixed totals alone fill about three times as many cells as a sparse count web, which makes
 * every observed count web look modular (Dormann, Fründ, Blüthgen & Gruber 2009, Open Ecol J 2:7 —
 * nulls keeping marginal totals and connectance; Vázquez et al. 2007, Oikos 116:1120).
 *
 * Definition (our formulation of that constraint set): the law of Patefield's null (tables with the
 * observed totals drawn under independence, P(X) ∝ 1 / Π x_ij!; Patefield 1981, doi:10.2307/2346669)
 * conditioned on exactly L non-zero cells. Sampler: a Metropolis–Hastings chain (Metropolis et al. 1953;
 * Hastings 1970) of 2 × 2 moves, which keep every row and column total (the basic moves of contingency
 * tables, Diaconis & Sturmfels 1998, Ann Stat 26:363 — from memory), started from the observed table:
 *   pick two non-zero cells (a, j) and (b, i) uniformly, a ≠ b, i ≠ j; pick d uniformly in
 *   1..min(x_aj, x_bi); move d units from (a, j) to (a, i) and from (b, i) to (b, j).
 * A move that changes the number of non-zero cells is rejected; otherwise it is accepted with
 *   min(1, π(X′)/π(X) · q(X′→X)/q(X→X′)),  π ∝ 1/Π x!,  q(X→X′) = 1/(L² · min(x_aj, x_bi)),
 * so the stationary law is exactly the conditioned Patefield law (tested by exact enumeration on small
 * tables). Moving d units at once lets the chain pass between tables whose unit steps would change L.
 * Stated limitation: we do not prove that these moves connect every table with the constraints (a chain
 * that cannot leave the observed table returns it, which is conservative: z is then unstable or p = 1).
 *
 * Keeps: every row and column total, L (hence connectance), the total weight, integer weights.
 * Does not keep: degrees, which cells are links, the weight distribution.
 * Variants: bipartite incidence matrices and directed one-mode adjacency matrices (an S × S table whose
 * diagonal cells may change, as for Patefield); an undirected one-mode network is refused (the table would
 * not stay symmetric); non-integer weights are refused (`non-integer-weights`), and so is binary data
 * (with L equal to the total, every table is binary: this is then the fixed-degree null, use curveball).
 * Cost: `moves` = max(2000, 30 × L) proposals, each O(1) with a dense count table (≤ 4 M cells) or a hash
 * map; O(L log L) to write the result.
 */
import { NetworkEngineError } from "../errors";
import type { Rng } from "../random";
import type { Network } from "../types";

export interface TotalsConnectanceOptions {
  /** Number of proposed moves (default max(2000, 30 × L)). */
  moves?: number;
}

export function defaultTotalsConnectanceMoves(links: number): number {
  return Math.max(2000, 30 * links);
}

interface CountTable {
  get(key: number): number;
  set(key: number, v: number): void;
}

function countTable(size: number): CountTable {
  if (size <= 4 * 1024 * 1024) {
    const a = new Int32Array(size);
    return { get: (k) => a[k], set: (k, v) => void (a[k] = v) };
  }
  const m = new Map<number, number>();
  return { get: (k) => m.get(k) ?? 0, set: (k, v) => void (v === 0 ? m.delete(k) : m.set(k, v)) };
}

export function totalsConnectanceNull(net: Network, rng: Rng, options: TotalsConnectanceOptions = {}): Network {
  if (net.kind === "unipartite" && !net.directed) {
    throw new NetworkEngineError("unsupported", "The fixed-totals-and-connectance null needs a bipartite or directed network; an undirected one-mode table would lose its symmetry");
  }
  const I = net.rowLabels.length;
  const J = net.kind === "bipartite" ? net.colLabels.length : I;
  const { rowPtr, colIdx, weights } = net;
  const L = rowPtr[I];
  for (let p = 0; p < L; p++) {
    const w = weights[p];
    if (!Number.isInteger(w)) {
      throw new NetworkEngineError("non-integer-weights", `The fixed-totals-and-connectance null needs integer weights (interaction counts); a cell holds ${w}`);
    }
  }
  if (!net.weighted) {
    throw new NetworkEngineError("unsupported", "The fixed-totals-and-connectance null of binary data is the fixed-degree null: use curveball");
  }
  const table = countTable(I * J);
  // Non-zero cells in a list with each cell's slot, for uniform choice and O(1) updates.
  const cells = new Float64Array(L);
  const slotOf = new Map<number, number>();
  let total = 0;
  for (let i = 0, n = 0; i < I; i++) {
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++, n++) {
      const key = i * J + colIdx[p];
      table.set(key, weights[p]);
      cells[n] = key;
      slotOf.set(key, n);
      total += weights[p];
    }
  }
  const lf = logFactorials(Math.min(total, 1 << 22));
  const moves = options.moves ?? defaultTotalsConnectanceMoves(L);
  if (L >= 2) {
    for (let t = 0; t < moves; t++) {
      const s1 = rng.nextInt(L);
      const s2 = rng.nextInt(L);
      const kaj = cells[s1];
      const kbi = cells[s2];
      const a = Math.floor(kaj / J);
      const j = kaj - a * J;
      const b = Math.floor(kbi / J);
      const i = kbi - b * J;
      if (a === b || i === j) continue;
      const xaj = table.get(kaj);
      const xbi = table.get(kbi);
      const kai = a * J + i;
      const kbj = b * J + j;
      const xai = table.get(kai);
      const xbj = table.get(kbj);
      const dMax = Math.min(xaj, xbi);
      const d = 1 + rng.nextInt(dMax);
      // Non-zero cells after the move: the two sources may empty, the two targets may fill.
      const change = (xai === 0 ? 1 : 0) + (xbj === 0 ? 1 : 0) - (xaj === d ? 1 : 0) - (xbi === d ? 1 : 0);
      if (change !== 0) continue;
      const logRatio =
        lf(xaj) + lf(xbi) + lf(xai) + lf(xbj) - lf(xaj - d) - lf(xbi - d) - lf(xai + d) - lf(xbj + d) +
        Math.log(dMax) - Math.log(Math.min(xai + d, xbj + d));
      if (logRatio < 0 && Math.log(rng.next()) >= logRatio) continue;
      table.set(kaj, xaj - d);
      table.set(kbi, xbi - d);
      table.set(kai, xai + d);
      table.set(kbj, xbj + d);
      // Keep the list of non-zero cells: an emptied source hands its slot to a newly filled target.
      const freed: number[] = [];
      if (xaj === d) freed.push(s1);
      if (xbi === d) freed.push(s2);
      const filled: number[] = [];
      if (xai === 0) filled.push(kai);
      if (xbj === 0) filled.push(kbj);
      for (let k = 0; k < freed.length; k++) {
        slotOf.delete(cells[freed[k]]);
        cells[freed[k]] = filled[k];
        slotOf.set(filled[k], freed[k]);
      }
    }
  }
  const sorted = Float64Array.from(cells).sort();
  const outPtr = new Uint32Array(I + 1);
  const outCol = new Uint32Array(L);
  const outW = new Float64Array(L);
  let weighted = false;
  for (let p = 0; p < L; p++) {
    const key = sorted[p];
    const r = Math.floor(key / J);
    outCol[p] = key - r * J;
    outW[p] = table.get(key);
    if (outW[p] !== 1) weighted = true;
    outPtr[r + 1]++;
  }
  for (let r = 0; r < I; r++) outPtr[r + 1] += outPtr[r];
  return { kind: net.kind, directed: net.directed, weighted, rowLabels: net.rowLabels, colLabels: net.colLabels, rowPtr: outPtr, colIdx: outCol, weights: outW };
}

/** ln(n!) from a table up to `size`, Stirling's series beyond (relative error < 1e-15). */
export function logFactorials(size: number): (n: number) => number {
  const table = new Float64Array(size + 1);
  for (let n = 2; n <= size; n++) table[n] = table[n - 1] + Math.log(n);
  return (n: number) => {
    if (n <= size) return table[n];
    const inv = 1 / n;
    const inv2 = inv * inv;
    return n * Math.log(n) - n + 0.5 * Math.log(2 * Math.PI * n) + inv * (1 / 12 - inv2 * (1 / 360 - inv2 / 1260));
  };
}
