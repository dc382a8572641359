/**
 * Patefield null model: a random r × c table of non-negative integers with exactly the observed row and
 * column totals, drawn from the distribution of tables under independence with fixed margins (the
 * multiple hypergeometric). Patefield, W. M. (1981). Algorithm AS 159: An efficient method of generating
 * random R × C tables with given row and column totals. Applied Statistics 30:91–97, doi:10.2307/2346669.
 *
 * Method (AS 159): cells are filled row by row, column by column. Given what remains of row l's total
 * (ia), of column m's total (id, over the rows not yet filled) and the total of columns m.. (ie), the cell
 * is hypergeometric:
 *   P(x) = C(id, x) · C(ie − id, ia − x) / C(ie, ia),  max(0, ia + id − ie) ≤ x ≤ min(ia, id),
 * sampled by inversion starting at the mode and stepping outward alternately up and down (the search of
 * AS 159), with probabilities from log-factorials and the ratio recurrences. The last column of a row and
 * the last row take what remains. Rows and columns with total 0 stay empty. A row whose total is small
 * compared with the number of columns is drawn instead unit by unit from the urn of remaining column units
 * (without replacement, via a Fenwick tree): this is the same conditional law (multivariate
 * hypergeometric) that AS 159 decomposes cell by cell, at O(total · log J) cost instead of O(J).
 *
 * Variants (our decisions, README): bipartite incidence matrices and directed one-mode adjacency matrices
 * (seen as an S × S table: out- and in-strengths kept; cannibal cells may change) are supported; an
 * undirected one-mode network is refused (the table would not stay symmetric). Weights must be integers
 * (interaction counts); non-integer weights are refused unless `allowRounding` (each cell rounded to the
 * nearest integer first; cells that round to 0 are dropped). Binary input is allowed: the output may then
 * hold counts above 1 (`weighted` when any cell differs from 1).
 */
import { NetworkEngineError } from "../errors";
import type { Rng } from "../random";
import type { Network } from "../types";

export interface PatefieldOptions {
  /** Round non-integer weights to the nearest integer instead of refusing them (default false). */
  allowRounding?: boolean;
}

export function patefieldNull(net: Network, rng: Rng, options: PatefieldOptions = {}): Network {
  if (net.kind === "unipartite" && !net.directed) {
    throw new NetworkEngineError(
      "unsupported",
      "Patefield's fixed-totals null model needs a bipartite or directed network; an undirected one-mode network would lose its symmetry",
    );
  }
  const I = net.rowLabels.length;
  const J = net.kind === "bipartite" ? net.colLabels.length : I;
  const rowTot = new Float64Array(I);
  const colTot = new Float64Array(J);
  const { rowPtr, colIdx, weights } = net;
  for (let i = 0; i < I; i++) {
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      let w = weights[p];
      if (!Number.isInteger(w)) {
        if (!options.allowRounding) {
          throw new NetworkEngineError(
            "non-integer-weights",
            `Patefield's null model needs integer weights (interaction counts); row ${i + 1} (${net.rowLabels[i]}) has ${w}`,
          );
        }
        w = Math.round(w);
      }
      rowTot[i] += w;
      colTot[colIdx[p]] += w;
    }
  }
  const rows: number[] = [];
  for (let i = 0; i < I; i++) if (rowTot[i] > 0) rows.push(i);
  const cols: number[] = [];
  for (let j = 0; j < J; j++) if (colTot[j] > 0) cols.push(j);
  let total = 0;
  for (const i of rows) total += rowTot[i];

  const lf = logFactorialTable(total);
  const nc = cols.length;
  const jwork = new Float64Array(nc);
  for (let m = 0; m < nc; m++) jwork[m] = colTot[cols[m]];

  const outPtr = new Uint32Array(I + 1);
  let cap = Math.max(16, rowPtr[I]);
  let outCol = new Uint32Array(cap);
  let outW = new Float64Array(cap);
  let nnz = 0;
  const push = (j: number, w: number) => {
    if (nnz === cap) {
      cap *= 2;
      const c2 = new Uint32Array(cap);
      c2.set(outCol);
      outCol = c2;
      const w2 = new Float64Array(cap);
      w2.set(outW);
      outW = w2;
    }
    outCol[nnz] = j;
    outW[nnz] = w;
    nnz++;
  };

  const tree = new Fenwick(jwork);
  const hits = new Float64Array(nc);
  const touched: number[] = [];
  const logNc = Math.max(1, Math.ceil(Math.log2(nc + 1)));
  let remaining = total; // Σ jwork
  let r = 0;
  for (let i = 0; i < I; i++) {
    if (r < rows.length && rows[r] === i) {
      if (r === rows.length - 1) {
        for (let m = 0; m < nc; m++) if (jwork[m] > 0) push(cols[m], jwork[m]);
      } else if (rowTot[i] * logNc < URN_FACTOR * nc && remaining <= 4294967296) {
        // Small row total: draw its units one by one without replacement from the urn of remaining
        // column units (Fenwick tree over jwork) — the same multivariate hypergeometric law.
        let ia = rowTot[i];
        let pool = remaining;
        while (ia > 0) {
          const m = tree.find(rng.nextInt(pool));
          if (hits[m] === 0) touched.push(m);
          hits[m]++;
          tree.add(m, -1);
          jwork[m]--;
          pool--;
          ia--;
        }
        touched.sort((x, y) => x - y);
        for (const m of touched) {
          push(cols[m], hits[m]);
          hits[m] = 0;
        }
        touched.length = 0;
        remaining -= rowTot[i];
      } else {
        let ia = rowTot[i];
        let ie = remaining;
        for (let m = 0; m < nc && ia > 0; m++) {
          const id = jwork[m];
          let x: number;
          if (m === nc - 1) x = ia;
          else x = hypergeometric(ia, id, ie, lf, rng);
          ie -= id;
          if (x > 0) {
            push(cols[m], x);
            jwork[m] -= x;
            tree.add(m, -x);
            ia -= x;
          }
        }
        remaining -= rowTot[i];
      }
      r++;
    }
    outPtr[i + 1] = nnz;
  }
  const w = outW.slice(0, nnz);
  let weighted = false;
  for (let p = 0; p < nnz; p++) if (w[p] !== 1) { weighted = true; break; }
  return {
    kind: net.kind,
    directed: net.directed,
    weighted,
    rowLabels: net.rowLabels,
    colLabels: net.colLabels,
    rowPtr: outPtr,
    colIdx: outCol.slice(0, nnz),
    weights: w,
  };
}

/** Rows whose total × log2(columns) is below this many times the column count use the urn draw. */
const URN_FACTOR = 4;

/** Fenwick (binary indexed) tree over non-negative integer counts: point update, search by prefix sum. */
class Fenwick {
  private readonly t: Float64Array;
  private readonly n: number;
  private readonly top: number;
  constructor(values: Float64Array) {
    this.n = values.length;
    this.t = new Float64Array(this.n + 1);
    for (let k = 0; k < this.n; k++) {
      const i = k + 1;
      this.t[i] += values[k];
      const parent = i + (i & -i);
      if (parent <= this.n) this.t[parent] += this.t[i];
    }
    let top = 1;
    while (top * 2 <= this.n) top *= 2;
    this.top = top;
  }
  add(k: number, delta: number): void {
    for (let i = k + 1; i <= this.n; i += i & -i) this.t[i] += delta;
  }
  /** Index k of the unit numbered u (0-based): the smallest k with prefix sum through k greater than u. */
  find(u: number): number {
    let pos = 0;
    let rest = u;
    for (let step = this.top; step > 0; step >>= 1) {
      const next = pos + step;
      if (next <= this.n && this.t[next] <= rest) {
        pos = next;
        rest -= this.t[next];
      }
    }
    return pos;
  }
}

/** ln(n!) for n = 0..min(n, 2^22) from a table; larger n from Stirling's series (relative error < 1e-15). */
interface LogFactorial {
  (n: number): number;
}

function logFactorialTable(maxN: number): LogFactorial {
  const size = Math.min(maxN, 1 << 22) + 1;
  const table = new Float64Array(size);
  for (let n = 2; n < size; n++) table[n] = table[n - 1] + Math.log(n);
  return (n: number) => {
    if (n < size) return table[n];
    const inv = 1 / n;
    const inv2 = inv * inv;
    return n * Math.log(n) - n + 0.5 * Math.log(2 * Math.PI * n) + inv * (1 / 12 - inv2 * (1 / 360 - inv2 / 1260));
  };
}

/**
 * Hypergeometric draw: number of successes among `draws` taken without replacement from `population`
 * holding `successes`. Inversion from the mode outward, alternating up and down (AS 159's search); if
 * rounding leaves the accumulated mass below the uniform, the uniform is rescaled and the search repeats.
 */
function hypergeometric(draws: number, successes: number, population: number, lf: LogFactorial, rng: Rng): number {
  const failures = population - successes;
  const lo = Math.max(0, draws - failures);
  const hi = Math.min(draws, successes);
  if (lo === hi) return lo;
  let mode = Math.floor(((draws + 1) * (successes + 1)) / (population + 2));
  if (mode < lo) mode = lo;
  if (mode > hi) mode = hi;
  const pMode = Math.exp(
    lf(successes) - lf(mode) - lf(successes - mode) +
      lf(failures) - lf(draws - mode) - lf(failures - draws + mode) -
      lf(population) + lf(draws) + lf(population - draws),
  );
  let u = rng.next();
  for (;;) {
    let cum = pMode;
    if (u < cum) return mode;
    let up = mode;
    let down = mode;
    let pUp = pMode;
    let pDown = pMode;
    while (up < hi || down > lo) {
      if (up < hi) {
        // P(x+1)/P(x) = (successes − x)(draws − x) / ((x + 1)(failures − draws + x + 1))
        pUp *= ((successes - up) * (draws - up)) / ((up + 1) * (failures - draws + up + 1));
        up++;
        cum += pUp;
        if (u < cum) return up;
      }
      if (down > lo) {
        // P(x−1)/P(x) = x (failures − draws + x) / ((successes − x + 1)(draws − x + 1))
        pDown *= (down * (failures - draws + down)) / ((successes - down + 1) * (draws - down + 1));
        down--;
        cum += pDown;
        if (u < cum) return down;
      }
    }
    u = cum * rng.next();
  }
}
