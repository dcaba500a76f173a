/**
 * The pn-junction exponential and the Newton step limits that keep it tractable.
 *
 * `limitJunctionStep` is the classic pn-junction voltage limiting of L. W. Nagel's 1975 thesis
 * (UC Berkeley ERL-M520): above the critical voltage, a Newton step on a junction voltage is
 * replaced by the step that the logarithm of the predicted current would take, so an
 * exponential never sees a jump of more than a few thermal voltages.
 */

/** Exponent beyond which exp() continues as its tangent line: keeps currents finite on wild iterates. */
const MAX_EXPONENT = 80;
const EXP_AT_MAX = Math.exp(MAX_EXPONENT);

/**
 * exp(arg), continued as its tangent line above arg = 80 so value and slope stay continuous and
 * finite. A real junction never gets there (IS·e^80 is amperes by the 1e19); Newton iterates can.
 */
export function expValue(arg: number): number {
  return arg <= MAX_EXPONENT ? Math.exp(arg) : EXP_AT_MAX * (1 + (arg - MAX_EXPONENT));
}

/**
 * exp(arg) − 1 with the same continuation, computed with expm1 so currents near 0 V keep full
 * relative precision (KCL at a node at 0 V balances to the last bit, not to the roundoff of 1).
 */
export function expm1Value(arg: number): number {
  return arg <= MAX_EXPONENT ? Math.expm1(arg) : EXP_AT_MAX * (1 + (arg - MAX_EXPONENT)) - 1;
}

/** d/d(arg) of {@link expValue}. */
export function expSlope(arg: number): number {
  return arg <= MAX_EXPONENT ? Math.exp(arg) : EXP_AT_MAX;
}

/**
 * Critical voltage of a junction, nVT·ln(nVT/(√2·IS)): where the exponential's curvature makes
 * plain Newton steps unsafe (Nagel 1975).
 */
export function criticalVoltage(nvt: number, is: number): number {
  return nvt * Math.log(nvt / (Math.SQRT2 * is));
}

/**
 * Limits a Newton update of a junction voltage from `vOld` to `vNew` (Nagel 1975).
 * Returns the voltage to evaluate the junction at.
 */
export function limitJunctionStep(vNew: number, vOld: number, nvt: number, vCrit: number): number {
  if (vNew > vCrit && Math.abs(vNew - vOld) > 2 * nvt) {
    if (vOld > 0) {
      const arg = 1 + (vNew - vOld) / nvt;
      return arg > 0 ? vOld + nvt * Math.log(arg) : vCrit;
    }
    return nvt * Math.log(vNew / nvt);
  }
  return vNew;
}

/** Caps a Newton step of a MOS control voltage (gate–source, gate–drain) at ±maxStep volts. */
export function limitVoltageStep(vNew: number, vOld: number, maxStep: number): number {
  const d = vNew - vOld;
  if (d > maxStep) return vOld + maxStep;
  if (d < -maxStep) return vOld - maxStep;
  return vNew;
}
