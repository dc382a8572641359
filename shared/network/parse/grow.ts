/**
 * Growable typed arrays: the readers stream rows straight into them (CSR rows, column indices, weights,
 * line numbers), doubling their capacity when full, so no array of all cells is ever built. Two classes
 * rather than one over both array types: each `push` then sees one array type and stays fast in the
 * readers' per-cell loops.
 */
export class GrowU32 {
  a: Uint32Array;
  n = 0;
  constructor(cap = 1024) {
    this.a = new Uint32Array(cap);
  }
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = new Uint32Array(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  done(): Uint32Array {
    return this.a.slice(0, this.n);
  }
}

export class GrowF64 {
  a: Float64Array;
  n = 0;
  constructor(cap = 1024) {
    this.a = new Float64Array(cap);
  }
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = new Float64Array(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  done(): Float64Array {
    return this.a.slice(0, this.n);
  }
}
