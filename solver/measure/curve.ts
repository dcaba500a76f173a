/**
 * Frequency-response curves and the measures taken on them: interpolation at a frequency, the
 * −3 dB corner, the unity-gain crossing and the phase margin.
 *
 * Interpolation is linear in log-frequency for magnitude-in-dB and for unwrapped phase: a Bode
 * plot is a set of straight lines on those axes, so this is the interpolation a designer does
 * by eye and it is exact on a pure pole's asymptotes.
 */
import { fromPolar, type Phasor } from '../numeric/complex';
import type { Curve } from '../numeric/phasor-curve';
import { MeasureError } from './measure-error';

/** A named curve together with its frequency axis. */
export interface FreqCurve {
  /** How it reads in messages: `adm`, `ac(outa)`. */
  name: string;
  freqHz: number[];
  curve: Curve;
}

/** 20·log10(√2): the "−3 dB" of a corner frequency, taken exactly. */
export const CORNER_DB = 10 * Math.log10(2);

function requirePoints(c: FreqCurve, what: string): void {
  if (c.freqHz.length < 2) throw new MeasureError(`${what}(${c.name}) needs an ac sweep of at least two points.`, 'add `analyze ac from F1 to F2 per decade N`');
}

/** Fraction of the way from log f0 to log f1 at which f stands. */
function logFraction(f: number, f0: number, f1: number): number {
  return f1 === f0 ? 0 : Math.log(f / f0) / Math.log(f1 / f0);
}

/** Frequency at which a quantity linear in log f reaches `target` between samples k−1 and k. */
function crossingFrequency(c: FreqCurve, y: number[], k: number, target: number): number {
  const f0 = c.freqHz[k - 1];
  const f1 = c.freqHz[k];
  const t = y[k] === y[k - 1] ? 0 : (target - y[k - 1]) / (y[k] - y[k - 1]);
  return f0 * Math.pow(f1 / f0, t);
}

/** Interpolated dB and unwrapped phase at `f`, which must lie within the sweep. */
export function dbPhaseAt(c: FreqCurve, f: number, what = 'at'): { db: number; phase: number } {
  requirePoints(c, what);
  const fs = c.freqHz;
  const lo = fs[0];
  const hi = fs[fs.length - 1];
  if (!Number.isFinite(f) || f < lo * (1 - 1e-12) || f > hi * (1 + 1e-12)) {
    throw new MeasureError(`${what}(${c.name}, …): ${formatHz(f)} lies outside the ac sweep (${formatHz(lo)} to ${formatHz(hi)}).`, 'widen `analyze ac` or ask for a frequency inside it');
  }
  let k = 1;
  while (k < fs.length - 1 && fs[k] < f) k++;
  const t = Math.min(1, Math.max(0, logFraction(f, fs[k - 1], fs[k])));
  const { db, phase_deg } = c.curve;
  return { db: db[k - 1] + t * (db[k] - db[k - 1]), phase: phase_deg[k - 1] + t * (phase_deg[k] - phase_deg[k - 1]) };
}

/** The curve's complex value at `f` (magnitude from the interpolated dB). */
export function valueAt(c: FreqCurve, f: number): Phasor {
  const { db, phase } = dbPhaseAt(c, f);
  return fromPolar(Math.pow(10, db / 20), phase);
}

/** The −3 dB frequency: where the curve first falls 3.01 dB below its value at the sweep's start. */
export function corner(c: FreqCurve): number {
  requirePoints(c, 'corner');
  const { db } = c.curve;
  const target = db[0] - CORNER_DB;
  for (let k = 1; k < db.length; k++) {
    if (db[k] <= target) return crossingFrequency(c, db, k, target);
  }
  throw new MeasureError(
    `corner(${c.name}): the curve stays within 3 dB of its low-frequency value up to ${formatHz(c.freqHz[c.freqHz.length - 1])}.`,
    'extend the ac sweep to higher frequencies',
  );
}

/** The frequency where |curve| first falls through 1 (0 dB). */
export function unity(c: FreqCurve): number {
  requirePoints(c, 'unity');
  const { db } = c.curve;
  if (db[0] < 0) {
    throw new MeasureError(`unity(${c.name}): the magnitude is already below 1 at ${formatHz(c.freqHz[0])}, the start of the sweep.`, 'start the ac sweep at a lower frequency');
  }
  for (let k = 1; k < db.length; k++) {
    if (db[k] < 0) return crossingFrequency(c, db, k, 0);
  }
  throw new MeasureError(
    `unity(${c.name}): the magnitude stays above 1 up to ${formatHz(c.freqHz[c.freqHz.length - 1])}, the end of the sweep.`,
    'extend the ac sweep to higher frequencies',
  );
}

/**
 * Phase margin in degrees: 180° + phase at the unity crossing, with the phase measured from the
 * response's low-frequency sign. An inverting response (phase ±180° at the sweep's start, as for
 * adm = −gm·RC) is the inverting input of the loop it would close, so its lag counts from 180°;
 * otherwise margin(−A) would differ from margin(A) by 180° for the same loop.
 */
export function margin(c: FreqCurve): number {
  const fu = unity(c);
  const { phase } = dbPhaseAt(c, fu, 'margin');
  const reference = 180 * Math.round(c.curve.phase_deg[0] / 180);
  return 180 + (phase - reference);
}

function formatHz(f: number): string {
  if (!Number.isFinite(f)) return String(f);
  const a = Math.abs(f);
  if (a >= 1e9) return `${+(f / 1e9).toPrecision(4)} GHz`;
  if (a >= 1e6) return `${+(f / 1e6).toPrecision(4)} MHz`;
  if (a >= 1e3) return `${+(f / 1e3).toPrecision(4)} kHz`;
  return `${+f.toPrecision(4)} Hz`;
}
