/**
 * Temperature dependence shared by the junction devices: thermal voltage and saturation current.
 *
 * Constants are the exact SI (2019 redefinition, CODATA 2018) values.
 */

/** Boltzmann constant k in J/K (exact, SI 2019). */
export const BOLTZMANN = 1.380649e-23;
/** Elementary charge q in C (exact, SI 2019). */
export const ELEMENTARY_CHARGE = 1.602176634e-19;
/** 0 °C in kelvin. */
export const ZERO_CELSIUS_K = 273.15;
/** Nominal temperature of the model parameters: 27 °C. */
export const NOMINAL_TEMP_K = 300.15;

/** Absolute temperature in K for a temperature in °C. */
export function kelvin(tempC: number): number {
  return tempC + ZERO_CELSIUS_K;
}

/** Thermal voltage VT = k·T/q in volts at `tempC` °C. */
export function thermalVoltage(tempC: number): number {
  return (BOLTZMANN * kelvin(tempC)) / ELEMENTARY_CHARGE;
}

/**
 * Saturation current at `tempC`: IS(T) = IS·(T/T0)^pt·exp((q·eg/k)·(1/T0 − 1/T)), T0 = 300.15 K.
 * `eg` is the band gap in eV, `pt` the temperature exponent.
 */
export function saturationCurrentAt(is: number, eg: number, pt: number, tempC: number): number {
  const t = kelvin(tempC);
  const ratio = t / NOMINAL_TEMP_K;
  return is * Math.pow(ratio, pt) * Math.exp(((ELEMENTARY_CHARGE * eg) / BOLTZMANN) * (1 / NOMINAL_TEMP_K - 1 / t));
}
