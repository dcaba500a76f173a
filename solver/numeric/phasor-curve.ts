/**
 * A frequency response as reported: the phasors of a sweep turned into magnitude, dB and a phase
 * unwrapped so that it is continuous across ±180°. The curve's shape is declared here, with the
 * arithmetic that builds it; the result contract (circuit/result.ts) names it from here.
 */
import { decibels, magnitude, phaseDeg, type Phasor } from './complex';

/** One response over the sweep's frequencies. */
export interface Curve {
  mag: number[];
  /** Magnitude in dB (20·log10). */
  db: number[];
  phase_deg: number[];
}

/** Builds a curve from phasors, unwrapping the phase so it is continuous across ±180°. */
export function curveFromPhasors(values: Phasor[]): Curve {
  const mag = values.map(magnitude);
  const db = mag.map(decibels);
  const phase_deg = unwrapDegrees(values.map(phaseDeg));
  return { mag, db, phase_deg };
}

/** Removes 360° jumps between consecutive samples. */
export function unwrapDegrees(wrapped: number[]): number[] {
  const out: number[] = [];
  let offset = 0;
  for (let k = 0; k < wrapped.length; k++) {
    if (k > 0) {
      const step = wrapped[k] + offset - out[k - 1];
      if (step > 180) offset -= 360 * Math.round(step / 360);
      else if (step < -180) offset += 360 * Math.round(-step / 360);
    }
    out.push(wrapped[k] + offset);
  }
  return out;
}
