/**
 * Junction diode: Shockley equation ID = IS·(exp(VD/(n·VT)) − 1), no breakdown, no series
 * resistance; a constant junction capacitance in the small-signal model.
 */
import type { Diode } from '../circuit/types';
import { criticalVoltage, expm1Value, expSlope } from './junction';
import { saturationCurrentAt, thermalVoltage } from './temperature';

/** A diode's parameters at the analysis temperature. */
export interface DiodeParams {
  /** IS(T)·area in A. */
  is: number;
  /** n·VT in V. */
  nvt: number;
  /** Critical voltage for step limiting. */
  vcrit: number;
  /** Junction capacitance in F (cj·area). */
  cj: number;
}

/** Current and conductance of a diode at one junction voltage. */
export interface DiodeEval {
  /** Current anode → cathode in A. */
  id: number;
  /** dID/dVD in S. */
  gd: number;
}

/** Resolves a diode part's model at `tempC`. */
export function diodeParams(part: Diode, tempC: number): DiodeParams {
  const m = part.model;
  const is = saturationCurrentAt(m.is, m.eg, m.pt, tempC) * part.area;
  const nvt = m.n * thermalVoltage(tempC);
  return { is, nvt, vcrit: criticalVoltage(nvt, is), cj: m.cj * part.area };
}

/** Evaluates the Shockley equation and its exact derivative at `vd` (anode − cathode). */
export function evalDiode(p: DiodeParams, vd: number, out: DiodeEval): DiodeEval {
  const arg = vd / p.nvt;
  out.id = p.is * expm1Value(arg);
  out.gd = (p.is * expSlope(arg)) / p.nvt;
  return out;
}
