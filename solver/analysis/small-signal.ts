/**
 * Linearisation at a DC operating point: (G + s·C)·x = b over the DC unknowns.
 *
 * G holds the linear conductances, min_g, the controlled sources, the branch equations and the
 * devices' exact Jacobian at the operating point (the hybrid-pi gm, rπ, ro, rμ and the series
 * rb for bipolars; gm, gds, gmb for MOS; gd for diodes). C holds capacitors, −L on each
 * inductor's branch diagonal (so the branch reads v(a) − v(b) − s·L·i = 0), and the device
 * capacitances: Cπ = cje + gm·τF from the internal base to the emitter, Cμ = cjc from the
 * internal base to the collector, MOS cgs and cgd, diode cj.
 */
import type { Circuit } from '../circuit/types';
import { bjtCpi, bjtSmallSignal } from '../devices/bjt';
import type { LinearSystem, OperatingPoint } from './engine-api';
import { buildLayout, stampConductance, stampLinear, type MnaLayout } from './mna';
import { DeviceSet } from './nonlinear-devices';

/** Builds the small-signal system of `circuit` at `op`. */
export function linearize(circuit: Circuit, op: OperatingPoint): LinearSystem {
  const layout = buildLayout(circuit);
  const n = layout.size;
  const G = new Float64Array(n * n);
  const C = new Float64Array(n * n);
  const minG = Number.isFinite(circuit.options.minG) && circuit.options.minG > 0 ? circuit.options.minG : 0;
  stampLinear(circuit, layout, G, C, null, { sourceScale: 0, gmin: minG });

  const x = op.x.length === n ? op.x : new Float64Array(n);
  const devices = new DeviceSet(circuit, layout);
  devices.stateFrom(x);
  // The companion stamp without limiting is exactly the Jacobian at x; its current part is dropped.
  devices.stamp(x, G, new Float64Array(n), false);
  stampDeviceCapacitances(devices, C, n);
  return { size: n, nodeIndex: layout.nodeIndex, branchIndex: layout.branchIndex, G, C, sources: sourceMap(circuit, layout) };
}

function stampDeviceCapacitances(devices: DeviceSet, C: Float64Array, n: number): void {
  for (const q of devices.bjts) {
    // q.ev holds the evaluation at the operating point from the stamp just made.
    const cpi = bjtCpi(q.p, bjtSmallSignal(q.ev).gm);
    stampConductance(C, n, q.b, q.e, cpi);
    stampConductance(C, n, q.b, q.c, q.p.cjc);
  }
  for (const m of devices.mos) {
    stampConductance(C, n, m.g, m.s, m.p.cgs);
    stampConductance(C, n, m.g, m.d, m.p.cgd);
  }
  for (const d of devices.diodes) stampConductance(C, n, d.a, d.k, d.p.cj);
}

function sourceMap(circuit: Circuit, layout: MnaLayout): LinearSystem['sources'] {
  const sources: LinearSystem['sources'] = new Map();
  const row = (name: string) => layout.nodeIndex.get(name) ?? -1;
  for (const p of circuit.parts) {
    if (p.kind === 'vsrc') sources.set(p.name, { kind: 'vsrc', row: layout.branchIndex.get(p.name)! });
    else if (p.kind === 'isrc') sources.set(p.name, { kind: 'isrc', from: row(p.from), to: row(p.to) });
  }
  return sources;
}
