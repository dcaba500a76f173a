/**
 * Poles and zeros of the small-signal circuit, from its LinearSystem (G + s·C over the MNA
 * unknowns, every independent source unexcited: voltage sources shorted by their branch rows,
 * current sources open).
 *
 * Poles: the finite s with det(G + s·C) = 0 (pencil-eigenvalues.ts, shift 0: G is the Jacobian
 * the operating point was solved with, so it is invertible).
 *
 * Zeros of a transfer H(s) = cᵀ·x with (G + s·C)·x = b (b the excitation, c the output
 * selector): the finite s at which the bordered matrix [[G + s·C, b], [cᵀ, 0]] is singular
 * (where G + s·C is invertible that is exactly H(s) = 0). Its pencil has E = [[C, 0], [0, 0]].
 * H(0) = 0 is common (a coupling capacitor), so the bordered matrix is often singular at s = 0:
 * it is solved with a real shift σ of the circuit's own rate scale times an irrational factor,
 * and the next factor of a short list when that one happens to sit on a zero. A zero equal to a
 * pole within CANCEL_RELATIVE is a mode the transfer does not see (a common-mode pole in a
 * differential gain): it cancels and is not reported as a zero. The poles stay, being the circuit's.
 */
import type { PortsRequest } from '../circuit/analyses';
import { GROUND } from '../circuit/types';
import type { LinearSystem } from './engine-api';
import { pencilEigenvalues } from './pencil-eigenvalues';
import type { Phasor } from '../numeric/complex';

/**
 * Most MNA unknowns the poles analysis takes on: its dense LU and eigenvalue work grow as n³
 * (about 1 s at this size on the bench machine; `npm run bench` prints the times).
 */
export const MAX_POLES_UNKNOWNS = 400;
/** A zero within this relative distance of a pole cancels it. */
export const CANCEL_RELATIVE = 1e-6;

/**
 * Zeros beyond this many times the fastest pole are left out: a near-infinite zero of the bordered
 * pencil comes back from the eigenvalue routine as a ± pair in the petahertz, which no first-order
 * model speaks for and which would only puzzle the reader. (A zero 10⁴ times above every pole
 * moves the response by less than 0.006° of phase anywhere below the fastest pole.)
 */
export const ZERO_BEYOND_FASTEST_POLE = 1e4;
/** A zero closer to the origin than this fraction of the shift's rate scale is the origin. */
export const ORIGIN_RELATIVE = 1e-9;
/** Factors of the rate scale tried in turn as the zeros' shift (irrational, so no circuit sits on them by design). */
const SHIFT_FACTORS = [-0.6180339887498949, 0.7548776662466927, -1.3247179572447460, 2.2055694304005900];

/** An excitation and an output over the unknowns: the transfer whose zeros are asked for. */
export interface TransferVectors {
  /** Right-hand side of the unit excitation (length size). */
  b: Float64Array;
  /** Output selector: H = cᵀ·x (length size). */
  c: Float64Array;
}

export type PolesOutcome = { ok: true; poles: Phasor[] } | { ok: false };
export type ZerosOutcome = { ok: true; zeros: Phasor[]; cancelled: number } | { ok: false };

/** Poles in rad/s (complex s), unsorted; `ok: false` when G is singular. */
export function circuitPoles(system: LinearSystem): PolesOutcome {
  const outcome = pencilEigenvalues(system.G, system.C, system.size, 0);
  return outcome.singular ? { ok: false } : { ok: true, poles: outcome.values };
}

/**
 * Zeros in rad/s of the transfer (b, c), unsorted, with the ones equal to a pole cancelled;
 * `ok: false` when the bordered pencil is singular at every shift tried — the transfer is zero
 * at every frequency.
 */
export function transferZeros(system: LinearSystem, transfer: TransferVectors, poles: readonly Phasor[]): ZerosOutcome {
  const n = system.size;
  const N = n + 1;
  const A = new Float64Array(N * N);
  const E = new Float64Array(N * N);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      A[i * N + j] = system.G[i * n + j];
      E[i * N + j] = system.C[i * n + j];
    }
    A[i * N + n] = transfer.b[i];
    A[n * N + i] = transfer.c[i];
  }
  const scale = rateScale(system, poles);
  for (const factor of SHIFT_FACTORS) {
    const outcome = pencilEigenvalues(A, E, N, factor * scale);
    if (outcome.singular) continue;
    // s = σ + 1/μ carries an absolute rounding of order eps·|σ|: a zero at the origin comes back
    // as ±1e-15·|σ|, and is reported as the 0 it is.
    const snapped = outcome.values.map((z) => (Math.hypot(z.re, z.im) <= ORIGIN_RELATIVE * scale ? { re: 0, im: 0 } : z));
    let fastest = 0;
    for (const p of poles) fastest = Math.max(fastest, Math.hypot(p.re, p.im));
    const near = fastest > 0 ? snapped.filter((z) => Math.hypot(z.re, z.im) <= ZERO_BEYOND_FASTEST_POLE * fastest) : snapped;
    return cancelAgainst(near, poles);
  }
  return { ok: false };
}

/**
 * The circuit's own rate (rad/s) to size the shift: the slowest non-zero pole, so the shift sits
 * among the low-frequency poles and zeros where the precision matters; without poles, the ratio
 * of the total conductance to the total capacitance.
 */
function rateScale(system: LinearSystem, poles: readonly Phasor[]): number {
  let slowest = Infinity;
  for (const p of poles) {
    const m = Math.hypot(p.re, p.im);
    if (m > 0 && m < slowest) slowest = m;
  }
  if (Number.isFinite(slowest)) return slowest;
  let g = 0;
  let c = 0;
  for (let k = 0; k < system.G.length; k++) {
    g += Math.abs(system.G[k]);
    c += Math.abs(system.C[k]);
  }
  return c > 0 && g > 0 ? g / c : 1;
}

/** Zeros with each one that matches a distinct pole (within CANCEL_RELATIVE of its size) removed. */
function cancelAgainst(zeros: readonly Phasor[], poles: readonly Phasor[]): ZerosOutcome {
  const used = new Uint8Array(poles.length);
  const kept: Phasor[] = [];
  let cancelled = 0;
  for (const z of zeros) {
    const size = Math.hypot(z.re, z.im);
    let match = -1;
    for (let k = 0; k < poles.length; k++) {
      if (used[k]) continue;
      if (Math.hypot(z.re - poles[k].re, z.im - poles[k].im) <= CANCEL_RELATIVE * Math.max(size, Math.hypot(poles[k].re, poles[k].im))) {
        match = k;
        break;
      }
    }
    if (match >= 0) {
      used[match] = 1;
      cancelled++;
    } else kept.push(z);
  }
  return { ok: true, zeros: kept, cancelled };
}

/** Adds `value` of a source's excitation to b: a voltage source on its branch row, a current source out of `from` into `to`. */
function excite(system: LinearSystem, b: Float64Array, source: string, value: number): void {
  const s = system.sources.get(source);
  if (!s) return;
  if (s.kind === 'vsrc') b[s.row] += value;
  else {
    if (s.from >= 0) b[s.from] -= value;
    if (s.to >= 0) b[s.to] += value;
  }
}

function select(system: LinearSystem, c: Float64Array, node: string, weight: number): void {
  const i = node === GROUND ? undefined : system.nodeIndex.get(node);
  if (i !== undefined) c[i] += weight;
}

/** The ports' differential transfer adm: +½ and −½ on the two sources, vod at the output (ports.ts). */
export function portsTransfer(system: LinearSystem, req: PortsRequest): TransferVectors {
  const b = new Float64Array(system.size);
  const c = new Float64Array(system.size);
  excite(system, b, req.inP, 0.5);
  excite(system, b, req.inN, -0.5);
  select(system, c, req.outP, 1);
  if (req.outN !== undefined) select(system, c, req.outN, -1);
  return { b, c };
}

/** The transfer from one source, driven alone with 1 V or 1 A, to a node's voltage. */
export function nodeTransfer(system: LinearSystem, source: string, node: string): TransferVectors {
  const b = new Float64Array(system.size);
  const c = new Float64Array(system.size);
  excite(system, b, source, 1);
  select(system, c, node, 1);
  return { b, c };
}
