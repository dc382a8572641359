/**
 * The annealing's Metropolis test without the exponential: metropolisAccepts(u, x) must give exactly the
 * decision of the plain comparison u < Math.exp(x) (the rule of Metropolis et al. 1953 as the annealing
 * states it), for draws u that are multiples of 2⁻³² as the generator gives them — checked here on draws
 * placed at, just below and just above exp(x), where a wrong bound would show, and on random pairs.
 */
import { describe, expect, it } from "vitest";
import { metropolisAccepts } from "@shared/network/optimizer/annealing";
import { createRng } from "@shared/network/random";

const TWO32 = 4294967296;

describe("Metropolis test of the annealing", () => {
  it("decides as u < exp(x) for draws at the boundary exp(x) and beside it", () => {
    const rng = createRng(2024);
    let checked = 0;
    for (let s = 0; s < 20000; s++) {
      // x over the whole range the annealing meets, including grid points of the bounds and below −23.
      const x = s % 10 === 0 ? -23 + (rng.nextInt(23 * 64) / 64) : -30 * rng.next() - 1e-9;
      const k = Math.floor(Math.exp(x) * TWO32);
      for (const d of [-2, -1, 0, 1, 2]) {
        const u = Math.max(0, k + d) / TWO32;
        expect(metropolisAccepts(u, x)).toBe(u < Math.exp(x));
        checked++;
      }
    }
    expect(checked).toBe(100000);
  });

  it("decides as u < exp(x) on random pairs, and accepts only u = 0 far below", () => {
    const rng = createRng(7);
    let accepted = 0;
    for (let s = 0; s < 100000; s++) {
      const x = -25 * rng.next();
      const u = rng.nextUint32() / TWO32;
      const plain = u < Math.exp(x);
      expect(metropolisAccepts(u, x)).toBe(plain);
      if (plain) accepted++;
    }
    // About the mean of exp(x) over x uniform on (−25, 0): (1 − e⁻²⁵)/25 = 4 %.
    expect(accepted / 100000).toBeGreaterThan(0.03);
    expect(accepted / 100000).toBeLessThan(0.05);
    expect(metropolisAccepts(0, -40)).toBe(true);
    expect(metropolisAccepts(1 / TWO32, -40)).toBe(false);
    expect(metropolisAccepts(0, -800)).toBe(false); // exp underflows to 0
  });
});
