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
import { SparsePattern } from '../numeric/sparse-pattern';
import type { LinearSystem, OperatingPoint, SparseSystem } from './engine-api';
import { borrowWorkspace, releaseWorkspace } from './newton';
import { PatternValues, stampConductance, stampLinear, type MnaLayout, type StampSink } from './mna';
import { DeviceSet } from './nonlinear-devices';

/** Builds the small-signal system of `circuit` at `op`, on the circuit's sparse pattern. */
export function linearize(circuit: Circuit, op: OperatingPoint): LinearSystem {
  // A DC workspace of the circuit's shape lends its devices, bound to the pattern.
  const ws = borrowWorkspace(circuit);
  const { layout, pattern, devices, n } = ws;
  const G = new PatternValues(pattern);
  const C = new PatternValues(pattern);
  const minG = Number.isFinite(circuit.options.minG) && circuit.options.minG > 0 ? circuit.options.minG : 0;
  stampLinear(circuit, layout, G, C, null, { sourceScale: 0, gmin: minG });

  const x = op.x.length === n ? op.x : new Float64Array(n);
  devices.stateFrom(x);
  // The companion stamp without limiting is exactly the Jacobian at x; its current part is dropped.
  devices.stamp(x, G.values, ws.b, false);
  stampDeviceCapacitances(devices, C);
  releaseWorkspace(ws);
  return linearSystem(layout, sourceMap(circuit, layout), { pattern, g: G.values, c: C.values });
}

/**
 * A LinearSystem over sparse storage whose dense `G` and `C` are built on first access and kept
 * (other analyses may want dense matrices; the AC solver never asks).
 */
export function linearSystem(layout: Pick<MnaLayout, 'size' | 'nodeIndex' | 'branchIndex'>, sources: LinearSystem['sources'], sparse: SparseSystem): LinearSystem {
  let G: Float64Array | undefined;
  let C: Float64Array | undefined;
  return {
    size: layout.size,
    nodeIndex: layout.nodeIndex,
    branchIndex: layout.branchIndex,
    sources,
    sparse,
    get G(): Float64Array {
      return (G ??= sparse.pattern.toDense(sparse.g));
    },
    get C(): Float64Array {
      return (C ??= sparse.pattern.toDense(sparse.c));
    },
  };
}

/** The pattern and values a system is solved on: its own sparse storage, or derived from dense G and C. */
export function sparseOf(system: LinearSystem): SparseSystem {
  if (system.sparse) return system.sparse;
  const pattern = SparsePattern.fromDense(system.size, system.G, system.C);
  return { pattern, g: pattern.gather(system.G), c: pattern.gather(system.C) };
}

function stampDeviceCapacitances(devices: DeviceSet, C: StampSink): void {
  for (const q of devices.bjts) {
    // q.ev holds the evaluation at the operating point from the stamp just made.
    const cpi = bjtCpi(q.p, bjtSmallSignal(q.ev).gm);
    stampConductance(C, q.b, q.e, cpi);
    stampConductance(C, q.b, q.c, q.p.cjc);
  }
  for (const m of devices.mos) {
    stampConductance(C, m.g, m.s, m.p.cgs);
    stampConductance(C, m.g, m.d, m.p.cgd);
  }
  for (const d of devices.diodes) stampConductance(C, d.a, d.k, d.p.cj);
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
