/**
 * The engine's linear solvers on a circuit's fixed pattern, real (DC Newton) and complex (AC),
 * each choosing the dense LU or the sparse one by size. Both equilibrate and judge singularity
 * relative to the column scale, so the choice changes speed, not verdicts.
 */
import { complexLuFactor, complexLuSolve, complexLuSolveTransposed } from './complex-lu';
import { luFactor, luSolve, luSolveTransposed } from './dense-lu';
import { equilibrate } from './equilibrate';
import { SINGULAR_RELATIVE, type LuFailure } from './lu-structure';
import { SparseComplexLu } from './sparse-complex-lu';
import { SparseRealLu } from './sparse-lu';
import type { SparsePattern } from './sparse-pattern';
import { symbolicFor } from './sparse-symbolic';

/**
 * Unknowns below which the dense LU is used. Measured (factor + solve of the same circuit
 * matrices with each LU, timed alternately in batches; `npm run bench` prints the table; Node 20
 * on the development machine): at 3 unknowns (a divider) the dense LU is about 1.8× faster for
 * AC and 1.0–1.3× for DC; at 6 and 8 the two are even (0.95–1.06); from 10 on the sparse one is
 * faster and pulls away (AC 1.07–1.09× at 10, 1.2× at 14, 1.45× at 20, 2.1× at 52 unknowns).
 */
export const DENSE_CROSSOVER = 10;

/** Which LU to use: chosen by size, or forced (tests, the bench). */
export type SolverKind = 'auto' | 'dense' | 'sparse';

/** A real solver for the matrices of one pattern. */
export interface RealLinearSolver {
  readonly n: number;
  readonly kind: 'dense' | 'sparse';
  /** Factors the matrix with these values on the pattern; −1 on success, else the singular unknown. */
  factor(values: Float64Array): number;
  /** Why the last factorisation failed, or null. */
  readonly failure: LuFailure | null;
  /** Solves A·x = b in place with the last successful factorisation. */
  solve(b: Float64Array): void;
  /** Solves Aᵀ·y = b in place with the same factors. */
  solveTransposed(b: Float64Array): void;
}

/** A complex solver for the matrices of one pattern, split storage. */
export interface ComplexLinearSolver {
  readonly n: number;
  readonly kind: 'dense' | 'sparse';
  factor(re: Float64Array, im: Float64Array): number;
  readonly failure: LuFailure | null;
  solve(bRe: Float64Array, bIm: Float64Array): void;
  /** The plain transpose (not the conjugate). */
  solveTransposed(bRe: Float64Array, bIm: Float64Array): void;
}

function useDense(pattern: SparsePattern, kind: SolverKind): boolean {
  return kind === 'dense' || (kind === 'auto' && pattern.n < DENSE_CROSSOVER);
}

/** The real solver for `pattern`: dense below {@link DENSE_CROSSOVER} unknowns, else sparse. */
export function createRealSolver(pattern: SparsePattern, kind: SolverKind = 'auto'): RealLinearSolver {
  if (useDense(pattern, kind)) return new DenseRealOnPattern(pattern);
  return new SparseRealLu(pattern, symbolicFor(pattern));
}

/** The complex solver for `pattern`: dense below {@link DENSE_CROSSOVER} unknowns, else sparse. */
export function createComplexSolver(pattern: SparsePattern, kind: SolverKind = 'auto'): ComplexLinearSolver {
  if (useDense(pattern, kind)) return new DenseComplexOnPattern(pattern);
  return new SparseComplexLu(pattern, symbolicFor(pattern));
}

/** The dense real LU fed from pattern values, equilibrated like the sparse one. */
class DenseRealOnPattern implements RealLinearSolver {
  readonly kind = 'dense';
  readonly n: number;
  failure: LuFailure | null = null;
  private readonly a: Float64Array;
  private readonly pivots: Int32Array;
  private readonly rowScale: Float64Array;
  private readonly colScale: Float64Array;

  constructor(private readonly pattern: SparsePattern) {
    const n = pattern.n;
    this.n = n;
    this.a = new Float64Array(n * n);
    this.pivots = new Int32Array(n);
    this.rowScale = new Float64Array(n);
    this.colScale = new Float64Array(n);
  }

  factor(values: Float64Array): number {
    const { n, a, rowScale, colScale } = this;
    const { colPtr, rowIdx } = this.pattern;
    equilibrate(n, colPtr, rowIdx, values, null, rowScale, colScale);
    a.fill(0);
    for (let j = 0; j < n; j++) {
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        const i = rowIdx[p];
        a[i * n + j] = values[p] * rowScale[i] * colScale[j];
      }
    }
    const k = luFactor(a, n, this.pivots, SINGULAR_RELATIVE);
    this.failure = k < 0 ? null : { column: k, structural: false };
    return k;
  }

  solve(b: Float64Array): void {
    const { n, rowScale, colScale } = this;
    for (let i = 0; i < n; i++) b[i] *= rowScale[i];
    luSolve(this.a, n, this.pivots, b);
    for (let j = 0; j < n; j++) b[j] *= colScale[j];
  }

  solveTransposed(b: Float64Array): void {
    const { n, rowScale, colScale } = this;
    for (let j = 0; j < n; j++) b[j] *= colScale[j];
    luSolveTransposed(this.a, n, this.pivots, b);
    for (let i = 0; i < n; i++) b[i] *= rowScale[i];
  }
}

/** The dense complex LU fed from pattern values, equilibrated like the sparse one. */
class DenseComplexOnPattern implements ComplexLinearSolver {
  readonly kind = 'dense';
  readonly n: number;
  failure: LuFailure | null = null;
  private readonly re: Float64Array;
  private readonly im: Float64Array;
  private readonly pivots: Int32Array;
  private readonly rowScale: Float64Array;
  private readonly colScale: Float64Array;

  constructor(private readonly pattern: SparsePattern) {
    const n = pattern.n;
    this.n = n;
    this.re = new Float64Array(n * n);
    this.im = new Float64Array(n * n);
    this.pivots = new Int32Array(n);
    this.rowScale = new Float64Array(n);
    this.colScale = new Float64Array(n);
  }

  factor(re: Float64Array, im: Float64Array): number {
    const { n, rowScale, colScale } = this;
    const { colPtr, rowIdx } = this.pattern;
    equilibrate(n, colPtr, rowIdx, re, im, rowScale, colScale);
    this.re.fill(0);
    this.im.fill(0);
    for (let j = 0; j < n; j++) {
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        const i = rowIdx[p];
        const f = rowScale[i] * colScale[j];
        this.re[i * n + j] = re[p] * f;
        this.im[i * n + j] = im[p] * f;
      }
    }
    const k = complexLuFactor(this.re, this.im, n, this.pivots, SINGULAR_RELATIVE);
    this.failure = k < 0 ? null : { column: k, structural: false };
    return k;
  }

  solve(bRe: Float64Array, bIm: Float64Array): void {
    const { n, rowScale, colScale } = this;
    for (let i = 0; i < n; i++) {
      bRe[i] *= rowScale[i];
      bIm[i] *= rowScale[i];
    }
    complexLuSolve(this.re, this.im, n, this.pivots, bRe, bIm);
    for (let j = 0; j < n; j++) {
      bRe[j] *= colScale[j];
      bIm[j] *= colScale[j];
    }
  }

  solveTransposed(bRe: Float64Array, bIm: Float64Array): void {
    const { n, rowScale, colScale } = this;
    for (let j = 0; j < n; j++) {
      bRe[j] *= colScale[j];
      bIm[j] *= colScale[j];
    }
    complexLuSolveTransposed(this.re, this.im, n, this.pivots, bRe, bIm);
    for (let i = 0; i < n; i++) {
      bRe[i] *= rowScale[i];
      bIm[i] *= rowScale[i];
    }
  }
}
