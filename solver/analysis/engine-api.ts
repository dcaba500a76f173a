/**
 * The contract between the numerical engine (MNA, devices, DC, AC) and the layers above it
 * (ports, measures, checks, the CLI). Types only; implemented in this folder.
 *
 * Functions implementing it (one file per algorithm):
 *   operating-point.ts  solveOperatingPoint(circuit): OperatingPoint | OpFailure
 *   small-signal.ts     linearize(circuit, op): LinearSystem
 *   ac-solve.ts         createAcSolver(system): AcSolver
 *   dc-sweep.ts         dcSweep(circuit, source, values, start?): DcSweepResult
 */
import type { Diagnostic } from '../circuit/diagnostic';
import type { Circuit } from '../circuit/types';
import type { OpResult } from '../circuit/result';
import type { Phasor } from '../numeric/complex';
import type { SparsePattern } from '../numeric/sparse-pattern';

/**
 * Most MNA unknowns a circuit may have: the elaborator refuses a larger circuit before any
 * matrix is allocated. Declared with the circuit types (elaboration comes before the engine);
 * an engine that holds more raises it there.
 */
export { MAX_UNKNOWNS } from '../circuit/capacity';

/** A converged DC operating point. */
export interface OperatingPoint {
  circuit: Circuit;
  /** The raw MNA solution vector (node voltages then branch currents), for warm starts. */
  x: Float64Array;
  /** Index of each node's voltage in `x` (ground absent). */
  nodeIndex: Map<string, number>;
  /** Index of each branch current (voltage sources, inductors, vcvs) in `x`. */
  branchIndex: Map<string, number>;
  /** The §5 `op` member, ready to print. */
  report: OpResult;
  /** Region warnings (saturated bipolar, MOS triode/cut-off …), one per device. */
  warnings: Diagnostic[];
  /** What it took: 'newton' | 'gmin-stepping' | 'source-stepping', and iterations. */
  method: string;
  iterations: number;
}

export interface OpFailure {
  failed: true;
  /** Errors naming the worst nodes and what was tried. */
  errors: Diagnostic[];
}

/**
 * The linearised circuit at an operating point: (G + sC)·x = b(s) over the same unknowns as the
 * DC system. Independent sources contribute nothing until an excitation is given.
 *
 * The engine's own storage is `sparse` (values of G and C on the circuit's pattern); `G` and `C`
 * are dense row-major views of the same matrices, built on first access (by `linearize`'s
 * systems) and kept — O(size²) memory, so read them only where a dense matrix is really needed
 * (e.g. the generalised eigenvalues of the poles analysis). A system written by hand may give
 * only `G` and `C`: the AC solver then derives the pattern from their nonzeros.
 */
export interface LinearSystem {
  size: number;
  nodeIndex: Map<string, number>;
  branchIndex: Map<string, number>;
  /** Row-major size×size conductance matrix (dense view). */
  readonly G: Float64Array;
  /** Row-major size×size capacitance (and inductance) matrix (dense view). */
  readonly C: Float64Array;
  /** G and C as values on one sparse pattern (CSC), the AC solver's input. */
  sparse?: SparseSystem;
  /** Names of independent sources and how to excite each: voltage sources by their branch row. */
  sources: Map<string, { kind: 'vsrc'; row: number } | { kind: 'isrc'; from: number; to: number }>;
}

/** A linear system's matrices on its circuit's sparsity pattern: one value per slot of `pattern`. */
export interface SparseSystem {
  pattern: SparsePattern;
  g: Float64Array;
  c: Float64Array;
}

/** Complex phasor as a pair, to avoid allocation in the hot loop (declared in numeric/complex.ts). */
export type { Phasor };

/** What drives the AC system in one solve. */
export interface Excitation {
  /** Independent source name → phasor (volts for vsrc, amperes for isrc). Unlisted sources are zero. */
  sources?: Map<string, Phasor>;
  /** Test currents injected INTO a node from ground (for zout): node name → phasor. */
  injections?: Map<string, Phasor>;
}

/** Solution of one AC solve. */
export interface AcSolution {
  /** Node voltage phasor (0 for `gnd`). */
  v(node: string): Phasor;
  /** Branch current phasor of a voltage source / inductor / vcvs, p→n through it. */
  branch(name: string): Phasor;
  /**
   * True when the system was singular at this frequency (no finite solution): every phasor is
   * then reported as 0 and the caller should report the point as an error. (Engine extension.)
   */
  singular?: boolean;
}

/**
 * Solves the linear system at one frequency for one or more excitations, reusing storage:
 * one factorisation per frequency, one back-substitution per excitation.
 */
export interface AcSolver {
  solve(freqHz: number, excitations: Excitation[]): AcSolution[];
  /**
   * Solves the transposed (adjoint) system (G + j·2πf·C)ᵀ·y = rhs at one frequency — the plain
   * transpose, not the conjugate — reusing the factors when `freqHz` is the frequency last
   * factored (by `solve` or by this). `rhsRe`/`rhsIm` (length `size`, indexed like the unknowns)
   * are read, not modified. With rhs = e_k, y[j] is the transfer from a unit current injected at
   * row j to unknown k: every noise contributor of a node from one solve.
   */
  solveTransposed(freqHz: number, rhsRe: Float64Array, rhsIm: Float64Array): AdjointSolution;
  /**
   * Hands the solver's LU back for the next solver of the same pattern (a mismatch analysis or a
   * sweep makes one per run). Solutions already returned stay valid; the solver itself throws if
   * used again. Calling it is optional: a solver never released is simply collected.
   */
  release(): void;
}

/** Solution of one transposed solve: split complex vectors over the unknowns. */
export interface AdjointSolution {
  re: Float64Array;
  im: Float64Array;
  /** The matrix could not be factored at this frequency (the vectors are then 0). */
  singular: boolean;
}

export interface DcSweepResult {
  x: number[];
  /** One report per converged point (same length as x). */
  points: OpResult[];
  errors: Diagnostic[];
}
