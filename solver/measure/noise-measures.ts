/**
 * The measure functions over an `analyze noise` sweep (names of the vocabulary):
 *
 *   noise_out(f)               output noise density at f, V/√Hz
 *   noise_in(f)                input-referred noise density at f (V/√Hz; A/√Hz for a current-source input)
 *   noise_out_rms([f1, f2])    rms output noise over the band (default: the whole sweep), V
 *   noise_in_rms([f1, f2])     rms input-referred noise over the band, V (A)
 *
 * Densities between grid points and the band integrals follow the power-law rule of
 * report/noise-band.ts. The input-referred figures refuse a frequency where the input source does
 * not reach the output (H = 0), rather than report a number there.
 */
import { cx, isEffectivelyReal } from '../numeric/complex';
import { bandPower, inBand, powerAt } from '../report/noise-band';
import { formatSi } from '../report/si-format';
import { FollowOnError, MeasureError } from './measure-error';

/** What the noise analysis offers the measures. */
export interface NoiseMeasureData {
  freqHz: number[];
  /** Output power density, V²/Hz. */
  outPower: number[];
  /** Input-referred power density (V²/Hz or A²/Hz); 0 where `inDefined` is false. */
  inPower: number[];
  /** False at the frequencies where the gain from the input is 0 (input-referred noise undefined). */
  inDefined: boolean[];
  /** The input source's unit: the input-referred figures are volts or amperes. */
  inUnit: 'V' | 'A';
}

type Fn = (...args: unknown[]) => unknown;

/** A real number from mathjs (a number, or a complex with no imaginary part). */
function realArg(fn: string, what: string, x: unknown): number {
  const z = typeof x === 'number' ? cx(x) : typeof x === 'object' && x !== null && 're' in x && 'im' in x ? (x as { re: number; im: number }) : undefined;
  if (!z || !isEffectivelyReal(z) || !Number.isFinite(z.re)) throw new MeasureError(`${fn}(): the ${what} must be a real number.`, `write e.g. ${fn === 'noise_out' || fn === 'noise_in' ? `${fn}(1k)` : `${fn}(20, 20k)`}`);
  return z.re;
}

/** The noise functions over the run's noise data that `read` gives at each call (absent: they say what is missing). */
export function noiseFunctions(read: () => { noise?: NoiseMeasureData; failed?: ReadonlySet<string> }): Record<string, Fn> {
  const need = (fn: string): NoiseMeasureData => {
    const { noise, failed } = read();
    if (!noise && failed?.has('noise')) throw new FollowOnError('analyze noise');
    if (!noise) throw new MeasureError(`${fn}() needs a noise analysis.`, 'add e.g. `analyze noise out outa in va from 10 Hz to 10 MHz per decade 10`');
    return noise;
  };
  const band = (data: NoiseMeasureData) => `${formatSi(data.freqHz[0], 'Hz')} to ${formatSi(data.freqHz[data.freqHz.length - 1], 'Hz')}`;
  const frequency = (fn: string, data: NoiseMeasureData, x: unknown): number => {
    const f = realArg(fn, 'frequency', x);
    if (!inBand(data.freqHz, f)) throw new MeasureError(`${fn}(${formatSi(f, 'Hz')}): the frequency is outside the noise sweep (${band(data)}).`);
    return f;
  };
  /** The band of an rms function: the whole sweep, or (f1, f2) inside it. */
  const limits = (fn: string, data: NoiseMeasureData, args: unknown[]): [number, number] => {
    if (args.length === 0) return [data.freqHz[0], data.freqHz[data.freqHz.length - 1]];
    if (args.length !== 2) throw new MeasureError(`${fn}() takes no argument (the whole sweep) or a band f1, f2.`, `write ${fn}() or ${fn}(20, 20k)`);
    const f1 = frequency(fn, data, args[0]);
    const f2 = frequency(fn, data, args[1]);
    if (!(f2 > f1)) throw new MeasureError(`${fn}(): the band must run from a lower to a higher frequency.`);
    return [f1, f2];
  };
  /** Refuses an input-referred figure that would read a point where it is undefined. */
  const defined = (fn: string, data: NoiseMeasureData, f1: number, f2: number): void => {
    const f = data.freqHz;
    // The grid points that shape [f1, f2]: from the last at or below f1 to the first at or above f2.
    let lo = 0;
    while (lo + 1 < f.length && f[lo + 1] <= f1) lo++;
    let hi = f.length - 1;
    while (hi > 0 && f[hi - 1] >= f2) hi--;
    for (let k = lo; k <= hi; k++) {
      if (!data.inDefined[k]) {
        throw new MeasureError(`${fn}(): the input-referred noise is undefined at ${formatSi(f[k], 'Hz')}: the input source does not reach the output there.`, 'use noise_out, or a band where the input reaches the output');
      }
    }
  };

  return {
    noise_out: (...args) => {
      if (args.length !== 1) throw new MeasureError('noise_out() takes one frequency.', 'write noise_out(1k)');
      const data = need('noise_out');
      return Math.sqrt(powerAt(data.freqHz, data.outPower, frequency('noise_out', data, args[0])));
    },
    noise_in: (...args) => {
      if (args.length !== 1) throw new MeasureError('noise_in() takes one frequency.', 'write noise_in(1k)');
      const data = need('noise_in');
      const f = frequency('noise_in', data, args[0]);
      defined('noise_in', data, f, f);
      return Math.sqrt(powerAt(data.freqHz, data.inPower, f));
    },
    noise_out_rms: (...args) => {
      const data = need('noise_out_rms');
      const [f1, f2] = limits('noise_out_rms', data, args);
      return Math.sqrt(bandPower(data.freqHz, data.outPower, f1, f2));
    },
    noise_in_rms: (...args) => {
      const data = need('noise_in_rms');
      const [f1, f2] = limits('noise_in_rms', data, args);
      defined('noise_in_rms', data, f1, f2);
      return Math.sqrt(bandPower(data.freqHz, data.inPower, f1, f2));
    },
  };
}
