/**
 * Exact optimum by enumeration: for random networks of up to 10 nodes, every set partition (restricted
 * growth strings; Bell(10) = 115,975 of them) is scored with modularity() of quality.ts, an independent
 * implementation of the objective, and the optimizer with default settings must reach the maximum.
 * (Method: exhaustive search, as docs/science.md describes for networks up to about 10 nodes.)
 */
import { describe, expect, it } from "vitest";
import { modularity, type Objective } from "@shared/network/modularity/quality";
import { optimizeModularity } from "@shared/network/optimizer/optimize";
import type { Network } from "@shared/network/types";
import { bipartite, createRng, oneMode, randomEdges, randomMatrix } from "./helpers";

/** Calls visit(a) for every set partition of n nodes, as a restricted growth string a (a[0] = 0, a[i] ≤ 1 + max a[0..i−1]). */
function forEachPartition(n: number, visit: (a: Int32Array) => void): void {
  const a = new Int32Array(n);
  const mx = new Int32Array(n); // mx[i] = max(a[0..i])
  for (;;) {
    visit(a);
    // Next string: increment the last position that can grow, reset the tail to 0.
    let i = n - 1;
    while (i > 0 && a[i] > mx[i - 1]) i--;
    if (i === 0) break;
    a[i]++;
    mx[i] = Math.max(mx[i - 1], a[i]);
    for (let j = i + 1; j < n; j++) {
      a[j] = 0;
      mx[j] = mx[i];
    }
  }
}

/** Maximum of modularity() over all set partitions of n nodes. */
function exactMaximum(net: Network, n: number, objective: Objective): number {
  let best = -Infinity;
  forEachPartition(n, (a) => {
    const q = modularity(net, a, objective);
    if (q > best) best = q;
  });
  return best;
}

describe("exact enumeration of all partitions", () => {
  it("the enumerator visits Bell(n) distinct partitions", () => {
    // Bell numbers 1, 2, 5, 15, 52, 203, …, 115975 (OEIS A000110).
    for (const [n, bell] of [[1, 1], [2, 2], [3, 5], [4, 15], [5, 52], [6, 203], [10, 115975]]) {
      let count = 0;
      const seen = new Set<string>();
      forEachPartition(n, (a) => {
        count++;
        if (n <= 6) seen.add(a.join(","));
      });
      expect(count).toBe(bell);
      if (n <= 6) expect(seen.size).toBe(bell);
    }
  });

  const rng = createRng(8675309);
  const cases: Array<{ name: string; net: Network; n: number; objective: Objective }> = [];
  for (let k = 0; k < 4; k++) {
    const n = 8 + (k % 3);
    cases.push({ name: `one-mode binary #${k} (${n} nodes)`, net: oneMode(n, randomEdges(rng, n, 0.35)), n, objective: "newman" });
  }
  for (let k = 0; k < 3; k++) {
    const n = 9;
    cases.push({
      name: `one-mode weighted with self-loops #${k}`,
      net: oneMode(n, randomEdges(rng, n, 0.35, 4, false, true)),
      n,
      objective: "newman",
    });
  }
  for (let k = 0; k < 3; k++) {
    const n = 9;
    cases.push({
      name: `directed ${k % 2 ? "weighted" : "binary"} #${k}`,
      net: oneMode(n, randomEdges(rng, n, 0.2, k % 2 ? 5 : 1, true, k === 2), true),
      n,
      objective: "newman-directed",
    });
  }
  for (let k = 0; k < 4; k++) {
    const [R, C] = k < 2 ? [4, 5] : [4, 6];
    cases.push({
      name: `bipartite ${k % 2 ? "weighted" : "binary"} ${R}×${C} #${k}`,
      net: bipartite(randomMatrix(rng, R, C, 0.45, k % 2 ? 6 : 1)),
      n: R + C,
      objective: "barber",
    });
  }
  cases.push({ name: "bipartite as one-mode (newman) 4×5", net: bipartite(randomMatrix(rng, 4, 5, 0.5)), n: 9, objective: "newman" });

  for (const c of cases) {
    it(`${c.name}: the optimizer reaches the exact maximum`, () => {
      let links = 0;
      for (const w of c.net.weights) links += w;
      if (links === 0) return;
      const exact = exactMaximum(c.net, c.n, c.objective);
      const res = optimizeModularity(c.net, { objective: c.objective });
      expect(res.Q!).toBeCloseTo(exact, 10);
      // The maximum is not attained by the trivial partitions (so the check has teeth).
      expect(exact).toBeGreaterThan(modularity(c.net, new Int32Array(c.n), c.objective) + 1e-9);
    });
  }
});
