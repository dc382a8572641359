/**
 * Seeded network classes for calibrating null models (tests/shared/network/calibration.test.ts and
 * `npm run bench:significance`): four without modules and one with planted modules, all bipartite I × J.
 * Generating processes of our own:
 * - binary: each cell a link with probability C (default 0.25);
 * - lognormal: random structure (probability C) with weights exp(N(0, 1));
 * - counts: random structure (probability C) with integer counts 1 + ⌊e^(1 + N(0, 1))⌋ (overdispersed, as field counts are);
 * - nested: perfectly nested staircase, row i links the first ⌈J(1 − i/I)⌉ columns (no randomness);
 * - planted: three diagonal blocks, link probability 2.4·C inside (0.6 at C = 0.25) and 0.2·C outside.
 * Normal deviates by Box–Muller from the engine's seeded generator, so a seed gives the same network anywhere.
 */
import { createRng, networkFromTriples, type Network } from "@shared/network/index";

export const NON_MODULAR_CLASSES = ["binary", "lognormal", "counts", "nested"] as const;

export type ClassName = "binary" | "lognormal" | "counts" | "nested" | "planted";

/** A network of class `cls`, I × J, link probability C (planted: 2.4·C inside the blocks, 0.2·C outside). */
export function classNetwork(cls: ClassName, I: number, J: number, seed: number, C = 0.25): Network {
  const rng = createRng(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - rng.next())) * Math.cos(2 * Math.PI * rng.next());
  const cell = (i: number, j: number): number => {
    switch (cls) {
      case "binary":
        return rng.next() < C ? 1 : 0;
      case "lognormal":
        return rng.next() < C ? Math.exp(normal()) : 0;
      case "counts":
        return rng.next() < C ? 1 + Math.floor(Math.exp(1 + normal())) : 0;
      case "nested":
        return j < Math.ceil(J * (1 - i / I)) ? 1 : 0;
      case "planted":
        return rng.next() < (Math.floor((i * 3) / I) === Math.floor((j * 3) / J) ? Math.min(0.9, 2.4 * C) : 0.2 * C) ? 1 : 0;
    }
  };
  const r: number[] = [];
  const c: number[] = [];
  const w: number[] = [];
  for (let i = 0; i < I; i++) {
    for (let j = 0; j < J; j++) {
      const v = cell(i, j);
      if (v !== 0) {
        r.push(i);
        c.push(j);
        w.push(v);
      }
    }
  }
  const labels = (n: number, p: string) => Array.from({ length: n }, (_, k) => `${p}${k}`);
  return networkFromTriples({ kind: "bipartite", directed: false, rowLabels: labels(I, "r"), colLabels: labels(J, "c") }, r, c, w);
}

