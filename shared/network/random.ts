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
  /** Fills `out` with the next out.length draws of nextUint32 (hot loops read them from the array). */
  fill(out: Uint32Array): void;
  /** The generator's state, to come back to with restore (draws taken ahead and not all used). */
  save(): number[];
  restore(state: readonly number[]): void;
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
  const [s1, a] = splitmix32(seed >>> 0);
  const [s2, b] = splitmix32(s1);
  const [s3, c] = splitmix32(s2);
  const [, d] = splitmix32(s3);
  return new Xoshiro128((a | b | c | d) === 0 ? 1 : a, b, c, d);
}

/**
 * xoshiro128** with its state in an Int32Array. One class for every generator, so that hot loops calling
 * rng.next() or rng.nextInt() see one call target whatever the generator (a closure per generator made
 * the optimizing compiler discard such loops' code at each new restart), and the state is written in place
 * (no boxed numbers per draw). The state words are used as 32-bit integers only, so the draws are those of
 * the same algorithm on plain numbers.
 */
class Xoshiro128 implements Rng {
  private readonly s: Int32Array;

  constructor(a: number, b: number, c: number, d: number) {
    this.s = Int32Array.of(a, b, c, d);
  }

  nextUint32(): number {
    const s = this.s;
    const a = s[0];
    const b = s[1];
    const result = Math.imul(rotl(Math.imul(b, 5), 7), 9) >>> 0;
    const t = b << 9;
    const c = s[2] ^ a;
    const d = s[3] ^ b;
    s[0] = a ^ d;
    s[1] = b ^ c;
    s[2] = c ^ t;
    s[3] = rotl(d, 11);
    return result;
  }

  fill(out: Uint32Array): void {
    const s = this.s;
    let s0 = s[0];
    let s1 = s[1];
    let s2 = s[2];
    let s3 = s[3];
    for (let i = 0; i < out.length; i++) {
      out[i] = Math.imul(rotl(Math.imul(s1, 5), 7), 9);
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = rotl(s3, 11);
    }
    s[0] = s0;
    s[1] = s1;
    s[2] = s2;
    s[3] = s3;
  }

  save(): number[] {
    const s = this.s;
    return [s[0], s[1], s[2], s[3]];
  }

  restore(state: readonly number[]): void {
    const s = this.s;
    for (let i = 0; i < 4; i++) s[i] = state[i];
  }

  next(): number {
    return this.nextUint32() / 4294967296;
  }

  nextInt(n: number): number {
    if (!(n >= 1) || n > 4294967296) throw new RangeError(`nextInt: n must be in [1, 2^32], got ${n}`);
    // Rejection sampling removes modulo bias: draws at or above limit = 2^32 − (2^32 mod n) are
    // redrawn, and the result is x mod n. limit = n·⌊2^32/n⌋ is the start of the first block
    // [qn, qn + n) that does not fit below 2^32, so x ≥ limit exactly when x's own block x − r … x − r + n
    // ends beyond 2^32: one division per draw instead of two (same draws, same results).
    for (;;) {
      const x = this.nextUint32();
      const r = mod(x, n);
      if (x - r + n <= 4294967296) return r;
    }
  }
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

/**
 * The draws of `rng` taken ahead in blocks and read from an array: exactly the numbers that rng.next(),
 * rng.nextInt(n) and rng.nextUint32() would give, in the same order, for hot loops (the annealing's
 * millions of proposals), where reading an array costs less than stepping the generator each time.
 * `release()` leaves `rng` in the state it would have after exactly the draws used, so whatever draws
 * from `rng` afterwards sees the same numbers as without the buffer.
 */
export class DrawBuffer {
  /**
   * The block of draws, the next one to use (`i`) and the number filled (`len`). A hot loop may read
   * `buf[i++]` itself while i < len, calling refill() when i reaches len, and write `i` back before any
   * other method is called: the draws are the same as through nextUint32().
   */
  readonly buf: Uint32Array;
  i = 0;
  len = 0;
  private saved: number[];

  constructor(
    private readonly rng: Rng,
    size = 4096,
  ) {
    this.buf = new Uint32Array(size);
    this.saved = rng.save();
  }

  nextUint32(): number {
    if (this.i === this.len) this.refill();
    return this.buf[this.i++];
  }

  /** Takes the next block of draws (i = 0, len = the block size). */
  refill(): void {
    this.saved = this.rng.save();
    this.rng.fill(this.buf);
    this.len = this.buf.length;
    this.i = 0;
  }

  next(): number {
    return this.nextUint32() / 4294967296;
  }

  /** As Rng.nextInt (same rejection rule, same draws). */
  nextInt(n: number): number {
    if (!(n >= 1) || n > 4294967296) throw new RangeError(`nextInt: n must be in [1, 2^32], got ${n}`);
    for (;;) {
      const x = this.nextUint32();
      const r = mod(x, n);
      if (x - r + n <= 4294967296) return r;
    }
  }

  /** Puts `rng` where the draws used so far leave it; the buffer starts afresh from there. */
  release(): void {
    if (this.len > 0) {
      this.rng.restore(this.saved);
      for (let k = 0; k < this.i; k++) this.rng.nextUint32();
    }
    this.i = 0;
    this.len = 0;
    this.saved = this.rng.save();
  }
}
