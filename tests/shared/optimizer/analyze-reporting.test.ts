/**
 * How the analysis reports its partition: ties at Q = 0 give one module (the engine README's rule), the
 * module count leaves isolated nodes out and says so, the share of restarts refers to the reported Q, and
 * roles use the same weights as the partition.
 */
import { describe, expect, it } from "vitest";
import { analyzeNetwork, reportedPartition, shareReaching } from "@shared/network/analyze";
import { bipartite } from "../network/helpers";

describe("reported partition and restart share", () => {
  it("a complete bipartite matrix K(3,4) has Q_B = 0 at best and is reported as one module (definition: every partition has Q_B ≤ 0)", () => {
    const res = analyzeNetwork(bipartite(Array.from({ length: 3 }, () => [1, 1, 1, 1])), { restarts: 3, nulls: 0 });
    expect(res.modularity.Q).toBeCloseTo(0, 12);
    expect(res.modularity.modules).toBe(1);
    expect(new Set(Object.values(res.modularity.partition)).size).toBe(1);
  });

  it("isolated nodes are not counted as modules and are counted apart", () => {
    // Two disconnected blocks plus an empty row and an empty column.
    const res = analyzeNetwork(bipartite([[1, 1, 0, 0, 0], [1, 1, 0, 0, 0], [0, 0, 1, 1, 0], [0, 0, 1, 1, 0], [0, 0, 0, 0, 0]]), { restarts: 3, nulls: 0 });
    expect(res.modularity.Q).toBeCloseTo(0.5, 12); // c = 2 identical blocks: 1 − 1/c (science.md)
    expect(res.modularity.modules).toBe(2);
    expect(res.modularity.isolatedNodes).toBe(2);
    expect(new Set(Object.values(res.modularity.partition)).size).toBe(4);
  });

  it("reportedPartition: Q = 0 merges linked nodes only; shareReaching counts restarts at the reported Q", () => {
    const net = bipartite([[1, 1], [0, 0]]);
    expect(Array.from(reportedPartition(net, [0, 1, 2, 3], 0).partition)).toEqual([0, 1, 0, 0]);
    expect(shareReaching([0.3, 0.31, 0.31], 0.31)).toBeCloseTo(2 / 3, 12);
    // Annealing found a better partition than every restart: no restart reached the reported Q.
    expect(shareReaching([0.3, 0.31], 0.32)).toBe(0);
  });

  it("roles of a weighted network use strengths, as its weighted partition does", () => {
    const w = bipartite([[5, 1, 0, 0], [4, 1, 0, 0], [0, 0, 3, 1], [0, 0, 1, 6]]);
    const res = analyzeNetwork(w, { restarts: 2, nulls: 0 });
    const r0 = res.roles!.nodes.find((n) => n.label === "r0")!;
    expect(r0.degree).toBe(6); // strength 5 + 1, not 2 links
  });
});
