/**
 * Derives the exact modularity optima that the engine's tests assert for the reference networks in
 * tests/fixtures, with a general-purpose mixed-integer solver (HiGHS, compiled to WebAssembly; npm
 * package `highs`) instead of values copied from elsewhere.
 *
 * Formulation (Brandes et al. 2008, IEEE TKDE 20:172, doi:10.1109/TKDE.2007.190689): one binary variable
 * x_uv per node pair (1 = same module) and the transitivity constraints x_uv + x_vw − x_uw ≤ 1 for every
 * triple in each of its three rotations, so every feasible x is an equivalence relation, i.e. a partition.
 * The objective is the modularity sum over pairs:
 *   - Newman–Girvan (one-mode): Q = (1/2m) [Σ_i B_ii + 2 Σ_{u<v} B_uv x_uv], B_uv = A_uv − k_u k_v / 2m;
 *   - Barber's bipartite Q_B: Q_B = (1/m) Σ_{i row, j column} (A_ij − k_i d_j / m) x_ij — pairs of two rows or
 *     of two columns have no term but still take part in transitivity.
 * Integer coefficients (the objective multiplied by 2m·2m or m·m) keep the solver's arithmetic exact; the
 * optimum is then recomputed from the returned partition in exact integers and printed as a fraction.
 *
 *   npx tsx scripts/derive-reference-optima.ts          # prints each optimum; tests/fixtures/README.md quotes them
 *
 * On this project's 2-core machine: Davis Q_B 8 s, Davis one-mode 42 s, karate 3 s (one core each).
 * tests/scripts/reference-optima.test.ts re-derives the two quick ones on every `npm test`.
 */
import { readFileSync } from "node:fs";
import { join, dirname } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import highsLoader from "highs";

const FIXTURES = join(dirname(fileURLToPath(import.meta.url)), "..", "tests", "fixtures");

export interface PairProblem {
  name: string;
  n: number;
  /** Integer objective coefficient of x_uv (u < v), indexed u * n + v. */
  coef: (u: number, v: number) => number;
  /** Exact objective of a partition as [numerator, denominator]. */
  exact: (module: number[]) => [number, number];
}

function gcd(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) [a, b] = [b, a % b];
  return a;
}

function lpText(p: PairProblem): string {
  const v = (u: number, w: number) => (u < w ? `x${u}_${w}` : `x${w}_${u}`);
  const terms: string[] = [];
  for (let u = 0; u < p.n; u++) for (let w = u + 1; w < p.n; w++) {
    const c = p.coef(u, w);
    if (c !== 0) terms.push(`${c >= 0 ? "+" : "-"} ${Math.abs(c)} ${v(u, w)}`);
  }
  const rows: string[] = [];
  let k = 0;
  for (let a = 0; a < p.n; a++) for (let b = a + 1; b < p.n; b++) for (let c = b + 1; c < p.n; c++) {
    rows.push(` t${k++}: ${v(a, b)} + ${v(b, c)} - ${v(a, c)} <= 1`);
    rows.push(` t${k++}: ${v(a, b)} - ${v(b, c)} + ${v(a, c)} <= 1`);
    rows.push(` t${k++}: - ${v(a, b)} + ${v(b, c)} + ${v(a, c)} <= 1`);
  }
  const vars: string[] = [];
  for (let u = 0; u < p.n; u++) for (let w = u + 1; w < p.n; w++) vars.push(v(u, w));
  return ["Maximize", " obj: " + terms.join(" "), "Subject To", ...rows, "Binary", " " + vars.join(" "), "End"].join("\n");
}

export async function solve(p: PairProblem): Promise<{ q: [number, number]; modules: number }> {
  const highs = await highsLoader();
  const res = highs.solve(lpText(p), { mip_rel_gap: 0, mip_abs_gap: 0 } as never);
  if (res.Status !== "Optimal") throw new Error(`${p.name}: solver status ${res.Status}`);
  // Read the partition back from x (union of pairs with x = 1; transitivity makes it consistent).
  const module = Array.from({ length: p.n }, (_, i) => i);
  const find = (i: number): number => (module[i] === i ? i : (module[i] = find(module[i])));
  for (const [name, col] of Object.entries(res.Columns)) {
    const m = /^x(\d+)_(\d+)$/.exec(name);
    if (m && Math.round((col as { Primal: number }).Primal) === 1) module[find(+m[1])] = find(+m[2]);
  }
  const labels = module.map((_, i) => find(i));
  return { q: p.exact(labels), modules: new Set(labels).size };
}

export function readEdgeList(file: string): { n: number; edges: [number, number][]; names: string[] } {
  const lines = readFileSync(join(FIXTURES, file), "utf8").trim().split(/\r?\n/).slice(1);
  const index = new Map<string, number>();
  const id = (s: string) => (index.has(s) ? index.get(s)! : (index.set(s, index.size), index.size - 1));
  const edges = lines.map((l) => l.split(",").map((s) => id(s.trim())) as [number, number]);
  return { n: index.size, edges, names: [...index.keys()] };
}

export function readIncidence(file: string): { rows: number; cols: number; a: number[][] } {
  const lines = readFileSync(join(FIXTURES, file), "utf8").trim().split(/\r?\n/).slice(1);
  const a = lines.map((l) => l.split(",").slice(1).map(Number));
  return { rows: a.length, cols: a[0].length, a };
}

/** Newman–Girvan Q of a one-mode graph; coefficients scaled by (2m)². */
export function newmanProblem(name: string, n: number, edges: [number, number][]): PairProblem {
  const A = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (const [u, v] of edges) { A[u][v] += 1; A[v][u] += 1; }
  const k = A.map((r) => r.reduce((s, x) => s + x, 0));
  const twoM = k.reduce((s, x) => s + x, 0);
  // (2m)²·Q = Σ_uv (2m·A_uv − k_u k_v) δ_uv
  const b = (u: number, v: number) => twoM * A[u][v] - k[u] * k[v];
  return {
    name,
    n,
    coef: (u, v) => 2 * b(u, v),
    exact: (mod) => {
      let num = 0;
      for (let u = 0; u < n; u++) for (let v = 0; v < n; v++) if (mod[u] === mod[v]) num += b(u, v);
      const den = twoM * twoM;
      const g = gcd(num, den);
      return [num / g, den / g];
    },
  };
}

/** Barber's Q_B of an incidence matrix; nodes 0..rows-1 are rows, the rest columns; scaled by m². */
export function barberProblem(name: string, inc: { rows: number; cols: number; a: number[][] }): PairProblem {
  const { rows, cols, a } = inc;
  const kr = a.map((r) => r.reduce((s, x) => s + x, 0));
  const dc = Array.from({ length: cols }, (_, j) => a.reduce((s, r) => s + r[j], 0));
  const m = kr.reduce((s, x) => s + x, 0);
  const b = (i: number, j: number) => m * a[i][j] - kr[i] * dc[j];
  const n = rows + cols;
  return {
    name,
    n,
    coef: (u, v) => (u < rows && v >= rows ? b(u, v - rows) : 0),
    exact: (mod) => {
      let num = 0;
      for (let i = 0; i < rows; i++) for (let j = 0; j < cols; j++) if (mod[i] === mod[rows + j]) num += b(i, j);
      const g = gcd(num, m * m);
      return [num / g, (m * m) / g];
    },
  };
}

/** The reference problems, in the order the script prints them. */
export function referenceProblems(): PairProblem[] {
  const davis = readIncidence("davis-southern-women.csv");
  const davisEdges: [number, number][] = [];
  for (let i = 0; i < davis.rows; i++) for (let j = 0; j < davis.cols; j++) if (davis.a[i][j]) davisEdges.push([i, davis.rows + j]);
  const karate = readEdgeList("karate.edgelist.csv");
  return [
    barberProblem("Davis Southern Women, Barber's Q_B", davis),
    newmanProblem("Davis Southern Women as one-mode, Newman–Girvan Q", davis.rows + davis.cols, davisEdges),
    newmanProblem("Zachary's karate club, Newman–Girvan Q", karate.n, karate.edges),
  ];
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const only = process.argv[2];
  for (const p of referenceProblems()) {
    if (only && !p.name.toLowerCase().includes(only.toLowerCase())) continue;
    const t = performance.now();
    const { q, modules } = await solve(p);
    console.log(`${p.name}: maximum ${q[0]}/${q[1]} = ${(q[0] / q[1]).toFixed(6)}, ${modules} modules (${((performance.now() - t) / 1000).toFixed(1)} s)`);
  }
}
