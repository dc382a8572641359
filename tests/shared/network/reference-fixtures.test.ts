/**
 * The reference networks in tests/fixtures are checked against outside sources, not against memory:
 * - Zachary's karate club must be exactly the graph that the general-purpose graph library
 *   graphology-generators ships (release 0.11.2, `social.karateClub`, citing Zachary 1977), node i there
 *   being node i + 1 in our file.
 * - Davis Southern Women (Davis, Gardner & Gardner 1941) ships with no npm package; its counts are
 *   derived here from the file and held against the published marginals (18 women, 14 events, 89
 *   attendances) that tests/fixtures/README.md lists, and its exact optima are derived by
 *   scripts/derive-reference-optima.ts with a mixed-integer solver.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import Graph from "graphology";
import { karateClub } from "graphology-generators/social";
import { FIXTURES } from "../optimizer/helpers";

function edgeKey(a: string, b: string): string {
  return Number(a) < Number(b) ? `${a}-${b}` : `${b}-${a}`;
}

describe("reference fixtures", () => {
  it("karate.edgelist.csv is graphology-generators 0.11.2's karate club graph, edge for edge", () => {
    const lib = karateClub(Graph);
    const expected = new Set<string>();
    lib.forEachEdge((_e, _a, s, t) => expected.add(edgeKey(String(Number(s) + 1), String(Number(t) + 1))));
    const lines = readFileSync(join(FIXTURES, "karate.edgelist.csv"), "utf8").trim().split(/\r?\n/);
    expect(lines[0]).toBe("source,target");
    const ours = lines.slice(1).map((l) => {
      const [a, b] = l.split(",");
      return edgeKey(a, b);
    });
    expect(new Set(ours).size).toBe(ours.length); // each link once
    expect(lib.order).toBe(34);
    expect(new Set(ours)).toEqual(expected);
  });

  it("davis-southern-women.csv has the published marginals: 18 × 14, 89 attendances", () => {
    const lines = readFileSync(join(FIXTURES, "davis-southern-women.csv"), "utf8").trim().split(/\r?\n/);
    const a = lines.slice(1).map((l) => l.split(",").slice(1).map(Number));
    const rowTotals = a.map((r) => r.reduce((s, x) => s + x, 0));
    const colTotals = a[0].map((_, j) => a.reduce((s, r) => s + r[j], 0));
    expect(a.length).toBe(18);
    expect(colTotals.length).toBe(14);
    expect(rowTotals.reduce((s, x) => s + x, 0)).toBe(89);
    // Event sizes and women's attendance counts as printed in tests/fixtures/README.md.
    expect(colTotals).toEqual([3, 3, 6, 4, 8, 8, 10, 14, 12, 5, 4, 6, 3, 3]);
    expect(rowTotals).toEqual([8, 7, 8, 7, 4, 4, 4, 3, 4, 4, 4, 6, 7, 8, 5, 2, 2, 2]);
  });
});
