/**
 * What each null model keeps, over many seeded draws, and the law it samples, by exact enumeration of
 * every table of a tiny network with a chi-square test (the acceptance bound is the 0.999 quantile from
 * the Wilson–Hilferty approximation, Wilson & Hilferty 1931, PNAS 17:684 — from memory).
 */
import { describe, expect, it } from "vitest";
import {
  basicMetrics, configurationNull, createRng, deriveSeed, generateNull, linkWeights, marginalTotals, nullModelProblem,
  probabilisticNull, totalsConnectanceNull, validateNetwork, weightShuffleNull, type Network, type NullModelName,
} from "@shared/network/index";
import { bipartite, dense, oneMode, randomMatrix, randomOneMode } from "./helpers";

const degrees = (n: Network) => {
  const { rows, cols } = marginalTotals(n, true);
  return [Array.from(rows), Array.from(cols)];
};
const totals = (n: Network) => {
  const { rows, cols } = marginalTotals(n);
  return [Array.from(rows), Array.from(cols)];
};
const sortedWeights = (n: Network) => Array.from(linkWeights(n)).sort((a, b) => a - b);

/** Chi-square statistic of observed counts against probabilities, and the 0.999 quantile of its df. */
function chiSquare(counts: Map<string, number>, probs: Map<string, number>, N: number): { stat: number; bound: number } {
  let stat = 0;
  for (const [k, p] of probs) {
    const e = N * p;
    const o = counts.get(k) ?? 0;
    stat += ((o - e) * (o - e)) / e;
  }
  for (const k of counts.keys()) if (!probs.has(k)) stat = Infinity; // a state outside the law
  const df = probs.size - 1;
  const z = 3.0902; // standard normal 0.999 quantile
  const bound = df * (1 - 2 / (9 * df) + z * Math.sqrt(2 / (9 * df))) ** 3;
  return { stat, bound };
}

describe("what each null model keeps (60–200 seeded draws each)", () => {
  const rng = createRng(101);
  const binary = bipartite(randomMatrix(rng, 9, 12, 0.3, false));
  const counts = bipartite(randomMatrix(rng, 9, 12, 0.3, true));
  const real = bipartite(randomMatrix(rng, 9, 12, 0.3, false).map((row) => row.map((v) => (v ? 0.25 + rng.next() * 3 : 0))));
  const undirectedW = randomOneMode(rng, 14, 0.3, false, true, true);
  const directedB = randomOneMode(rng, 12, 0.3, true, false, true);
  const draws = (model: NullModelName, net: Network, check: (n: Network) => void, count = 200) => {
    for (let r = 0; r < count; r++) {
      const n = generateNull(model, net, createRng(deriveSeed(202, r)));
      validateNetwork(n);
      expect(n.weighted).toBe(net.weighted); // same kind of object as the observed network
      check(n);
    }
  };

  it("curveball: every degree; weighted data also the weight multiset (bipartite, one-mode)", () => {
    for (const net of [binary, counts, real, undirectedW, directedB]) {
      draws("curveball", net, (n) => {
        expect(degrees(n)).toEqual(degrees(net));
        expect(sortedWeights(n)).toEqual(sortedWeights(net));
      }, 60);
    }
  });

  it("Erdős–Rényi: the number of links and the weight multiset", () => {
    for (const net of [binary, real, undirectedW]) {
      draws("er", net, (n) => {
        expect(basicMetrics(n).links).toBe(basicMetrics(net).links);
        expect(sortedWeights(n)).toEqual(sortedWeights(net));
      });
    }
  });

  it("probabilistic: exactly L links (connectance), binary stays binary, weights keep their multiset", () => {
    for (const net of [binary, counts, undirectedW, directedB]) {
      draws("probabilistic", net, (n) => {
        expect(basicMetrics(n).links).toBe(basicMetrics(net).links);
        expect(basicMetrics(n).connectance).toBeCloseTo(basicMetrics(net).connectance!, 14);
        expect(sortedWeights(n)).toEqual(sortedWeights(net));
      });
    }
  });

  it("fixed totals and connectance: every row and column total and exactly L non-zero integer cells", () => {
    let moved = 0;
    draws("totals-connectance", counts, (n) => {
      expect(totals(n)).toEqual(totals(counts));
      expect(basicMetrics(n).links).toBe(basicMetrics(counts).links);
      for (const w of n.weights) expect(Number.isInteger(w)).toBe(true);
      if (JSON.stringify(dense(n)) !== JSON.stringify(dense(counts))) moved++;
    });
    expect(moved).toBeGreaterThan(190); // the chain leaves the observed table
  });

  it("shuffled weights: the observed structure and the weight multiset; undirected stays symmetric", () => {
    for (const net of [counts, real, undirectedW]) {
      draws("weight-shuffle", net, (n) => {
        expect(Array.from(n.colIdx)).toEqual(Array.from(net.colIdx));
        expect(Array.from(n.rowPtr)).toEqual(Array.from(net.rowPtr));
        expect(sortedWeights(n)).toEqual(sortedWeights(net));
      });
    }
  });

  it("configuration model (one-mode fixed degrees): degrees and self-loops kept; bipartite refused", () => {
    const u = randomOneMode(createRng(5), 16, 0.25, false, false, true);
    for (let r = 0; r < 100; r++) {
      const n = configurationNull(u, createRng(deriveSeed(9, r)));
      validateNetwork(n);
      expect(degrees(n)).toEqual(degrees(u));
      expect(basicMetrics(n).selfLoops).toBe(basicMetrics(u).selfLoops);
    }
    expect(() => configurationNull(binary, createRng(1))).toThrow(/one-mode/);
  });

  it("refuses models that do not fit: Patefield and totals on binary or undirected data, shuffles of binary data", () => {
    expect(nullModelProblem("patefield", binary)).toMatch(/binary/);
    expect(nullModelProblem("totals-connectance", real)).toMatch(/integers/);
    expect(nullModelProblem("totals-connectance", undirectedW)).toMatch(/undirected/);
    expect(nullModelProblem("weight-shuffle", binary)).toMatch(/no weights/);
    expect(nullModelProblem("curveball", real)).toBeNull();
    expect(() => generateNull("patefield", binary, createRng(1))).toThrow(/binary/);
    expect(() => weightShuffleNull(binary, createRng(1))).toThrow(/no weights/);
  });
});

describe("the laws the chains sample (exact enumeration, chi-square)", () => {
  it("probabilistic: P(A) ∝ Π p/(1 − p) over the links, p_ij = (k_i/J + d_j/I)/2, on a 2 × 3 matrix with L = 3", () => {
    const net = bipartite([[1, 1, 0], [1, 0, 0]]);
    const k = [2, 1];
    const d = [2, 1, 0];
    const w = (i: number, j: number) => {
      const p = (k[i] / 3 + d[j] / 2) / 2;
      return p / (1 - p);
    };
    const probs = new Map<string, number>();
    let z = 0;
    for (let mask = 0; mask < 64; mask++) {
      let bits = 0;
      let prod = 1;
      for (let c = 0; c < 6; c++) if (mask & (1 << c)) { bits++; prod *= w(Math.floor(c / 3), c % 3); }
      if (bits !== 3) continue;
      probs.set(String(mask), prod);
      z += prod;
    }
    for (const [key, v] of probs) probs.set(key, v / z);
    const N = 6000;
    const seen = new Map<string, number>();
    for (let r = 0; r < N; r++) {
      const A = dense(probabilisticNull(net, createRng(deriveSeed(31, r)), { moves: 60 }));
      let mask = 0;
      A.forEach((row, i) => row.forEach((v, j) => { if (v) mask |= 1 << (i * 3 + j); }));
      seen.set(String(mask), (seen.get(String(mask)) ?? 0) + 1);
    }
    expect(probs.size).toBe(20);
    const { stat, bound } = chiSquare(seen, probs, N);
    expect(stat).toBeLessThan(bound);
  });

  it("fixed totals and connectance: P(X) ∝ 1/Π x_ij! over tables with the totals and L non-zero cells (2 × 3, totals 3,3 / 2,2,2, L = 4)", () => {
    const net = bipartite([[2, 1, 0], [0, 1, 2]]);
    const probs = new Map<string, number>();
    const fact = [1, 1, 2, 6];
    let z = 0;
    for (let a = 0; a <= 2; a++) {
      for (let b = 0; b <= 2; b++) {
        const c = 3 - a - b;
        if (c < 0 || c > 2) continue;
        const t = [a, b, c, 2 - a, 2 - b, 2 - c];
        if (t.filter((x) => x > 0).length !== 4) continue;
        const weight = 1 / t.reduce((s, x) => s * fact[x], 1);
        probs.set(t.join(","), weight);
        z += weight;
      }
    }
    for (const [key, v] of probs) probs.set(key, v / z);
    const N = 6000;
    const seen = new Map<string, number>();
    for (let r = 0; r < N; r++) {
      const key = dense(totalsConnectanceNull(net, createRng(deriveSeed(37, r)), { moves: 80 })).flat().join(",");
      seen.set(key, (seen.get(key) ?? 0) + 1);
    }
    expect(probs.size).toBeGreaterThan(4);
    const { stat, bound } = chiSquare(seen, probs, N);
    expect(stat).toBeLessThan(bound);
  });

  it("fixed totals and connectance refuses binary, undirected and non-integer data", () => {
    expect(() => totalsConnectanceNull(bipartite([[1, 0], [1, 1]]), createRng(1))).toThrow(/binary/);
    expect(() => totalsConnectanceNull(bipartite([[1.5, 0], [1, 2]]), createRng(1))).toThrow(/integer/);
    expect(() => totalsConnectanceNull(oneMode(3, [[0, 1, 2], [1, 2, 3]]), createRng(1))).toThrow(/undirected/);
  });
});
