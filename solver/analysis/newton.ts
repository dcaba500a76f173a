/**
 * Newton–Raphson on the MNA system: the inner loop every DC strategy (plain Newton, gmin
 * stepping, source stepping, warm-started sweeps) runs.
 *
 * Each iteration stamps the linear parts (precomputed once per attempt), then the devices'
 * companion models at the current iterate, checks the nonlinear residual, and solves for the
 * next iterate. Convergence needs all three: the last update within rel_tol/abs_tol, no junction
 * step limited in this evaluation, and the residual of every row within rel_tol of the currents
 * flowing in it.
 *
 * The matrix lives on the circuit's sparse pattern (./mna.ts circuitPattern, kept per shape by
 * ./circuit-shape.ts): stamping, the
 * residual and the copy of the linear part are O(nonzeros), and the real solver
 * (numeric/linear-solver.ts: dense for tiny circuits, else the sparse LU refactoring on its last
 * pivot order) reuses the pattern's symbolic analysis across iterations, attempts and sweeps.
 *
 * A Newton matrix can be numerically singular at an iterate of a well-posed circuit: a long
 * chain of gain stages linearised at the cold start (every junction conducting) amplifies ten-
 * or a hundredfold per stage, so 300 stages make an inverse of order 10³⁰⁰ or more, which no
 * floating-point step can represent (and a junction on its exponential's far continuation puts
 * 1e18 S beside a kilohm). When the circuit's topology is sound, such an iteration takes a damped step
 * instead (Levenberg–Marquardt: K. Levenberg 1944, D. W. Marquardt 1963): the smallest shunt
 * from DAMPING_LADDER that makes the matrix factor, added to every node row in proportion to
 * the row's largest entry, with the step written as a correction to the present iterate.
 * Convergence is still judged on the undamped equations.
 */
import { DiagnosticBag } from '../circuit/diagnostic';
import { checkTopology } from '../circuit/topology';
import type { Circuit } from '../circuit/types';
import { createRealSolver, type RealLinearSolver, type SolverKind } from '../numeric/linear-solver';
import type { SparsePattern } from '../numeric/sparse-pattern';
import { circuitShape } from './circuit-shape';
import { PatternValues, stampLinear, type MnaLayout } from './mna';
import { DeviceSet } from './nonlinear-devices';

/** Absolute residual floor in amperes, under which a row counts as balanced whatever its scale. */
export const ABS_CURRENT_TOL = 1e-15;

/**
 * Damping factors tried in turn when a Newton matrix is numerically singular: each node row gets
 * a shunt of λ times its largest entry. The smallest that factors gives the step closest to
 * Newton's; up to 1 (the shunt as large as the row) — a chain of gain stages needs about 0.1.
 */
export const DAMPING_LADDER: readonly number[] = [1e-9, 1e-6, 1e-3, 1e-2, 1e-1, 1];

/** The reusable state of DC solves of one circuit. */
export class NewtonWorkspace {
  readonly n: number;
  readonly devices: DeviceSet;
  /** The circuit's sparsity pattern; the matrices below are values on its slots. */
  readonly pattern: SparsePattern;
  /** Linear part (G values and source vector) of the current attempt. */
  readonly linValues: Float64Array;
  readonly bLin: Float64Array;
  /** The Newton matrix of the current iterate (linear part plus device stamps). */
  readonly values: Float64Array;
  readonly b: Float64Array;
  readonly solver: RealLinearSolver;
  readonly residual: Float64Array;
  readonly scale: Float64Array;
  readonly update: Float64Array;
  /** Slot of each diagonal entry, for damping. */
  readonly diagonal: Int32Array;
  /** Largest entry of each row and the undamped diagonal, while a step is damped. */
  private readonly rowMax: Float64Array;
  private readonly savedDiagonal: Float64Array;
  /** The right-hand side of the step, kept for a damped retry. */
  private readonly bStep: Float64Array;
  /** After {@link step}: as {@link NewtonOutcome.dampedAt}. */
  dampedAt = -1;
  private topology: boolean | undefined;

  readonly layout: MnaLayout;

  private current: Circuit;

  constructor(circuit: Circuit, solverKind: SolverKind = 'auto') {
    this.current = circuit;
    const { layout, pattern } = circuitShape(circuit);
    const n = layout.size;
    this.layout = layout;
    this.n = n;
    this.devices = new DeviceSet(circuit, layout);
    this.pattern = pattern;
    this.devices.bind(this.pattern);
    this.linValues = new Float64Array(this.pattern.nnz);
    this.bLin = new Float64Array(n);
    this.values = new Float64Array(this.pattern.nnz);
    this.b = new Float64Array(n);
    this.solver = createRealSolver(this.pattern, solverKind);
    this.residual = new Float64Array(n);
    this.scale = new Float64Array(n);
    this.update = new Float64Array(n);
    this.diagonal = Int32Array.from({ length: n }, (_, i) => this.pattern.slot(i, i));
    this.rowMax = new Float64Array(n);
    this.savedDiagonal = new Float64Array(n);
    this.bStep = new Float64Array(n);
  }

  /** The circuit solved (see {@link rebind}). */
  get circuit(): Circuit {
    return this.current;
  }

  /**
   * Points the workspace at `circuit`, of the same shape (same parts in the same order on the
   * same nodes; values, options and temperature may differ): the devices take its parameters,
   * the arrays, the pattern and the LU (with its last pivot order) are kept.
   */
  rebind(circuit: Circuit): void {
    this.current = circuit;
    this.devices.rebind(circuit);
    this.topology = undefined;
  }

  /**
   * True when the circuit passes the topology checks (circuit/topology.ts): every node has a DC
   * path to ground and no loop of voltage sources. A singular matrix of such a circuit is a
   * numerical failure, never a topological one. Computed once.
   */
  get topologyOk(): boolean {
    if (this.topology === undefined) {
      const bag = new DiagnosticBag();
      checkTopology(this.circuit.parts, bag);
      this.topology = !bag.hasErrors;
    }
    return this.topology;
  }

  /** Rebuilds the linear part for a source scale (source stepping) and a gmin (gmin stepping). */
  prepare(sourceScale: number, gmin: number): void {
    this.linValues.fill(0);
    this.bLin.fill(0);
    stampLinear(this.circuit, this.layout, new PatternValues(this.pattern, this.linValues), null, this.bLin, { sourceScale, gmin });
  }

  /**
   * Solves the Newton matrix in `values` for the next iterate, in place in `b`: undamped when it
   * factors and gives a finite step, else damped (see the file comment) when the topology is
   * sound. Returns −1 on success, the singular unknown, or {@link STEP_DIVERGED}.
   */
  step(x: Float64Array): number {
    const { values, solver, diagonal, rowMax, savedDiagonal, b, bStep, n } = this;
    bStep.set(b);
    this.dampedAt = -1;
    const first = solver.factor(values);
    if (first < 0) {
      solver.solve(b);
      if (allFinite(b, n)) return -1;
    }
    this.dampedAt = first >= 0 ? first : n;
    if (solver.failure?.structural || !this.topologyOk) return first >= 0 ? first : STEP_DIVERGED;
    const { colPtr, rowIdx } = this.pattern;
    const nodes = this.layout.voltageCount;
    rowMax.fill(0);
    for (let j = 0; j < n; j++) {
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        const a = Math.abs(values[p]);
        if (a > rowMax[rowIdx[p]]) rowMax[rowIdx[p]] = a;
      }
    }
    for (let i = 0; i < nodes; i++) savedDiagonal[i] = values[diagonal[i]];
    let outcome = first >= 0 ? first : STEP_DIVERGED;
    for (const lambda of DAMPING_LADDER) {
      for (let i = 0; i < nodes; i++) values[diagonal[i]] = savedDiagonal[i] + lambda * rowMax[i];
      if (solver.factor(values) >= 0) continue;
      b.set(bStep);
      for (let i = 0; i < nodes; i++) b[i] += lambda * rowMax[i] * x[i];
      solver.solve(b);
      if (allFinite(b, n)) {
        outcome = -1;
        break;
      }
    }
    for (let i = 0; i < nodes; i++) values[diagonal[i]] = savedDiagonal[i];
    return outcome;
  }
}

/** Idle workspaces by shape (the pattern is the shape's identity), for {@link borrowWorkspace}. */
const idle = new WeakMap<SparsePattern, NewtonWorkspace[]>();
/** Idle workspaces kept per shape: one per solve that may be open at once (a search inside a run). */
const IDLE_PER_SHAPE = 4;

/**
 * A workspace for `circuit`: an idle one of its shape rebound to it, else a new one. A sweep, a
 * mismatch analysis or a search solves one shape hundreds of times; building the workspace (its
 * devices, arrays and LU) was a fifth of a mismatch run and most of its garbage. Hand it back with
 * {@link releaseWorkspace} when the solve is done and nothing holds it (one not handed back is
 * simply collected).
 */
export function borrowWorkspace(circuit: Circuit): NewtonWorkspace {
  const pool = idle.get(circuitShape(circuit).pattern);
  const ws = pool?.pop();
  if (!ws) return new NewtonWorkspace(circuit);
  ws.rebind(circuit);
  return ws;
}

/** Hands a workspace from {@link borrowWorkspace} back for the next solve of its shape. */
export function releaseWorkspace(ws: NewtonWorkspace): void {
  let pool = idle.get(ws.pattern);
  if (!pool) idle.set(ws.pattern, (pool = []));
  if (pool.length < IDLE_PER_SHAPE && !pool.includes(ws)) pool.push(ws);
}

/** {@link NewtonWorkspace.step}'s answer when no step came out finite. */
export const STEP_DIVERGED = -2;

function allFinite(v: Float64Array, n: number): boolean {
  for (let i = 0; i < n; i++) if (!Number.isFinite(v[i])) return false;
  return true;
}

/** Outcome of one Newton attempt. */
export interface NewtonOutcome {
  converged: boolean;
  iterations: number;
  /** Unknown at which the matrix was singular, or -1. */
  singularRow: number;
  /** True when an iterate went non-finite. */
  diverged: boolean;
  /**
   * −1 when the last step was an undamped Newton step; else it was damped, and this is the
   * unknown at which the undamped matrix was numerically singular (or the count of unknowns when
   * that matrix factored but gave a non-finite step).
   */
  dampedAt?: number;
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
  const { n, values, b, residual, scale, update } = ws;
  const { colPtr, rowIdx } = ws.pattern;
  const { relTol, absTol } = ws.circuit.options;
  let updateSmall = false;
  for (let iter = 0; iter <= maxIter; iter++) {
    values.set(ws.linValues);
    b.set(ws.bLin);
    const limited = ws.devices.stamp(x, values, b, true);
    watch?.record();
    // Residual of the nonlinear equations at x (exact when nothing was limited), column by column.
    for (let i = 0; i < n; i++) {
      residual[i] = -b[i];
      scale[i] = Math.abs(b[i]);
    }
    for (let j = 0; j < n; j++) {
      const xj = x[j];
      if (xj === 0) continue;
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        const t = values[p] * xj;
        residual[rowIdx[p]] += t;
        scale[rowIdx[p]] += Math.abs(t);
      }
    }
    let balanced = true;
    for (let i = 0; i < n; i++) if (!(Math.abs(residual[i]) <= relTol * scale[i] + ABS_CURRENT_TOL)) balanced = false;
    if (updateSmall && balanced && !limited) return { converged: true, iterations: iter, singularRow: -1, diverged: false };
    if (iter === maxIter) break;

    const step = ws.step(x);
    if (step === STEP_DIVERGED) return { converged: false, iterations: iter, singularRow: -1, diverged: true, dampedAt: ws.dampedAt };
    if (step >= 0) return { converged: false, iterations: iter, singularRow: step, diverged: false };
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
  return { converged: false, iterations: maxIter, singularRow: -1, diverged: false, dampedAt: ws.dampedAt };
}
