/**
 * The curves of `analyze transfer`, read out of a solve result for the Transfer panel: node
 * voltages `v(n)` and part currents `i(p)` with their units, the differential output
 * vod = v(outP) − v(outN) when `ports` names a differential output, which curves are flat over
 * the sweep, which to show first and which one's linear range to mark.
 */
import type { SolveResult } from '../../../../../solver';
import { portNames } from '../modes-panel';

export interface TransferCurve {
  /** `v(outa)`, `i(rc1)`, or `vod` for the derived differential output. */
  key: string;
  /** How the legend and readouts name it (the key). */
  label: string;
  /** What a derived curve is: `vod = v(outa) − v(outb)`. */
  definition?: string;
  unit: 'V' | 'A';
  values: readonly number[];
  /** Spread of the values over the sweep (max − min). */
  swing: number;
}

export interface TransferData {
  /** The swept source and its unit (V for a vsrc, A for an isrc). */
  source: string;
  sourceUnit: 'V' | 'A' | '';
  /** The swept values, cleared of the rounding of repeated addition (see tidySweep). */
  x: readonly number[];
  /** Curves that change over the sweep, voltages then currents, in the result's order. */
  curves: TransferCurve[];
  /** Every curve, flat ones included (for the full CSV). */
  all: TransferCurve[];
  /** Keys of the curves that stay constant over the sweep (supplies, an ideal current source). */
  flat: string[];
  /** Keys shown before the user chooses. */
  defaults: string[];
  /** The curve whose linear range is marked before the user chooses. */
  markKey: string | undefined;
}

/** A curve is flat when it moves less than this fraction of its size (or of 1 fV/fA) over the sweep. */
const FLAT = 1e-9;

/** The transfer data of `result`, or undefined when it has no transfer sweep. */
export function transferData(result: SolveResult | undefined): TransferData | undefined {
  const t = result?.transfer;
  if (!t || t.x.length === 0) return undefined;
  const all: TransferCurve[] = [];
  for (const [key, values] of Object.entries(t.curves)) {
    const unit = key.startsWith('i(') ? 'A' : 'V';
    all.push({ key, label: key, unit, values, swing: spread(values) });
  }
  const ports = result?.ports;
  const names = ports ? portNames(ports) : undefined;
  const outP = names ? t.curves[`v(${names.outP})`] : undefined;
  const outN = names?.outN ? t.curves[`v(${names.outN})`] : undefined;
  if (names?.outN && outP && outN) {
    const values = outP.map((v, k) => v - outN[k]);
    all.unshift({ key: 'vod', label: 'vod', definition: `vod = v(${names.outP}) − v(${names.outN})`, unit: 'V', values, swing: spread(values) });
  }
  // Rounding leaves a node tied to a 0 V source at ±1e-16 V rather than 0: below 1 fV is no swing.
  const isFlat = (c: TransferCurve) => !(c.swing > Math.max(FLAT * Math.max(...c.values.map(Math.abs)), 1e-15));
  const moving = all.filter((c) => !isFlat(c));
  const curves = [...moving.filter((c) => c.unit === 'V'), ...moving.filter((c) => c.unit === 'A')];
  const op = result?.op;
  const sourceUnit = op?.sources[t.source] ? 'V' : op?.parts[t.source] ? 'A' : '';

  // First shown: the outputs the ports line names, else the two voltages that move most (not
  // the swept node itself, which only repeats the x axis), and the two currents that move most.
  const sweptNode = Object.keys(t.curves).find((k) => k.startsWith('v(') && sameAsX(t.curves[k], t.x));
  const byswing = (unit: 'V' | 'A') => curves.filter((c) => c.unit === unit && c.key !== sweptNode && c.key !== `i(${t.source})`)
    .sort((a, b) => b.swing - a.swing);
  const named = names ? ['vod', `v(${names.outP})`, names.outN ? `v(${names.outN})` : ''].filter((k) => curves.some((c) => c.key === k)) : [];
  const voltages = named.length > 0 ? named : byswing('V').slice(0, 2).map((c) => c.key);
  const currents = byswing('A').slice(0, 2).map((c) => c.key);
  const defaults = [...voltages, ...currents];
  return {
    source: t.source, sourceUnit, x: tidySweep(t.x), curves, all, flat: all.filter(isFlat).map((c) => c.key),
    defaults, markKey: voltages[0] ?? currents[0] ?? curves[0]?.key,
  };
}

/**
 * The swept values as the netlist wrote them: a sweep stepped by adding 1m two hundred times
 * lands on 8.3e-17 instead of 0 and on 0.05000000000000013 instead of 0.05. Rounded to twelve
 * significant digits, and to 0 within a millionth of a step, the axis, the readout and the CSV
 * show −100 mV … 0 V … 100 mV.
 */
export function tidySweep(x: readonly number[]): number[] {
  const step = x.length > 1 ? Math.abs(x[x.length - 1] - x[0]) / (x.length - 1) : 0;
  return x.map((v) => (Math.abs(v) <= step * 1e-6 ? 0 : Number(v.toPrecision(12))));
}

function spread(values: readonly number[]): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  return hi >= lo ? hi - lo : 0;
}

/** Whether a node voltage simply repeats the swept value (the source's own node). */
function sameAsX(values: readonly number[], x: readonly number[]): boolean {
  return values.length === x.length && values.every((v, k) => Math.abs(v - x[k]) <= 1e-9 * Math.max(1, Math.abs(x[k])));
}
