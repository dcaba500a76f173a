/**
 * Sparse real LU with threshold partial pivoting, for the DC Newton matrix of a circuit of any
 * size. P·(R·A·C)·Q = L·U: R and C equilibrate (./equilibrate.ts), Q is the fill-reducing column
 * order of the pattern's symbolic analysis, P the row pivots.
 *
 * `factor` first refactors on the previous pivot order and patterns (numeric work only, no
 * search, no allocation); when a pivot has degraded below REPIVOT_TOLERANCE of its column — or
 * there is no previous order — it factors from scratch, left-looking (Gilbert–Peierls, see
 * ./lu-structure.ts), choosing each pivot afresh: the diagonal of the symmetric order while it is
 * within PIVOT_TOLERANCE of the column's largest candidate, else that largest.
 */
import { equilibrate } from './equilibrate';
import { grow, LuStructure, PIVOT_TOLERANCE, REPIVOT_TOLERANCE, SINGULAR_RELATIVE, type LuFailure } from './lu-structure';
import type { SparsePattern } from './sparse-pattern';
import type { SparseSymbolic } from './sparse-symbolic';

/** Sparse real LU of matrices on one pattern. */
export class SparseRealLu {
  readonly kind = 'sparse';
  readonly n: number;
  /** Values of L (below the diagonal) and U (above it), aligned with the structure's li / ui. */
  private lx: Float64Array;
  private ux: Float64Array;
  private readonly ud: Float64Array;
  private readonly rowScale: Float64Array;
  private readonly colScale: Float64Array;
  /** Dense work vector, all zero between columns. */
  private readonly x: Float64Array;
  private readonly s: LuStructure;
  /** Why the last factorisation failed (null after a success). */
  failure: LuFailure | null = null;
  /** How many times the pivot order was chosen from scratch (the first factorisation included). */
  fullFactorizations = 0;

  constructor(readonly pattern: SparsePattern, private readonly symbolic: SparseSymbolic) {
    const n = pattern.n;
    this.n = n;
    const capacity = 2 * pattern.nnz + n;
    this.s = new LuStructure(n, symbolic.order, capacity);
    this.lx = new Float64Array(this.s.li.length);
    this.ux = new Float64Array(this.s.ui.length);
    this.ud = new Float64Array(n);
    this.rowScale = new Float64Array(n);
    this.colScale = new Float64Array(n);
    this.x = new Float64Array(n);
    // A pivot order that worked for another matrix of this pattern is the first one tried.
    if (symbolic.realSeed) this.adopt(symbolic.realSeed);
  }

  /** Factors the matrix with `values` on the pattern. Returns −1 on success, else the singular unknown. */
  factor(values: Float64Array): number {
    const { pattern } = this;
    equilibrate(this.n, pattern.colPtr, pattern.rowIdx, values, null, this.rowScale, this.colScale);
    this.failure = null;
    if (this.s.valid && this.refactor(values)) return -1;
    return this.factorFromScratch(values);
  }

  /** Solves A·x = b in place in `b` with the last successful factorisation. */
  solve(b: Float64Array): void {
    const { n, x: z, lx, ux, ud, rowScale, colScale } = this;
    const { prow, lp, li, up, ui, order } = this.s;
    for (let k = 0; k < n; k++) z[k] = b[prow[k]] * rowScale[prow[k]];
    for (let k = 0; k < n; k++) {
      const zk = z[k];
      if (zk !== 0) for (let p = lp[k]; p < lp[k + 1]; p++) z[li[p]] -= lx[p] * zk;
    }
    for (let k = n - 1; k >= 0; k--) {
      const zk = z[k] / ud[k];
      z[k] = zk;
      if (zk !== 0) for (let p = up[k]; p < up[k + 1]; p++) z[ui[p]] -= ux[p] * zk;
    }
    for (let k = 0; k < n; k++) {
      b[order[k]] = z[k] * colScale[order[k]];
      z[k] = 0;
    }
  }

  /** Solves Aᵀ·y = b in place in `b` from the same factors: Uᵀ forward, Lᵀ back, permutations undone. */
  solveTransposed(b: Float64Array): void {
    const { n, x: z, lx, ux, ud, rowScale, colScale } = this;
    const { prow, lp, li, up, ui, order } = this.s;
    for (let k = 0; k < n; k++) z[k] = b[order[k]] * colScale[order[k]];
    for (let k = 0; k < n; k++) {
      let s = z[k];
      for (let p = up[k]; p < up[k + 1]; p++) s -= ux[p] * z[ui[p]];
      z[k] = s / ud[k];
    }
    for (let k = n - 1; k >= 0; k--) {
      let s = z[k];
      for (let p = lp[k]; p < lp[k + 1]; p++) s -= lx[p] * z[li[p]];
      z[k] = s;
    }
    for (let k = 0; k < n; k++) {
      b[prow[k]] = z[k] * rowScale[prow[k]];
      z[k] = 0;
    }
  }

  /** True when a pivot order is known (from a factorisation, or adopted from the last one of this pattern). */
  get hasPivotOrder(): boolean {
    return this.s.valid;
  }

  /** Entries of L and U (diagonal included): the fill the factorisation produced. */
  get factorNonzeros(): number {
    return this.s.lnz + this.s.unz + this.n;
  }

  /** Takes over a pivot order and patterns found for another matrix of this pattern. */
  private adopt(seed: LuStructure): void {
    seed.copyInto(this.s);
    this.matchCapacity();
  }

  private matchCapacity(): void {
    if (this.lx.length < this.s.li.length) this.lx = grow(this.lx, this.s.li.length);
    if (this.ux.length < this.s.ui.length) this.ux = grow(this.ux, this.s.ui.length);
  }

  /** Numeric refactorisation on the known order; false when a pivot degraded (x is left all zero). */
  private refactor(values: Float64Array): boolean {
    const { n, x, lx, ux, ud, rowScale, colScale } = this;
    const { colPtr, rowIdx } = this.pattern;
    const { pinv, lp, li, up, ui, order } = this.s;
    for (let k = 0; k < n; k++) {
      const col = order[k];
      const cs = colScale[col];
      let scale = 0;
      for (let p = colPtr[col]; p < colPtr[col + 1]; p++) {
        const row = rowIdx[p];
        const v = values[p] * rowScale[row] * cs;
        x[pinv[row]] = v;
        const a = Math.abs(v);
        if (a > scale) scale = a;
        else if (!(a <= scale)) scale = NaN;
      }
      for (let p = up[k]; p < up[k + 1]; p++) {
        const j = ui[p];
        const xj = x[j];
        x[j] = 0;
        ux[p] = xj;
        if (xj === 0) continue;
        const a = Math.abs(xj);
        if (a > scale) scale = a;
        for (let q = lp[j]; q < lp[j + 1]; q++) x[li[q]] -= lx[q] * xj;
      }
      const pivot = x[k];
      x[k] = 0;
      let largest = 0;
      let finite = true;
      for (let q = lp[k]; q < lp[k + 1]; q++) {
        const a = Math.abs(x[li[q]]);
        if (a > largest) largest = a;
        else if (!(a <= largest)) finite = false;
      }
      const a = Math.abs(pivot);
      if (!finite || !(a >= REPIVOT_TOLERANCE * largest) || !(a > SINGULAR_RELATIVE * scale)) {
        for (let q = lp[k]; q < lp[k + 1]; q++) x[li[q]] = 0;
        return false;
      }
      ud[k] = pivot;
      const inv = 1 / pivot;
      for (let q = lp[k]; q < lp[k + 1]; q++) {
        const i = li[q];
        lx[q] = x[i] * inv;
        x[i] = 0;
      }
    }
    return true;
  }

  /** Full left-looking factorisation with threshold pivoting. Returns −1 or the singular unknown. */
  private factorFromScratch(values: Float64Array): number {
    const { n, x, ud, rowScale, colScale } = this;
    const { colPtr, rowIdx } = this.pattern;
    const s = this.s;
    const { pinv, prow, lp, up, xi, order } = s;
    this.fullFactorizations++;
    s.begin();
    for (let k = 0; k < n; k++) {
      if (s.reserve(n)) this.matchCapacity();
      const { li, ui } = s;
      const { lx, ux } = this;
      lp[k] = s.lnz;
      up[k] = s.unz;
      const col = order[k];
      const top = s.reach(colPtr, rowIdx, col);
      const cs = colScale[col];
      let scale = 0;
      for (let p = colPtr[col]; p < colPtr[col + 1]; p++) {
        const row = rowIdx[p];
        const v = values[p] * rowScale[row] * cs;
        x[row] = v;
        const a = Math.abs(v);
        if (a > scale) scale = a;
        else if (!(a <= scale)) scale = NaN;
      }
      // The sparse triangular solve, in the topological order of the reach.
      for (let t = top; t < n; t++) {
        const i = xi[t];
        const j = pinv[i];
        if (j < 0) continue;
        const xj = x[i];
        x[i] = 0;
        ui[s.unz] = j;
        ux[s.unz++] = xj;
        if (xj === 0) continue;
        const a = Math.abs(xj);
        if (a > scale) scale = a;
        for (let q = lp[j]; q < lp[j + 1]; q++) x[li[q]] -= lx[q] * xj;
      }
      // Pivot: the largest candidate, or the diagonal of the symmetric order when close enough.
      let pivotRow = -1;
      let largest = 0;
      let candidates = 0;
      let finite = true;
      for (let t = top; t < n; t++) {
        const i = xi[t];
        if (pinv[i] >= 0) continue;
        candidates++;
        const a = Math.abs(x[i]);
        if (a > largest) {
          largest = a;
          pivotRow = i;
        } else if (!(a <= largest)) finite = false;
      }
      if (candidates === 0 || !finite || pivotRow < 0 || !(largest > SINGULAR_RELATIVE * scale)) {
        for (let t = top; t < n; t++) x[xi[t]] = 0;
        this.failure = { column: col, structural: candidates === 0 };
        return col;
      }
      if (pinv[col] < 0 && Math.abs(x[col]) >= PIVOT_TOLERANCE * largest) pivotRow = col;
      const pivot = x[pivotRow];
      x[pivotRow] = 0;
      ud[k] = pivot;
      pinv[pivotRow] = k;
      prow[k] = pivotRow;
      const inv = 1 / pivot;
      for (let t = top; t < n; t++) {
        const i = xi[t];
        if (pinv[i] >= 0) continue;
        li[s.lnz] = i;
        lx[s.lnz++] = x[i] * inv;
        x[i] = 0;
      }
    }
    s.finish();
    // Remembered for the next LU of this pattern (into the same storage: no allocation once it fits).
    s.copyInto((this.symbolic.realSeed ??= new LuStructure(n, s.order, 0)));
    return -1;
  }
}
