/**
 * Newton–Raphson on the MNA system: the inner loop every DC strategy (plain Newton, gmin
 * stepping, source stepping, warm-started sweeps) runs.
 *
 * Each iteration stamps the linear parts (precomputed once per attempt), then the devices'
 * companion models at the current iterate, checks the nonlinear residual, and solves for the
 * next iterate with the dense real LU. Convergence needs all three: the last update within
 * rel_tol/abs_tol, no junction step limited in this evaluation, and the residual of every row
 * within rel_tol of the currents flowing in it.
 */
import type { Circuit } from '../circuit/types';
import { DenseRealLu } from '../numeric/dense-lu';
import { stampLinear, type MnaLayout } from './mna';
import { DeviceSet } from './nonlinear-devices';

/** Absolute residual floor in amperes, under which a row counts as balanced whatever its scale. */
export const ABS_CURRENT_TOL = 1e-15;

/** The reusable state of DC solves of one circuit. */
export class NewtonWorkspace {
  readonly n: number;
  readonly devices: DeviceSet;
  /** Linear part (G and source vector) of the current attempt. */
  readonly aLin: Float64Array;
  readonly bLin: Float64Array;
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly lu: DenseRealLu;
  readonly residual: Float64Array;
  readonly scale: Float64Array;
  readonly update: Float64Array;

  constructor(readonly circuit: Circuit, readonly layout: MnaLayout) {
    const n = layout.size;
    this.n = n;
    this.devices = new DeviceSet(circuit, layout);
    this.aLin = new Float64Array(n * n);
    this.bLin = new Float64Array(n);
    this.a = new Float64Array(n * n);
    this.b = new Float64Array(n);
    this.lu = new DenseRealLu(n);
    this.residual = new Float64Array(n);
    this.scale = new Float64Array(n);
    this.update = new Float64Array(n);
  }

  /** Rebuilds the linear part for a source scale (source stepping) and a gmin (gmin stepping). */
  prepare(sourceScale: number, gmin: number): void {
    this.aLin.fill(0);
    this.bLin.fill(0);
    stampLinear(this.circuit, this.layout, this.aLin, null, this.bLin, { sourceScale, gmin });
  }
}

/** Outcome of one Newton attempt. */
export interface NewtonOutcome {
  converged: boolean;
  iterations: number;
  /** Row at which the matrix was singular, or -1. */
  singularRow: number;
  /** True when an iterate went non-finite. */
  diverged: boolean;
}

/** Something that watches each iteration's device state (to name what failed to settle). */
export interface IterationWatch {
  record(): void;
}

/**
 * Runs Newton from `x` (updated in place; on success it holds the solution) with the linear part
 * last {@link NewtonWorkspace.prepare}d. Never throws; a non-finite iterate ends the attempt.
 * `watch`, when given, is told after the devices are linearised in each iteration.
 */
export function runNewton(ws: NewtonWorkspace, x: Float64Array, maxIter: number, watch?: IterationWatch): NewtonOutcome {
  const { n, a, b, residual, scale, update, lu } = ws;
  const { relTol, absTol } = ws.circuit.options;
  let updateSmall = false;
  for (let iter = 0; iter <= maxIter; iter++) {
    a.set(ws.aLin);
    b.set(ws.bLin);
    const limited = ws.devices.stamp(x, a, b, true);
    watch?.record();
    // Residual of the nonlinear equations at x (exact when nothing was limited).
    let balanced = true;
    for (let i = 0; i < n; i++) {
      const ri = i * n;
      let r = -b[i];
      let s = Math.abs(b[i]);
      for (let j = 0; j < n; j++) {
        const t = a[ri + j] * x[j];
        r += t;
        s += Math.abs(t);
      }
      residual[i] = r;
      scale[i] = s;
      if (!(Math.abs(r) <= relTol * s + ABS_CURRENT_TOL)) balanced = false;
    }
    if (updateSmall && balanced && !limited) return { converged: true, iterations: iter, singularRow: -1, diverged: false };
    if (iter === maxIter) break;

    const singular = lu.factorInPlace(a);
    if (singular >= 0) return { converged: false, iterations: iter, singularRow: singular, diverged: false };
    lu.solve(b);
    updateSmall = true;
    for (let i = 0; i < n; i++) {
      const next = b[i];
      if (!Number.isFinite(next)) return { converged: false, iterations: iter, singularRow: -1, diverged: true };
      const d = next - x[i];
      update[i] = d;
      if (Math.abs(d) > relTol * Math.max(Math.abs(next), Math.abs(x[i])) + absTol) updateSmall = false;
      x[i] = next;
    }
  }
  return { converged: false, iterations: maxIter, singularRow: -1, diverged: false };
}
