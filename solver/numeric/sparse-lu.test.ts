/**
 * The sparse LUs (real and complex) against the dense LUs of this folder and against two
 * general-purpose references: mathjs `lusolve` (dense, partial pivoting) and mathjs `slu` (its
 * sparse LU, CSparse's algorithms: T. A. Davis, Direct Methods for Sparse Linear Systems, SIAM
 * 2006), on random circuit-like matrices: nodal conductance stamps (structurally symmetric),
 * controlled-source entries (unsymmetric), voltage-source branch rows with a zero diagonal, a
 * conductance to ground at every node (diagonally weighted) — plus nearly floating ones and ones
 * whose rows are scaled by up to 10^±12.
 */
import fc from 'fast-check';
import { complex, inv, lusolve, matrix, slu, sparse, transpose, type Complex, type Matrix as MathMatrix } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { maxNormRelativeError } from '../testing/nearly-equal';
import { createComplexSolver, createRealSolver, DENSE_CROSSOVER } from './linear-solver';
import { SparseComplexLu } from './sparse-complex-lu';
import { SparseRealLu } from './sparse-lu';
import { SparsePattern } from './sparse-pattern';
import { clearSymbolicCache, symbolicFor } from './sparse-symbolic';

/** A circuit-like matrix: dense row-major copies (real and imaginary parts) and its pattern. */
interface TestMatrix {
  n: number;
  re: Float64Array;
  im: Float64Array;
}


/**
 * Random nodal matrices: `nodes` node rows, a few branch rows. `groundWeight` scales every
 * node's conductance to ground (1e-6: a nearly floating circuit).
 */
const circuitMatrix = (groundWeight = 1) =>
  fc.record({
    nodes: fc.integer({ min: 1, max: 30 }),
    branches: fc.integer({ min: 0, max: 4 }),
    seed: fc.integer({ min: 1, max: 2 ** 30 }),
  }).map(({ nodes, branches, seed }): TestMatrix => {
    let s = seed;
    const rand = () => {
      s = (Math.imul(s, 1103515245) + 12345) >>> 0;
      return s / 2 ** 32;
    };
    const n = nodes + branches;
    const re = new Float64Array(n * n);
    const im = new Float64Array(n * n);
    const add = (m: Float64Array, i: number, j: number, v: number) => {
      m[i * n + j] += v;
    };
    const conductance = (m: Float64Array, a: number, b: number, g: number) => {
      add(m, a, a, g);
      add(m, b, b, g);
      add(m, a, b, -g);
      add(m, b, a, -g);
    };
    for (let i = 0; i < nodes; i++) {
      add(re, i, i, groundWeight * (0.1 + rand()));
      for (let e = 0; e < 2; e++) {
        const j = Math.floor(rand() * nodes);
        if (j !== i) {
          conductance(re, i, j, 10 ** (4 * rand() - 2));
          conductance(im, i, j, rand());
        }
      }
      if (rand() < 0.2) add(re, Math.floor(rand() * nodes), i, rand() - 0.5); // a controlled source
    }
    const held = new Set<number>();
    for (let k = nodes; k < n; k++) {
      // A voltage source from a node to ground (one per node: two would be a loop): KCL entry
      // and branch equation, zero diagonal.
      const a = Math.floor(rand() * nodes);
      if (held.has(a)) {
        add(re, k, k, 1); // an unused branch row: a plain unknown
        continue;
      }
      held.add(a);
      add(re, a, k, 1);
      add(re, k, a, 1);
    }
    return { n, re, im };
  });

const rhs = (n: number, seed: number) => Float64Array.from({ length: n }, (_, i) => 1 + ((i * 7919 + seed) % 13) / 4);

function patternOf(m: TestMatrix): SparsePattern {
  return SparsePattern.fromDense(m.n, m.re, m.im);
}

/** mathjs complex matrix from split parts. */
function mathComplex(m: TestMatrix, rowScale?: Float64Array): Complex[][] {
  return Array.from({ length: m.n }, (_, i) =>
    Array.from({ length: m.n }, (_, j) => complex(m.re[i * m.n + j] * (rowScale?.[i] ?? 1), m.im[i * m.n + j] * (rowScale?.[i] ?? 1))),
  );
}

function fromMathColumn(x: MathMatrix | number[][]): { re: number[]; im: number[] } {
  const rows = (Array.isArray(x) ? x : x.toArray()) as unknown as (Complex | number)[][];
  const c = rows.map((r) => complex(r[0] as Complex));
  return { re: c.map((z) => z.re), im: c.map((z) => z.im) };
}

function realSolve(m: TestMatrix, kind: 'dense' | 'sparse', b: Float64Array, transposed = false, rowScale?: Float64Array): Float64Array {
  const p = patternOf(m);
  const scaled = Float64Array.from(m.re, (v, k) => v * (rowScale?.[Math.floor(k / m.n)] ?? 1));
  const solver = createRealSolver(p, kind);
  expect(solver.factor(p.gather(scaled))).toBe(-1);
  const x = Float64Array.from(b, (v, i) => (transposed ? v : v * (rowScale?.[i] ?? 1)));
  if (transposed) solver.solveTransposed(x);
  else solver.solve(x);
  return x;
}

describe('sparse real LU', () => {
  it('solves random circuit-like systems as the dense LU and mathjs lusolve do (relative 1e-10)', () => {
    fc.assert(
      fc.property(circuitMatrix(), fc.integer({ min: 0, max: 100 }), (m, seed) => {
        const b = rhs(m.n, seed);
        const sparseX = realSolve(m, 'sparse', b);
        expect(maxNormRelativeError(sparseX, realSolve(m, 'dense', b))).toBeLessThan(1e-10);
        const A = Array.from({ length: m.n }, (_, i) => Array.from(m.re.subarray(i * m.n, (i + 1) * m.n)));
        const ref = (lusolve(matrix(A), Array.from(b, (v) => [v])) as MathMatrix).toArray() as number[][];
        expect(maxNormRelativeError(sparseX, ref.map((r) => r[0]))).toBeLessThan(1e-10);
      }),
      { numRuns: 150, seed: 11 },
    );
  });

  it('solves as mathjs sparse slu (AMD order on A + Aᵀ, partial pivoting) does (relative 1e-10)', () => {
    fc.assert(
      fc.property(circuitMatrix(), (m) => {
        const b = rhs(m.n, 3);
        const A = Array.from({ length: m.n }, (_, i) => Array.from(m.re.subarray(i * m.n, (i + 1) * m.n)));
        const ref = (lusolve(slu(sparse(A), 1, 1), Array.from(b, (v) => [v])) as MathMatrix).toArray() as number[][];
        expect(maxNormRelativeError(realSolve(m, 'sparse', b), ref.map((r) => r[0]))).toBeLessThan(1e-10);
      }),
      { numRuns: 100, seed: 12 },
    );
  });

  it('solves the transposed system from the same factors as mathjs lusolve does on Aᵀ (relative 1e-10)', () => {
    fc.assert(
      fc.property(circuitMatrix(), (m) => {
        const b = rhs(m.n, 5);
        const A = Array.from({ length: m.n }, (_, i) => Array.from(m.re.subarray(i * m.n, (i + 1) * m.n)));
        const ref = (lusolve(transpose(matrix(A)), Array.from(b, (v) => [v])) as MathMatrix).toArray() as number[][];
        const ours = realSolve(m, 'sparse', b, true);
        expect(maxNormRelativeError(ours, ref.map((r) => r[0]))).toBeLessThan(1e-10);
        expect(maxNormRelativeError(realSolve(m, 'dense', b, true), ref.map((r) => r[0]))).toBeLessThan(1e-10);
      }),
      { numRuns: 100, seed: 13 },
    );
  });

  it('nearly floating circuits (ground conductances 1e-6 of the rest): backward error at rounding level, and mathjs lusolve matched as far as the conditioning allows', () => {
    fc.assert(
      fc.property(circuitMatrix(1e-6), (m) => {
        const b = rhs(m.n, 7);
        const A = Array.from({ length: m.n }, (_, i) => Array.from(m.re.subarray(i * m.n, (i + 1) * m.n)));
        const ref = (lusolve(matrix(A), Array.from(b, (v) => [v])) as MathMatrix).toArray() as number[][];
        const x = realSolve(m, 'sparse', b);
        // Normwise backward error ‖b − A·x‖∞ / (‖A‖∞·‖x‖∞ + ‖b‖∞) (Higham, Accuracy and Stability
        // of Numerical Algorithms, 2nd ed., §7.1): a stable LU keeps it near the unit roundoff.
        let res = 0;
        let normA = 0;
        for (let i = 0; i < m.n; i++) {
          let r = b[i];
          let row = 0;
          for (let j = 0; j < m.n; j++) {
            r -= m.re[i * m.n + j] * x[j];
            row += Math.abs(m.re[i * m.n + j]);
          }
          res = Math.max(res, Math.abs(r));
          normA = Math.max(normA, row);
        }
        const normX = Math.max(...Array.from(x, Math.abs));
        expect(res / (normA * normX + Math.max(...b))).toBeLessThan(1e-14);
        // Forward error ≲ condition number × backward error: 1e-10 relative wherever κ∞(A) < 1e5.
        const kappa = normA * Math.max(...(inv(matrix(A)).toArray() as number[][]).map((r) => r.reduce((t, v) => t + Math.abs(v), 0)));
        expect(maxNormRelativeError(x, ref.map((r) => r[0]))).toBeLessThan(Math.max(1e-10, 1e-15 * kappa));
      }),
      { numRuns: 100, seed: 14 },
    );
  });

  it('rows scaled by 10^±12 give the unscaled solution (equilibration; relative 1e-10), forward and transposed', () => {
    const scaled = fc.tuple(circuitMatrix(), fc.array(fc.integer({ min: -12, max: 12 }), { minLength: 34, maxLength: 34 }));
    fc.assert(
      fc.property(scaled, ([m, exps]) => {
        const rowScale = Float64Array.from({ length: m.n }, (_, i) => 10 ** exps[i]);
        const b = rhs(m.n, 9);
        const A = Array.from({ length: m.n }, (_, i) => Array.from(m.re.subarray(i * m.n, (i + 1) * m.n)));
        // The reference solves the well-scaled system: row scaling does not change x.
        const ref = (lusolve(matrix(A), Array.from(b, (v) => [v])) as MathMatrix).toArray() as number[][];
        for (const kind of ['sparse', 'dense'] as const) {
          expect(maxNormRelativeError(realSolve(m, kind, b, false, rowScale), ref.map((r) => r[0]))).toBeLessThan(1e-10);
        }
        // (D·A)ᵀ·y = b ⇔ Aᵀ·(D·y) = b: the transposed solution comes back divided by the scale.
        const refT = (lusolve(transpose(matrix(A)), Array.from(b, (v) => [v])) as MathMatrix).toArray() as number[][];
        const yT = realSolve(m, 'sparse', b, true, rowScale).map((v, i) => v * rowScale[i]);
        expect(maxNormRelativeError(yT, refT.map((r) => r[0]))).toBeLessThan(1e-10);
      }),
      { numRuns: 100, seed: 15 },
    );
  });

  it('a degraded pivot makes the refactorisation choose a new pivot order, and the result is still right', () => {
    // [[4, 1, 0], [1, 3, 1], [0, 1, 2]] pivots on its diagonal; then a(0,0) drops to 1e-9, far
    // under REPIVOT_TOLERANCE of the 1 below it: the old order would divide by it.
    const n = 3;
    const a = Float64Array.of(4, 1, 0, 1, 3, 1, 0, 1, 2);
    const p = SparsePattern.fromDense(n, a);
    const lu = new SparseRealLu(p, symbolicFor(p));
    expect(lu.factor(p.gather(a))).toBe(-1);
    const before = lu.fullFactorizations;
    a[0] = 1e-9;
    expect(lu.factor(p.gather(a))).toBe(-1);
    expect(lu.fullFactorizations).toBe(before + 1);
    const x = Float64Array.of(1, 2, 3);
    lu.solve(x);
    const ref = (lusolve(matrix([[1e-9, 1, 0], [1, 3, 1], [0, 1, 2]]), [[1], [2], [3]]) as MathMatrix).toArray() as number[][];
    expect(maxNormRelativeError(x, ref.map((r) => r[0]))).toBeLessThan(1e-12);
    // A value change that keeps every pivot healthy is only refactored.
    a[4] = 3.5;
    expect(lu.factor(p.gather(a))).toBe(-1);
    expect(lu.fullFactorizations).toBe(before + 1);
  });

  it('on random matrices, refactoring after zeroing a diagonal either keeps or renews the order and matches the dense LU (relative 1e-10)', () => {
    fc.assert(
      fc.property(circuitMatrix(), fc.nat(), (m, pick) => {
        const p = patternOf(m);
        const lu = new SparseRealLu(p, symbolicFor(p));
        expect(lu.factor(p.gather(m.re))).toBe(-1);
        const k = pick % m.n;
        const changed = Float64Array.from(m.re);
        changed[k * m.n + k] = 0;
        // A node keeps a path to ground through its neighbours, so the matrix stays regular
        // unless the node had no neighbour: then both LUs agree it is singular.
        const dense = createRealSolver(p, 'dense');
        const denseOk = dense.factor(p.gather(changed)) < 0;
        const sparseOk = lu.factor(p.gather(changed)) < 0;
        if (!denseOk || !sparseOk) return;
        const b = rhs(m.n, pick);
        const x = Float64Array.from(b);
        const y = Float64Array.from(b);
        lu.solve(x);
        dense.solve(y);
        expect(maxNormRelativeError(x, y)).toBeLessThan(1e-10);
      }),
      { numRuns: 100, seed: 16 },
    );
  });

  it('tells a structurally singular column (no entry can pivot) from a numerically singular one', () => {
    // Column 1 is empty: structural.
    const a = Float64Array.of(1, 0, 0, 0, 0, 0, 0, 0, 1);
    const p = SparsePattern.fromCoordinates(3, [0, 2], [0, 2], 2, false);
    const lu = new SparseRealLu(p, symbolicFor(p));
    expect(lu.factor(p.gather(a))).toBe(1);
    expect(lu.failure).toEqual({ column: 1, structural: true });
    // Two equal conductances between two nodes and nothing to ground: g − g cancels exactly.
    const b = Float64Array.of(2, -2, -2, 2);
    const q = SparsePattern.fromDense(2, b);
    const lu2 = new SparseRealLu(q, symbolicFor(q));
    expect(lu2.factor(q.gather(b))).toBeGreaterThanOrEqual(0);
    expect(lu2.failure?.structural).toBe(false);
    // Relative, not absolute: [[1, 1], [1, 1 + 2⁻⁵⁰]] leaves a last pivot of 2⁻⁵⁰ ≈ 9e-16 of its
    // column (condition number ≈ 4.5e15): numerically singular, although far above any absolute
    // floor; with 2⁻⁴⁰ it is regular (pivot ≈ 9e-13 of the column, above SINGULAR_RELATIVE = 2⁻⁴⁶).
    const near = (e: number) => Float64Array.of(1, 1, 1, 1 + 2 ** -e);
    const lu4 = new SparseRealLu(q, symbolicFor(q));
    expect(lu4.factor(q.gather(near(50)))).toBeGreaterThanOrEqual(0);
    expect(lu4.failure?.structural).toBe(false);
    expect(lu4.factor(q.gather(near(40)))).toBe(-1);
    // While a tiny but honest matrix (all of it at 1e-200) is regular.
    const tiny = Float64Array.of(2e-200, -1e-200, -1e-200, 2e-200);
    const lu3 = new SparseRealLu(q, symbolicFor(q));
    expect(lu3.factor(q.gather(tiny))).toBe(-1);
    const x = Float64Array.of(1e-200, 0);
    lu3.solve(x);
    expect(maxNormRelativeError(x, [2 / 3, 1 / 3])).toBeLessThan(1e-14);
  });

  it('reports NaN entries as a failed factorisation instead of spreading them', () => {
    const a = Float64Array.of(1, NaN, 0, 1);
    const p = SparsePattern.fromDense(2, Float64Array.of(1, 1, 0, 1));
    expect(new SparseRealLu(p, symbolicFor(p)).factor(p.gather(a))).toBeGreaterThanOrEqual(0);
  });
});

describe('sparse complex LU', () => {
  const complexSolve = (m: TestMatrix, kind: 'dense' | 'sparse', b: Float64Array, transposed: boolean, rowScale?: Float64Array) => {
    const p = patternOf(m);
    const sc = (v: number, k: number) => v * (rowScale?.[Math.floor(k / m.n)] ?? 1);
    const solver = createComplexSolver(p, kind);
    expect(solver.factor(p.gather(Float64Array.from(m.re, sc)), p.gather(Float64Array.from(m.im, sc)))).toBe(-1);
    const xr = Float64Array.from(b, (v, i) => (transposed ? v : v * (rowScale?.[i] ?? 1)));
    const xi = new Float64Array(m.n);
    if (transposed) solver.solveTransposed(xr, xi);
    else solver.solve(xr, xi);
    return [...xr, ...xi];
  };
  const reference = (A: Complex[][], b: Float64Array, transposed: boolean) => {
    const M = transposed ? transpose(matrix(A)) : matrix(A);
    const r = fromMathColumn(lusolve(M, Array.from(b, (v) => [complex(v, 0)])) as MathMatrix);
    return [...r.re, ...r.im];
  };

  it('solves random complex circuit-like systems as the dense LU and mathjs lusolve do, forward and transposed (relative 1e-10)', () => {
    fc.assert(
      fc.property(circuitMatrix(), fc.boolean(), (m, transposed) => {
        const b = rhs(m.n, 1);
        const ours = complexSolve(m, 'sparse', b, transposed);
        expect(maxNormRelativeError(ours, complexSolve(m, 'dense', b, transposed))).toBeLessThan(1e-10);
        expect(maxNormRelativeError(ours, reference(mathComplex(m), b, transposed))).toBeLessThan(1e-10);
      }),
      { numRuns: 150, seed: 21 },
    );
  });

  it('solves as mathjs sparse slu does on complex matrices (relative 1e-10)', () => {
    fc.assert(
      fc.property(circuitMatrix(), (m) => {
        const b = rhs(m.n, 2);
        const ref = fromMathColumn(lusolve(slu(sparse(mathComplex(m)), 1, 1), Array.from(b, (v) => [complex(v, 0)])) as MathMatrix);
        expect(maxNormRelativeError(complexSolve(m, 'sparse', b, false), [...ref.re, ...ref.im])).toBeLessThan(1e-10);
      }),
      { numRuns: 80, seed: 22 },
    );
  });

  it('rows scaled by 10^±12 give the unscaled solution (relative 1e-10)', () => {
    const scaled = fc.tuple(circuitMatrix(), fc.array(fc.integer({ min: -12, max: 12 }), { minLength: 34, maxLength: 34 }));
    fc.assert(
      fc.property(scaled, ([m, exps]) => {
        const rowScale = Float64Array.from({ length: m.n }, (_, i) => 10 ** exps[i]);
        const b = rhs(m.n, 4);
        expect(maxNormRelativeError(complexSolve(m, 'sparse', b, false, rowScale), reference(mathComplex(m), b, false))).toBeLessThan(1e-10);
      }),
      { numRuns: 80, seed: 23 },
    );
  });

  it('a frequency change that degrades a pivot renews the order; other changes only refactor', () => {
    // [[1 + jω, 1], [1, 2]]: at ω = 0 the diagonal pivots; the real part then drops away and
    // at tiny ω the (0,0) entry is 1e-9·j, far under REPIVOT_TOLERANCE of the 1 below it.
    const p = SparsePattern.fromDense(2, Float64Array.of(1, 1, 1, 1));
    const lu = new SparseComplexLu(p, symbolicFor(p));
    const re = p.gather(Float64Array.of(1, 1, 1, 2));
    expect(lu.factor(re, new Float64Array(4))).toBe(-1);
    expect(lu.factor(re, p.gather(Float64Array.of(0.5, 0, 0, 0)))).toBe(-1);
    expect(lu.fullFactorizations).toBe(1);
    const re2 = p.gather(Float64Array.of(0, 1, 1, 2));
    expect(lu.factor(re2, p.gather(Float64Array.of(1e-9, 0, 0, 0)))).toBe(-1);
    expect(lu.fullFactorizations).toBe(2);
    const xr = Float64Array.of(1, 0);
    const xi = Float64Array.of(0, 0);
    lu.solve(xr, xi);
    const ref = fromMathColumn(lusolve(matrix([[complex(0, 1e-9), 1], [1, 2]]), [[1], [0]]) as MathMatrix);
    expect(maxNormRelativeError([...xr, ...xi], [...ref.re, ...ref.im])).toBeLessThan(1e-12);
  });
});

describe('solver choice and the symbolic cache', () => {
  it('uses the dense LU below the crossover and the sparse one from it on', () => {
    const small = SparsePattern.fromCoordinates(DENSE_CROSSOVER - 1, [], [], 0);
    const large = SparsePattern.fromCoordinates(DENSE_CROSSOVER, [], [], 0);
    expect(createRealSolver(small).kind).toBe('dense');
    expect(createRealSolver(large).kind).toBe('sparse');
    expect(createComplexSolver(small).kind).toBe('dense');
    expect(createComplexSolver(large).kind).toBe('sparse');
  });

  it('analyses a pattern once: an equal pattern built again shares its order, and a new LU starts from the last pivot order', () => {
    clearSymbolicCache();
    const a = Float64Array.of(4, 1, 0, 1, 3, 1, 0, 1, 2);
    const p1 = SparsePattern.fromDense(3, a);
    const p2 = SparsePattern.fromDense(3, a);
    expect(p2).not.toBe(p1);
    expect(symbolicFor(p2)).toBe(symbolicFor(p1));
    const first = new SparseRealLu(p1, symbolicFor(p1));
    first.factor(p1.gather(a));
    expect(first.fullFactorizations).toBe(1);
    const second = new SparseRealLu(p2, symbolicFor(p2));
    expect(second.factor(p2.gather(a))).toBe(-1);
    expect(second.fullFactorizations).toBe(0);
  });
});
