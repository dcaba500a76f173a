/**
 * Kirchhoff's current law, checked on a finished `op` report: for every node, the sum of the
 * currents leaving it through the parts, the sources, the device terminals and min_g. This is
 * independent of the MNA assembly (it reads only the reported currents), so it checks both the
 * solution and the report's sign conventions.
 */
import { GROUND, type Circuit } from '../circuit/types';
import type { OpResult } from '../circuit/result';

/** Net current leaving a node and the sum of the magnitudes that make it up. */
export interface KclBalance {
  residual: number;
  scale: number;
}

/** KCL balance of every circuit node of `report`. */
export function kclBalances(circuit: Circuit, report: OpResult): Map<string, KclBalance> {
  const out = new Map<string, KclBalance>();
  for (const n of circuit.nodes) out.set(n, { residual: 0, scale: 0 });
  const leave = (node: string, i: number) => {
    if (node === GROUND) return;
    const b = out.get(node);
    if (!b) return;
    b.residual += i;
    b.scale += Math.abs(i);
  };
  const minG = circuit.options.minG > 0 ? circuit.options.minG : 0;
  for (const n of circuit.nodes) leave(n, (report.nodes[n] ?? 0) * minG);
  for (const p of circuit.parts) {
    switch (p.kind) {
      case 'res':
      case 'cap':
      case 'ind': {
        const i = report.parts[p.name]?.i ?? 0;
        leave(p.a, i);
        leave(p.b, -i);
        break;
      }
      case 'isrc':
      case 'vccs': {
        const i = report.parts[p.name]?.i ?? 0;
        leave(p.from, i);
        leave(p.to, -i);
        break;
      }
      case 'vsrc':
      case 'vcvs': {
        const i = report.sources[p.name]?.i ?? 0;
        leave(p.p, i);
        leave(p.n, -i);
        break;
      }
      case 'npn':
      case 'pnp': {
        const d = report.devices[p.name];
        if (d?.kind !== 'npn' && d?.kind !== 'pnp') break;
        const s = p.kind === 'npn' ? 1 : -1;
        leave(p.c, s * d.ic);
        leave(p.b, s * d.ib);
        leave(p.e, -s * d.ie);
        break;
      }
      case 'nmos':
      case 'pmos': {
        const d = report.devices[p.name];
        if (d?.kind !== 'nmos' && d?.kind !== 'pmos') break;
        const s = p.kind === 'nmos' ? 1 : -1;
        leave(p.d, s * d.id);
        leave(p.s, -s * d.id);
        break;
      }
      case 'diode': {
        const d = report.devices[p.name];
        if (d?.kind !== 'diode') break;
        leave(p.a, d.id);
        leave(p.k, -d.id);
        break;
      }
    }
  }
  return out;
}

/** The worst relative KCL imbalance, |residual| / (scale + floor), over all nodes. */
export function worstKclError(circuit: Circuit, report: OpResult, floor = 1e-15): { node: string; relative: number } {
  let worst = { node: '', relative: 0 };
  for (const [node, b] of kclBalances(circuit, report)) {
    const rel = Math.abs(b.residual) / (b.scale + floor);
    if (rel > worst.relative) worst = { node, relative: rel };
  }
  return worst;
}
