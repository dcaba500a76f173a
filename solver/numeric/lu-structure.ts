/**
 * The structural half of a sparse LU factorisation P·A·Q = L·U, shared by the real and complex
 * factorisations: the column order Q (fill-reducing, from the symbolic analysis), the row pivot
 * order P chosen by the last full factorisation, and the patterns of L and U it produced.
 *
 * The factorisation is the left-looking one of J. R. Gilbert and T. Peierls ("Sparse partial
 * pivoting in time proportional to arithmetic operations", SIAM J. Sci. Stat. Comput. 9(5),
 * 1988): column k of L and U comes from a sparse triangular solve with the columns of L already
 * made, whose nonzero pattern is the set of rows reachable from A(:, Q[k]) through those columns
 * — found by a depth-first search that also yields a valid order for the solve. Once a pivot
 * order is known, the patterns are known too; a later matrix with the same pattern is refactored
 * numerically on them with no search at all (as KLU's refactorisation does).
 */

/** Threshold partial pivoting: the diagonal candidate is kept while it is at least this fraction of the column's largest. */
export const PIVOT_TOLERANCE = 0.1;
/**
 * A refactorisation on the old pivot order is accepted while every pivot stays at least this
 * fraction of the largest candidate of its column; below that the pivots are chosen again. Lower
 * than {@link PIVOT_TOLERANCE}, so a Newton iteration's small value changes do not flip the order back and forth.
 */
export const REPIVOT_TOLERANCE = 1e-3;
/**
 * A pivot column whose largest candidate is below this fraction of the column's scale (the
 * largest entry of the equilibrated column, U part included) is numerically singular: what is
 * left is the rounding noise of a cancellation, about 2⁻⁵² of the entries that cancelled, and
 * dividing by it would hand out noise as a solution. 2⁻⁴⁶ leaves 64 ulps of margin.
 */
export const SINGULAR_RELATIVE = 2 ** -46;

/** Where and why the last factorisation stopped. */
export interface LuFailure {
  /** The unknown (original column) that had no usable pivot. */
  column: number;
  /** True when no row could ever pivot there, whatever the values (the pattern itself is singular). */
  structural: boolean;
}

/** Pivot order and L/U patterns; the numeric LUs keep their values beside it. */
export class LuStructure {
  /** Row (original index) pivoted at step k. */
  readonly prow: Int32Array;
  /** Pivot step of each original row; −1 while not yet pivotal during a full factorisation. */
  readonly pinv: Int32Array;
  /** L's column k (strictly below the diagonal): slots lp[k] … lp[k+1] − 1 of li. */
  readonly lp: Int32Array;
  /** U's column k (strictly above the diagonal): slots up[k] … up[k+1] − 1 of ui, in a valid elimination order. */
  readonly up: Int32Array;
  /** Row of each L entry: original rows while factoring, pivot steps once {@link finish}ed. */
  li: Int32Array;
  /** Pivot step of each U entry. */
  ui: Int32Array;
  lnz = 0;
  unz = 0;
  /** True when the patterns and pivot order describe a complete factorisation. */
  valid = false;

  // Depth-first search work: the reach (top … n − 1), the stack, the resume point of each level.
  readonly xi: Int32Array;
  private readonly stack: Int32Array;
  private readonly resume: Int32Array;
  private readonly mark: Int32Array;
  private stamp = 0;

  constructor(readonly n: number, readonly order: Int32Array, capacity: number) {
    this.prow = new Int32Array(n);
    this.pinv = new Int32Array(n);
    this.lp = new Int32Array(n + 1);
    this.up = new Int32Array(n + 1);
    this.li = new Int32Array(Math.max(capacity, n));
    this.ui = new Int32Array(Math.max(capacity, n));
    this.xi = new Int32Array(n);
    this.stack = new Int32Array(n);
    this.resume = new Int32Array(n);
    this.mark = new Int32Array(n).fill(-1);
  }

  /** Starts a full factorisation: no row pivotal, no entries. */
  begin(): void {
    this.pinv.fill(-1);
    this.lnz = 0;
    this.unz = 0;
    this.valid = false;
  }

  /**
   * Makes room for `extra` more entries in L and in U (a column adds at most n to each).
   * Returns true when the index arrays grew (the caller grows its value arrays to match).
   */
  reserve(extra: number): boolean {
    let grew = false;
    if (this.lnz + extra > this.li.length) {
      this.li = grow(this.li, Math.max(2 * this.li.length, this.lnz + extra));
      grew = true;
    }
    if (this.unz + extra > this.ui.length) {
      this.ui = grow(this.ui, Math.max(2 * this.ui.length, this.unz + extra));
      grew = true;
    }
    return grew;
  }

  /**
   * The rows reachable from the pattern of A(:, col) through the columns of L made so far, in
   * topological order, in xi[top … n − 1]; returns top. Iterative, so deep chains cannot
   * overflow the call stack.
   */
  reach(colPtr: Int32Array, rowIdx: Int32Array, col: number): number {
    const { xi, stack, resume, mark, pinv, lp, li } = this;
    if (++this.stamp >= 0x3fffffff) {
      mark.fill(-1);
      this.stamp = 0;
    }
    const stamp = this.stamp;
    let top = this.n;
    for (let p = colPtr[col]; p < colPtr[col + 1]; p++) {
      const start = rowIdx[p];
      if (mark[start] === stamp) continue;
      let head = 0;
      stack[0] = start;
      while (head >= 0) {
        const j = stack[head];
        const jcol = pinv[j];
        if (mark[j] !== stamp) {
          mark[j] = stamp;
          resume[head] = jcol < 0 ? 0 : lp[jcol];
        }
        const end = jcol < 0 ? 0 : lp[jcol + 1];
        let descended = false;
        for (let q = resume[head]; q < end; q++) {
          const i = li[q];
          if (mark[i] === stamp) continue;
          resume[head] = q + 1;
          stack[++head] = i;
          descended = true;
          break;
        }
        if (!descended) {
          head--;
          xi[--top] = j;
        }
      }
    }
    return top;
  }

  /** Ends a successful full factorisation: L's rows renumbered from original rows to pivot steps. */
  finish(): void {
    const { li, pinv } = this;
    for (let p = 0; p < this.lnz; p++) li[p] = pinv[li[p]];
    this.lp[this.n] = this.lnz;
    this.up[this.n] = this.unz;
    this.valid = true;
  }

  /** Copies pivot order and patterns into `target` (same n and order). */
  copyInto(target: LuStructure): void {
    target.prow.set(this.prow);
    target.pinv.set(this.pinv);
    target.lp.set(this.lp);
    target.up.set(this.up);
    target.lnz = 0;
    target.unz = 0;
    target.reserve(Math.max(this.lnz, this.unz));
    target.li.set(this.li.subarray(0, this.lnz));
    target.ui.set(this.ui.subarray(0, this.unz));
    target.lnz = this.lnz;
    target.unz = this.unz;
    target.valid = this.valid;
  }
}

/** A larger copy of a typed array. */
export function grow<T extends Int32Array | Float64Array>(a: T, size: number): T {
  const b = new (a.constructor as { new (n: number): T })(size);
  b.set(a);
  return b;
}
