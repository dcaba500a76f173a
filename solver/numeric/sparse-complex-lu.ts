/**
 * Sparse complex LU with threshold partial pivoting on split storage (real and imaginary parts
 * in two Float64Arrays): the AC hot path, (G + jωC) factored once per frequency on the circuit's
 * fixed pattern. The same method as the real one (./sparse-lu.ts): equilibration, the symbolic
 * column order, refactorisation on the last pivot order while every pivot stays within
 * REPIVOT_TOLERANCE of its column, else a full Gilbert–Peierls factorisation choosing pivots
 * afresh. Magnitudes are |re| + |im| (as LAPACK's izamax): within √2 of the modulus, no overflow.
 * Factoring a new frequency allocates nothing.
 */
import { equilibrate } from './equilibrate';
import { grow, LuStructure, PIVOT_TOLERANCE, REPIVOT_TOLERANCE, SINGULAR_RELATIVE, type LuFailure } from './lu-structure';
import type { SparsePattern } from './sparse-pattern';
import type { SparseSymbolic } from './sparse-symbolic';

/** Sparse complex LU of matrices on one pattern. */
export class SparseComplexLu {
  readonly kind = 'sparse';
  readonly n: number;
  private lr: Float64Array;
  private li: Float64Array;
  private ur: Float64Array;
  private ui: Float64Array;
  /** Inverse of each pivot (multiplying is cheaper than dividing in every solve). */
  private readonly dr: Float64Array;
  private readonly di: Float64Array;
  private readonly rowScale: Float64Array;
  private readonly colScale: Float64Array;
  private readonly xr: Float64Array;
  private readonly xi: Float64Array;
  private readonly s: LuStructure;
  failure: LuFailure | null = null;
  fullFactorizations = 0;

  constructor(readonly pattern: SparsePattern, private readonly symbolic: SparseSymbolic) {
    const n = pattern.n;
    this.n = n;
    this.s = new LuStructure(n, symbolic.order, 2 * pattern.nnz + n);
    this.lr = new Float64Array(this.s.li.length);
    this.li = new Float64Array(this.s.li.length);
    this.ur = new Float64Array(this.s.ui.length);
    this.ui = new Float64Array(this.s.ui.length);
    this.dr = new Float64Array(n);
    this.di = new Float64Array(n);
    this.rowScale = new Float64Array(n);
    this.colScale = new Float64Array(n);
    this.xr = new Float64Array(n);
    this.xi = new Float64Array(n);
    if (symbolic.complexSeed) {
      symbolic.complexSeed.copyInto(this.s);
      this.matchCapacity();
    }
  }

  /** Factors the matrix (re, im) on the pattern. Returns −1 on success, else the singular unknown. */
  factor(re: Float64Array, im: Float64Array): number {
    const { pattern } = this;
    equilibrate(this.n, pattern.colPtr, pattern.rowIdx, re, im, this.rowScale, this.colScale);
    this.failure = null;
    if (this.s.valid && this.refactor(re, im)) return -1;
    return this.factorFromScratch(re, im);
  }

  /** Solves A·x = b in place in (bRe, bIm). */
  solve(bRe: Float64Array, bIm: Float64Array): void {
    const { n, xr: zr, xi: zi, lr, li, ur, ui, dr, di, rowScale, colScale } = this;
    const { prow, lp, li: lrow, up, ui: urow, order } = this.s;
    for (let k = 0; k < n; k++) {
      const r = prow[k];
      zr[k] = bRe[r] * rowScale[r];
      zi[k] = bIm[r] * rowScale[r];
    }
    for (let k = 0; k < n; k++) {
      const ar = zr[k];
      const ai = zi[k];
      if (ar === 0 && ai === 0) continue;
      for (let p = lp[k]; p < lp[k + 1]; p++) {
        const i = lrow[p];
        zr[i] -= lr[p] * ar - li[p] * ai;
        zi[i] -= lr[p] * ai + li[p] * ar;
      }
    }
    for (let k = n - 1; k >= 0; k--) {
      const ar = zr[k] * dr[k] - zi[k] * di[k];
      const ai = zr[k] * di[k] + zi[k] * dr[k];
      zr[k] = ar;
      zi[k] = ai;
      if (ar === 0 && ai === 0) continue;
      for (let p = up[k]; p < up[k + 1]; p++) {
        const i = urow[p];
        zr[i] -= ur[p] * ar - ui[p] * ai;
        zi[i] -= ur[p] * ai + ui[p] * ar;
      }
    }
    for (let k = 0; k < n; k++) {
      const c = order[k];
      bRe[c] = zr[k] * colScale[c];
      bIm[c] = zi[k] * colScale[c];
      zr[k] = 0;
      zi[k] = 0;
    }
  }

  /** Solves Aᵀ·y = b (the plain transpose, not the conjugate) in place from the same factors. */
  solveTransposed(bRe: Float64Array, bIm: Float64Array): void {
    const { n, xr: zr, xi: zi, lr, li, ur, ui, dr, di, rowScale, colScale } = this;
    const { prow, lp, li: lrow, up, ui: urow, order } = this.s;
    for (let k = 0; k < n; k++) {
      const c = order[k];
      zr[k] = bRe[c] * colScale[c];
      zi[k] = bIm[c] * colScale[c];
    }
    for (let k = 0; k < n; k++) {
      let sr = zr[k];
      let si = zi[k];
      for (let p = up[k]; p < up[k + 1]; p++) {
        const j = urow[p];
        sr -= ur[p] * zr[j] - ui[p] * zi[j];
        si -= ur[p] * zi[j] + ui[p] * zr[j];
      }
      zr[k] = sr * dr[k] - si * di[k];
      zi[k] = sr * di[k] + si * dr[k];
    }
    for (let k = n - 1; k >= 0; k--) {
      let sr = zr[k];
      let si = zi[k];
      for (let p = lp[k]; p < lp[k + 1]; p++) {
        const j = lrow[p];
        sr -= lr[p] * zr[j] - li[p] * zi[j];
        si -= lr[p] * zi[j] + li[p] * zr[j];
      }
      zr[k] = sr;
      zi[k] = si;
    }
    for (let k = 0; k < n; k++) {
      const r = prow[k];
      bRe[r] = zr[k] * rowScale[r];
      bIm[r] = zi[k] * rowScale[r];
      zr[k] = 0;
      zi[k] = 0;
    }
  }

  /** True when a pivot order is known (from a factorisation, or adopted from the last one of this pattern). */
  get hasPivotOrder(): boolean {
    return this.s.valid;
  }

  /** Entries of L and U, diagonal included. */
  get factorNonzeros(): number {
    return this.s.lnz + this.s.unz + this.n;
  }

  private matchCapacity(): void {
    const { li: lIdx, ui: uIdx } = this.s;
    if (this.lr.length < lIdx.length) {
      this.lr = grow(this.lr, lIdx.length);
      this.li = grow(this.li, lIdx.length);
    }
    if (this.ur.length < uIdx.length) {
      this.ur = grow(this.ur, uIdx.length);
      this.ui = grow(this.ui, uIdx.length);
    }
  }

  /** Stores 1/(pr + j·pi) at step k, scaled by the larger part so |z|² neither underflows nor overflows. */
  private setPivot(k: number, pr: number, pi: number): void {
    const s = Math.max(Math.abs(pr), Math.abs(pi));
    const a = pr / s;
    const b = pi / s;
    const d = (a * a + b * b) * s;
    this.dr[k] = a / d;
    this.di[k] = -b / d;
  }

  private refactor(re: Float64Array, im: Float64Array): boolean {
    const { n, xr, xi, lr, li, ur, ui, dr, di, rowScale, colScale } = this;
    const { colPtr, rowIdx } = this.pattern;
    const { pinv, lp, li: lrow, up, ui: urow, order } = this.s;
    for (let k = 0; k < n; k++) {
      const col = order[k];
      const cs = colScale[col];
      let scale = 0;
      for (let p = colPtr[col]; p < colPtr[col + 1]; p++) {
        const row = rowIdx[p];
        const f = rowScale[row] * cs;
        const vr = re[p] * f;
        const vi = im[p] * f;
        const j = pinv[row];
        xr[j] = vr;
        xi[j] = vi;
        const a = Math.abs(vr) + Math.abs(vi);
        if (a > scale) scale = a;
        else if (!(a <= scale)) scale = NaN;
      }
      for (let p = up[k]; p < up[k + 1]; p++) {
        const j = urow[p];
        const ar = xr[j];
        const ai = xi[j];
        xr[j] = 0;
        xi[j] = 0;
        ur[p] = ar;
        ui[p] = ai;
        if (ar === 0 && ai === 0) continue;
        const a = Math.abs(ar) + Math.abs(ai);
        if (a > scale) scale = a;
        for (let q = lp[j]; q < lp[j + 1]; q++) {
          const i = lrow[q];
          xr[i] -= lr[q] * ar - li[q] * ai;
          xi[i] -= lr[q] * ai + li[q] * ar;
        }
      }
      const pr = xr[k];
      const pi = xi[k];
      xr[k] = 0;
      xi[k] = 0;
      let largest = 0;
      let finite = true;
      for (let q = lp[k]; q < lp[k + 1]; q++) {
        const i = lrow[q];
        const a = Math.abs(xr[i]) + Math.abs(xi[i]);
        if (a > largest) largest = a;
        else if (!(a <= largest)) finite = false;
      }
      const a = Math.abs(pr) + Math.abs(pi);
      if (!finite || !(a >= REPIVOT_TOLERANCE * largest) || !(a > SINGULAR_RELATIVE * scale)) {
        for (let q = lp[k]; q < lp[k + 1]; q++) {
          xr[lrow[q]] = 0;
          xi[lrow[q]] = 0;
        }
        return false;
      }
      this.setPivot(k, pr, pi);
      const invR = dr[k];
      const invI = di[k];
      for (let q = lp[k]; q < lp[k + 1]; q++) {
        const i = lrow[q];
        const ar = xr[i];
        const ai = xi[i];
        lr[q] = ar * invR - ai * invI;
        li[q] = ar * invI + ai * invR;
        xr[i] = 0;
        xi[i] = 0;
      }
    }
    return true;
  }

  private factorFromScratch(re: Float64Array, im: Float64Array): number {
    const { n, xr, xi, dr, di, rowScale, colScale } = this;
    const { colPtr, rowIdx } = this.pattern;
    const s = this.s;
    const { pinv, prow, lp, up, xi: reachList, order } = s;
    this.fullFactorizations++;
    s.begin();
    for (let k = 0; k < n; k++) {
      if (s.reserve(n)) this.matchCapacity();
      const { li: lrow, ui: urow } = s;
      const { lr, li, ur, ui } = this;
      lp[k] = s.lnz;
      up[k] = s.unz;
      const col = order[k];
      const top = s.reach(colPtr, rowIdx, col);
      const cs = colScale[col];
      let scale = 0;
      for (let p = colPtr[col]; p < colPtr[col + 1]; p++) {
        const row = rowIdx[p];
        const f = rowScale[row] * cs;
        xr[row] = re[p] * f;
        xi[row] = im[p] * f;
        const a = Math.abs(xr[row]) + Math.abs(xi[row]);
        if (a > scale) scale = a;
        else if (!(a <= scale)) scale = NaN;
      }
      for (let t = top; t < n; t++) {
        const i = reachList[t];
        const j = pinv[i];
        if (j < 0) continue;
        const ar = xr[i];
        const ai = xi[i];
        xr[i] = 0;
        xi[i] = 0;
        urow[s.unz] = j;
        ur[s.unz] = ar;
        ui[s.unz++] = ai;
        if (ar === 0 && ai === 0) continue;
        const a = Math.abs(ar) + Math.abs(ai);
        if (a > scale) scale = a;
        for (let q = lp[j]; q < lp[j + 1]; q++) {
          const r = lrow[q];
          xr[r] -= lr[q] * ar - li[q] * ai;
          xi[r] -= lr[q] * ai + li[q] * ar;
        }
      }
      let pivotRow = -1;
      let largest = 0;
      let candidates = 0;
      let finite = true;
      for (let t = top; t < n; t++) {
        const i = reachList[t];
        if (pinv[i] >= 0) continue;
        candidates++;
        const a = Math.abs(xr[i]) + Math.abs(xi[i]);
        if (a > largest) {
          largest = a;
          pivotRow = i;
        } else if (!(a <= largest)) finite = false;
      }
      if (candidates === 0 || !finite || pivotRow < 0 || !(largest > SINGULAR_RELATIVE * scale)) {
        for (let t = top; t < n; t++) {
          xr[reachList[t]] = 0;
          xi[reachList[t]] = 0;
        }
        this.failure = { column: col, structural: candidates === 0 };
        return col;
      }
      if (pinv[col] < 0 && Math.abs(xr[col]) + Math.abs(xi[col]) >= PIVOT_TOLERANCE * largest) pivotRow = col;
      const pr = xr[pivotRow];
      const pi = xi[pivotRow];
      xr[pivotRow] = 0;
      xi[pivotRow] = 0;
      this.setPivot(k, pr, pi);
      pinv[pivotRow] = k;
      prow[k] = pivotRow;
      const invR = dr[k];
      const invI = di[k];
      for (let t = top; t < n; t++) {
        const i = reachList[t];
        if (pinv[i] >= 0) continue;
        const ar = xr[i];
        const ai = xi[i];
        lrow[s.lnz] = i;
        lr[s.lnz] = ar * invR - ai * invI;
        li[s.lnz++] = ar * invI + ai * invR;
        xr[i] = 0;
        xi[i] = 0;
      }
    }
    s.finish();
    // Remembered for the next LU of this pattern (into the same storage: no allocation once it fits).
    s.copyInto((this.symbolic.complexSeed ??= new LuStructure(n, s.order, 0)));
    return -1;
  }
}
