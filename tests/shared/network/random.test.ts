/**
 * The seeded generator gives the same numbers on any machine and Node.js version: its integer draws are
 * pinned here (values of the generator as first released), and nextInt equals its definition — 32-bit
 * draws below 2^32 − (2^32 mod n), reduced mod n — computed with exact integer arithmetic (BigInt).
 */
import { describe, expect, it } from "vitest";
import { createRng, deriveSeed } from "../../../shared/network/random";

describe("createRng", () => {
  it("gives the pinned sequence for a seed", () => {
    const r = createRng(20261202);
    const ns = [1, 2, 3, 10, 1000, 65537, 2 ** 31 - 1, 2 ** 31 + 11, 2 ** 32 - 5, 2 ** 32];
    expect(ns.map((n) => [r.nextInt(n), r.nextInt(n)])).toEqual([
      [0, 0], [1, 0], [1, 0], [5, 9], [899, 28], [2497, 60849], [292849084, 930192029], [981706872, 45171383],
      [1009977101, 3358715861], [1162734149, 482123498],
    ]);
    expect(r.next()).toBe(0.21615538047626615);
    expect(r.nextUint32()).toBe(1259644605);
  });

  it("nextInt(n) is the rejection-sampled draw mod n, for small and huge n", () => {
    const seed = deriveSeed(7, 1);
    const a = createRng(seed);
    const b = createRng(seed);
    const two32 = 2n ** 32n;
    const gen = createRng(99);
    for (let i = 0; i < 20000; i++) {
      // n spread over every magnitude up to 2^32, with powers of two and their neighbours.
      const e = gen.nextInt(33);
      const base = 2 ** e;
      const n = Math.min(2 ** 32, Math.max(1, base + gen.nextInt(3) - 1 + (e > 3 ? gen.nextInt(base >>> 3 || 1) : 0)));
      const limit = two32 - (two32 % BigInt(n));
      let x: bigint;
      do x = BigInt(b.nextUint32());
      while (x >= limit);
      expect(a.nextInt(n)).toBe(Number(x % BigInt(n)));
    }
  });

  it("rejects n outside [1, 2^32]", () => {
    const r = createRng(1);
    expect(() => r.nextInt(0)).toThrow(RangeError);
    expect(() => r.nextInt(2 ** 32 + 1)).toThrow(RangeError);
  });
});
