/**
 * Dense complex LU factorisation with partial pivoting on split storage (real and imaginary
 * parts in two row-major Float64Arrays). This is the AC hot path: one factorisation per
 * frequency, one back-substitution per excitation, no allocation.
 *
 * Split storage keeps every inner loop a pair of contiguous streams with no object creation.
 */
import { scratch, SINGULAR_PIVOT } from './dense-lu';

/**
 * Factors the n×n complex matrix (re, im) in place. Pivot choice by |re| + |im| (as LAPACK's
 * izamax does): within √2 of the largest modulus, and it cannot underflow.
 * Returns -1 on success, or the step at which the remaining column is zero (its largest candidate
 * below `floor`; see luFactor).
 */
export function complexLuFactor(re: Float64Array, im: Float64Array, n: number, pivots: Int32Array, floor = SINGULAR_PIVOT): number {
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(re[k * n + k]) + Math.abs(im[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const mag = Math.abs(re[i * n + k]) + Math.abs(im[i * n + k]);
      if (mag > best) {
        best = mag;
        p = i;
      }
    }
    pivots[k] = p;
    if (!(best >= floor)) return k; // also catches NaN
    const rk = k * n;
    if (p !== k) {
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        let t = re[rk + j];
        re[rk + j] = re[rp + j];
        re[rp + j] = t;
        t = im[rk + j];
        im[rk + j] = im[rp + j];
        im[rp + j] = t;
      }
    }
    // 1/pivot, scaled by the larger part so |z|² neither underflows nor overflows.
    const s = Math.max(Math.abs(re[rk + k]), Math.abs(im[rk + k]));
    const pr = re[rk + k] / s;
    const pi = im[rk + k] / s;
    const d = (pr * pr + pi * pi) * s;
    const invR = pr / d;
    const invI = -pi / d;
    // Only the pivot row's nonzero columns and the rows with a nonzero multiplier change.
    const cols = scratch(n);
    let nnz = 0;
    for (let j = k + 1; j < n; j++) if (re[rk + j] !== 0 || im[rk + j] !== 0) cols[nnz++] = j;
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const ar = re[ri + k];
      const ai = im[ri + k];
      if (ar === 0 && ai === 0) continue;
      const lr = ar * invR - ai * invI;
      const li = ar * invI + ai * invR;
      re[ri + k] = lr;
      im[ri + k] = li;
      for (let t = 0; t < nnz; t++) {
        const j = cols[t];
        const ur = re[rk + j];
        const ui = im[rk + j];
        re[ri + j] -= lr * ur - li * ui;
        im[ri + j] -= lr * ui + li * ur;
      }
    }
  }
  return -1;
}

/** Solves in place in (bRe, bIm) with the output of {@link complexLuFactor}. */
export function complexLuSolve(
  re: Float64Array,
  im: Float64Array,
  n: number,
  pivots: Int32Array,
  bRe: Float64Array,
  bIm: Float64Array,
): void {
  for (let k = 0; k < n; k++) {
    const p = pivots[k];
    if (p !== k) {
      let t = bRe[k];
      bRe[k] = bRe[p];
      bRe[p] = t;
      t = bIm[k];
      bIm[k] = bIm[p];
      bIm[p] = t;
    }
  }
  for (let i = 1; i < n; i++) {
    const ri = i * n;
    let sr = bRe[i];
    let si = bIm[i];
    for (let j = 0; j < i; j++) {
      const lr = re[ri + j];
      const li = im[ri + j];
      const xr = bRe[j];
      const xi = bIm[j];
      sr -= lr * xr - li * xi;
      si -= lr * xi + li * xr;
    }
    bRe[i] = sr;
    bIm[i] = si;
  }
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * n;
    let sr = bRe[i];
    let si = bIm[i];
    for (let j = i + 1; j < n; j++) {
      const ur = re[ri + j];
      const ui = im[ri + j];
      const xr = bRe[j];
      const xi = bIm[j];
      sr -= ur * xr - ui * xi;
      si -= ur * xi + ui * xr;
    }
    const s = Math.max(Math.abs(re[ri + i]), Math.abs(im[ri + i]));
    const dr = re[ri + i] / s;
    const di = im[ri + i] / s;
    const d = (dr * dr + di * di) * s;
    bRe[i] = (sr * dr + si * di) / d;
    bIm[i] = (si * dr - sr * di) / d;
  }
}

/**
 * Solves Aᵀ·y = b (the plain transpose, not the conjugate) in place in (bRe, bIm) with the output
 * of {@link complexLuFactor} for A: with P·A = L·U, Aᵀ = Uᵀ·Lᵀ·P, so forward through Uᵀ, back
 * through Lᵀ (unit diagonal), then the row swaps undone in reverse order. The adjoint system of
 * noise and sensitivity analysis, from the factors the forward solve already paid for.
 */
export function complexLuSolveTransposed(
  re: Float64Array,
  im: Float64Array,
  n: number,
  pivots: Int32Array,
  bRe: Float64Array,
  bIm: Float64Array,
): void {
  // Uᵀ·z = b: column i of U above the diagonal is row i of Uᵀ left of it.
  for (let i = 0; i < n; i++) {
    let sr = bRe[i];
    let si = bIm[i];
    for (let j = 0; j < i; j++) {
      const ur = re[j * n + i];
      const ui = im[j * n + i];
      const xr = bRe[j];
      const xi = bIm[j];
      sr -= ur * xr - ui * xi;
      si -= ur * xi + ui * xr;
    }
    const s = Math.max(Math.abs(re[i * n + i]), Math.abs(im[i * n + i]));
    const dr = re[i * n + i] / s;
    const di = im[i * n + i] / s;
    const d = (dr * dr + di * di) * s;
    bRe[i] = (sr * dr + si * di) / d;
    bIm[i] = (si * dr - sr * di) / d;
  }
  // Lᵀ·w = z, unit diagonal.
  for (let i = n - 1; i >= 0; i--) {
    let sr = bRe[i];
    let si = bIm[i];
    for (let j = i + 1; j < n; j++) {
      const lr = re[j * n + i];
      const li = im[j * n + i];
      const xr = bRe[j];
      const xi = bIm[j];
      sr -= lr * xr - li * xi;
      si -= lr * xi + li * xr;
    }
    bRe[i] = sr;
    bIm[i] = si;
  }
  // y = Pᵀ·w: the swaps of the factorisation in reverse order.
  for (let k = n - 1; k >= 0; k--) {
    const p = pivots[k];
    if (p !== k) {
      let t = bRe[k];
      bRe[k] = bRe[p];
      bRe[p] = t;
      t = bIm[k];
      bIm[k] = bIm[p];
      bIm[p] = t;
    }
  }
}
