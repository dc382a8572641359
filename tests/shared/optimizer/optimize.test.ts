import { describe, expect, it } from "vitest";
import { modularity } from "@shared/network/modularity/quality";
import { optimizeModularity } from "@shared/network/optimizer/optimize";
import type { Network } from "@shared/network/types";
import { bipartite, createRng, davis, karate, oneMode, randomEdges, randomMatrix } from "./helpers";

/** Checks the partition is 0-based, consecutive, one entry per node. */
function expectValidPartition(p: Int32Array, n: number, modules: number) {
  expect(p.length).toBe(n);
  const seen = new Set<number>();
  for (const c of p) {
    expect(Number.isInteger(c) && c >= 0 && c < modules).toBe(true);
    seen.add(c);
  }
  expect(seen.size).toBe(modules);
  // Canonical numbering: first appearances in node order are 0, 1, 2, ...
  let next = 0;
  for (const c of p) if (c === next) next++;
  expect(next).toBe(modules);
}

/** Every module induces a connected sub-graph (links taken in either direction). */
function expectConnectedModules(net: Network, p: Int32Array) {
  const R = net.rowLabels.length;
  const n = p.length;
  const off = net.kind === "bipartite" ? R : 0;
  const adj: number[][] = Array.from({ length: n }, () => []);
  for (let i = 0; i < R; i++)
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
      const j = net.colIdx[e] + off;
      adj[i].push(j);
      adj[j].push(i);
    }
  const seenModule = new Set<number>();
  const visited = new Uint8Array(n);
  for (let s = 0; s < n; s++) {
    if (visited[s]) continue;
    // A second component of an already seen module means the module is disconnected.
    expect(seenModule.has(p[s]), `module ${p[s]} is disconnected`).toBe(false);
    seenModule.add(p[s]);
    const stack = [s];
    visited[s] = 1;
    while (stack.length) {
      const v = stack.pop()!;
      for (const u of adj[v])
        if (!visited[u] && p[u] === p[v]) {
          visited[u] = 1;
          stack.push(u);
        }
    }
  }
}

/** Relabels nodes: node v of the result is node perm[v] of `net` (bipartite: rows and columns separately). */
function permuteNetwork(net: Network, rowPerm: number[], colPerm: number[]): Network {
  const inv = (perm: number[]) => {
    const r = new Array<number>(perm.length);
    perm.forEach((old, nw) => (r[old] = nw));
    return r;
  };
  const rInv = inv(rowPerm);
  const cInv = inv(colPerm);
  const R = net.rowLabels.length;
  if (net.kind === "bipartite") {
    const C = net.colLabels.length;
    const m = Array.from({ length: R }, () => new Array<number>(C).fill(0));
    for (let i = 0; i < R; i++)
      for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) m[rInv[i]][cInv[net.colIdx[e]]] = net.weights[e];
    return bipartite(m);
  }
  const edges: Array<[number, number, number]> = [];
  for (let i = 0; i < R; i++)
    for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
      const j = net.colIdx[e];
      if (net.directed || i <= j) edges.push([rInv[i], rInv[j], net.weights[e]]);
    }
  return oneMode(R, edges, net.directed);
}

function shuffled(n: number, seed: number): number[] {
  const rng = createRng(seed);
  const p = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = rng.nextInt(i + 1);
    [p[i], p[j]] = [p[j], p[i]];
  }
  return p;
}

describe("optimizeModularity on reference networks", () => {
  it("reaches the karate-club maximum Q = 1277/3042 ≈ 0.4198 with 4 modules", () => {
    // Source: Brandes et al. 2008, IEEE TKDE 20:172 (doi:10.1109/TKDE.2007.190689), exact optimum of
    // Zachary's (1977) karate club; also ../../fixtures/README.md.
    const net = karate();
    const res = optimizeModularity(net);
    expect(res.objective).toBe("newman");
    expect(res.Q!).toBeCloseTo(1277 / 3042, 4);
    expect(Math.abs(res.Q! - 1277 / 3042)).toBeLessThan(1e-4);
    expect(res.modules).toBe(4);
    expect(res.Q!).toBeCloseTo(modularity(net, res.partition, "newman"), 12);
  });

  it("reaches the Davis Southern Women maximum Barber Q_B = 2737/7921 ≈ 0.345537 with 4 modules", () => {
    // Source: exact integer program (Brandes et al. 2008 formulation) solved by scripts/derive-reference-optima.ts
    // (re-derived in tests/scripts/reference-optima.test.ts) on Davis, Gardner & Gardner (1941) 18 women × 14 events.
    const net = davis();
    const res = optimizeModularity(net);
    expect(res.objective).toBe("barber");
    expect(Math.abs(res.Q! - 2737 / 7921)).toBeLessThan(1e-4);
    expect(res.modules).toBe(4);
    expect(res.Q!).toBeCloseTo(modularity(net, res.partition, "barber"), 12);
  });

  it("reaches the one-mode Newman Q maximum 0.336006 of the Davis graph", () => {
    // Source: exact integer program, scripts/derive-reference-optima.ts: 5323/15842 with 3 modules (Davis graph as one-mode).
    const res = optimizeModularity(davis(), { objective: "newman" });
    expect(Math.abs(res.Q! - 0.336006)).toBeLessThan(1e-4);
  });

  it("splits two triangles joined by one link into the triangles, Q = 5/14", () => {
    // Source: hand computation from the definition (docs/science.md check table).
    const net = oneMode(6, [[0, 1], [1, 2], [0, 2], [3, 4], [4, 5], [3, 5], [2, 3]]);
    const res = optimizeModularity(net);
    expect(res.Q!).toBeCloseTo(5 / 14, 12);
    expect(Array.from(res.partition)).toEqual([0, 0, 0, 1, 1, 1]);
  });

  it("splits two directed 3-cycles joined by an arc, Q_d = 18/49", () => {
    // Source: hand computation in the Leicht & Newman 2008 form (docs/science.md check table).
    const net = oneMode(6, [[0, 1], [1, 2], [2, 0], [3, 4], [4, 5], [5, 3], [2, 3]], true);
    const res = optimizeModularity(net);
    expect(res.objective).toBe("newman-directed");
    expect(res.Q!).toBeCloseTo(18 / 49, 12);
    expect(Array.from(res.partition)).toEqual([0, 0, 0, 1, 1, 1]);
  });

  it("finds Q_B = 1 − 1/c for c identical disconnected complete bipartite blocks", () => {
    // Source: follows from Barber's definition (docs/science.md check table).
    for (const c of [2, 3, 5]) {
      const m = Array.from({ length: 2 * c }, (_, i) =>
        Array.from({ length: 3 * c }, (_, j) => (Math.floor(i / 2) === Math.floor(j / 3) ? 1 : 0)),
      );
      const res = optimizeModularity(bipartite(m));
      expect(res.Q!).toBeCloseTo(1 - 1 / c, 12);
      expect(res.modules).toBe(c);
    }
  });

  it("uses weights: [[3,1],[1,3]] gives Q_B = 0.25 with modules {r1,c1},{r2,c2}", () => {
    // Source: hand computation (docs/science.md check table): (6/8) − 2·(4·4)/64 = 0.25.
    const res = optimizeModularity(bipartite([[3, 1], [1, 3]]));
    expect(res.Q!).toBeCloseTo(0.25, 12);
    expect(Array.from(res.partition)).toEqual([0, 1, 0, 1]);
  });
});

describe("optimizeModularity edge cases", () => {
  it("returns Q null with a reason for a network without links", () => {
    // Decision (engine README): modularity of an edge-less network is undefined (m = 0).
    const res = optimizeModularity(bipartite([[0, 0], [0, 0]]));
    expect(res.Q).toBeNull();
    expect(res.undefinedReason).toMatch(/no links/);
    expect(Array.from(res.partition)).toEqual([0, 1, 2, 3]);
    expect(res.restarts.n).toBe(0);
  });

  it("keeps isolated nodes in modules of their own and finds the optimum of the rest", () => {
    // Two triangles plus two isolated nodes: Q = 5/14 as without them (they change neither m nor any K_c).
    const net = oneMode(8, [[0, 1], [1, 2], [0, 2], [3, 4], [4, 5], [3, 5], [2, 3]]);
    const res = optimizeModularity(net);
    expect(res.Q!).toBeCloseTo(5 / 14, 12);
    expect(res.modules).toBe(4);
    expect(res.partition[6]).not.toBe(res.partition[7]);
  });

  it("counts self-loops as in modularity()", () => {
    const net = oneMode(6, [[0, 0, 2], [0, 1], [1, 2], [0, 2], [3, 4], [4, 5], [3, 5], [2, 3], [5, 5]]);
    const res = optimizeModularity(net);
    expect(res.Q!).toBeCloseTo(modularity(net, res.partition), 12);
    expect(res.Q!).toBeGreaterThan(modularity(net, [0, 0, 0, 1, 1, 1]) - 1e-12);
  });

  it("gives Q = 0 with one module for a complete graph", () => {
    // Any split of K_n lowers Q below 0 = Q of the single module (Newman 2006, PNAS 103:8577; from memory).
    const edges: Array<[number, number]> = [];
    for (let i = 0; i < 6; i++) for (let j = i + 1; j < 6; j++) edges.push([i, j]);
    const res = optimizeModularity(oneMode(6, edges));
    expect(res.Q!).toBeCloseTo(0, 12);
    expect(res.modules).toBe(1);
  });

  it("rejects Barber's objective on a one-mode network and bad options", () => {
    expect(() => optimizeModularity(karate(), { objective: "barber" })).toThrow(/bipartite/);
    expect(() => optimizeModularity(karate(), { restarts: 0 })).toThrow(/restarts/);
    expect(() => optimizeModularity(karate(), { seed: -1 })).toThrow(/seed/);
  });
});

describe("optimizeModularity invariants", () => {
  const rng = createRng(20240601);
  const cases: Array<[string, Network]> = [
    ["karate", karate()],
    ["davis", davis()],
    ["random one-mode 60", oneMode(60, randomEdges(rng, 60, 0.08))],
    ["random weighted directed 40", oneMode(40, randomEdges(rng, 40, 0.08, 5, true, true), true)],
    ["random weighted bipartite 30×45", bipartite(randomMatrix(rng, 30, 45, 0.12, 6))],
  ];
  for (const [name, net] of cases) {
    it(`${name}: valid partition, Q = modularity(), Q ≥ singleton Q, connected modules, spread`, () => {
      const res = optimizeModularity(net, { restarts: 8 });
      const n = res.partition.length;
      expectValidPartition(res.partition, n, res.modules);
      expect(res.Q!).toBeCloseTo(modularity(net, res.partition, res.objective), 12);
      const singletons = Int32Array.from({ length: n }, (_, i) => i);
      expect(res.Q!).toBeGreaterThanOrEqual(modularity(net, singletons, res.objective));
      expectConnectedModules(net, res.partition);
      const r = res.restarts;
      expect(r.n).toBe(8);
      expect(r.qs).toHaveLength(8);
      expect(r.min!).toBeLessThanOrEqual(r.median!);
      expect(r.median!).toBeLessThanOrEqual(r.max!);
      expect(res.Q!).toBeGreaterThanOrEqual(r.max! - 1e-12);
      expect(r.bestShare!).toBeGreaterThan(0);
      expect(r.bestShare!).toBeLessThanOrEqual(1);
    });
  }

  it("same seed → identical partition; restarts are reproducible one by one", () => {
    const net = cases[4][1];
    const a = optimizeModularity(net, { restarts: 6, seed: 77 });
    const b = optimizeModularity(net, { restarts: 6, seed: 77 });
    expect(Array.from(a.partition)).toEqual(Array.from(b.partition));
    expect(a.restarts.qs).toEqual(b.restarts.qs);
    // Restart r depends only on (seed, r): the first 3 of 6 restarts equal a 3-restart run.
    const c = optimizeModularity(net, { restarts: 3, seed: 77, annealing: "off" });
    expect(c.restarts.qs).toEqual(a.restarts.qs.slice(0, 3));
    expect(a.algorithm.seed).toBe(77);
  });

  it("the best Q does not depend on the order of the nodes (relabelling invariance)", () => {
    // Karate and Davis: the optimizer reaches the known optimum, so any relabelling must give it too.
    const k = karate();
    const d = davis();
    const q0 = optimizeModularity(k).Q!;
    const q1 = optimizeModularity(permuteNetwork(k, shuffled(34, 3), [])).Q!;
    expect(q1).toBeCloseTo(q0, 10);
    const b0 = optimizeModularity(d).Q!;
    const b1 = optimizeModularity(permuteNetwork(d, shuffled(18, 4), shuffled(14, 5))).Q!;
    expect(b1).toBeCloseTo(b0, 10);
  });
});
