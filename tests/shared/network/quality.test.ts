import Graph from "graphology";
import graphologyModularity from "graphology-metrics/graph/modularity";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  createRng, defaultObjective, modularity, NetworkEngineError, parseNetworkText, type Objective,
} from "@shared/network/index";
import { bipartite, denseModularity, oneMode, randomMatrix, randomOneMode, randomPartition } from "./helpers";

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/${name}`, import.meta.url));

describe("modularity of a given partition: published and hand-computed values", () => {
  it("two triangles joined by one edge, split into the triangles: Q = 5/14 (hand computation from the definition)", () => {
    const net = oneMode(6, [[0, 1], [1, 2], [0, 2], [3, 4], [4, 5], [3, 5], [2, 3]]);
    expect(modularity(net, Int32Array.from([0, 0, 0, 1, 1, 1]))).toBeCloseTo(5 / 14, 12);
    expect(defaultObjective(net)).toBe("newman");
  });

  it("directed 3-cycles 0→1→2→0 and 3→4→5→3 plus arc 2→3: Q_d = 18/49 (hand computation, Leicht & Newman form)", () => {
    const net = oneMode(6, [[0, 1], [1, 2], [2, 0], [3, 4], [4, 5], [5, 3], [2, 3]], true);
    expect(defaultObjective(net)).toBe("newman-directed");
    expect(modularity(net, Int32Array.from([0, 0, 0, 1, 1, 1]))).toBeCloseTo(18 / 49, 12);
  });

  it.each([2, 3, 4, 5])("%i identical disconnected complete bipartite blocks: Q_B = 1 − 1/c (follows from Barber's definition)", (c) => {
    const I = 2 * c, J = 3 * c;
    const matrix = Array.from({ length: I }, (_, i) => Array.from({ length: J }, (_, j) => (Math.floor(i / 2) === Math.floor(j / 3) ? 1 : 0)));
    const net = bipartite(matrix);
    const part = new Int32Array(I + J);
    for (let i = 0; i < I; i++) part[i] = Math.floor(i / 2);
    for (let j = 0; j < J; j++) part[I + j] = Math.floor(j / 3);
    expect(defaultObjective(net)).toBe("barber");
    expect(modularity(net, part)).toBeCloseTo(1 - 1 / c, 12);
  });

  it("weighted 2×2 [[3,1],[1,3]] with modules {r1,c1},{r2,c2}: Q_B = 0.25 weighted, 0 binary (hand computation)", () => {
    const net = bipartite([[3, 1], [1, 3]]);
    const part = Int32Array.from([0, 1, 0, 1]);
    expect(modularity(net, part, "barber")).toBeCloseTo(0.25, 12);
    expect(modularity(net, part, "barber", { weighted: false })).toBeCloseTo(0, 12);
  });

  it("Zachary's karate club, the 4-module partition of maximum Q: Q = 1277/3042 ≈ 0.4198 (Brandes et al. 2008; partition from memory)", () => {
    const { network } = parseNetworkText(fixture("karate.edgelist.csv"), { fileName: "karate.edgelist.csv", kind: "unipartite" });
    const modules = [
      [1, 2, 3, 4, 8, 12, 13, 14, 18, 20, 22],
      [5, 6, 7, 11, 17],
      [9, 10, 15, 16, 19, 21, 23, 27, 30, 31, 33, 34],
      [24, 25, 26, 28, 29, 32],
    ];
    const part = new Int32Array(34);
    modules.forEach((ms, c) => ms.forEach((v) => (part[network.rowLabels.indexOf(String(v))] = c)));
    expect(modularity(network, part)).toBeCloseTo(1277 / 3042, 10);
  });

  it("a single module gives Q = 0 exactly for every objective (Σ K_c = 2m)", () => {
    const rng = createRng(5);
    const b = bipartite(randomMatrix(rng, 6, 7, 0.4, true));
    expect(modularity(b, new Int32Array(13), "barber")).toBeCloseTo(0, 14);
    expect(modularity(b, new Int32Array(13), "newman")).toBeCloseTo(0, 14);
    const d = randomOneMode(rng, 9, 0.3, true, true, true);
    expect(modularity(d, new Int32Array(9), "newman-directed")).toBeCloseTo(0, 14);
  });
});

describe("modularity agrees with graphology-metrics (npm reference library) on random one-mode graphs", () => {
  const cases: Array<[boolean, boolean]> = [[false, false], [false, true], [true, false], [true, true]];
  it.each(cases)("directed=%s weighted=%s, 30 random graphs, to 1e-9", (directed, weighted) => {
    const rng = createRng(directed ? (weighted ? 11 : 12) : weighted ? 13 : 14);
    for (let t = 0; t < 30; t++) {
      const n = 5 + rng.nextInt(40);
      const net = randomOneMode(rng, n, 0.05 + rng.next() * 0.4, directed, weighted);
      if (net.rowPtr[n] === 0) continue;
      const part = randomPartition(rng, n, 1 + rng.nextInt(6));
      const g = new Graph({ type: directed ? "directed" : "undirected" });
      for (let v = 0; v < n; v++) g.addNode(String(v), { community: part[v] });
      for (let i = 0; i < n; i++) {
        for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) {
          const j = net.colIdx[p];
          if (!directed && j < i) continue;
          g.addEdge(String(i), String(j), { weight: net.weights[p] });
        }
      }
      const ref = graphologyModularity(g, { getNodeCommunity: "community", getEdgeWeight: weighted ? "weight" : null });
      expect(Math.abs(modularity(net, part) - ref)).toBeLessThan(1e-9);
    }
  });
});

describe("sparse modularity equals a dense O(N²) evaluation of the definition", () => {
  const objectives: Objective[] = ["newman", "newman-directed", "barber"];
  for (const objective of objectives) {
    for (const binary of [false, true]) {
      it(`${objective}, ${binary ? "binary" : "weighted"} form, bipartite and one-mode networks with self-loops`, () => {
        const rng = createRng(objective.length * 7 + (binary ? 1 : 0));
        for (let t = 0; t < 25; t++) {
          const nets = [bipartite(randomMatrix(rng, 2 + rng.nextInt(12), 2 + rng.nextInt(12), 0.3, true))];
          if (objective !== "barber") {
            nets.push(randomOneMode(rng, 3 + rng.nextInt(15), 0.3, false, true, true));
            nets.push(randomOneMode(rng, 3 + rng.nextInt(15), 0.3, true, true, true));
          }
          for (const net of nets) {
            if (net.rowPtr[net.rowLabels.length] === 0) continue;
            const n = net.kind === "bipartite" ? net.rowLabels.length + net.colLabels.length : net.rowLabels.length;
            const part = randomPartition(rng, n, 1 + rng.nextInt(5));
            const sparse = modularity(net, part, objective, { weighted: !binary });
            expect(Math.abs(sparse - denseModularity(net, part, objective, binary))).toBeLessThan(1e-12);
          }
        }
      });
    }
  }

  it("Leicht–Newman on a bipartite network oriented rows → columns equals Barber's Q_B", () => {
    const rng = createRng(77);
    const net = bipartite(randomMatrix(rng, 8, 11, 0.35, true));
    const part = randomPartition(rng, 19, 4);
    expect(modularity(net, part, "newman-directed")).toBeCloseTo(modularity(net, part, "barber"), 14);
  });
});

describe("modularity invariants and edge cases", () => {
  it("is invariant under relabelling of the modules and permutation of the nodes", () => {
    const rng = createRng(21);
    const net = randomOneMode(rng, 20, 0.25, false, true);
    const part = randomPartition(rng, 20, 4);
    const q = modularity(net, part);
    const relabel = [3, 0, 2, 1];
    expect(modularity(net, part.map((c) => relabel[c]))).toBeCloseTo(q, 13);
    // Permute nodes: node v becomes perm[v].
    const perm = Array.from({ length: 20 }, (_, i) => i);
    for (let k = 19; k > 0; k--) {
      const r = rng.nextInt(k + 1);
      [perm[k], perm[r]] = [perm[r], perm[k]];
    }
    const edges: Array<[number, number, number]> = [];
    for (let i = 0; i < 20; i++) for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) if (net.colIdx[p] >= i) edges.push([perm[i], perm[net.colIdx[p]], net.weights[p]]);
    const permuted = oneMode(20, edges);
    const part2 = new Int32Array(20);
    for (let v = 0; v < 20; v++) part2[perm[v]] = part[v];
    expect(modularity(permuted, part2)).toBeCloseTo(q, 13);
  });

  it("isolated nodes change nothing wherever they are placed", () => {
    const base = oneMode(6, [[0, 1], [1, 2], [0, 2], [3, 4], [4, 5], [3, 5], [2, 3]]);
    const withIsolated = oneMode(8, [[0, 1], [1, 2], [0, 2], [3, 4], [4, 5], [3, 5], [2, 3]]);
    const q = modularity(base, Int32Array.from([0, 0, 0, 1, 1, 1]));
    expect(modularity(withIsolated, Int32Array.from([0, 0, 0, 1, 1, 1, 0, 2]))).toBeCloseTo(q, 14);
  });

  it("an edge-less network throws NetworkEngineError no-links (stored as null with a reason)", () => {
    const net = oneMode(4, []);
    expect(() => modularity(net, new Int32Array(4))).toThrow(NetworkEngineError);
    try {
      modularity(net, new Int32Array(4));
    } catch (e) {
      expect((e as NetworkEngineError).code).toBe("no-links");
    }
  });

  it("rejects a partition of the wrong length or with bad module numbers, and Barber on one-mode networks", () => {
    const net = oneMode(3, [[0, 1], [1, 2]]);
    expect(() => modularity(net, new Int32Array(2))).toThrow(/3 nodes/);
    expect(() => modularity(net, Int32Array.from([0, -1, 0]))).toThrow(/not an integer/);
    expect(() => modularity(net, [0, 0.5, 1])).toThrow(/not an integer/);
    expect(() => modularity(net, new Int32Array(3), "barber")).toThrow(/bipartite/);
  });

  it("Q_B lies in [−1, 1) and Newman Q in [−1/2, 1) on random partitions", () => {
    const rng = createRng(99);
    for (let t = 0; t < 50; t++) {
      const b = bipartite(randomMatrix(rng, 5, 6, 0.5, false));
      if (b.rowPtr[5] === 0) continue;
      const qb = modularity(b, randomPartition(rng, 11, 3));
      expect(qb).toBeGreaterThanOrEqual(-1);
      expect(qb).toBeLessThan(1);
      const qn = modularity(b, randomPartition(rng, 11, 3), "newman");
      expect(qn).toBeGreaterThanOrEqual(-0.5);
    }
  });
});
