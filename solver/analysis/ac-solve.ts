/**
 * The AC solver: (G + j·2πf·C)·x = b at one frequency, one complex LU per frequency and one
 * back-substitution per excitation, all in storage allocated once per system.
 *
 * The matrix is formed on the circuit's sparse pattern (O(nonzeros) per frequency) and factored
 * by numeric/linear-solver.ts: dense for tiny circuits, else the sparse LU, which refactors each
 * new frequency on the pivot order of the last one (choosing pivots again only when one has
 * degraded). The transposed solve for noise and sensitivity uses the same factors.
 */
import { GROUND } from '../circuit/types';
import { createComplexSolver, type ComplexLinearSolver, type SolverKind } from '../numeric/linear-solver';
import type { SparsePattern } from '../numeric/sparse-pattern';
import type { AcSolution, AcSolver, AdjointSolution, Excitation, LinearSystem, Phasor } from './engine-api';
import { sparseOf } from './small-signal';

export { logSweep, unwrapPhaseDeg } from './frequency';

const ZERO: Phasor = Object.freeze({ re: 0, im: 0 }) as Phasor;

/**
 * Complex LUs handed back by released solvers, by pattern (the circuit shape's, see
 * circuit-shape.ts): building one (its structure and arrays) was a tenth of a mismatch run.
 */
const idleLus = new WeakMap<SparsePattern, ComplexLinearSolver[]>();
const IDLE_LUS_PER_PATTERN = 4;

/**
 * Creates a solver over `system`; the system's matrices are read, never modified. `kind` forces
 * the dense or the sparse LU (tests and the bench); by default it is chosen by size.
 */
export function createAcSolver(system: LinearSystem, kind: SolverKind = 'auto'): AcSolver {
  const n = system.size;
  const { pattern, g, c } = sparseOf(system);
  const lu = (kind === 'auto' ? idleLus.get(pattern)?.pop() : undefined) ?? createComplexSolver(pattern, kind);
  let released = false;
  const re = new Float64Array(pattern.nnz);
  const im = new Float64Array(pattern.nnz);

  /** The frequency whose factors the LU holds (NaN: none yet). */
  let factoredAt = NaN;
  let singular = false;
  const factor = (freqHz: number) => {
    if (released) throw new Error('an AC solver was used after it was released');
    if (freqHz === factoredAt) return;
    const omega = Number.isFinite(freqHz) ? 2 * Math.PI * freqHz : 0;
    re.set(g);
    for (let k = 0; k < c.length; k++) im[k] = omega * c[k];
    singular = lu.factor(re, im) >= 0;
    factoredAt = freqHz;
  };

  return {
    release(): void {
      if (released || kind !== 'auto') return;
      released = true;
      let pool = idleLus.get(pattern);
      if (!pool) idleLus.set(pattern, (pool = []));
      if (pool.length < IDLE_LUS_PER_PATTERN) pool.push(lu);
    },
    solveTransposed(freqHz: number, rhsRe: Float64Array, rhsIm: Float64Array): AdjointSolution {
      factor(freqHz);
      const yr = Float64Array.from(rhsRe);
      const yi = Float64Array.from(rhsIm);
      let bad = singular;
      if (!bad) {
        lu.solveTransposed(yr, yi);
        for (let i = 0; i < n && !bad; i++) if (!Number.isFinite(yr[i]) || !Number.isFinite(yi[i])) bad = true;
      }
      if (bad) {
        yr.fill(0);
        yi.fill(0);
      }
      return { re: yr, im: yi, singular: bad };
    },
    solve(freqHz: number, excitations: Excitation[]): AcSolution[] {
      factor(freqHz);
      const out: AcSolution[] = [];
      for (const ex of excitations) {
        const xr = new Float64Array(n);
        const xi = new Float64Array(n);
        let bad = singular;
        if (!bad) {
          fillExcitation(system, ex, xr, xi);
          lu.solve(xr, xi);
          // A nearly singular matrix can still overflow: never hand out NaN or Infinity.
          for (let i = 0; i < n && !bad; i++) if (!Number.isFinite(xr[i]) || !Number.isFinite(xi[i])) bad = true;
          if (bad) {
            xr.fill(0);
            xi.fill(0);
          }
        }
        out.push(makeSolution(system, xr, xi, bad));
      }
      return out;
    },
  };
}

/** Writes an excitation's right-hand side into (br, bi). */
export function fillExcitation(system: LinearSystem, ex: Excitation, br: Float64Array, bi: Float64Array): void {
  if (ex.sources) {
    for (const [name, ph] of ex.sources) {
      const s = system.sources.get(name);
      if (!s || !Number.isFinite(ph.re) || !Number.isFinite(ph.im)) continue;
      if (s.kind === 'vsrc') {
        br[s.row] += ph.re;
        bi[s.row] += ph.im;
      } else {
        // The source's current leaves `from` and enters `to`.
        if (s.from >= 0) {
          br[s.from] -= ph.re;
          bi[s.from] -= ph.im;
        }
        if (s.to >= 0) {
          br[s.to] += ph.re;
          bi[s.to] += ph.im;
        }
      }
    }
  }
  if (ex.injections) {
    for (const [node, ph] of ex.injections) {
      const r = system.nodeIndex.get(node);
      if (r === undefined || !Number.isFinite(ph.re) || !Number.isFinite(ph.im)) continue;
      br[r] += ph.re;
      bi[r] += ph.im;
    }
  }
}

function makeSolution(system: LinearSystem, xr: Float64Array, xi: Float64Array, singular: boolean): AcSolution {
  return {
    singular,
    v(node: string): Phasor {
      if (node === GROUND) return ZERO;
      const r = system.nodeIndex.get(node);
      return r === undefined ? ZERO : { re: xr[r], im: xi[r] };
    },
    branch(name: string): Phasor {
      const r = system.branchIndex.get(name);
      return r === undefined ? ZERO : { re: xr[r], im: xi[r] };
    },
  };
}

/** Solves one excitation at every frequency of `freqs` (a convenience over {@link createAcSolver}). */
export function acSweep(system: LinearSystem, freqs: readonly number[], excitation: Excitation): AcSolution[] {
  const solver = createAcSolver(system);
  return freqs.map((f) => solver.solve(f, [excitation])[0]);
}

/** The engine flags a solve whose matrix could not be factored (an extra member beyond the contract). */
export function isSingular(solution: object): boolean {
  return (solution as { singular?: boolean }).singular === true;
}
