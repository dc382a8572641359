/**
 * The exact optima that the optimizer tests assert are derived here by a general-purpose mixed-integer
 * solver (HiGHS via the npm package `highs`) over Brandes et al.'s (2008) clique-partitioning
 * formulation, not copied from elsewhere: scripts/derive-reference-optima.ts. The one-mode Davis value
 * (5323/15842 ≈ 0.336006, 3 modules) takes ~40 s and is derived by running the script by hand.
 */
import { describe, expect, it } from "vitest";
import { referenceProblems, solve } from "../../scripts/derive-reference-optima";

describe("exact modularity optima of the reference networks", () => {
  const problems = referenceProblems();

  it("Davis Southern Women: maximum Barber Q_B is 2737/7921 with 4 modules", async () => {
    const r = await solve(problems.find((p) => p.name.includes("Barber"))!);
    expect(r.q).toEqual([2737, 7921]);
    expect(r.modules).toBe(4);
  });

  it("Zachary's karate club: maximum Newman–Girvan Q is 1277/3042 with 4 modules (as published by Brandes et al. 2008)", async () => {
    const r = await solve(problems.find((p) => p.name.includes("karate"))!);
    expect(r.q).toEqual([1277, 3042]);
    expect(r.modules).toBe(4);
  });
});
