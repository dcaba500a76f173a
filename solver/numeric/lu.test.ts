/**
 * Dense real and complex LU against general-purpose reference libraries: ml-matrix's LU for
 * real systems, mathjs `lusolve` for complex ones.
 */
import fc from 'fast-check';
import { complex, lusolve, matrix, transpose, type Complex, type Matrix as MathMatrix } from 'mathjs';
import { LuDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { maxNormRelativeError } from '../testing/nearly-equal';
import { complexLuFactor, complexLuSolve, complexLuSolveTransposed } from './complex-lu';
import { DenseRealLu, luFactor } from './dense-lu';

const entries = (n: number) => fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n * n, maxLength: n * n });
// Right-hand sides of order one: mathjs compares against an absolute tolerance of 1e-15, so
// shrunk-to-tiny entries would test its rounding rather than ours.
const vec = (n: number) => fc.array(fc.double({ min: 1, max: 10, noNaN: true }), { minLength: n, maxLength: n });


/** Size, entries and right-hand sides (real and imaginary); the tests make the diagonal dominant so the systems are well conditioned. */
const sized = fc.integer({ min: 1, max: 12 }).chain((n) => fc.tuple(fc.constant(n), entries(n), vec(n), entries(n), vec(n)));

describe('dense real LU', () => {
  it('solves random systems as ml-matrix LuDecomposition does (relative 1e-9)', () => {
    fc.assert(
      fc.property(sized, ([n, a, b]) => {
        const A = Float64Array.from(a, (v, k) => (k % (n + 1) === 0 ? v + 10 * n + 1 : v));
        const ref = new LuDecomposition(new Matrix(Array.from({ length: n }, (_, i) => Array.from(A.subarray(i * n, i * n + n)))));
        const expected = ref.solve(Matrix.columnVector(b)).getColumn(0);
        const lu = new DenseRealLu(n);
        expect(lu.factor(A)).toBe(true);
        const x = Float64Array.from(b);
        lu.solve(x);
        expect(maxNormRelativeError(x, expected)).toBeLessThan(1e-9);
      }),
      { numRuns: 300, seed: 1 },
    );
  });

  it('pivots: solves a matrix with a zero leading entry', () => {
    const lu = new DenseRealLu(2);
    expect(lu.factor(Float64Array.of(0, 1, 1, 0))).toBe(true);
    const x = Float64Array.of(3, 4);
    lu.solve(x);
    expect(Array.from(x)).toEqual([4, 3]);
  });

  it('reports the step of a singular matrix instead of dividing by zero', () => {
    const a = Float64Array.of(1, 2, 3, 2, 4, 6, 1, 0, 1);
    expect(luFactor(a, 3, new Int32Array(3))).toBe(2);
    expect(luFactor(Float64Array.of(NaN), 1, new Int32Array(1))).toBe(0);
  });
});

describe('dense complex LU', () => {
  it('solves random complex systems as mathjs lusolve does (relative 1e-9)', () => {
    fc.assert(
      fc.property(sized, ([n, ar, br, ai, bi]) => {
        const re = Float64Array.from(ar, (v, k) => (k % (n + 1) === 0 ? v + 10 * n + 1 : v));
        const im = Float64Array.from(ai);
        const A: Complex[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => complex(re[i * n + j], im[i * n + j])));
        const b = Array.from({ length: n }, (_, i) => [complex(br[i], bi[i])]);
        const ref = (lusolve(matrix(A), matrix(b)) as MathMatrix).toArray() as unknown as Complex[][];
        const xr = Float64Array.from(br);
        const xi = Float64Array.from(bi);
        const piv = new Int32Array(n);
        expect(complexLuFactor(re, im, n, piv)).toBe(-1);
        complexLuSolve(re, im, n, piv, xr, xi);
        const ours: number[] = [];
        const theirs: number[] = [];
        for (let i = 0; i < n; i++) {
          const c = complex(ref[i][0]);
          ours.push(xr[i], xi[i]);
          theirs.push(c.re, c.im);
        }
        expect(maxNormRelativeError(ours, theirs)).toBeLessThan(1e-9);
      }),
      { numRuns: 300, seed: 2 },
    );
  });

  it('solves the transposed system from the same factors as mathjs lusolve does on Aᵀ, row swaps included (relative 1e-9)', () => {
    // A diagonally dominant matrix with its rows shuffled: well conditioned, and every step pivots.
    const shuffled = sized.chain((t) => fc.tuple(fc.constant(t), fc.shuffledSubarray([...Array(t[0]).keys()], { minLength: t[0], maxLength: t[0] })));
    fc.assert(
      fc.property(shuffled, ([[n, ar, br, ai, bi], order]) => {
        const re = new Float64Array(n * n);
        const im = new Float64Array(n * n);
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) {
            const k = i * n + j;
            re[order[i] * n + j] = i === j ? ar[k] + 10 * n + 1 : ar[k];
            im[order[i] * n + j] = ai[k];
          }
        }
        const A: Complex[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => complex(re[i * n + j], im[i * n + j])));
        const b = Array.from({ length: n }, (_, i) => [complex(br[i], bi[i])]);
        const ref = (lusolve(transpose(matrix(A)), matrix(b)) as MathMatrix).toArray() as unknown as Complex[][];
        const yr = Float64Array.from(br);
        const yi = Float64Array.from(bi);
        const piv = new Int32Array(n);
        expect(complexLuFactor(re, im, n, piv)).toBe(-1);
        complexLuSolveTransposed(re, im, n, piv, yr, yi);
        const ours: number[] = [];
        const theirs: number[] = [];
        for (let i = 0; i < n; i++) {
          const c = complex(ref[i][0]);
          ours.push(yr[i], yi[i]);
          theirs.push(c.re, c.im);
        }
        expect(maxNormRelativeError(ours, theirs)).toBeLessThan(1e-9);
      }),
      { numRuns: 300, seed: 3 },
    );
  });

  it('pivots on modulus: a purely imaginary pivot is found below a zero', () => {
    const re = Float64Array.of(0, 1, 0, 0);
    const im = Float64Array.of(0, 0, 2, 0);
    const piv = new Int32Array(2);
    expect(complexLuFactor(re, im, 2, piv)).toBe(-1);
    // [[0, 1], [2j, 0]]·x = [1, 2j] → x = [1, 1].
    const xr = Float64Array.of(1, 0);
    const xi = Float64Array.of(0, 2);
    complexLuSolve(re, im, 2, piv, xr, xi);
    expect(Array.from(xr)).toEqual([1, 1]);
    expect(Array.from(xi).map(Math.abs)).toEqual([0, 0]);
  });

  it('reports a singular complex matrix', () => {
    const re = Float64Array.of(1, 2, 2, 4);
    const im = Float64Array.of(1, 2, 2, 4);
    expect(complexLuFactor(re, im, 2, new Int32Array(2))).toBe(1);
  });

  it('handles entries of extreme magnitude without overflow in the pivot inverse', () => {
    const re = Float64Array.of(1e-200, 0, 0, 1e200);
    const im = Float64Array.of(1e-200, 0, 0, 0);
    const piv = new Int32Array(2);
    expect(complexLuFactor(re, im, 2, piv)).toBe(-1);
    const xr = Float64Array.of(1e-200, 1e200);
    const xi = Float64Array.of(0, 0);
    complexLuSolve(re, im, 2, piv, xr, xi);
    // (1e-200·(1 + j))·x0 = 1e-200 → x0 = (1 − j)/2.
    expect(xr[0]).toBeCloseTo(0.5, 14);
    expect(xi[0]).toBeCloseTo(-0.5, 14);
    expect(xr[1]).toBe(1);
  });
});
