/**
 * Significance of optimized modularity against null models.
 *
 * Each null replicate r is drawn from its own generator, createRng(deriveSeed(seed, NULL_STREAM, r)),
 * by `generateNull` (null-models/), and optimized with the same optimizer and effort as the observed
 * network (same objective, restarts and annealing — "auto" decided on the observed network; the optimizer's seed is
 * deriveSeed(seed, NULL_STREAM, r, OPTIMIZER_STREAM)). A replicate depends only on (network, settings,
 * seed, r), so replicates can be spread over worker threads in any order or chunking and give exactly the
 * numbers of a single-threaded run. Optimizing nulls with less effort than the observed network would
 * bias z upwards (docs/science.md).
 *
 * Summary of N null values Q_1..Q_N against the observed Q:
 *   mean, sd (sample, n − 1), z = (Q − mean)/sd, ΔQ = Q − mean, Q_rel = (Q − mean)/mean
 *   (relative modularity), one-sided p = (1 + #{Q_null ≥ Q}) / (N + 1) (the "+1" counts the observed
 *   network as one draw, so p is never 0; North, Curtis & Sham 2002, Am J Hum Genet 71:439,
 *   doi:10.1086/341527 — from memory).
 * `unstable` flags a z that should not be trusted, with the reason:
 *   - fewer than 2 replicates (sd undefined);
 *   - sd ≈ 0 (sd ≤ 1e-9 · max(1, |mean|)): z is null — a small or dense network has (almost) only one
 *     possible randomisation;
 *   - few distinct null values: fewer than min(10, ⌈N/2⌉) distinct Q_null (to 1e-9), the discrete
 *     distribution of a small, dense matrix, where z's normal reading fails.
 * Q_rel is null when the null mean is 0; z null when sd is 0 or undefined. A Q_null counts as ≥ Q when
 * it is within 1e-10·max(1, |Q|) of Q (ties of the same partition value computed on different arrays).
 *
 * Monte Carlo error (the figures depend on the number of nulls N):
 *   - p: binomial standard error sqrt(p(1 − p)/N); when no null reaches Q, p = 1/(N + 1) is the floor of
 *     what N nulls can show, so `pAtFloor` is true and p is reported as "≤ 1/(N + 1)".
 *   - z: delta-method standard error of (Q − mean)/sd with the mean's error sd/√N and the sd's error
 *     ≈ sd/√(2(N − 1)) (normal null values): se(z) ≈ sqrt(1/N + z²/(2(N − 1))) (standard large-sample
 *     results; e.g. Kendall & Stuart, The Advanced Theory of Statistics — from memory).
 * The same summary of NODF over the same null networks (`summarizeNodf`) compares nestedness with the
 * same nulls: p counts nulls at least as nested as the observed network.
 */
import { nodf } from "./nestedness/nodf";
import { generateNull, type NullModelName } from "./null-models/index";
import { annealingApplies, optimizeModularity, type AnnealingMode } from "./optimizer/optimize";
import type { OptimizerObjective } from "./optimizer/quality-graph";
import { createRng, deriveSeed } from "./random";
import type { Network } from "./types";

/** Seed-path element of the null replicates ("null"). */
export const NULL_STREAM = 0x6e756c6c;
/** Seed-path element of the optimizer run on a null replicate ("opt"). */
export const OPTIMIZER_STREAM = 0x6f7074;

export interface NullReplicateSettings {
  model: NullModelName;
  seed: number;
  replicate: number;
  restarts?: number;
  objective?: OptimizerObjective;
  annealing?: AnnealingMode;
}

/** The null network of replicate `replicate` (exposed for inspection and tests). */
export function nullReplicateNetwork(net: Network, model: NullModelName, seed: number, replicate: number): Network {
  if (!Number.isInteger(replicate) || replicate < 0) {
    throw new RangeError(`replicate must be a non-negative integer, got ${replicate}`);
  }
  return generateNull(model, net, createRng(deriveSeed(seed, NULL_STREAM, replicate)));
}

/**
 * Best Q of null replicate `replicate`, optimized like the observed network. Returns null when the null
 * network's modularity is undefined (it has no links; cannot happen for the engine's models, which keep L
 * or the totals).
 */
export function nullReplicateQ(net: Network, settings: NullReplicateSettings): number | null {
  const { model, seed, replicate } = settings;
  const nullNet = nullReplicateNetwork(net, model, seed, replicate);
  const res = optimizeModularity(nullNet, {
    objective: settings.objective,
    restarts: settings.restarts,
    // "auto" is decided on the observed network, so a null with a different number of linked nodes
    // gets the same treatment as the observed one.
    annealing: annealingApplies(net, settings.annealing ?? "auto") ? "on" : "off",
    seed: deriveSeed(seed, NULL_STREAM, replicate, OPTIMIZER_STREAM),
  });
  return res.Q;
}

/** Q and NODF of one null replicate (NODF null when undefined for that null network). */
export interface NullReplicate {
  q: number;
  nodf: number | null;
  /** True when the optimizer stopped at a safety cap on this null network instead of converging. */
  capped?: boolean;
}

/**
 * Best Q and NODF of null replicate `replicate` (null when the null network's modularity is undefined).
 * NODF is computed on the same null network, so nestedness meets the same nulls as modularity.
 */
export function nullReplicateStats(net: Network, settings: NullReplicateSettings): NullReplicate | null {
  const { model, seed, replicate } = settings;
  const nullNet = nullReplicateNetwork(net, model, seed, replicate);
  const res = optimizeModularity(nullNet, {
    objective: settings.objective,
    restarts: settings.restarts,
    annealing: annealingApplies(net, settings.annealing ?? "auto") ? "on" : "off",
    seed: deriveSeed(seed, NULL_STREAM, replicate, OPTIMIZER_STREAM),
  });
  if (res.Q === null) return null;
  const out: NullReplicate = { q: res.Q, nodf: nodf(nullNet)?.nodf ?? null };
  if (!res.convergence.converged) out.capped = true;
  return out;
}

export interface NullSummary {
  n: number;
  mean: number | null;
  sd: number | null;
  z: number | null;
  /** Monte Carlo standard error of z (null when z is). */
  zSe: number | null;
  qRel: number | null;
  deltaQ: number | null;
  p: number | null;
  /** Monte Carlo standard error of p (binomial). */
  pSe: number | null;
  /** True when no null reached Q: p = 1/(N + 1) is the floor of N nulls, report it as "p ≤". */
  pAtFloor: boolean;
  unstable: boolean;
  unstableReason?: string;
}

/** Monte Carlo standard error of z from N nulls (delta method; see the file header). */
export function zStandardError(z: number, n: number): number {
  return Math.sqrt(1 / n + (z * z) / (2 * Math.max(1, n - 1)));
}

export function summarizeNulls(observedQ: number, nullQs: readonly number[]): NullSummary {
  const n = nullQs.length;
  if (!Number.isFinite(observedQ)) throw new RangeError(`observed Q must be a finite number, got ${observedQ}`);
  for (const q of nullQs) if (!Number.isFinite(q)) throw new RangeError(`null Q values must be finite numbers, got ${q}`);
  if (n === 0) {
    return { n, mean: null, sd: null, z: null, zSe: null, qRel: null, deltaQ: null, p: null, pSe: null, pAtFloor: false, unstable: true, unstableReason: "no null replicates" };
  }
  let sum = 0;
  for (const q of nullQs) sum += q;
  const mean = sum / n;
  let ss = 0;
  for (const q of nullQs) ss += (q - mean) * (q - mean);
  const sd = n >= 2 ? Math.sqrt(ss / (n - 1)) : null;
  const tieTol = 1e-10 * Math.max(1, Math.abs(observedQ));
  let atLeast = 0;
  for (const q of nullQs) if (q >= observedQ - tieTol) atLeast++;
  const p = (1 + atLeast) / (n + 1);
  const deltaQ = observedQ - mean;
  const qRel = mean !== 0 ? deltaQ / mean : null;

  const sorted = [...nullQs].sort((x, y) => x - y);
  let distinct = 1;
  for (let i = 1; i < n; i++) if (sorted[i] - sorted[i - 1] > 1e-9 * Math.max(1, Math.abs(sorted[i]))) distinct++;

  let z: number | null = null;
  let unstableReason: string | undefined;
  if (sd === null) unstableReason = "fewer than 2 null replicates: sd and z are undefined";
  else if (sd <= 1e-9 * Math.max(1, Math.abs(mean))) {
    unstableReason = "the null Q values have (almost) no spread (sd ≈ 0), so z is undefined; the network may allow very few randomisations";
  } else {
    z = deltaQ / sd;
    const minDistinct = Math.min(10, Math.ceil(n / 2));
    if (distinct < minDistinct) {
      unstableReason = `only ${distinct} distinct null Q values among ${n}: a small or dense network allows few randomisations, so z is unreliable`;
    }
  }
  const zSe = z === null ? null : zStandardError(z, n);
  const pSe = Math.sqrt((p * (1 - p)) / n);
  const out: NullSummary = { n, mean, sd, z, zSe, qRel, deltaQ, p, pSe, pAtFloor: atLeast === 0, unstable: unstableReason !== undefined };
  if (unstableReason) out.unstableReason = unstableReason;
  return out;
}

export interface NodfNullSummary {
  n: number;
  mean: number | null;
  sd: number | null;
  z: number | null;
  /** (1 + #{NODF_null ≥ NODF}) / (N + 1): nulls at least as nested as the observed network. */
  p: number | null;
  pAtFloor: boolean;
}

/** NODF of the observed network against the NODF of the null networks (undefined nulls left out). */
export function summarizeNodf(observed: number | null, nullNodfs: ReadonlyArray<number | null>): NodfNullSummary | null {
  if (observed === null) return null;
  const vals = nullNodfs.filter((v): v is number => v !== null && Number.isFinite(v));
  const n = vals.length;
  if (n === 0) return { n, mean: null, sd: null, z: null, p: null, pAtFloor: false };
  let sum = 0;
  for (const v of vals) sum += v;
  const mean = sum / n;
  let ss = 0;
  for (const v of vals) ss += (v - mean) * (v - mean);
  const sd = n >= 2 ? Math.sqrt(ss / (n - 1)) : null;
  const tol = 1e-9 * Math.max(1, Math.abs(observed));
  let atLeast = 0;
  for (const v of vals) if (v >= observed - tol) atLeast++;
  const z = sd !== null && sd > 1e-9 * Math.max(1, Math.abs(mean)) ? (observed - mean) / sd : null;
  return { n, mean, sd, z, p: (1 + atLeast) / (n + 1), pAtFloor: atLeast === 0 };
}
