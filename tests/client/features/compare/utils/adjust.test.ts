/** The compare view's size- and connectance-adjusted comparison (client/src/features/compare/utils/adjust.ts). */
import { describe, expect, it } from "vitest";
import { adjustForSizeAndConnectance } from "../../../../../client/src/features/compare/utils/adjust";

describe("adjustment for size and connectance (least squares on ln S and C)", () => {
  it("recovers exact coefficients of noiseless data and gives every network the same adjusted value", () => {
    // y = 1 + 2 ln S − 3 C exactly (hand-made): after adjustment every network sits at the fit's value at the means.
    const rows = [
      { id: "a", S: 10, C: 0.1 },
      { id: "b", S: 40, C: 0.3 },
      { id: "c", S: 100, C: 0.05 },
      { id: "d", S: 25, C: 0.5 },
      { id: "e", S: 300, C: 0.2 },
    ].map((r) => ({ ...r, y: 1 + 2 * Math.log(r.S) - 3 * r.C }));
    const res = adjustForSizeAndConnectance(rows)!;
    expect(res.coefficients[0]).toBeCloseTo(1, 10);
    expect(res.coefficients[1]).toBeCloseTo(2, 10);
    expect(res.coefficients[2]).toBeCloseTo(-3, 10);
    expect(res.r2).toBeCloseTo(1, 12);
    const at = 1 + 2 * res.meanLnS - 3 * res.meanC;
    for (const v of res.adjusted.values()) expect(v).toBeCloseTo(at, 10);
  });

  it("keeps the residual: a network above the trend stays above it by the same amount", () => {
    const rows = [10, 20, 40, 80, 160].map((S, i) => ({ id: String(i), S, C: 0.1 + 0.05 * (i % 2), y: Math.log(S) + (i === 2 ? 0.5 : 0) }));
    const res = adjustForSizeAndConnectance(rows)!;
    const vals = [...res.adjusted.values()];
    const others = vals.filter((_, i) => i !== 2);
    expect(Math.max(...vals)).toBe(vals[2]);
    expect(vals[2] - others.reduce((s, v) => s + v, 0) / others.length).toBeGreaterThan(0.4);
  });

  it("refuses fewer than 4 networks or no spread in S or C", () => {
    expect(adjustForSizeAndConnectance([{ id: "a", S: 10, C: 0.1, y: 1 }, { id: "b", S: 20, C: 0.2, y: 2 }, { id: "c", S: 30, C: 0.3, y: 3 }])).toBeNull();
    expect(adjustForSizeAndConnectance([1, 2, 3, 4].map((i) => ({ id: String(i), S: 10, C: 0.1 * i, y: i })))).toBeNull();
  });
});
