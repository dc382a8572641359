import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  basicMetrics, classifyRole, createRng, nodeRoles, nodf, parseNetworkText, type Network,
} from "@shared/network/index";
import { bipartite, dense, oneMode, randomMatrix, randomOneMode, randomPartition } from "./helpers";

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/${name}`, import.meta.url));

describe("basic metrics", () => {
  it("Davis Southern Women: 18 × 14, 89 links, connectance 89/252 (Davis, Gardner & Gardner 1941; definition)", () => {
    const { network } = parseNetworkText(fixture("davis-southern-women.csv"), { fileName: "davis-southern-women.csv", kind: "bipartite" });
    const m = basicMetrics(network);
    expect(m).toMatchObject({ nodes: 32, rows: 18, cols: 14, links: 89, totalWeight: 89, isolated: 0, selfLoops: 0 });
    expect(m.connectance).toBeCloseTo(89 / 252, 14);
  });

  it("Zachary's karate club: 34 nodes, 78 links, C = 2·78/(34·33) (Zachary 1977; definition)", () => {
    const { network } = parseNetworkText(fixture("karate.edgelist.csv"), { fileName: "karate.edgelist.csv", kind: "unipartite" });
    const m = basicMetrics(network);
    expect(m).toMatchObject({ nodes: 34, rows: null, cols: null, links: 78, totalWeight: 78, isolated: 0 });
    expect(m.connectance).toBeCloseTo(156 / (34 * 33), 14);
  });

  it("directed: C = L/S² with cannibal links counted (Martinez 1992)", () => {
    const net = oneMode(4, [[0, 1], [1, 2], [2, 2], [3, 0]], true);
    const m = basicMetrics(net);
    expect(m.links).toBe(4);
    expect(m.selfLoops).toBe(1);
    expect(m.connectance).toBeCloseTo(4 / 16, 14);
  });

  it("undirected with a self-loop: L counts it once, C = 2L'/(S(S−1)) leaves it out; isolated nodes counted", () => {
    const net = oneMode(5, [[0, 1, 2], [1, 2, 3], [2, 2, 4]]);
    const m = basicMetrics(net);
    expect(m).toMatchObject({ links: 3, selfLoops: 1, totalWeight: 9, isolated: 2 });
    expect(m.connectance).toBeCloseTo((2 * 2) / (5 * 4), 14);
    expect(basicMetrics(oneMode(1, [[0, 0]])).connectance).toBeNull();
  });
});

/** Independent reference: the definitions of Guimerà & Amaral (2005) written naively over the dense matrix. */
function naiveRoles(net: Network, part: ArrayLike<number>) {
  const A = dense(net, true);
  const bip = net.kind === "bipartite";
  const I = net.rowLabels.length;
  const N = bip ? I + net.colLabels.length : I;
  const adj: number[][] = Array.from({ length: N }, () => new Array<number>(N).fill(0));
  A.forEach((row, i) => row.forEach((v, j) => {
    const a = i, b = bip ? I + j : j;
    if (v && a !== b) { adj[a][b] = 1; adj[b][a] = 1; }
  }));
  // For directed networks both directions count separately: rebuild as counts.
  if (!bip && net.directed) {
    for (let a = 0; a < N; a++) for (let b = 0; b < N; b++) adj[a][b] = a === b ? 0 : A[a][b] + A[b][a];
  }
  const kappa = (v: number, s: number) => adj[v].reduce((t, x, u) => t + (part[u] === s ? x : 0), 0);
  const k = (v: number) => adj[v].reduce((t, x) => t + x, 0);
  return Array.from({ length: N }, (_, v) => {
    if (k(v) === 0) return { z: null, P: null };
    const group = Array.from({ length: N }, (_, u) => u).filter((u) => part[u] === part[v] && k(u) > 0 && (!bip || (u < I) === (v < I)));
    const vals = group.map((u) => kappa(u, part[u]));
    const mean = vals.reduce((a, b) => a + b, 0) / vals.length;
    const sd = vals.length > 1 ? Math.sqrt(vals.reduce((a, b) => a + (b - mean) ** 2, 0) / (vals.length - 1)) : 0;
    const modules = new Set(Array.from(part));
    let sum = 0;
    for (const s of modules) sum += (kappa(v, s) / k(v)) ** 2;
    return { z: sd > 1e-12 ? (kappa(v, part[v]) - mean) / sd : null, P: 1 - sum };
  });
}

describe("node roles (Guimerà & Amaral 2005; Olesen et al. 2007 thresholds)", () => {
  it("star module: hub z from the sample sd, leaves −, P = 0 inside one module; hub is a module hub", () => {
    // One star with 10 leaves: κ = [10, 1 × 10]; mean 20/11; sample sd over 11 nodes (hand computation).
    const edges: Array<[number, number]> = Array.from({ length: 10 }, (_, i) => [0, i + 1]);
    const net = oneMode(11, edges);
    const roles = nodeRoles(net, new Int32Array(11));
    const mean = 20 / 11;
    const sd = Math.sqrt(((10 - mean) ** 2 + 10 * (1 - mean) ** 2) / 10);
    expect(roles[0].z).toBeCloseTo((10 - mean) / sd, 12);
    expect(roles[0].z!).toBeGreaterThan(2.5);
    expect(roles[0].participation).toBe(0);
    expect(roles[0].role).toBe("module-hub");
    expect(roles[1].role).toBe("peripheral");
  });

  it("two triangles joined by an edge: σ = 0 gives z = null; the bridge node has P = 1 − (2/3)² − (1/3)² = 4/9", () => {
    const net = oneMode(6, [[0, 1], [1, 2], [0, 2], [3, 4], [4, 5], [3, 5], [2, 3]]);
    const roles = nodeRoles(net, Int32Array.from([0, 0, 0, 1, 1, 1]));
    for (const r of roles) expect(r.z).toBeNull();
    expect(roles[2].participation).toBeCloseTo(4 / 9, 14);
    expect(roles[0].participation).toBe(0);
    expect(roles.every((r) => r.role === null)).toBe(true); // z undefined: no role, so no point without a role is counted
  });

  it("isolated nodes get null z, P and role and are left out of their module's statistics", () => {
    const net = oneMode(5, [[0, 1], [1, 2]]);
    const roles = nodeRoles(net, new Int32Array(5));
    expect(roles[4]).toMatchObject({ degree: 0, z: null, participation: null, role: null });
    expect(roles[1].z).toBeCloseTo((2 - 4 / 3) / Math.sqrt(((2 - 4 / 3) ** 2 + 2 * (1 - 4 / 3) ** 2) / 2), 12);
  });

  it("thresholds: z > 2.5 makes a hub, P > 0.62 a connector (Olesen et al. 2007)", () => {
    expect(classifyRole(2.5, 0.62)).toBe("peripheral");
    expect(classifyRole(2.51, 0.62)).toBe("module-hub");
    expect(classifyRole(2.5, 0.63)).toBe("connector");
    expect(classifyRole(3, 0.7)).toBe("network-hub");
    expect(classifyRole(null, 0.7)).toBe("connector");
  });

  it("matches a naive dense implementation of the definitions on random bipartite, undirected and directed networks", () => {
    const rng = createRng(31);
    for (let t = 0; t < 20; t++) {
      const nets = [
        bipartite(randomMatrix(rng, 6 + rng.nextInt(8), 6 + rng.nextInt(8), 0.3, true)),
        randomOneMode(rng, 8 + rng.nextInt(10), 0.3, false, true, true),
        randomOneMode(rng, 8 + rng.nextInt(10), 0.25, true, false, true),
      ];
      for (const net of nets) {
        const n = net.kind === "bipartite" ? net.rowLabels.length + net.colLabels.length : net.rowLabels.length;
        const part = randomPartition(rng, n, 3);
        const ours = nodeRoles(net, part);
        const ref = naiveRoles(net, part);
        ours.forEach((r, v) => {
          if (ref[v].z === null) expect(r.z).toBeNull();
          else expect(r.z).toBeCloseTo(ref[v].z!, 10);
          if (ref[v].P === null) expect(r.participation).toBeNull();
          else expect(r.participation).toBeCloseTo(ref[v].P!, 12);
        });
        if (net.kind === "bipartite") expect(ours[0].level).toBe("row");
      }
    }
  });
});

/** Independent reference: sort by decreasing totals, then the pairwise definition of Almeida-Neto et al. 2008. */
function naiveNodf(A: number[][]) {
  const rows = A.filter((r) => r.some((x) => x > 0)).map((r) => r.map((x) => (x > 0 ? 1 : 0)));
  const keepCols = rows[0].map((_, j) => rows.some((r) => r[j] === 1));
  const M = rows.map((r) => r.filter((_, j) => keepCols[j]));
  const T = M[0].map((_, j) => M.map((r) => r[j]));
  const side = (X: number[][]) => {
    const sorted = [...X].sort((a, b) => b.reduce((s, x) => s + x, 0) - a.reduce((s, x) => s + x, 0));
    let sum = 0, pairs = 0;
    for (let i = 0; i < sorted.length; i++) for (let j = i + 1; j < sorted.length; j++) {
      pairs++;
      const ti = sorted[i].reduce((s, x) => s + x, 0), tj = sorted[j].reduce((s, x) => s + x, 0);
      if (ti > tj) sum += (100 * sorted[j].reduce((s, x, k) => s + (x && sorted[i][k] ? 1 : 0), 0)) / tj;
    }
    return { sum, pairs };
  };
  const r = side(M), c = side(T);
  return { nodf: (r.sum + c.sum) / (r.pairs + c.pairs), rows: r.sum / r.pairs, cols: c.sum / c.pairs };
}

describe("NODF (Almeida-Neto et al. 2008)", () => {
  it("worked example of the paper (rows 10111/11100/01110/11000/11000): NODF 58.33, rows 53.33, cols 63.33", () => {
    const net = bipartite([[1, 0, 1, 1, 1], [1, 1, 1, 0, 0], [0, 1, 1, 1, 0], [1, 1, 0, 0, 0], [1, 1, 0, 0, 0]]);
    const r = nodf(net)!;
    expect(r.nodf).toBeCloseTo(58.33, 2);
    expect(r.rows).toBeCloseTo(53.33, 2);
    expect(r.cols).toBeCloseTo(63.33, 2);
  });

  it("a perfectly nested 5 × 5 staircase has NODF 100 (definition)", () => {
    const net = bipartite(Array.from({ length: 5 }, (_, i) => Array.from({ length: 5 }, (_, j) => (j < 5 - i ? 1 : 0))));
    expect(nodf(net)).toEqual({ nodf: 100, rows: 100, cols: 100 });
  });

  it("ties in marginal totals contribute 0; empty rows and columns are removed; weights ignored", () => {
    expect(nodf(bipartite([[1, 1], [1, 1]]))).toEqual({ nodf: 0, rows: 0, cols: 0 });
    const base = nodf(bipartite([[1, 0, 1, 1, 1], [1, 1, 1, 0, 0], [0, 1, 1, 1, 0], [1, 1, 0, 0, 0], [1, 1, 0, 0, 0]]))!;
    const padded = nodf(bipartite([[1, 0, 0, 5, 1, 1], [0, 0, 0, 0, 0, 0], [1, 1, 0, 1, 0, 0], [0, 1, 0, 1, 3, 0], [1, 1, 0, 0, 0, 0], [1, 1, 0, 0, 0, 0]]))!;
    expect(padded.nodf).toBeCloseTo(base.nodf, 12);
  });

  it("is null when fewer than two non-empty rows or columns remain", () => {
    expect(nodf(bipartite([[1, 1, 1], [0, 0, 0]]))).toBeNull();
  });

  it("matches a naive sort-then-compare implementation on random matrices, and transposition swaps rows and cols", () => {
    const rng = createRng(41);
    for (let t = 0; t < 40; t++) {
      const A = randomMatrix(rng, 3 + rng.nextInt(12), 3 + rng.nextInt(12), 0.2 + rng.next() * 0.6, false);
      const net = bipartite(A);
      const ours = nodf(net);
      if (ours === null) continue;
      const ref = naiveNodf(A);
      expect(ours.nodf).toBeCloseTo(ref.nodf, 10);
      expect(ours.rows).toBeCloseTo(ref.rows, 10);
      const T = nodf(bipartite(A[0].map((_, j) => A.map((r) => r[j]))))!;
      expect(T.rows).toBeCloseTo(ours.cols, 10);
    }
  });

  it("one-mode undirected: the adjacency matrix is read as a matrix, so N_rows = N_cols", () => {
    const r = nodf(randomOneMode(createRng(3), 12, 0.4, false, false))!;
    expect(r.rows).toBeCloseTo(r.cols, 12);
  });
});
