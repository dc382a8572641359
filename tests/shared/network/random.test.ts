/**
 * The seeded generator gives the same numbers on any machine and Node.js version: its integer draws are
 * pinned here (values of the generator as first released), and nextInt equals its definition — 32-bit
 * draws below 2^32 − (2^32 mod n), reduced mod n — computed with exact integer arithmetic (BigInt).
 */
import { describe, expect, it } from "vitest";
import { createRng, deriveSeed, DrawBuffer } from "@shared/network/random";

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

describe("DrawBuffer", () => {
  it("gives the generator's own draws in order, and release() leaves the generator where those draws leave it", () => {
    for (const size of [1, 7, 4096]) {
      const ref = createRng(31);
      const src = createRng(31);
      const buf = new DrawBuffer(src, size);
      const pick = createRng(5); // which kind of draw comes next, and its n
      for (let i = 0; i < 5000; i++) {
        const kind = pick.nextInt(3);
        if (kind === 0) expect(buf.next()).toBe(ref.next());
        else if (kind === 1) {
          const n = 1 + pick.nextInt(i % 2 ? 7 : 2 ** 31 + 5);
          expect(buf.nextInt(n)).toBe(ref.nextInt(n));
        } else expect(buf.nextUint32()).toBe(ref.nextUint32());
        if (i % 1237 === 0) {
          buf.release();
          expect(src.nextUint32()).toBe(ref.nextUint32());
        }
      }
      buf.release();
      buf.release(); // nothing drawn since: no change
      expect([src.nextUint32(), src.nextInt(10), src.next()]).toEqual([ref.nextUint32(), ref.nextInt(10), ref.next()]);
    }
  });

  it("fill(), save() and restore() agree with nextUint32()", () => {
    const a = createRng(8);
    const b = createRng(8);
    const state = a.save();
    const out = new Uint32Array(9);
    a.fill(out);
    expect(Array.from(out)).toEqual(Array.from({ length: 9 }, () => b.nextUint32()));
    a.restore(state);
    expect(a.nextUint32()).toBe(out[0]);
  });
});
