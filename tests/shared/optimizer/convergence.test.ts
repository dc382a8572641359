/**
 * The optimizer runs to convergence (whole Leiden passes until one no longer raises Q), keeps its modules
 * connected on hard networks (heavy-tailed degrees, unequal modules, weak separation: the seeded
 * generators of scripts/lib/hard-networks.ts), and gives, seed for seed, the results it gave before its
 * speed work wherever the algorithm is unchanged.
 */
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { lfrGraph, nestedBipartite, plantedBipartiteDC, weightedBipartiteDC, weightedLfrGraph } from "../../../scripts/lib/hard-networks";
import { modularity } from "@shared/network/modularity/quality";
import { leiden, type LeidenTrace } from "@shared/network/optimizer/leiden";
import { optimizeModularity } from "@shared/network/optimizer/optimize";
import { buildQualityGraph, type QualityGraph } from "@shared/network/optimizer/quality-graph";
import { createRng, deriveSeed } from "@shared/network/random";
import type { Network } from "@shared/network/types";
import { davis, karate } from "./helpers";

const hash = (p: Int32Array) => createHash("sha256").update(Array.from(p).join(",")).digest("hex").slice(0, 16);

/** Random one-mode graph with heavy-tailed degrees and no modules (one planted module of every node). */
const randomOneMode = (n: number, seed: number) =>
  lfrGraph({ nodes: n, mu: 0, seed, minDegree: 3, maxDegree: 20, tau1: 2.5, minModule: n, maxModule: n }).net;

/**
 * Largest ΔQ of any single-node move (to a module of a neighbour or to a new module) and of any merge of
 * two modules, each scored from scratch with modularity() of quality.ts (an implementation independent of
 * the optimizer's working graph).
 */
function bestImprovement(net: Network, part: Int32Array, objective: "newman" | "barber"): { move: number; merge: number } {
  const n = part.length;
  const q0 = modularity(net, part, objective);
  const R = net.rowLabels.length;
  const off = net.kind === "bipartite" ? R : 0;
  const nbrs: number[][] = Array.from({ length: n }, () => []);
  for (let i = 0; i < R; i++)
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
      nbrs[i].push(net.colIdx[e] + off);
      nbrs[net.colIdx[e] + off].push(i);
    }
  let k = 0;
  for (const c of part) k = Math.max(k, c + 1);
  const trial = part.slice();
  let move = -Infinity;
  for (let v = 0; v < n; v++) {
    const targets = new Set(nbrs[v].map((u) => part[u]));
    targets.add(k); // a new module of its own
    targets.delete(part[v]);
    for (const t of targets) {
      trial[v] = t;
      move = Math.max(move, modularity(net, trial, objective) - q0);
    }
    trial[v] = part[v];
  }
  let merge = -Infinity;
  for (let c1 = 0; c1 < k; c1++)
    for (let c2 = c1 + 1; c2 < k; c2++) {
      for (let v = 0; v < n; v++) trial[v] = part[v] === c2 ? c1 : part[v];
      merge = Math.max(merge, modularity(net, trial, objective) - q0);
    }
  return { move, merge };
}

/** Each module induces a connected sub-graph of the working graph. */
function disconnectedModules(g: QualityGraph, memb: Int32Array): number {
  const seen = new Uint8Array(g.n);
  const modulesSeen = new Set<number>();
  let bad = 0;
  for (let s = 0; s < g.n; s++) {
    if (seen[s]) continue;
    if (modulesSeen.has(memb[s])) bad++;
    modulesSeen.add(memb[s]);
    const stack = [s];
    seen[s] = 1;
    while (stack.length) {
      const v = stack.pop()!;
      for (let e = g.ptr[v]; e < g.ptr[v + 1]; e++) {
        const u = g.nbr[e];
        if (!seen[u] && memb[u] === memb[v]) {
          seen[u] = 1;
          stack.push(u);
        }
      }
    }
  }
  return bad;
}

describe("convergence", () => {
  it("leaves no improving single-node move or merge of two modules on seeded random networks", () => {
    const cases: Array<[Network, "newman" | "barber"]> = [
      [randomOneMode(300, 41), "newman"],
      [plantedBipartiteDC({ rows: 80, cols: 120, modules: 1, seed: 42, minDegree: 2 }).net, "barber"],
      [lfrGraph({ nodes: 250, mu: 0.5, seed: 43 }).net, "newman"],
    ];
    for (const [net, objective] of cases) {
      const res = optimizeModularity(net, { restarts: 3, seed: 9, annealing: "off" });
      expect(res.convergence).toMatchObject({ converged: true, capped: 0 });
      const { move, merge } = bestImprovement(net, res.partition, objective);
      expect(move).toBeLessThanOrEqual(1e-12);
      expect(merge).toBeLessThanOrEqual(1e-12);
    }
  });

  it("runs past the former cap of 20 passes when passes still raise Q, and only then differs", () => {
    // Q of each restart recorded with the optimizer as it was before convergence replaced the cap of 20
    // passes (same seed, same network). The first 20 passes draw the same random numbers, so a restart that
    // needed at most 20 passes gives exactly the old Q and one that needed more gives a higher Q.
    const old = [
      0.46480329924992525, 0.4640747467345787, 0.46316742771792513, 0.45586665999833664, 0.4579478673332,
      0.46238830078963516, 0.4604609239608082, 0.46054640876713066,
    ];
    const res = optimizeModularity(randomOneMode(1000, 35), { restarts: 8, seed: 5 });
    expect(res.convergence.converged).toBe(true);
    expect(Math.max(...res.restarts.passes)).toBeGreaterThan(20);
    res.restarts.passes.forEach((passes, r) => {
      if (passes <= 20) expect(res.restarts.qs[r]).toBe(old[r]);
      else expect(res.restarts.qs[r]).toBeGreaterThan(old[r] + 1e-9);
    });
  });

  it("records every pass and level in a trace; Q rises pass by pass until the last", () => {
    const g = buildQualityGraph(lfrGraph({ nodes: 400, mu: 0.5, seed: 44 }).net, "newman");
    const trace: LeidenTrace = { levels: [], passQ: [] };
    const res = leiden(g, createRng(7), { trace });
    expect(res.converged).toBe(true);
    expect(trace.passQ).toHaveLength(res.passes);
    for (let p = 1; p < res.passes - 1; p++) expect(trace.passQ[p]).toBeGreaterThan(trace.passQ[p - 1]);
    expect(trace.passQ[res.passes - 1]).toBeLessThanOrEqual(trace.passQ[res.passes - 2] + 1e-12);
    for (let p = 0; p < res.passes; p++) {
      const levels = trace.levels.filter((l) => l.pass === p);
      expect(levels[0].nodes).toBe(g.n);
      for (let i = 1; i < levels.length; i++) expect(levels[i].nodes).toBe(levels[i - 1].refined);
      expect(levels[levels.length - 1].refined).toBeNull(); // the last level moved nothing
      for (const l of levels) expect(l.visits).toBeGreaterThanOrEqual(l.nodes);
    }
  });
});

describe("connected modules on hard networks", () => {
  const cases: Array<[string, Network, "newman" | "barber"]> = [
    ["LFR-style, μ = 0.3, 600 nodes", lfrGraph({ nodes: 600, mu: 0.3, seed: 51 }).net, "newman"],
    ["LFR-style, μ = 0.5, 600 nodes", lfrGraph({ nodes: 600, mu: 0.5, seed: 52 }).net, "newman"],
    ["degree-corrected planted bipartite 150 × 250", plantedBipartiteDC({ rows: 150, cols: 250, modules: 8, seed: 53 }).net, "barber"],
    ["random bipartite 150 × 250 with heavy tails", plantedBipartiteDC({ rows: 150, cols: 250, modules: 1, seed: 54, tau: 2, colTau: 1.8 }).net, "barber"],
  ];
  for (const [name, net, objective] of cases) {
    it(`${name}: every module of every Leiden run is connected`, () => {
      const g = buildQualityGraph(net, objective);
      for (let r = 0; r < 4; r++) {
        const res = leiden(g, createRng(deriveSeed(3, r)));
        expect(disconnectedModules(g, res.membership)).toBe(0);
      }
    });
  }
});

describe("same seed, same results as before the speed work", () => {
  // Restart Qs and the best partition (SHA-256 of its comma-joined module numbers) recorded with the
  // optimizer before its speed work, for networks where every restart converged within 20 passes (so the
  // former cap did not bind): 8 restarts, seed 5, default annealing.
  const cases: Array<[string, () => Network, number[], string]> = [
    ["karate", karate, Array(8).fill(0.4197896120973044), "e535c9d43a8472f8"],
    [
      "davis",
      davis,
      [
        0.34515843959096076, 0.34515843959096076, 0.3452846862769852, 0.34515843959096076, 0.3452846862769852,
        0.34515843959096076, 0.3455371796490342, 0.34515843959096076,
      ],
      "dbd2d87ce0139fb5",
    ],
    ["LFR-style 400, μ = 0.3", () => lfrGraph({ nodes: 400, mu: 0.3, seed: 31 }).net, Array(8).fill(0.594697752572989), "d547f957be1a0a37"],
    [
      "LFR-style 600, μ = 0.5",
      () => lfrGraph({ nodes: 600, mu: 0.5, seed: 33 }).net,
      [
        0.4287651534722558, 0.429697980880884, 0.4303053000616934, 0.4303420349482715, 0.43116333152797504,
        0.42950111106454786, 0.43069685151520143, 0.42760521958974695,
      ],
      "39d1f893d9268b09",
    ],
    [
      "degree-corrected bipartite 40 × 60 (annealed)",
      () => plantedBipartiteDC({ rows: 40, cols: 60, modules: 4, seed: 34, minDegree: 3 }).net,
      [
        0.542355995652699, 0.5336010143702452, 0.5386124864146843, 0.5344463229078614, 0.5368011109769352,
        0.531548122207463, 0.5383105905083928, 0.5386124864146843,
      ],
      "b2b644d25d896a93",
    ],
    [
      "degree-corrected bipartite 100 × 150",
      () => plantedBipartiteDC({ rows: 100, cols: 150, modules: 6, seed: 32 }).net,
      [
        0.3309204439299331, 0.32732792798430244, 0.3269390646719916, 0.32348287437033196, 0.3196389381796727,
        0.31727447045309287, 0.3264429287218018, 0.3268686670033835,
      ],
      "c3f7fb3dfb55ba47",
    ],
    // Weighted and nested networks, recorded before refinement skipped the exponentials of clear choices.
    [
      "weighted LFR-style 400, μ = 0.4, real weights",
      () => weightedLfrGraph({ nodes: 400, mu: 0.4, seed: 36, integer: false }).net,
      [
        0.6251324925106113, 0.6267189205554242, 0.6280161000826392, 0.6258437731801614, 0.6272477994449457,
        0.6272190795259102, 0.6260178714375879, 0.6268291894297363,
      ],
      "0ed2cc8eaa1b4ffd",
    ],
    [
      "weighted bipartite 80 × 120 with heavy-tailed counts (annealed)",
      () => weightedBipartiteDC({ rows: 80, cols: 120, modules: 5, seed: 37 }).net,
      [
        0.5720821825941168, 0.5716446273433928, 0.5721871056241427, 0.5716446273433928, 0.5711786617893614,
        0.5706847126962353, 0.5714616674287457, 0.571795031245237,
      ],
      "a048eb95fb20e3a5",
    ],
    [
      "nested bipartite 60 × 90 (annealed)",
      () => nestedBipartite({ rows: 60, cols: 90, seed: 38 }).net,
      [
        0.32164266117969825, 0.32164266117969825, 0.3290209190672153, 0.3290903635116598, 0.32164266117969825,
        0.32862568587105623, 0.32164266117969825, 0.3290903635116598,
      ],
      "0eea21194325bd42",
    ],
  ];
  for (const [name, build, qs, partitionHash] of cases) {
    it(name, () => {
      const res = optimizeModularity(build(), { restarts: 8, seed: 5 });
      expect(res.restarts.qs).toEqual(qs);
      expect(hash(res.partition)).toBe(partitionHash);
    });
  }
});
