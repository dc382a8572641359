/**
 * Calibration of the primary null (fixed degrees, curveball) on networks with no modules, and its power on
 * planted modules. Each class is a seeded batch of 40 small networks (10 × 14), 19 null replicates each
 * (so p ≤ 0.05 means the observed Q beat every null: under a calibrated null that happens with probability
 * exactly 1/20), one optimizer restart, no annealing — the same effort for observed and nulls. Bounds are
 * generous (binomial(40, 0.05) exceeds 8 with probability < 0.001): the test catches a null that calls
 * random data modular almost always (as Patefield's does for counts, asserted below), not a few percent.
 * Full figures at realistic sizes: `npm run bench:significance`.
 *
 * Classes (generating processes of our own, seeded): random binary (each cell a link with p = 0.25);
 * random structure with lognormal weights (exp of a standard normal); random integer counts (1 + ⌊e^(1+N(0,1))⌋,
 * overdispersed like field counts); perfectly nested (a staircase: row i links the first ⌈J(1 − i/I)⌉
 * columns); planted: three diagonal blocks with link probability 0.6 inside and 0.05 outside.
 */
import { describe, expect, it } from "vitest";
import { analyzeNetwork, deriveSeed, type NullModelName } from "@shared/network/index";
import { classNetwork, type ClassName } from "../../../scripts/lib/significance-classes";

function significantShare(cls: ClassName, model: NullModelName, count = 40): number {
  let hits = 0;
  for (let k = 0; k < count; k++) {
    const net = classNetwork(cls, 10, 14, deriveSeed(2024, k));
    const res = analyzeNetwork(net, { nullModels: [model], nulls: 19, restarts: 1, annealing: "off", seed: k + 1 });
    const f = res.nulls![0];
    if (f.p !== null && f.p <= 0.05 + 1e-12) hits++;
  }
  return hits / count;
}

describe("calibration of the primary null model (fixed degrees)", () => {
  it.each(["binary", "lognormal", "counts", "nested"] as const)("%s networks without modules: p ≤ 0.05 in at most 20 % of 40 (nominal 5 %)", (cls) => {
    expect(significantShare(cls, "curveball")).toBeLessThanOrEqual(0.2);
  });

  it("planted modules are detected in at least 70 % of 40 networks", () => {
    expect(significantShare("planted", "curveball")).toBeGreaterThanOrEqual(0.7);
  });

  it("for contrast, Patefield's fixed totals (connectance not kept) call random counts modular almost always", () => {
    expect(significantShare("counts", "patefield", 20)).toBeGreaterThanOrEqual(0.8);
  });
});
