/**
 * The functions a measure or check expression may call, bound to one solved circuit.
 *
 * Values flowing through mathjs are plain numbers, mathjs Complex numbers, strings (quoted name
 * arguments) and FreqCurve objects (from `ac(n)`, or the ports curves named by `adm`, `acm`,
 * `cmrr` inside at/corner/unity/margin). Every function validates its arguments and throws a
 * MeasureError with a hint; the evaluator turns that into a diagnostic.
 */
import type { AcSolution, AcSolver, LinearSystem } from '../analysis/engine-api';
import { GROUND } from '../circuit/types';
import type { Curve, OpResult } from '../circuit/result';
import { CURVE_FUNCTIONS, PORTS_CURVE_NAMES } from '../language/vocabulary';
import { csub, cx, decibels, isEffectivelyReal, magnitude, phaseDeg, type Phasor } from '../numeric/complex';
import { curveFromPhasors } from '../numeric/phasor-curve';
import { corner, margin, unity, valueAt, type FreqCurve } from './curve';
import { inputImpedance, outputImpedance } from './impedance';
import { FollowOnError, MeasureError, didYouMean } from './measure-error';
import { measureMath } from './math';
import { DEVICE_QUANTITIES, deviceQuantity, nodeVoltage, partCurrent } from './quantities';
import { noiseFunctions, type NoiseMeasureData } from './noise-measures';
import { poleFunctions, type PolesMeasureData } from './pole-measures';

/** Everything a measure can read. Absent members make the functions that need them report so. */
export interface MeasureContext {
  op: OpResult;
  params: Record<string, number>;
  /** Ports figures at the ports frequency. */
  ports?: { adm: Phasor; acm: Phasor; cmrr: number; cmrrDb: number; atHz: number };
  /** The ac sweep: frequencies, the ports curves, and one solution per frequency driven by the sources' own ac=. */
  ac?: { freqHz: number[]; portsCurves?: { adm: Curve; acm: Curve; cmrr: Curve }; solutions: AcSolution[] };
  /** The linearised circuit, for zin and zout. */
  linear?: { system: LinearSystem; solver: AcSolver };
  /** The noise sweep: densities for noise_out, noise_in and their rms over a band. */
  noise?: NoiseMeasureData;
  /** The poles and zeros, for pole(k) and zero(k). */
  poles?: PolesMeasureData;
  /** Requests written but unusable, already reported (`'ac'`, `'ports'`): who needs them stays silent. */
  failed?: ReadonlySet<string>;
}

/** The functions whose first argument names a curve; `adm`, `acm`, `cmrr` there mean their curves (the vocabulary's lists). */
export { CURVE_FUNCTIONS, PORTS_CURVE_NAMES };

type MathComplex = { re: number; im: number; isComplex?: boolean };

function isFreqCurve(x: unknown): x is FreqCurve {
  return typeof x === 'object' && x !== null && 'freqHz' in x && 'curve' in x;
}

function isComplexValue(x: unknown): x is MathComplex {
  return typeof x === 'object' && x !== null && 're' in x && 'im' in x && !isFreqCurve(x);
}

/** A number or complex as a phasor; anything else is an error naming the function. */
export function toPhasor(fn: string, x: unknown): Phasor {
  if (typeof x === 'number') return cx(x);
  if (isComplexValue(x)) return { re: x.re, im: x.im };
  if (isFreqCurve(x)) throw new MeasureError(`${fn}() got the curve ${x.name}, not a value.`, `take a value from it first: ${fn}(at(${x.name}, f))`);
  if (typeof x === 'string') throw new MeasureError(`${fn}() got the name \`${x}\`, not a value.`, `write ${fn}(v(${x})) for a node voltage`);
  throw new MeasureError(`${fn}() takes a number.`);
}

/** A phasor back into mathjs: a plain number when it is real. */
export function fromPhasor(z: Phasor): number | MathComplex {
  return isEffectivelyReal(z) ? z.re : measureMath.complex(z.re, z.im);
}

function realNumber(fn: string, what: string, x: unknown): number {
  const z = toPhasor(fn, x);
  if (!isEffectivelyReal(z)) throw new MeasureError(`${fn}(): the ${what} must be real.`);
  return z.re;
}

/** The function table bound to one context. */
export function measureFunctions(ctx: MeasureContext): Record<string, (...args: unknown[]) => unknown> {
  return functionTable(() => ctx);
}

/**
 * The function table over the context `read` gives at each call: one table can serve every
 * evaluation (see evaluate.ts), where a table per evaluation was a tenth of a mismatch run's
 * garbage.
 */
export function functionTable(read: () => MeasureContext): Record<string, (...args: unknown[]) => unknown> {
  const needAc = (fn: string) => {
    const { ac, failed } = read();
    if (!ac && failed?.has('ac')) throw new FollowOnError('analyze ac');
    if (!ac) throw new MeasureError(`${fn}() needs an ac sweep.`, 'add `analyze ac from 10 Hz to 1 GHz per decade 20`');
    return ac;
  };
  const needLinear = (fn: string) => {
    const { linear } = read();
    if (!linear) throw new MeasureError(`${fn}() needs the small-signal circuit, which is not available.`);
    return linear;
  };
  const defaultFrequency = () => read().ports?.atHz ?? 0;

  const acNode = (fn: string, a: unknown, b?: unknown): FreqCurve => {
    const ac = needAc(fn);
    const names = b === undefined ? [a] : [a, b];
    const nodeNames = read().op.nodes;
    for (const n of names) {
      if (typeof n !== 'string') throw new MeasureError(`${fn}() takes node names.`, 'write ac(outa) or ac(outa, outb)');
      if (n !== GROUND && nodeNames[n] === undefined) throw new MeasureError(`${fn}(${n}): there is no node \`${n}\`.`, didYouMean(n, Object.keys(nodeNames)));
    }
    const v = (s: AcSolution, n: string) => (n === GROUND ? cx(0) : s.v(n));
    const points = ac.solutions.map((s) => (b === undefined ? v(s, a as string) : csub(v(s, a as string), v(s, b as string))));
    return { name: b === undefined ? `ac(${a})` : `ac(${a}, ${b})`, freqHz: ac.freqHz, curve: curveFromPhasors(points) };
  };

  const curveArg = (fn: string, x: unknown): FreqCurve => {
    if (isFreqCurve(x)) return x;
    if (typeof x === 'string' && PORTS_CURVE_NAMES.includes(x)) {
      const ac = needAc(fn);
      const { ports, failed } = read();
      if ((!ports || !ac.portsCurves) && failed?.has('ports')) throw new FollowOnError('ports');
      if (!ports || !ac.portsCurves) throw new MeasureError(`${fn}(${x}) needs a \`ports\` statement.`, 'add `ports in=(va, vb) out=(outa, outb)`');
      return { name: x, freqHz: ac.freqHz, curve: ac.portsCurves[x as 'adm' | 'acm' | 'cmrr'] };
    }
    throw new MeasureError(`${fn}() takes a curve: adm, acm, cmrr or ac(node).`, typeof x === 'string' ? `write ${fn}(ac(${x}))` : undefined);
  };

  const table: Record<string, (...args: unknown[]) => unknown> = {
    v: (...args) => {
      if (args.length === 1) return nodeVoltage(read().op, args[0]);
      if (args.length === 2) return nodeVoltage(read().op, args[0]) - nodeVoltage(read().op, args[1]);
      throw new MeasureError('v() takes one node, or two for a difference.', 'write v(outa) or v(outa, outb)');
    },
    i: (...args) => {
      if (args.length !== 1) throw new MeasureError('i() takes one part name.', 'write i(rc1)');
      return partCurrent(read().op, args[0]);
    },
    db: (...args) => {
      if (args.length !== 1) throw new MeasureError('db() takes one value.');
      return decibels(magnitude(toPhasor('db', args[0])));
    },
    mag: (...args) => {
      if (args.length !== 1) throw new MeasureError('mag() takes one value.');
      return magnitude(toPhasor('mag', args[0]));
    },
    phase: (...args) => {
      if (args.length !== 1) throw new MeasureError('phase() takes one value.');
      return phaseDeg(toPhasor('phase', args[0]));
    },
    ac: (...args) => {
      if (args.length < 1 || args.length > 2) throw new MeasureError('ac() takes one node, or two for a difference.', 'write ac(outa) or ac(outa, outb)');
      return acNode('ac', args[0], args[1]);
    },
    at: (...args) => {
      if (args.length !== 2) throw new MeasureError('at() takes a curve and a frequency.', 'write at(adm, 1k)');
      return fromPhasor(valueAt(curveArg('at', args[0]), realNumber('at', 'frequency', args[1])));
    },
    corner: (...args) => {
      if (args.length !== 1) throw new MeasureError('corner() takes one curve.', 'write corner(adm)');
      return corner(curveArg('corner', args[0]));
    },
    unity: (...args) => {
      if (args.length !== 1) throw new MeasureError('unity() takes one curve.', 'write unity(adm)');
      return unity(curveArg('unity', args[0]));
    },
    margin: (...args) => {
      if (args.length !== 1) throw new MeasureError('margin() takes one curve.', 'write margin(adm)');
      return margin(curveArg('margin', args[0]));
    },
    zin: (...args) => {
      if (args.length < 1 || args.length > 2) throw new MeasureError('zin() takes a source and an optional frequency.', 'write zin(va) or zin(va, 1k)');
      const f = args.length === 2 ? realNumber('zin', 'frequency', args[1]) : defaultFrequency();
      const { system, solver } = needLinear('zin');
      return fromPhasor(inputImpedance(system, solver, args[0], f));
    },
    zout: (...args) => {
      if (args.length < 1 || args.length > 2) throw new MeasureError('zout() takes a node and an optional frequency.', 'write zout(outa) or zout(outa, 1k)');
      const f = args.length === 2 ? realNumber('zout', 'frequency', args[1]) : defaultFrequency();
      const { system, solver } = needLinear('zout');
      return fromPhasor(outputImpedance(system, solver, args[0], f));
    },
  };
  Object.assign(table, noiseFunctions(read));
  Object.assign(table, poleFunctions(read));
  for (const q of DEVICE_QUANTITIES) {
    table[q] = (...args) => {
      if (args.length !== 1) throw new MeasureError(`${q}() takes one device name.`, `write ${q}(q1)`);
      return deviceQuantity(read().op, q, args[0]);
    };
  }
  return table;
}
