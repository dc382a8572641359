/**
 * The optimizer's working graph (one quality formula for all objectives) against modularity() of
 * quality.ts, an independent implementation of the published formulas: Q of random partitions, the move
 * gain g(v, c) of formula (2) against the change of modularity() when v actually moves, and aggregation
 * keeping Q (the invariant in shared/network/README.md, "One quality, three objectives"; aggregation in
 * Traag, Waltman & van Eck 2019, docs/science.md).
 */
import { describe, expect, it } from "vitest";
import { modularity, type Objective } from "@shared/network/modularity/quality";
import { aggregateGraph, createWorkspace, refinePartition } from "@shared/network/optimizer/leiden";
import { buildQualityGraph, graphQuality, renumber, type QualityGraph } from "@shared/network/optimizer/quality-graph";
import type { Network } from "@shared/network/types";
import { bipartite, createRng, oneMode, randomEdges, randomMatrix } from "./helpers";

const rng = createRng(4242);
const cases: Array<[string, Network, Objective]> = [
  ["undirected binary", oneMode(25, randomEdges(rng, 25, 0.2)), "newman"],
  ["undirected weighted with self-loops", oneMode(25, randomEdges(rng, 25, 0.2, 7, false, true)), "newman"],
  ["directed weighted with cannibal links (Q_d)", oneMode(25, randomEdges(rng, 25, 0.15, 5, true, true), true), "newman-directed"],
  ["directed seen as undirected (Newman on A + Aᵀ)", oneMode(25, randomEdges(rng, 25, 0.15, 5, true, true), true), "newman"],
  ["undirected under Q_d", oneMode(20, randomEdges(rng, 20, 0.25, 3, false, true)), "newman-directed"],
  ["bipartite binary (Barber)", bipartite(randomMatrix(rng, 12, 17, 0.25)), "barber"],
  ["bipartite weighted (Barber)", bipartite(randomMatrix(rng, 12, 17, 0.25, 9)), "barber"],
  ["bipartite seen as one-mode (Newman)", bipartite(randomMatrix(rng, 12, 17, 0.25, 9)), "newman"],
];

function randomPartition(n: number, k: number): Int32Array {
  return Int32Array.from({ length: n }, () => rng.nextInt(k));
}

/** Gain of moving v into module c (formula (2) of quality-graph.ts), v taken out of its module first. */
function gain(g: QualityGraph, memb: Int32Array, v: number, c: number): number {
  let e = 0;
  for (let p = g.ptr[v]; p < g.ptr[v + 1]; p++) if (memb[g.nbr[p]] === c && g.nbr[p] !== v) e += g.ew[p];
  let A = 0;
  let B = 0;
  for (let u = 0; u < g.n; u++)
    if (u !== v && memb[u] === c) {
      A += g.a[u];
      B += g.b[u];
    }
  return e - g.gamma * (g.a[v] * B + g.b[v] * A);
}

describe("working graph of the optimizer", () => {
  for (const [name, net, objective] of cases) {
    it(`${name}: Q equals modularity(), gains equal ΔQ, aggregation keeps Q`, () => {
      const g = buildQualityGraph(net, objective);
      for (let t = 0; t < 20; t++) {
        const memb = randomPartition(g.n, 1 + (t % 6));
        expect(graphQuality(g, memb)).toBeCloseTo(modularity(net, memb, objective), 12);
        // Move a random node to another module (or a new one) and compare ΔQ.
        const v = rng.nextInt(g.n);
        const target = rng.nextInt(8);
        if (target === memb[v]) continue;
        const before = modularity(net, memb, objective);
        const dq = g.alpha * (gain(g, memb, v, target) - gain(g, memb, v, memb[v]));
        const moved = memb.slice();
        moved[v] = target;
        expect(modularity(net, moved, objective) - before).toBeCloseTo(dq, 12);
      }
      // Aggregation on a random partition and on a refined Leiden partition: the coarse graph with the
      // induced partition has the same Q.
      const ws = createWorkspace(g.n);
      const fine = randomPartition(g.n, 9);
      const kf = renumber(fine);
      const coarse = aggregateGraph(g, fine, kf, ws);
      const upper = randomPartition(kf, 3);
      const lifted = Int32Array.from(fine, (c) => upper[c]);
      expect(graphQuality(coarse, upper)).toBeCloseTo(modularity(net, lifted, objective), 12);
      const modules = randomPartition(g.n, 4);
      renumber(modules);
      const { refined, k } = refinePartition(g, modules, rng, ws, 1);
      // Refinement only splits: each refined sub-module lies inside one module.
      for (let u = 0; u < g.n; u++)
        for (let w = 0; w < g.n; w++) if (refined[u] === refined[w]) expect(modules[u]).toBe(modules[w]);
      const agg = aggregateGraph(g, refined, k, ws);
      const induced = new Int32Array(k);
      for (let u = 0; u < g.n; u++) induced[refined[u]] = modules[u];
      expect(graphQuality(agg, induced)).toBeCloseTo(modularity(net, modules, objective), 12);
    });
  }
});
