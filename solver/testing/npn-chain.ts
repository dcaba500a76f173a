/**
 * A long chain of resistor-coupled common-emitter npn stages, for the engine's robustness tests
 * and the bench. Stage k: its base fed from the previous collector through `rb` and held towards
 * ground by `rbg`, its collector loaded by `rc` from vcc, its emitter grounded; the first base is
 * fed from `vin` through its `rb`.
 *
 * Well posed: every node has a DC path to ground, no loop of sources, and the stages settle to
 * a definite alternation (a stage whose base is driven from a high collector saturates and
 * holds the next one off). But linearised at the cold start — every junction at its critical
 * voltage, collecting tens of milliamps — each stage amplifies about tenfold, so the first
 * Newton matrix of 300 stages has an inverse of order 10³⁰⁰: singular to any floating-point LU.
 * The engine's former dense path failed on it from about 200 stages, and at 230 and 300 stages
 * blamed a missing DC path.
 */
import { bjtModel, circuitOf, type PartSpec } from '../analysis/test-circuits';
import type { Circuit } from '../circuit/types';

/** Values of the chain's parts (ohms, volts). */
export interface NpnChainValues {
  rb: number;
  rbg: number;
  rc: number;
  vcc: number;
  vin: number;
}

/** The values the robustness test uses. */
export const NPN_CHAIN_DEFAULTS: NpnChainValues = { rb: 100e3, rbg: 20e3, rc: 10e3, vcc: 10, vin: 1 };

/** A chain of `stages` stages; nodes `b<k>` and `c<k>`, parts `rb<k>`, `rbg<k>`, `q<k>`, `rc<k>`. */
export function npnChain(stages: number, values: Partial<NpnChainValues> = {}): Circuit {
  const v = { ...NPN_CHAIN_DEFAULTS, ...values };
  const q = bjtModel({ is: 1e-16, beta: 100 });
  const parts: PartSpec[] = [
    { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: v.vcc },
    { kind: 'vsrc', name: 'vin', p: 'in', n: 'gnd', dc: v.vin },
  ];
  let previous = 'in';
  for (let k = 0; k < stages; k++) {
    const b = `b${k}`;
    const c = `c${k}`;
    parts.push({ kind: 'res', name: `rb${k}`, a: previous, b, value: v.rb });
    parts.push({ kind: 'res', name: `rbg${k}`, a: b, b: 'gnd', value: v.rbg });
    parts.push({ kind: 'npn', name: `q${k}`, c, b, e: 'gnd', model: q, area: 1 });
    parts.push({ kind: 'res', name: `rc${k}`, a: 'vcc', b: c, value: v.rc });
    previous = c;
  }
  return circuitOf(parts, {}, `chain of ${stages} common-emitter stages`);
}
