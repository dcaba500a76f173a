/**
 * Dense real LU factorisation with partial pivoting, in place on a row-major Float64Array.
 *
 * The DC Newton loop factors one matrix per iteration; storage is owned by the caller and
 * reused, so the hot loop allocates nothing. Rows are swapped physically (row-major storage makes
 * the elimination's inner loop contiguous), and `pivots[k]` records the row swapped into row k.
 */

/** Pivots smaller than this (in magnitude) are treated as exact zeros: the matrix is singular. */
export const SINGULAR_PIVOT = 1e-300;

let scratchCols = new Int32Array(64);

/** A reusable column-index buffer of at least n entries (grown, never shrunk: no per-call allocation). */
export function scratch(n: number): Int32Array {
  if (scratchCols.length < n) scratchCols = new Int32Array(Math.max(n, 2 * scratchCols.length));
  return scratchCols;
}

/**
 * Factors `a` (n×n, row-major) into L·U in place: U on and above the diagonal, the unit-lower L
 * below it. Returns -1 on success, or the step (row) at which no usable pivot was found: the
 * largest candidate below `floor` (an equilibrated matrix passes a floor relative to its unit
 * column scale; the default only refuses exact zeros and NaN).
 */
export function luFactor(a: Float64Array, n: number, pivots: Int32Array, floor = SINGULAR_PIVOT): number {
  for (let k = 0; k < n; k++) {
    // Partial pivoting: the largest magnitude in column k at or below the diagonal.
    let p = k;
    let best = Math.abs(a[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const m = Math.abs(a[i * n + k]);
      if (m > best) {
        best = m;
        p = i;
      }
    }
    pivots[k] = p;
    if (!(best >= floor)) return k; // also catches NaN
    const rk = k * n;
    if (p !== k) {
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        const t = a[rk + j];
        a[rk + j] = a[rp + j];
        a[rp + j] = t;
      }
    }
    const inv = 1 / a[rk + k];
    // MNA matrices are sparse and stay fairly sparse under elimination: update only the
    // columns where the pivot row is nonzero, and only the rows with a nonzero multiplier.
    const cols = scratch(n);
    let nnz = 0;
    for (let j = k + 1; j < n; j++) if (a[rk + j] !== 0) cols[nnz++] = j;
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const aik = a[ri + k];
      if (aik === 0) continue;
      const l = aik * inv;
      a[ri + k] = l;
      for (let t = 0; t < nnz; t++) {
        const j = cols[t];
        a[ri + j] -= l * a[rk + j];
      }
    }
  }
  return -1;
}

/** Solves (L·U)·x = P·b in place in `b`, using the output of {@link luFactor}. */
export function luSolve(lu: Float64Array, n: number, pivots: Int32Array, b: Float64Array): void {
  for (let k = 0; k < n; k++) {
    const p = pivots[k];
    if (p !== k) {
      const t = b[k];
      b[k] = b[p];
      b[p] = t;
    }
  }
  for (let i = 1; i < n; i++) {
    const ri = i * n;
    let s = b[i];
    for (let j = 0; j < i; j++) s -= lu[ri + j] * b[j];
    b[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * n;
    let s = b[i];
    for (let j = i + 1; j < n; j++) s -= lu[ri + j] * b[j];
    b[i] = s / lu[ri + i];
  }
}

/**
 * Solves Aᵀ·y = b in place in `b` with the output of {@link luFactor} for A: with P·A = L·U,
 * Aᵀ = Uᵀ·Lᵀ·P, so forward through Uᵀ, back through Lᵀ (unit diagonal), then the row swaps
 * undone in reverse order.
 */
export function luSolveTransposed(lu: Float64Array, n: number, pivots: Int32Array, b: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let j = 0; j < i; j++) s -= lu[j * n + i] * b[j];
    b[i] = s / lu[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i];
    for (let j = i + 1; j < n; j++) s -= lu[j * n + i] * b[j];
    b[i] = s;
  }
  for (let k = n - 1; k >= 0; k--) {
    const p = pivots[k];
    if (p !== k) {
      const t = b[k];
      b[k] = b[p];
      b[p] = t;
    }
  }
}

/** A reusable real LU solver of fixed size: owns its matrix copy and pivot storage. */
export class DenseRealLu {
  readonly lu: Float64Array;
  readonly pivots: Int32Array;
  /** -1 when the last factorisation succeeded, else the singular step. */
  singularAt = -1;
  private factors: Float64Array;

  constructor(readonly n: number) {
    this.lu = new Float64Array(n * n);
    this.pivots = new Int32Array(n);
    this.factors = this.lu;
  }

  /** Copies `a` and factors it; returns true on success. */
  factor(a: Float64Array): boolean {
    this.lu.set(a);
    this.factors = this.lu;
    this.singularAt = luFactor(this.lu, this.n, this.pivots);
    return this.singularAt < 0;
  }

  /**
   * Factors `a` where it stands (its contents become the factors; this object only keeps the
   * pivots and a reference for {@link solve}). Returns -1 on success, else the singular step.
   */
  factorInPlace(a: Float64Array): number {
    this.factors = a;
    this.singularAt = luFactor(a, this.n, this.pivots);
    return this.singularAt;
  }

  /** Solves in place in `b` with the last factorisation. */
  solve(b: Float64Array): void {
    luSolve(this.factors, this.n, this.pivots, b);
  }
}
