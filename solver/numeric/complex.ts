/**
 * Small complex-number helpers shared by the engine, ports, measures and curves. Phasors are
 * plain `{ re, im }` pairs; reported figures add magnitude, dB and phase. The figure's shape is
 * declared here, with the arithmetic that builds it, so that numeric/ needs no other stage; the
 * result contract (circuit/result.ts) names it from here.
 */

/** A complex number: the engine's small-signal values (node voltages, branch currents, gains). */
export interface Phasor { re: number; im: number }

/** A complex figure as reported: rectangular and polar. */
export interface ComplexFigure {
  re: number;
  im: number;
  mag: number;
  db: number;
  phase_deg: number;
}

/**
 * Magnitudes below this are reported as this many dB (−300 dB) instead of −∞: an ideal,
 * perfectly symmetric circuit has a common-mode gain of exactly 0, and JSON has no −∞.
 */
export const MAG_FLOOR = 1e-15;
export const DB_FLOOR = 20 * Math.log10(MAG_FLOOR);

export function magnitude(z: Phasor): number {
  return Math.hypot(z.re, z.im);
}

/** 20·log10|z|, floored at DB_FLOOR. */
export function decibels(mag: number): number {
  return 20 * Math.log10(Math.max(Math.abs(mag), MAG_FLOOR));
}

/** Phase in degrees in (−180, 180]. */
export function phaseDeg(z: Phasor): number {
  if (z.re === 0 && z.im === 0) return 0;
  const deg = (Math.atan2(z.im, z.re) * 180) / Math.PI;
  return deg === -180 ? 180 : deg;
}

export function cx(re: number, im = 0): Phasor {
  return { re, im };
}

export function cadd(a: Phasor, b: Phasor): Phasor {
  return { re: a.re + b.re, im: a.im + b.im };
}

export function csub(a: Phasor, b: Phasor): Phasor {
  return { re: a.re - b.re, im: a.im - b.im };
}

export function cscale(a: Phasor, k: number): Phasor {
  return { re: a.re * k, im: a.im * k };
}

export function cdiv(a: Phasor, b: Phasor): Phasor {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}

/** The phasor from magnitude and phase in degrees. */
export function fromPolar(mag: number, deg: number): Phasor {
  const rad = (deg * Math.PI) / 180;
  return { re: mag * Math.cos(rad), im: mag * Math.sin(rad) };
}

/**
 * True when the imaginary part is zero to within rounding. At 0 Hz the engine's arithmetic is
 * real in exact terms but may leave an imaginary residue of a few ulps; such a value is real.
 */
export function isEffectivelyReal(z: Phasor): boolean {
  return Math.abs(z.im) <= 1e-12 * Math.abs(z.re) || Math.abs(z.im) < 1e-300;
}

/** The §5 complex figure. */
export function toFigure(z: Phasor): ComplexFigure {
  const real = isEffectivelyReal(z);
  const re = z.re;
  const im = real ? 0 : z.im;
  const mag = magnitude({ re, im });
  return { re, im, mag, db: decibels(mag), phase_deg: phaseDeg({ re, im }) };
}
