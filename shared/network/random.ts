/**
 * Seeded pseudo-random numbers for every stochastic step of the engine (optimizer restarts, annealing,
 * null models). Same seed → same sequence on any machine and Node.js version, because only 32-bit integer
 * arithmetic (Math.imul, >>>) is used; no Math.random anywhere in the engine.
 *
 * Generator: xoshiro128** (Blackman & Vigna 2018, "Scrambled linear pseudorandom number generators",
 * https://prng.di.unimi.it/, doi:10.1145/3460772), state seeded by SplitMix32 so any 32-bit seed gives a
 * well-mixed, non-zero state. `deriveSeed` hashes a parent seed with a path of integers (e.g. restart
 * number, null replicate number) so that independent streams can run on different threads and still give
 * the results of a single-threaded run.
 */

export interface Rng {
  /** Uniform float in [0, 1) with 32 bits of randomness. */
  next(): number;
  /** Uniform integer in [0, n) for 1 ≤ n ≤ 2^32, without modulo bias. */
  nextInt(n: number): number;
  /** Unsigned 32-bit integer. */
  nextUint32(): number;
}

function splitmix32(state: number): [number, number] {
  const s = (state + 0x9e3779b9) | 0;
  let z = s;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  z ^= z >>> 16;
  return [s, z >>> 0];
}

/** Mixes a seed with a path of integers into a new 32-bit seed (deterministic, order-sensitive). */
export function deriveSeed(seed: number, ...path: number[]): number {
  let h = seed >>> 0;
  for (const p of path) {
    const [s, z1] = splitmix32(h ^ Math.imul(p >>> 0, 0x27d4eb2d));
    h = splitmix32(s ^ z1)[1];
  }
  return h >>> 0;
}

export function createRng(seed: number): Rng {
  let st = seed >>> 0;
  let a: number, b: number, c: number, d: number;
  [st, a] = splitmix32(st);
  [st, b] = splitmix32(st);
  [st, c] = splitmix32(st);
  [, d] = splitmix32(st);
  if ((a | b | c | d) === 0) a = 1;

  const nextUint32 = (): number => {
    const result = Math.imul(rotl(Math.imul(b, 5), 7), 9) >>> 0;
    const t = b << 9;
    c ^= a;
    d ^= b;
    b ^= c;
    a ^= d;
    c ^= t;
    d = rotl(d, 11);
    return result;
  };

  return {
    nextUint32,
    next: () => nextUint32() / 4294967296,
    nextInt(n: number): number {
      if (!(n >= 1) || n > 4294967296) throw new RangeError(`nextInt: n must be in [1, 2^32], got ${n}`);
      // Rejection sampling removes modulo bias: draws at or above limit = 2^32 − (2^32 mod n) are
      // redrawn, and the result is x mod n. limit = n·⌊2^32/n⌋ is the start of the first block
      // [qn, qn + n) that does not fit below 2^32, so x ≥ limit exactly when x's own block x − r … x − r + n
      // ends beyond 2^32: one division per draw instead of two (same draws, same results).
      for (;;) {
        const x = nextUint32();
        const r = mod(x, n);
        if (x - r + n <= 4294967296) return r;
      }
    },
  };
}

/**
 * x mod n for integers 0 ≤ x ≤ 2^32 and 1 ≤ n ≤ 2^32, exactly as x % n, by a floating-point division: the
 * rounded quotient is off by at most one, which the correction repairs. (The % operator on numbers
 * beyond 2^31 goes through a slow library call.)
 */
function mod(x: number, n: number): number {
  const r = x - Math.floor(x / n) * n;
  return r < 0 ? r + n : r >= n ? r - n : r;
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
