/**
 * Simulated-annealing refinement of a partition (Guimerà & Amaral 2005, "Functional cartography of
 * complex metabolic networks", Nature 433:895, doi:10.1038/nature03288; method in Guimerà, Sales-Pardo &
 * Amaral 2004, PRE 70:025101, doi:10.1103/PhysRevE.70.025101), on the working graph of quality-graph.ts,
 * so it serves Newman–Girvan Q, the directed Q_d and Barber's Q_B alike.
 *
 * Metropolis dynamics on the cost −Q at temperature T: a proposed change with ΔQ ≥ 0 is accepted, one
 * with ΔQ < 0 with probability exp(ΔQ/T). At each temperature: f·S² single-node moves and f·S collective
 * moves (merge two modules, or split one module in two), S the number of nodes; then T ← 0.995·T.
 *
 * Our choices (the paper leaves them open or we adapt them to refining a good start):
 * - The start is the best Leiden partition, not a random one, so the start temperature is low: T0 is set
 *   so that a typical worsening single-node move from the start is accepted with probability 1 %.
 * - Single-node moves propose the module of a random neighbour of the node or, with probability
 *   1/(degree+1), a new empty module; nodes without links are never proposed (they cannot change Q).
 * - Merges pick a random link between two modules. Splits cut a random module in two by a random
 *   bisection followed by greedy sweeps inside the module (the original splits by a short annealing
 *   inside the module).
 * - Stop when the best Q has not risen for 50 consecutive temperatures (T has then fallen by a factor
 *   0.995^50 ≈ 0.78 without progress), or after 3000 temperatures. The best partition visited is returned.
 *
 * Cost: about f·S²·(mean degree) work per temperature and a few hundred temperatures, so the engine runs
 * it only on small networks (see ANNEALING_MAX_NODES in optimize.ts). The single-node proposals, most of
 * the work, run in one loop (singleMoves) that reads its draws straight from the buffer and decides most
 * Metropolis tests without the exponential (metropolisAccepts), with exactly the draws and decisions of
 * the plain form. Randomness comes only from the injected generator; Math.exp is only compared with a
 * uniform draw (see leiden.ts on determinism).
 */
import { DrawBuffer, type Rng } from "../random";
import { graphQuality, type QualityGraph } from "./quality-graph";

export interface AnnealingOptions {
  /** f: moves per temperature are f·S² single-node and f·S collective. */
  f?: number;
  /** Cooling factor per temperature. */
  cooling?: number;
  /** Acceptance probability of a typical worsening move at the start temperature. */
  startAcceptance?: number;
  /** Temperatures without improvement of the best Q before stopping. */
  patience?: number;
  maxTemperatures?: number;
}

export const ANNEALING_DEFAULTS = {
  f: 1,
  cooling: 0.995,
  startAcceptance: 0.01,
  patience: 50,
  maxTemperatures: 3000,
} as const;

export interface AnnealingResult {
  membership: Int32Array;
  Q: number;
  temperatures: number;
}

export function anneal(g: QualityGraph, initial: Int32Array, source: Rng, options: AnnealingOptions = {}): AnnealingResult {
  // The same draws as from `source`, read from blocks taken ahead; `source` is put back where the draws
  // used leave it (whatever draws from it next sees the numbers it would have seen).
  const rng = new DrawBuffer(source);
  try {
    return annealWith(g, initial, rng, options);
  } finally {
    rng.release();
  }
}

function annealWith(g: QualityGraph, initial: Int32Array, rng: DrawBuffer, options: AnnealingOptions): AnnealingResult {
  const f = options.f ?? ANNEALING_DEFAULTS.f;
  const cooling = options.cooling ?? ANNEALING_DEFAULTS.cooling;
  const startAcceptance = options.startAcceptance ?? ANNEALING_DEFAULTS.startAcceptance;
  const patience = options.patience ?? ANNEALING_DEFAULTS.patience;
  const maxTemperatures = options.maxTemperatures ?? ANNEALING_DEFAULTS.maxTemperatures;
  const { n, ptr, nbr, ew, a, b, alpha, gamma } = g;

  const memb = initial.slice();
  const modA = new Float64Array(n);
  const modB = new Float64Array(n);
  const modSize = new Int32Array(n);
  for (let v = 0; v < n; v++) {
    modA[memb[v]] += a[v];
    modB[memb[v]] += b[v];
    modSize[memb[v]]++;
  }
  const empty = new Int32Array(n);
  let nEmpty = 0;
  for (let c = n - 1; c >= 0; c--) if (modSize[c] === 0) empty[nEmpty++] = c;

  // Nodes that can change Q (with at least one link), for uniform proposals.
  let nActive = 0;
  const active = new Int32Array(n);
  for (let v = 0; v < n; v++) if (ptr[v + 1] > ptr[v]) active[nActive++] = v;
  const result0 = { membership: memb.slice(), Q: graphQuality(g, memb), temperatures: 0 };
  if (nActive < 2) return result0;

  const side = new Int8Array(n);
  const members = new Int32Array(n);

  /** ΔQ/α of moving v from its module to module t (t ≠ memb[v]). Needs E(v, ·) for cur and t. */
  function singleMoveDelta(v: number, t: number): number {
    const cur = memb[v];
    let eCur = 0;
    let eT = 0;
    for (let e = ptr[v]; e < ptr[v + 1]; e++) {
      const c = memb[nbr[e]];
      if (c === cur) eCur += ew[e];
      else if (c === t) eT += ew[e];
    }
    const av = a[v];
    const bv = b[v];
    const gainT = eT - gamma * (av * modB[t] + bv * modA[t]);
    const gainCur = eCur - gamma * (av * (modB[cur] - bv) + bv * (modA[cur] - av));
    return gainT - gainCur;
  }

  function proposeTarget(v: number): number {
    const deg = ptr[v + 1] - ptr[v];
    const x = rng.nextInt(deg + 1);
    if (x < deg) return memb[nbr[ptr[v] + x]];
    if (modSize[memb[v]] === 1 || nEmpty === 0) return -1;
    return empty[nEmpty - 1];
  }

  // Start temperature from a sample of single-node proposals at the start partition.
  let worse = 0;
  let nWorse = 0;
  for (let s = 0; s < 10 * nActive; s++) {
    const v = active[rng.nextInt(nActive)];
    const t = proposeTarget(v);
    if (t < 0 || t === memb[v]) continue;
    const d = alpha * singleMoveDelta(v, t);
    if (d < 0) {
      worse += -d;
      nWorse++;
    }
  }
  if (nWorse === 0) return result0;
  let T = worse / nWorse / Math.log(1 / startAcceptance);

  let q = result0.Q;
  let bestQ = q;
  const best = memb.slice();
  const nSingle = Math.max(1, Math.round(f * nActive * nActive));
  const nCollective = Math.max(1, Math.round(f * nActive));
  const singlePerCollective = Math.max(1, Math.floor(nSingle / nCollective));
  const tol = 1e-12;
  let sinceBest = 0;
  let temps = 0;
  const st: SingleMoveState = {
    ptr, nbr, ew, a, b, alpha, gamma, memb, modA, modB, modSize, empty, active, nActive, best, rng, tol,
    nEmpty, T, q, bestQ,
  };

  function accept(dq: number): boolean {
    if (dq >= 0) return true;
    const u = rng.next(); // a multiple of 2^−32
    const x = dq / T;
    // Below x = −23, exp(x) < 1.1e-10 < 2^−32: only u = 0 can fall below it (the same outcome as the
    // plain comparison, without the exponential for the many hopeless moves of a cold system).
    if (x < -23) return u === 0 && Math.exp(x) > 0;
    return u < Math.exp(x);
  }

  for (; temps < maxTemperatures; temps++) {
    const improvedBefore = bestQ;
    st.T = T;
    for (let round = 0; round < nCollective; round++) {
      st.q = q;
      st.bestQ = bestQ;
      st.nEmpty = nEmpty;
      singleMoves(st, singlePerCollective);
      q = st.q;
      bestQ = st.bestQ;
      nEmpty = st.nEmpty;
      // One collective move.
      const v = active[rng.nextInt(nActive)];
      const c1 = memb[v];
      if (rng.next() < 0.5) {
        // Merge c1 with the module of a random neighbour of v.
        const u = nbr[ptr[v] + rng.nextInt(ptr[v + 1] - ptr[v])];
        const c2 = memb[u];
        if (c2 === c1) continue;
        let e12 = 0;
        for (let x = 0; x < n; x++) {
          if (memb[x] !== c1) continue;
          for (let e = ptr[x]; e < ptr[x + 1]; e++) if (memb[nbr[e]] === c2) e12 += ew[e];
        }
        const dq = alpha * (e12 - gamma * (modA[c1] * modB[c2] + modA[c2] * modB[c1]));
        if (accept(dq)) {
          for (let x = 0; x < n; x++) if (memb[x] === c2) memb[x] = c1;
          modA[c1] += modA[c2];
          modB[c1] += modB[c2];
          modSize[c1] += modSize[c2];
          modA[c2] = 0;
          modB[c2] = 0;
          modSize[c2] = 0;
          empty[nEmpty++] = c2;
          q += dq;
          if (q > bestQ + tol) {
            bestQ = q;
            best.set(memb);
          }
        }
      } else {
        // Split c1 in two.
        if (modSize[c1] < 2 || nEmpty === 0) continue;
        let k = 0;
        for (let x = 0; x < n; x++) if (memb[x] === c1) members[k++] = x;
        let A0 = 0,
          B0 = 0,
          A1 = 0,
          B1 = 0;
        for (let i = 0; i < k; i++) {
          const x = members[i];
          side[x] = rng.next() < 0.5 ? 0 : 1;
          if (side[x] === 0) {
            A0 += a[x];
            B0 += b[x];
          } else {
            A1 += a[x];
            B1 += b[x];
          }
        }
        for (let sweep = 0; sweep < 5; sweep++) {
          let changed = false;
          for (let i = 0; i < k; i++) {
            const x = members[i];
            let e0 = 0,
              e1 = 0;
            for (let e = ptr[x]; e < ptr[x + 1]; e++) {
              const y = nbr[e];
              if (memb[y] !== c1) continue;
              if (side[y] === 0) e0 += ew[e];
              else e1 += ew[e];
            }
            const ax = a[x],
              bx = b[x];
            // Gains of x joining side 0 or side 1 (x taken out of its side first).
            const s0A = side[x] === 0 ? A0 - ax : A0;
            const s0B = side[x] === 0 ? B0 - bx : B0;
            const s1A = side[x] === 1 ? A1 - ax : A1;
            const s1B = side[x] === 1 ? B1 - bx : B1;
            const g0 = e0 - gamma * (ax * s0B + bx * s0A);
            const g1 = e1 - gamma * (ax * s1B + bx * s1A);
            const want = g1 > g0 + tol ? 1 : g0 > g1 + tol ? 0 : side[x];
            if (want !== side[x]) {
              if (want === 1) {
                A0 -= ax; B0 -= bx; A1 += ax; B1 += bx;
              } else {
                A1 -= ax; B1 -= bx; A0 += ax; B0 += bx;
              }
              side[x] = want;
              changed = true;
            }
          }
          if (!changed) break;
        }
        let n1 = 0;
        for (let i = 0; i < k; i++) n1 += side[members[i]];
        if (n1 === 0 || n1 === k) continue;
        let e01 = 0;
        for (let i = 0; i < k; i++) {
          const x = members[i];
          if (side[x] !== 0) continue;
          for (let e = ptr[x]; e < ptr[x + 1]; e++) {
            const y = nbr[e];
            if (memb[y] === c1 && side[y] === 1) e01 += ew[e];
          }
        }
        const dq = -alpha * (e01 - gamma * (A0 * B1 + A1 * B0));
        if (accept(dq)) {
          const c2 = empty[--nEmpty];
          for (let i = 0; i < k; i++) if (side[members[i]] === 1) memb[members[i]] = c2;
          modA[c1] = A0;
          modB[c1] = B0;
          modSize[c1] = k - n1;
          modA[c2] = A1;
          modB[c2] = B1;
          modSize[c2] = n1;
          q += dq;
          if (q > bestQ + tol) {
            bestQ = q;
            best.set(memb);
          }
        }
      }
    }
    if (bestQ > improvedBefore + tol) sinceBest = 0;
    else sinceBest++;
    if (sinceBest >= patience) {
      temps++;
      break;
    }
    T *= cooling;
  }
  return { membership: best, Q: graphQuality(g, best), temperatures: temps };
}

/**
 * Bounds of exp(x) for the acceptance test u < exp(x) on −23 ≤ x < 0, so that most tests need no
 * exponential: with x_j = −23 + j/EXP_STEPS, the computed index i = ⌊(x + 23)·EXP_STEPS⌋ places x in
 * [x_{i−1}, x_{i+2}] (the product's rounding error is far below 1/EXP_STEPS), so Math.exp(x) lies between
 * Math.exp(x_{i−1}) and Math.exp(x_{i+2}) up to its own error (under one unit in the last place; the
 * factors 1 ∓ 2⁻⁴⁰ leave a wide margin). u below EXP_BELOW[i] is below Math.exp(x), u at or above
 * EXP_ABOVE[i] is not; only between them (a band of about 5 % of exp(x)) is Math.exp called. The decisions
 * are therefore exactly those of the plain comparison.
 */
const EXP_STEPS = 64;
const EXP_BELOW = new Float64Array(23 * EXP_STEPS + 1);
const EXP_ABOVE = new Float64Array(23 * EXP_STEPS + 1);
for (let i = 0; i <= 23 * EXP_STEPS; i++) {
  EXP_BELOW[i] = Math.exp(-23 + Math.max(0, i - 1) / EXP_STEPS) * (1 - 2 ** -40);
  EXP_ABOVE[i] = Math.exp(-23 + (i + 2) / EXP_STEPS) * (1 + 2 ** -40);
}

/**
 * The Metropolis test u < exp(x) for a uniform draw u (a multiple of 2⁻³²) and x = ΔQ/T < 0: the same
 * decision as `accept` in annealWith, with the exponential computed only when u falls near exp(x).
 */
export function metropolisAccepts(u: number, x: number): boolean {
  if (x >= -23) {
    const i = ((x + 23) * EXP_STEPS) | 0;
    return u < EXP_BELOW[i] || (u < EXP_ABOVE[i] && u < Math.exp(x));
  }
  // Below x = −23, exp(x) < 1.1e-10 < 2⁻³²: only u = 0 can fall below it.
  return u === 0 && Math.exp(x) > 0;
}

/** What the single-node moves of one round read and change (scalars written back by the caller). */
interface SingleMoveState {
  ptr: Int32Array;
  nbr: Int32Array;
  ew: Float64Array;
  a: Float64Array;
  b: Float64Array;
  alpha: number;
  gamma: number;
  memb: Int32Array;
  modA: Float64Array;
  modB: Float64Array;
  modSize: Int32Array;
  empty: Int32Array;
  active: Int32Array;
  nActive: number;
  best: Int32Array;
  rng: DrawBuffer;
  tol: number;
  nEmpty: number;
  T: number;
  q: number;
  bestQ: number;
}

/**
 * `count` single-node proposals at temperature st.T: exactly the proposals, draws and decisions of
 * proposeTarget, singleMoveDelta, accept and moveNode in annealWith, written out in one loop that reads
 * the draws from the buffer itself (the hot loop of the annealing: no calls, no boxed numbers).
 */
function singleMoves(st: SingleMoveState, count: number): void {
  const { ptr, nbr, ew, a, b, alpha, gamma, memb, modA, modB, modSize, empty, active, nActive, best, rng, tol, T } = st;
  const buf = rng.buf;
  let bi = rng.i;
  let bl = rng.len;
  let nEmpty = st.nEmpty;
  let q = st.q;
  let bestQ = st.bestQ;
  for (let s = 0; s < count; s++) {
    // v = active[nextInt(nActive)] (rejection rule of Rng.nextInt).
    let r: number;
    for (;;) {
      if (bi === bl) {
        rng.i = bi;
        rng.refill();
        bi = rng.i;
        bl = rng.len;
      }
      const x = buf[bi++];
      r = x - Math.floor(x / nActive) * nActive;
      r = r < 0 ? r + nActive : r >= nActive ? r - nActive : r;
      if (x - r + nActive <= 4294967296) break;
    }
    const v = active[r];
    // Target: the module of a random neighbour, or (x = deg) an empty module.
    const p0 = ptr[v];
    const p1 = ptr[v + 1];
    const deg1 = p1 - p0 + 1;
    for (;;) {
      if (bi === bl) {
        rng.i = bi;
        rng.refill();
        bi = rng.i;
        bl = rng.len;
      }
      const x = buf[bi++];
      r = x - Math.floor(x / deg1) * deg1;
      r = r < 0 ? r + deg1 : r >= deg1 ? r - deg1 : r;
      if (x - r + deg1 <= 4294967296) break;
    }
    const cur = memb[v];
    let t: number;
    if (r < deg1 - 1) t = memb[nbr[p0 + r]];
    else if (modSize[cur] === 1 || nEmpty === 0) continue;
    else t = empty[nEmpty - 1];
    if (t === cur) continue;
    let eCur = 0;
    let eT = 0;
    for (let e = p0; e < p1; e++) {
      const c = memb[nbr[e]];
      if (c === cur) eCur += ew[e];
      else if (c === t) eT += ew[e];
    }
    const av = a[v];
    const bv = b[v];
    const gainT = eT - gamma * (av * modB[t] + bv * modA[t]);
    const gainCur = eCur - gamma * (av * (modB[cur] - bv) + bv * (modA[cur] - av));
    const dq = alpha * (gainT - gainCur);
    if (!(dq >= 0)) {
      if (bi === bl) {
        rng.i = bi;
        rng.refill();
        bi = rng.i;
        bl = rng.len;
      }
      const u = buf[bi++] / 4294967296;
      const x = dq / T;
      if (!metropolisAccepts(u, x)) continue;
    }
    // Move v to t.
    if (t === empty[nEmpty - 1] && modSize[t] === 0 && nEmpty > 0) nEmpty--;
    modA[cur] -= av;
    modB[cur] -= bv;
    modSize[cur]--;
    modA[t] += av;
    modB[t] += bv;
    modSize[t]++;
    memb[v] = t;
    if (modSize[cur] === 0) empty[nEmpty++] = cur;
    q += dq;
    if (q > bestQ + tol) {
      bestQ = q;
      best.set(memb);
    }
  }
  rng.i = bi;
  st.nEmpty = nEmpty;
  st.q = q;
  st.bestQ = bestQ;
}
