import { describe, expect, it } from "vitest";
import {
  basicMetrics, createRng, curveballNull, deriveSeed, erdosRenyiNull, generateNull, marginalTotals,
  NetworkEngineError, patefieldNull, serializeNetwork, validateNetwork, type Network, type NullModelName,
} from "@shared/network/index";
import { bipartite, dense, oneMode, randomMatrix, randomOneMode } from "./helpers";

const degreesOf = (net: Network) => {
  const { rows, cols } = marginalTotals(net, true);
  return { rows: Array.from(rows), cols: Array.from(cols) };
};

describe("Erdős–Rényi-type null model", () => {
  it("keeps I, J and exactly L links, binary, valid CSR (sparse and dense placements)", () => {
    const rng = createRng(1);
    for (const p of [0.1, 0.45, 0.8, 1]) {
      const net = bipartite(randomMatrix(rng, 12, 17, p, true));
      const nul = erdosRenyiNull(net, rng);
      validateNetwork(nul);
      expect(nul.rowLabels).toEqual(net.rowLabels);
      expect(nul.colLabels).toEqual(net.colLabels);
      expect(nul.weighted).toBe(false);
      expect(basicMetrics(nul).links).toBe(basicMetrics(net).links);
    }
  });

  it("one-mode: directed keeps L on S² cells; undirected keeps L, the self-loop count and symmetry", () => {
    const rng = createRng(2);
    for (let t = 0; t < 10; t++) {
      const d = randomOneMode(rng, 15, 0.2 + 0.07 * t, true, false, true);
      const nd = erdosRenyiNull(d, rng);
      validateNetwork(nd);
      expect(basicMetrics(nd).links).toBe(basicMetrics(d).links);
      const u = randomOneMode(rng, 15, 0.1 + 0.08 * t, false, true, true);
      const nu = erdosRenyiNull(u, rng);
      validateNetwork(nu); // includes the symmetry check
      expect(basicMetrics(nu).links).toBe(basicMetrics(u).links);
      expect(basicMetrics(nu).selfLoops).toBe(basicMetrics(u).selfLoops);
      expect(basicMetrics(nu).connectance).toBeCloseTo(basicMetrics(u).connectance!, 14);
    }
  });

  it("places links uniformly: every cell of a 3 × 3 matrix with L = 4 is filled with frequency 4/9 (definition of G(n, L))", () => {
    const net = bipartite([[1, 1, 0], [1, 1, 0], [0, 0, 0]]);
    const counts = new Array<number>(9).fill(0);
    const N = 9000;
    for (let r = 0; r < N; r++) {
      const A = dense(erdosRenyiNull(net, createRng(deriveSeed(3, r))));
      A.forEach((row, i) => row.forEach((v, j) => (counts[i * 3 + j] += v)));
    }
    const sd = Math.sqrt(N * (4 / 9) * (5 / 9));
    for (const c of counts) expect(Math.abs(c - (N * 4) / 9)).toBeLessThan(5 * sd);
  });
});

describe("curveball null model (Strona et al. 2014)", () => {
  it("keeps every row and column degree of bipartite networks, binary output, valid CSR", () => {
    const rng = createRng(4);
    for (let t = 0; t < 10; t++) {
      const net = bipartite(randomMatrix(rng, 5 + t, 8 + t, 0.3, true));
      const nul = curveballNull(net, rng);
      validateNetwork(nul);
      expect(degreesOf(nul)).toEqual(degreesOf(net));
      expect(nul.weighted).toBe(false);
    }
  });

  it("changes the matrix (the chain moves) while keeping degrees", () => {
    const net = bipartite(randomMatrix(createRng(5), 20, 30, 0.3, false));
    const nul = curveballNull(net, createRng(6));
    expect(serializeNetwork(nul).idx).not.toEqual(serializeNetwork(net).idx);
  });

  it("directed one-mode: keeps in- and out-degrees and cannibal links, never creates new ones", () => {
    const rng = createRng(7);
    for (let t = 0; t < 10; t++) {
      const net = randomOneMode(rng, 12, 0.3, true, false, true);
      const nul = curveballNull(net, rng);
      validateNetwork(nul);
      expect(degreesOf(nul)).toEqual(degreesOf(net));
      const loops = (n: Network) => Array.from({ length: 12 }, (_, i) => dense(n)[i][i]);
      expect(loops(nul)).toEqual(loops(net));
    }
  });

  it("undirected one-mode: stays symmetric and keeps every degree and self-loop", () => {
    const rng = createRng(8);
    for (let t = 0; t < 10; t++) {
      const net = randomOneMode(rng, 14, 0.3, false, false, true);
      const nul = curveballNull(net, rng);
      validateNetwork(nul);
      expect(degreesOf(nul)).toEqual(degreesOf(net));
      expect(basicMetrics(nul).selfLoops).toBe(basicMetrics(net).selfLoops);
    }
  });

  it("samples uniformly: the 6 permutation matrices with all margins 1 each appear 1/6 of the time (exact enumeration)", () => {
    const net = bipartite([[1, 0, 0], [0, 1, 0], [0, 0, 1]]);
    const seen = new Map<string, number>();
    const N = 6000;
    for (let r = 0; r < N; r++) {
      const key = JSON.stringify(dense(curveballNull(net, createRng(deriveSeed(9, r)), { trades: 50 })));
      seen.set(key, (seen.get(key) ?? 0) + 1);
    }
    expect(seen.size).toBe(6);
    const sd = Math.sqrt(N * (1 / 6) * (5 / 6));
    for (const c of seen.values()) expect(Math.abs(c - N / 6)).toBeLessThan(5 * sd);
  });
});

describe("Patefield null model (Patefield 1981, AS 159)", () => {
  it("keeps row and column totals of integer-weighted bipartite and directed networks", () => {
    const rng = createRng(10);
    for (let t = 0; t < 10; t++) {
      const net = bipartite(randomMatrix(rng, 6 + t, 9, 0.35, true));
      const nul = patefieldNull(net, rng);
      validateNetwork(nul);
      expect(marginalTotals(nul)).toEqual(marginalTotals(net));
      for (const w of nul.weights) expect(Number.isInteger(w)).toBe(true);
      const d = randomOneMode(rng, 10, 0.3, true, false, true);
      const nd = patefieldNull(d, rng);
      validateNetwork(nd);
      expect(marginalTotals(nd)).toEqual(marginalTotals(d));
    }
  });

  it("keeps totals with large counts (log-factorial table and ratio recurrences)", () => {
    const net = bipartite([[500, 20, 0, 3], [0, 1000, 7, 0], [40, 0, 0, 2000]]);
    const nul = patefieldNull(net, createRng(11));
    expect(marginalTotals(nul)).toEqual(marginalTotals(net));
  });

  it("draws the hypergeometric law: margins (2,2)/(2,2) give x11 = 0, 1, 2 with probabilities 1/6, 4/6, 1/6 (exact)", () => {
    const net = bipartite([[1, 1], [1, 1]]);
    const counts = [0, 0, 0];
    const N = 6000;
    for (let r = 0; r < N; r++) counts[dense(patefieldNull(net, createRng(deriveSeed(12, r))))[0][0]]++;
    const expected = [1 / 6, 4 / 6, 1 / 6];
    counts.forEach((c, k) => expect(Math.abs(c - N * expected[k])).toBeLessThan(5 * Math.sqrt(N * expected[k] * (1 - expected[k]))));
  });

  it("cell-by-cell path (large totals): margins (50,50)/(50,50) give x11 hypergeometric, mean 25, P(25) = C(50,25)²/C(100,50)", () => {
    const net = bipartite([[25, 25], [25, 25]]);
    const N = 4000;
    let sum = 0;
    let at25 = 0;
    for (let r = 0; r < N; r++) {
      const x = dense(patefieldNull(net, createRng(deriveSeed(14, r))))[0][0];
      sum += x;
      if (x === 25) at25++;
    }
    // Hypergeometric variance n·K·(N−K)·(N−n)/(N²(N−1)) = 50·50·50·50/(100²·99).
    const variance = (50 * 50 * 50 * 50) / (100 * 100 * 99);
    expect(Math.abs(sum / N - 25)).toBeLessThan(5 * Math.sqrt(variance / N));
    let logC = 0; // ln C(50,25)² − ln C(100,50)
    for (let k = 1; k <= 25; k++) logC += 2 * Math.log((25 + k) / k);
    for (let k = 1; k <= 50; k++) logC -= Math.log((50 + k) / k);
    const p25 = Math.exp(logC);
    expect(Math.abs(at25 - N * p25)).toBeLessThan(5 * Math.sqrt(N * p25 * (1 - p25)));
  });

  it("refuses non-integer weights unless rounding is allowed, and undirected one-mode networks", () => {
    const net = bipartite([[1.5, 2], [0, 3.2]]);
    expect(() => patefieldNull(net, createRng(1))).toThrow(/integer weights/);
    const rounded = patefieldNull(net, createRng(1), { allowRounding: true });
    const { rows } = marginalTotals(rounded);
    expect(Array.from(rows)).toEqual([4, 3]);
    expect(() => patefieldNull(oneMode(3, [[0, 1], [1, 2]]), createRng(1))).toThrow(/undirected/);
  });
});

describe("generateNull", () => {
  const models: NullModelName[] = ["er", "curveball", "patefield"];
  it.each(models)("%s is deterministic per seed and differs between seeds", (model) => {
    const net = bipartite(randomMatrix(createRng(13), 15, 20, 0.3, true));
    const a = serializeNetwork(generateNull(model, net, createRng(42)));
    const b = serializeNetwork(generateNull(model, net, createRng(42)));
    const c = serializeNetwork(generateNull(model, net, createRng(43)));
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
  });

  it("keeps empty rows and columns of the dimensions (ER) and at degree 0 (curveball)", () => {
    const net = bipartite([[1, 1, 0], [0, 0, 0], [1, 0, 0]]);
    const er = generateNull("er", net, createRng(1));
    expect(er.rowLabels.length).toBe(3);
    expect(er.colLabels.length).toBe(3);
    const cb = generateNull("curveball", net, createRng(1));
    expect(degreesOf(cb)).toEqual(degreesOf(net));
  });

  it("refuses an edge-less network with no-links", () => {
    const net = bipartite([[0, 0], [0, 0]]);
    expect(() => generateNull("er", net, createRng(1))).toThrow(NetworkEngineError);
  });
});
