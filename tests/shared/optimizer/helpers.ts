/**
 * Small builders for test networks in the engine's canonical CSR form (shared/network/types.ts), so the
 * optimizer tests do not depend on the file parser.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import type { Network } from "@shared/network/types";
import { createRng, type Rng } from "@shared/network/random";

export const FIXTURES = fileURLToPath(new URL("../../fixtures/", import.meta.url));

function csr(nRows: number, cells: Map<number, Map<number, number>>) {
  const rowPtr = new Uint32Array(nRows + 1);
  const cols: number[] = [];
  const ws: number[] = [];
  for (let i = 0; i < nRows; i++) {
    const row = cells.get(i);
    if (row) {
      for (const j of [...row.keys()].sort((x, y) => x - y)) {
        cols.push(j);
        ws.push(row.get(j)!);
      }
    }
    rowPtr[i + 1] = cols.length;
  }
  return { rowPtr, colIdx: Uint32Array.from(cols), weights: Float64Array.from(ws) };
}

function add(cells: Map<number, Map<number, number>>, i: number, j: number, w: number) {
  let row = cells.get(i);
  if (!row) cells.set(i, (row = new Map()));
  row.set(j, (row.get(j) ?? 0) + w);
}

/** One-mode network of n nodes from [source, target, weight?] triples (undirected: stored both ways). */
export function oneMode(n: number, edges: Array<[number, number, number?]>, directed = false): Network {
  const cells = new Map<number, Map<number, number>>();
  for (const [i, j, w = 1] of edges) {
    add(cells, i, j, w);
    if (!directed && i !== j) add(cells, j, i, w);
  }
  const labels = Array.from({ length: n }, (_, i) => `n${i}`);
  const c = csr(n, cells);
  return {
    kind: "unipartite",
    directed,
    weighted: edges.some((e) => (e[2] ?? 1) !== 1),
    rowLabels: labels,
    colLabels: labels,
    ...c,
  };
}

/** Bipartite network from a dense rows × columns matrix (0 = no link). */
export function bipartite(matrix: number[][]): Network {
  const R = matrix.length;
  const C = matrix[0]?.length ?? 0;
  const cells = new Map<number, Map<number, number>>();
  let weighted = false;
  for (let i = 0; i < R; i++)
    for (let j = 0; j < C; j++)
      if (matrix[i][j] !== 0) {
        add(cells, i, j, matrix[i][j]);
        if (matrix[i][j] !== 1) weighted = true;
      }
  return {
    kind: "bipartite",
    directed: false,
    weighted,
    rowLabels: Array.from({ length: R }, (_, i) => `r${i}`),
    colLabels: Array.from({ length: C }, (_, j) => `c${j}`),
    ...c(R, cells),
  };
  function c(n: number, cl: typeof cells) {
    return csr(n, cl);
  }
}

/** Zachary's karate club from tests/fixtures/karate.edgelist.csv (nodes 1..34 → 0..33). */
export function karate(): Network {
  const lines = readFileSync(FIXTURES + "karate.edgelist.csv", "utf8").trim().split(/\r?\n/).slice(1);
  const edges = lines.map((l) => l.split(",").map(Number)).map(([s, t]) => [s - 1, t - 1] as [number, number]);
  return oneMode(34, edges);
}

/** Davis Southern Women (18 women × 14 events) from tests/fixtures/davis-southern-women.csv. */
export function davis(): Network {
  const lines = readFileSync(FIXTURES + "davis-southern-women.csv", "utf8").trim().split(/\r?\n/).slice(1);
  return bipartite(lines.map((l) => l.split(",").slice(1).map(Number)));
}

/** Random matrix with given density; weights 1 or integers 1..maxW. */
export function randomMatrix(rng: Rng, R: number, C: number, density: number, maxW = 1): number[][] {
  return Array.from({ length: R }, () =>
    Array.from({ length: C }, () => (rng.next() < density ? 1 + rng.nextInt(maxW) : 0)),
  );
}

export function randomEdges(rng: Rng, n: number, density: number, maxW = 1, directed = false, loops = false) {
  const edges: Array<[number, number, number]> = [];
  for (let i = 0; i < n; i++)
    for (let j = directed ? 0 : i; j < n; j++) {
      if (i === j && !loops) continue;
      if (rng.next() < density) edges.push([i, j, 1 + rng.nextInt(maxW)]);
    }
  return edges;
}

export { createRng };
