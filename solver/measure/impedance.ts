/**
 * Small-signal impedances for measures.
 *
 * zin(source): the impedance the named source sees looking into the rest of the circuit. The
 * source alone is excited (every other independent source zeroed: voltage sources shorted,
 * current sources opened) and Z = V/I in the sense that makes a resistor load read +R:
 *   - voltage source, 1 V: its branch current runs p→n through the source, which is the
 *     negative of the current it delivers into the load, so Z = 1 / (−I_branch);
 *   - current source, 1 A from `from` through it into `to`: the load carries that 1 A from `to`
 *     back to `from`, so Z = v(to) − v(from).
 * zout(node): 1 A injected into the node from ground with every independent source zeroed;
 * Z = v(node) / 1 A.
 */
import type { AcSolver, LinearSystem } from '../analysis/engine-api';
import { isSingular } from '../analysis/ac-solve';
import { GROUND } from '../circuit/types';
import { cdiv, csub, cx, magnitude, type Phasor } from '../numeric/complex';
import { MeasureError, didYouMean } from './measure-error';

/** Beyond this the "impedance" is an open circuit held only by the min_g leakage. */
const OPEN_CIRCUIT_OHMS = 1e15;

function checkFrequency(fn: string, f: number): void {
  if (typeof f !== 'number' || !Number.isFinite(f) || f < 0) {
    throw new MeasureError(`${fn}(): the frequency must be a number of hertz, 0 or more.`, `write ${fn}(name, 1k) for 1 kHz`);
  }
}

/** Impedance seen by an independent source at `freqHz`. */
export function inputImpedance(system: LinearSystem, solver: AcSolver, source: unknown, freqHz: number): Phasor {
  if (typeof source !== 'string') throw new MeasureError('zin() takes the name of an independent source.', 'write zin(va)');
  checkFrequency('zin', freqHz);
  const entry = system.sources.get(source);
  if (!entry) {
    throw new MeasureError(`zin(${source}): there is no independent source \`${source}\`.`, didYouMean(source, system.sources.keys()) ?? 'zin() takes a vsrc or isrc name');
  }
  const [solution] = solver.solve(freqHz, [{ sources: new Map([[source, cx(1)]]) }]);
  if (isSingular(solution)) throw new MeasureError(`zin(${source}): the small-signal circuit is singular at ${freqHz} Hz.`, 'look for a loop of voltage sources or an inductor across a source');
  let z: Phasor;
  if (entry.kind === 'vsrc') {
    const delivered = solution.branch(source);
    const current = { re: -delivered.re, im: -delivered.im };
    if (magnitude(current) < 1 / OPEN_CIRCUIT_OHMS) {
      throw new MeasureError(`zin(${source}): no small-signal current flows out of \`${source}\`; it sees an open circuit.`);
    }
    z = cdiv(cx(1), current);
  } else {
    z = csub(voltageAtIndex(system, solution, entry.to), voltageAtIndex(system, solution, entry.from));
  }
  if (magnitude(z) > OPEN_CIRCUIT_OHMS) {
    throw new MeasureError(`zin(${source}): \`${source}\` sees an open circuit (above 1e15 Ω).`);
  }
  return z;
}

/** Impedance between a node and ground with every independent source zeroed, at `freqHz`. */
export function outputImpedance(system: LinearSystem, solver: AcSolver, node: unknown, freqHz: number): Phasor {
  if (typeof node !== 'string') throw new MeasureError('zout() takes the name of a node.', 'write zout(outa)');
  checkFrequency('zout', freqHz);
  if (node === GROUND) throw new MeasureError('zout(gnd): the reference node has zero impedance to itself.', 'name a node other than gnd');
  if (!system.nodeIndex.has(node)) {
    throw new MeasureError(`zout(${node}): there is no node \`${node}\`.`, didYouMean(node, system.nodeIndex.keys()));
  }
  const [solution] = solver.solve(freqHz, [{ injections: new Map([[node, cx(1)]]) }]);
  if (isSingular(solution)) throw new MeasureError(`zout(${node}): the small-signal circuit is singular at ${freqHz} Hz.`);
  const z = solution.v(node);
  if (magnitude(z) > OPEN_CIRCUIT_OHMS) {
    throw new MeasureError(`zout(${node}): the node is held only by leakage (above 1e15 Ω); nothing drives it.`);
  }
  return z;
}

/** Node voltage of the solution by MNA index (the engine's source map holds indices, not names). */
function voltageAtIndex(system: LinearSystem, solution: { v(node: string): Phasor }, index: number): Phasor {
  if (index < 0) return cx(0);
  for (const [name, i] of system.nodeIndex) if (i === index) return solution.v(name);
  return cx(0);
}
