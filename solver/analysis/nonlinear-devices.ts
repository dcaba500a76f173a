/**
 * The nonlinear devices of a circuit, resolved to their parameters at the analysis temperature,
 * with the state the Newton iteration keeps per device (the junction voltages it linearised at
 * last time, for step limiting). Stamps each device's companion model: the exact Jacobian plus
 * the equivalent current I0 − J·v0, so one linear solve gives the next Newton iterate.
 *
 * Stamps go straight to the slots of the circuit's sparse pattern: each device's positions are
 * looked up once ({@link DeviceSet.bind}), so a Newton iteration stamps with plain indexed adds.
 */
import type { Bjt, Circuit, Diode, Mosfet } from '../circuit/types';
import { bjtParams, evalBjt, type BjtEval, type BjtParams } from '../devices/bjt';
import { diodeParams, evalDiode, type DiodeEval, type DiodeParams } from '../devices/diode';
import { limitJunctionStep, limitVoltageStep } from '../devices/junction';
import { evalMos, mosParams, newMosEval, type MosEval, type MosParams } from '../devices/mos';
import type { SparsePattern } from '../numeric/sparse-pattern';
import { nodeRow, type MnaLayout, type StampSink } from './mna';

/**
 * Largest change of a MOS gate–source (or gate–drain) voltage in one Newton step: 0.5 V plus
 * the present distance from threshold, so steps stay small around threshold (where the square
 * law turns on) and can double the overdrive far from it (a gate at 500 V is reached in a dozen
 * steps, not a thousand).
 */
export const MOS_GATE_STEP = 0.5;

function gateStepCap(vOld: number, p: MosParams): number {
  return MOS_GATE_STEP + Math.abs(p.polarity * vOld - p.vth0);
}

export interface BjtInstance {
  part: Bjt;
  p: BjtParams;
  /** Rows of collector, intrinsic base, emitter, external base. */
  c: number;
  b: number;
  e: number;
  bExt: number;
  /** Junction voltages (mirrored for pnp) the device was last linearised at. */
  vbe: number;
  vbc: number;
  ev: BjtEval;
}

export interface MosInstance {
  part: Mosfet;
  p: MosParams;
  d: number;
  g: number;
  s: number;
  b: number;
  vgs: number;
  vgd: number;
  ev: MosEval;
}

export interface DiodeInstance {
  part: Diode;
  p: DiodeParams;
  a: number;
  k: number;
  vd: number;
  ev: DiodeEval;
}

const at = (x: Float64Array, i: number) => (i >= 0 ? x[i] : 0);

/** All nonlinear devices of a circuit, ready to stamp. */
export class DeviceSet {
  readonly bjts: BjtInstance[] = [];
  readonly mos: MosInstance[] = [];
  readonly diodes: DiodeInstance[] = [];
  /** True until the first stamp after {@link initialGuess}: devices then sit at their guesses. */
  private useGuess = true;
  /**
   * Pattern slots of each device's Jacobian entries, −1 for a ground row or column: per bipolar
   * rows (c, b', e) × columns (b', e, c); per MOS rows (d, s) × columns (g, d, s, b); per diode
   * rows (a, k) × columns (a, k). Filled by {@link bind}.
   */
  private bjtSlots = new Int32Array(0);
  private mosSlots = new Int32Array(0);
  private diodeSlots = new Int32Array(0);

  constructor(circuit: Circuit, readonly layout: MnaLayout) {
    const t = circuit.options.temp;
    const row = (name: string) => nodeRow(layout, name);
    for (const part of circuit.parts) {
      if (part.kind === 'npn' || part.kind === 'pnp') {
        const bExt = row(part.b);
        const bi = layout.internalBase.get(part.name);
        this.bjts.push({
          part, p: bjtParams(part, t), c: row(part.c), b: bi ?? bExt, e: row(part.e), bExt, vbe: 0, vbc: 0,
          ev: { ic: 0, ib: 0, dIcDvbe: 0, dIcDvbc: 0, dIbDvbe: 0, dIbDvbc: 0 },
        });
      } else if (part.kind === 'nmos' || part.kind === 'pmos') {
        this.mos.push({ part, p: mosParams(part), d: row(part.d), g: row(part.g), s: row(part.s), b: row(part.b), vgs: 0, vgd: 0, ev: newMosEval() });
      } else if (part.kind === 'diode') {
        this.diodes.push({ part, p: diodeParams(part, t), a: row(part.a), k: row(part.k), vd: 0, ev: { id: 0, gd: 0 } });
      }
    }
    this.initialGuess();
  }

  /**
   * Takes the parameters of `circuit`'s devices, a circuit of the same shape as the one this set
   * was built for (same parts in the same order on the same nodes; values and temperature may
   * differ): the rows, slots and objects are kept, so a mismatch run or a sweep value costs no
   * new device objects. The state goes back to the cold-start guesses.
   */
  rebind(circuit: Circuit): void {
    const t = circuit.options.temp;
    let kb = 0;
    let km = 0;
    let kd = 0;
    for (const part of circuit.parts) {
      if (part.kind === 'npn' || part.kind === 'pnp') {
        const q = this.bjts[kb++];
        q.part = part;
        q.p = bjtParams(part, t);
      } else if (part.kind === 'nmos' || part.kind === 'pmos') {
        const m = this.mos[km++];
        m.part = part;
        m.p = mosParams(part);
      } else if (part.kind === 'diode') {
        const d = this.diodes[kd++];
        d.part = part;
        d.p = diodeParams(part, t);
      }
    }
    this.initialGuess();
  }

  get count(): number {
    return this.bjts.length + this.mos.length + this.diodes.length;
  }

  /**
   * Cold start: junctions at their critical voltage (forward, conducting), collector junctions
   * at zero, MOS gates at threshold + 0.1 V. The next stamp uses these instead of x.
   */
  initialGuess(): void {
    for (const q of this.bjts) {
      q.vbe = q.p.vcrit;
      q.vbc = 0;
    }
    for (const m of this.mos) {
      m.vgs = m.p.polarity * (m.p.vth0 + 0.1);
      m.vgd = 0;
    }
    for (const d of this.diodes) d.vd = d.p.vcrit;
    this.useGuess = true;
  }

  /** Warm start: take the device state from a solution vector (e.g. a converged neighbour). */
  stateFrom(x: Float64Array): void {
    for (const q of this.bjts) {
      const s = q.p.polarity;
      q.vbe = s * (at(x, q.b) - at(x, q.e));
      q.vbc = s * (at(x, q.b) - at(x, q.c));
    }
    for (const m of this.mos) {
      m.vgs = at(x, m.g) - at(x, m.s);
      m.vgd = at(x, m.g) - at(x, m.d);
    }
    for (const d of this.diodes) d.vd = at(x, d.a) - at(x, d.k);
    this.useGuess = false;
  }

  /** Every position the devices stamp: the Jacobian (Newton) and the capacitances (AC). */
  collectPositions(sink: StampSink): void {
    const block = (rows: number[], cols: number[]) => {
      for (const r of rows) for (const c of cols) sink.add(r, c, 0);
    };
    for (const q of this.bjts) block([q.c, q.b, q.e], [q.b, q.e, q.c]);
    for (const m of this.mos) {
      block([m.d, m.s], [m.g, m.d, m.s, m.b]);
      // cgs and cgd: the gate's row, which the drain current does not touch.
      block([m.g, m.s, m.d], [m.g, m.s, m.d]);
    }
    for (const d of this.diodes) block([d.a, d.k], [d.a, d.k]);
  }

  /** Looks up each device's stamp positions in `pattern` (which must hold {@link collectPositions}). */
  bind(pattern: SparsePattern): void {
    const slots = (out: Int32Array, at: number, rows: number[], cols: number[]) => {
      for (const r of rows) for (const c of cols) out[at++] = r >= 0 && c >= 0 ? pattern.slot(r, c) : -1;
    };
    this.bjtSlots = new Int32Array(9 * this.bjts.length);
    this.bjts.forEach((q, k) => slots(this.bjtSlots, 9 * k, [q.c, q.b, q.e], [q.b, q.e, q.c]));
    this.mosSlots = new Int32Array(8 * this.mos.length);
    this.mos.forEach((m, k) => slots(this.mosSlots, 8 * k, [m.d, m.s], [m.g, m.d, m.s, m.b]));
    this.diodeSlots = new Int32Array(4 * this.diodes.length);
    this.diodes.forEach((d, k) => slots(this.diodeSlots, 4 * k, [d.a, d.k], [d.a, d.k]));
  }

  /**
   * Evaluates every device at x (junction steps limited when `limit`), stamps the companion
   * models into A (values on the pattern given to {@link bind}) and b, and returns true when any
   * voltage was limited (x is then not yet a solution of the nonlinear system, whatever the
   * update size says).
   */
  stamp(x: Float64Array, A: Float64Array, b: Float64Array, limit: boolean): boolean {
    let limited = false;
    const guess = this.useGuess;
    this.useGuess = false;
    if (guess) limited = this.count > 0;

    const bjtSlots = this.bjtSlots;
    for (let k = 0; k < this.bjts.length; k++) {
      const q = this.bjts[k];
      const s = q.p.polarity;
      let vbe = q.vbe;
      let vbc = q.vbc;
      if (!guess) {
        const vb = at(x, q.b);
        const rawBe = s * (vb - at(x, q.e));
        const rawBc = s * (vb - at(x, q.c));
        vbe = limit ? limitJunctionStep(rawBe, q.vbe, q.p.nvt, q.p.vcrit) : rawBe;
        vbc = limit ? limitJunctionStep(rawBc, q.vbc, q.p.nvt, q.p.vcrit) : rawBc;
        if (vbe !== rawBe || vbc !== rawBc) limited = true;
      }
      q.vbe = vbe;
      q.vbc = vbc;
      const ev = evalBjt(q.p, vbe, vbc, q.ev);
      // Terminal currents: s·ic into c, s·ib into b', −s·(ic + ib) into e; the Jacobian in
      // terminal voltages is the mirrored one unchanged (both signs cancel).
      const icEq = s * (ev.ic - ev.dIcDvbe * vbe - ev.dIcDvbc * vbc);
      const ibEq = s * (ev.ib - ev.dIbDvbe * vbe - ev.dIbDvbc * vbc);
      const at0 = 9 * k;
      stampTransistorRow(A, b, bjtSlots, at0, q.c, ev.dIcDvbe, ev.dIcDvbc, icEq, 1);
      stampTransistorRow(A, b, bjtSlots, at0 + 3, q.b, ev.dIbDvbe, ev.dIbDvbc, ibEq, 1);
      stampTransistorRow(A, b, bjtSlots, at0 + 6, q.e, ev.dIcDvbe + ev.dIbDvbe, ev.dIcDvbc + ev.dIbDvbc, icEq + ibEq, -1);
    }

    for (let k = 0; k < this.mos.length; k++) {
      const m = this.mos[k];
      const vs = at(x, m.s);
      const vbk = at(x, m.b);
      let vgs = m.vgs;
      let vgd = m.vgd;
      if (!guess) {
        const rawGs = at(x, m.g) - vs;
        const rawGd = at(x, m.g) - at(x, m.d);
        vgs = rawGs;
        vgd = rawGd;
        if (limit) {
          // Cap the gate step against whichever terminal acts as the source.
          const s = m.p.polarity;
          if (s * (rawGs - rawGd) >= 0) {
            vgs = limitVoltageStep(rawGs, m.vgs, gateStepCap(m.vgs, m.p));
            vgd = rawGd + (vgs - rawGs);
          } else {
            vgd = limitVoltageStep(rawGd, m.vgd, gateStepCap(m.vgd, m.p));
            vgs = rawGs + (vgd - rawGd);
          }
        }
        if (vgs !== rawGs) limited = true;
      }
      m.vgs = vgs;
      m.vgd = vgd;
      // Linearisation point in terminal voltages: source and bulk from x, gate and drain implied.
      const vg0 = vs + vgs;
      const vd0 = vg0 - vgd;
      const ev = evalMos(m.p, vg0, vd0, vs, vbk, m.ev);
      const ieq = ev.id - ev.dIdVg * vg0 - ev.dIdVd * vd0 - ev.dIdVs * vs - ev.dIdVb * vbk;
      stampMosRow(A, b, this.mosSlots, 8 * k, m, m.d, 1, ieq);
      stampMosRow(A, b, this.mosSlots, 8 * k + 4, m, m.s, -1, ieq);
    }

    const diodeSlots = this.diodeSlots;
    for (let k = 0; k < this.diodes.length; k++) {
      const d = this.diodes[k];
      let vd = d.vd;
      if (!guess) {
        const raw = at(x, d.a) - at(x, d.k);
        vd = limit ? limitJunctionStep(raw, d.vd, d.p.nvt, d.p.vcrit) : raw;
        if (vd !== raw) limited = true;
      }
      d.vd = vd;
      const ev = evalDiode(d.p, vd, d.ev);
      const ieq = ev.id - ev.gd * vd;
      const at0 = 4 * k;
      addAt(A, diodeSlots[at0], ev.gd);
      addAt(A, diodeSlots[at0 + 1], -ev.gd);
      addAt(A, diodeSlots[at0 + 2], -ev.gd);
      addAt(A, diodeSlots[at0 + 3], ev.gd);
      if (d.a >= 0) b[d.a] -= ieq;
      if (d.k >= 0) b[d.k] += ieq;
    }
    return limited;
  }
}

/** Adds v at a pattern slot (−1: a ground row or column, skipped). */
function addAt(A: Float64Array, slot: number, v: number): void {
  if (slot >= 0) A[slot] += v;
}

/** Stamps ±(drain current) into row r: +1 for the drain, −1 for the source; slots (g, d, s, b) from `at0`. */
function stampMosRow(A: Float64Array, b: Float64Array, slots: Int32Array, at0: number, m: MosInstance, r: number, sign: 1 | -1, ieq: number): void {
  if (r < 0) return;
  const ev = m.ev;
  addAt(A, slots[at0], sign * ev.dIdVg);
  addAt(A, slots[at0 + 1], sign * ev.dIdVd);
  addAt(A, slots[at0 + 2], sign * ev.dIdVs);
  addAt(A, slots[at0 + 3], sign * ev.dIdVb);
  b[r] -= sign * ieq;
}

/**
 * Stamps sign·I into row r, where I = ieq + gBe·(v_b − v_e) + gBc·(v_b − v_c): the current into
 * one transistor terminal linearised in its two junction voltages. Slots (b', e, c) from `at0`.
 */
function stampTransistorRow(
  A: Float64Array, b: Float64Array, slots: Int32Array, at0: number,
  r: number, gBe: number, gBc: number, ieq: number, sign: 1 | -1,
): void {
  if (r < 0) return;
  addAt(A, slots[at0], sign * (gBe + gBc));
  addAt(A, slots[at0 + 1], -sign * gBe);
  addAt(A, slots[at0 + 2], -sign * gBc);
  b[r] -= sign * ieq;
}
