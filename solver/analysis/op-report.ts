/**
 * The §5 `op` report of a converged solution, and the region warnings.
 *
 * Sign conventions (documented for the CLI and measures):
 * - `sources`: v = v(p) − v(n), i = current p→n through the source (negative when it delivers).
 * - `parts`: i = current a→b (from→to) through the part, v = v(a) − v(b) (from − to).
 * - bipolar: an npn reports ic into the collector, ib into the base, ie out of the emitter,
 *   vbe = v(b) − v(e), vce = v(c) − v(e). A pnp reports the mirrored quantities, so the same
 *   numbers are positive in forward-active operation: ic out of the collector, ib out of the
 *   base, ie into the emitter, vbe = v(e) − v(b), vce = v(e) − v(c).
 * - MOS: nmos id into the drain, vgs = v(g) − v(s), vds = v(d) − v(s); pmos mirrored (id out of
 *   the drain, vgs = v(s) − v(g), vds = v(s) − v(d)); vov and vth in the same (positive) sense.
 * - `ro` is reported as 1e30 Ω when va = ∞ (JSON has no Infinity); `rpi` and `ro` are also capped
 *   at 1e30 Ω wherever the slope is zero or negative (cut-off).
 */
import { diagnostic, type Diagnostic, type DiagnosticCode, type SourceLoc } from '../circuit/diagnostic';
import type { Circuit } from '../circuit/types';
import type { BjtOp, DeviceOp, DiodeOp, MosOp, OpResult } from '../circuit/result';
import { bjtCpi, bjtSmallSignal, evalBjt, finiteResistance, RESISTANCE_CAP } from '../devices/bjt';
import { evalDiode } from '../devices/diode';
import { evalMos } from '../devices/mos';
import { conductanceOf, nodeRow, type MnaLayout } from './mna';
import type { BjtInstance, DeviceSet, DiodeInstance, MosInstance } from './nonlinear-devices';

/** A junction counts as forward-biased above this (common practice: the 0.4 V collector-junction allowance of Sedra & Smith, from memory). */
export const JUNCTION_ON_V = 0.4;

const voltageAt = (x: Float64Array, i: number) => (i >= 0 ? x[i] : 0);

/** Builds the `op` report and the region warnings from a converged solution x. */
export function buildOpReport(
  circuit: Circuit,
  layout: MnaLayout,
  devices: DeviceSet,
  x: Float64Array,
): { report: OpResult; warnings: Diagnostic[] } {
  const v = (name: string) => voltageAt(x, nodeRow(layout, name));
  const nodes: Record<string, number> = {};
  for (const name of circuit.nodes) nodes[name] = v(name);
  const sources: OpResult['sources'] = {};
  const parts: OpResult['parts'] = {};
  for (const p of circuit.parts) {
    switch (p.kind) {
      case 'vsrc':
      case 'vcvs':
        sources[p.name] = { v: v(p.p) - v(p.n), i: x[layout.branchIndex.get(p.name)!] };
        break;
      case 'res': {
        const vd = v(p.a) - v(p.b);
        parts[p.name] = { i: vd * conductanceOf(p.value), v: vd };
        break;
      }
      case 'cap':
        parts[p.name] = { i: 0, v: v(p.a) - v(p.b) };
        break;
      case 'ind':
        parts[p.name] = { i: x[layout.branchIndex.get(p.name)!], v: v(p.a) - v(p.b) };
        break;
      case 'isrc':
        parts[p.name] = { i: p.dc, v: v(p.from) - v(p.to) };
        break;
      case 'vccs':
        parts[p.name] = { i: p.gm * (v(p.cp) - v(p.cn)), v: v(p.from) - v(p.to) };
        break;
      default:
        break;
    }
  }
  const deviceOps: Record<string, DeviceOp> = {};
  const warnings: Diagnostic[] = [];
  for (const q of devices.bjts) deviceOps[q.part.name] = bjtOp(q, x, warnings);
  for (const m of devices.mos) deviceOps[m.part.name] = mosOp(m, x, warnings);
  for (const d of devices.diodes) deviceOps[d.part.name] = diodeOp(d, x);
  return { report: { nodes, sources, parts, devices: deviceOps }, warnings };
}

function warn(out: Diagnostic[], code: DiagnosticCode, loc: SourceLoc, message: string, hint: string): void {
  out.push(diagnostic('warning', code, loc, message, hint));
}

const mv = (volts: number) => `${(volts * 1000).toPrecision(3)} mV`;
const volts = (x: number) => `${x.toPrecision(3)} V`;

function bjtOp(q: BjtInstance, x: Float64Array, warnings: Diagnostic[]): BjtOp {
  const s = q.p.polarity;
  const vbeInt = s * (voltageAt(x, q.b) - voltageAt(x, q.e));
  const vbcInt = s * (voltageAt(x, q.b) - voltageAt(x, q.c));
  const ev = evalBjt(q.p, vbeInt, vbcInt, { ic: 0, ib: 0, dIcDvbe: 0, dIcDvbc: 0, dIbDvbe: 0, dIbDvbc: 0 });
  const ss = bjtSmallSignal(ev);
  const beOn = vbeInt > JUNCTION_ON_V;
  const bcOn = vbcInt > JUNCTION_ON_V;
  const region: BjtOp['region'] = beOn ? (bcOn ? 'saturated' : 'active') : bcOn ? 'reverse' : 'cutoff';
  const vbe = s * (voltageAt(x, q.bExt) - voltageAt(x, q.e));
  const vce = s * (voltageAt(x, q.c) - voltageAt(x, q.e));
  const name = q.part.name;
  const tag = q.part.kind === 'npn' ? 'VBE' : 'VEB';
  const tagC = q.part.kind === 'npn' ? 'VCE' : 'VEC';
  if (region === 'saturated') {
    warn(warnings, 'bjt-saturated', q.part.loc, `${name} is saturated (${tagC} = ${mv(vce)}): its collector junction is forward-biased.`,
      'give the collector more headroom or lower the bias current');
  } else if (region === 'reverse') {
    warn(warnings, 'bjt-reverse', q.part.loc, `${name} is in reverse-active operation: collector and emitter act swapped.`,
      'check the c= and e= pins');
  } else if (region === 'cutoff') {
    warn(warnings, 'bjt-cutoff', q.part.loc, `${name} is cut off (${tag} = ${mv(vbe)}): it carries no useful current.`,
      'check its base bias');
  }
  return {
    kind: q.part.kind,
    region,
    ic: ev.ic,
    ib: ev.ib,
    ie: ev.ic + ev.ib,
    vbe,
    vce,
    gm: ss.gm,
    rpi: finiteResistance(ss.gpi),
    // With va = ∞ the model has no output resistance: report the cap, not the reverse junction's 1/g.
    ro: q.p.invVa === 0 ? RESISTANCE_CAP : finiteResistance(ss.go),
    cpi: bjtCpi(q.p, ss.gm),
    cmu: q.p.cjc,
    rb: q.p.rb,
  };
}

function mosOp(m: MosInstance, x: Float64Array, warnings: Diagnostic[]): MosOp {
  const vg = voltageAt(x, m.g);
  const vd = voltageAt(x, m.d);
  const vs = voltageAt(x, m.s);
  const vb = voltageAt(x, m.b);
  const ev = evalMos(m.p, vg, vd, vs, vb, m.ev);
  const s = m.p.polarity;
  const c = ev.core;
  const vgs = s * (vg - vs);
  const vds = s * (vd - vs);
  const name = m.part.name;
  if (c.region === 'triode') {
    warn(warnings, 'mos-triode', m.part.loc, `${name} is in triode (|VDS| = ${volts(Math.abs(vds))} < Vov = ${volts(c.vov)}).`,
      'raise its drain–source voltage above Vov or lower its overdrive');
  } else if (c.region === 'cutoff') {
    warn(warnings, 'mos-cutoff', m.part.loc, `${name} is cut off (Vov = ${volts(c.vov)}): it carries no current.`,
      'check its gate bias against Vth');
  }
  return {
    kind: m.part.kind,
    region: c.region,
    id: s * ev.id,
    vgs,
    vds,
    vov: c.vov,
    vth: c.vth,
    gm: c.gm,
    gds: c.gds,
    gmb: c.gmb,
    cgs: m.p.cgs,
    cgd: m.p.cgd,
  };
}

function diodeOp(d: DiodeInstance, x: Float64Array): DiodeOp {
  const vd = voltageAt(x, d.a) - voltageAt(x, d.k);
  const ev = evalDiode(d.p, vd, { id: 0, gd: 0 });
  return { kind: 'diode', region: vd > 0 ? 'forward' : 'reverse', id: ev.id, vd, gd: ev.gd, cj: d.p.cj };
}

/** True when every number in the report is finite (the guard against NaN/Infinity in JSON). */
export function reportIsFinite(r: OpResult): boolean {
  const ok = (o: object): boolean =>
    Object.values(o).every((val) => (typeof val === 'number' ? Number.isFinite(val) : typeof val === 'object' && val !== null ? ok(val) : true));
  return ok(r);
}
