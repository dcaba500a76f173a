/**
 * The solver's result: exactly the JSON object of the netlist-language contract §5.
 * All numbers are finite, in SI base units; frequencies in Hz, phases in degrees.
 */
import type { ComplexFigure } from '../numeric/complex';
import type { SampleStats } from '../numeric/stats';
import type { Curve } from '../numeric/phasor-curve';
import type { Diagnostic } from './diagnostic';

// The figure and the curve are declared beside the arithmetic that builds them (numeric/).
export type { ComplexFigure, Curve };

export interface BjtOp {
  kind: 'npn' | 'pnp';
  region: 'active' | 'saturated' | 'cutoff' | 'reverse';
  ic: number; ib: number; ie: number; vbe: number; vce: number;
  gm: number; rpi: number; ro: number; cpi: number; cmu: number;
  /** Base resistance in the small-signal model (0 when absent). */
  rb: number;
}

export interface MosOp {
  kind: 'nmos' | 'pmos';
  region: 'saturation' | 'triode' | 'cutoff';
  id: number; vgs: number; vds: number; vov: number; vth: number;
  gm: number; gds: number; gmb: number; cgs: number; cgd: number;
}

export interface DiodeOp {
  kind: 'diode';
  region: 'forward' | 'reverse';
  id: number; vd: number; gd: number; cj: number;
}

export type DeviceOp = BjtOp | MosOp | DiodeOp;

export interface OpResult {
  nodes: Record<string, number>;
  /** Independent and controlled voltage sources: voltage p−n and current p→n through the source. */
  sources: Record<string, { v: number; i: number }>;
  /** Two-terminal passive parts and current sources: current a→b (from→to) and voltage a−b. */
  parts: Record<string, { i: number; v: number }>;
  devices: Record<string, DeviceOp>;
}

export interface PortsResult {
  at_hz: number;
  output: 'differential' | 'single-ended';
  adm: ComplexFigure;
  acm: ComplexFigure;
  cmrr: number;
  cmrr_db: number;
  /** The definitions used, in words, for reports. */
  conventions: string;
}

export interface AcResult {
  freq_hz: number[];
  curves: Record<string, Curve>;
}

export interface TransferResult {
  source: string;
  x: number[];
  curves: Record<string, number[]>;
}

/**
 * `analyze noise`: densities over the noise sweep. `out_density` is the total noise at the output
 * (V/√Hz); `in_density` is out_density/|H|, H the transfer from the `in` source (1 V or 1 A, the
 * other sources zeroed) to the output — V/√Hz for a voltage source, A/√Hz for a current source;
 * 0 where H is 0 (a warning names those frequencies). `contributors.<part>` is each noisy part's
 * share of the output density, so Σ contributors² = out_density² at every frequency.
 */
export interface NoiseResult {
  /** The output node. */
  out: string;
  /** The reference node when one was written (`out outa outb`): the output is then v(out) − v(out_ref). */
  out_ref?: string;
  /** The input source. */
  in: string;
  freq_hz: number[];
  out_density: number[];
  in_density: number[];
  contributors: Record<string, number[]>;
}

/**
 * One pole or zero: the complex frequency s/2π in Hz. `q` = |s|/(−2·Re s) is given for a
 * complex one only (a conjugate pair shares it; negative in the right half-plane).
 */
export interface PoleZero {
  re: number;
  im: number;
  q?: number;
}

/**
 * `analyze poles`: the natural frequencies of the circuit linearised at its operating point,
 * every independent source zeroed, and the zeros of the ports' adm (or of the transfer to the
 * `out` node), each list sorted by |s|, a conjugate pair with im > 0 first.
 */
export interface PolesResult {
  poles_hz: PoleZero[];
  zeros_hz: PoleZero[];
  /** Whose zeros `zeros_hz` holds (`adm`, or `v(out)/vin`); absent when none were asked for. */
  zeros_of?: string;
  /** The definitions used, in words, for reports. */
  conventions: string;
}

export interface CheckResult {
  text: string;
  pass: boolean;
  value: number;
  /** The limit the value is compared against (the centre for `=`). */
  limit: number;
  /** Signed distance to failing, in the value's units: positive passes. */
  margin: number;
  line: number;
}

export interface SolveResult {
  title: string;
  temp_c: number;
  op?: OpResult;
  ports?: PortsResult;
  ac?: AcResult;
  transfer?: TransferResult;
  noise?: NoiseResult;
  poles?: PolesResult;
  vary?: VaryResult;
  temp?: TempResult;
  mismatch?: MismatchResult;
  sensitivity?: SensitivityResult;
  measures: Record<string, number>;
  checks: CheckResult[];
  warnings: Diagnostic[];
  errors: Diagnostic[];
  // Later analyses (noise, mismatch, poles) add typed optional members of their own, named by
  // their keyword, as solver/run/ gains them.
}

/**
 * One value of a sweep: the members a plain solve would have at that value (the transfer curve
 * is not re-run per value). `errors` holds why the circuit did not solve there, if it did not.
 */
export interface SweepRun {
  op?: OpResult;
  ports?: PortsResult;
  ac?: AcResult;
  noise?: NoiseResult;
  poles?: PolesResult;
  measures: Record<string, number>;
  checks: CheckResult[];
  errors?: { line: number; col: number; message: string }[];
}

/** `analyze vary PARAM …`: `runs[i]` at `values[i]`. */
export interface VaryResult {
  param: string;
  values: number[];
  runs: SweepRun[];
}

/**
 * `analyze mismatch`: statistics and samples by name — `adm`, `acm` (signed real at 0 Hz, else
 * magnitude), `cmrr_db`, `vos` (with ports) and every measure — over the runs that solved.
 */
export interface MismatchResult {
  runs: number;
  seed: number;
  stats: Record<string, SampleStats>;
  samples: Record<string, number[]>;
  /** Fraction of the solved runs in which every check passes. */
  yield: number;
  /** Runs whose operating point did not solve (left out of the statistics). */
  failed_runs: number;
}

/**
 * `analyze sensitivity`: by figure name, the normalised sensitivities (∂F/F)/(∂x/x) to each part
 * value or device parameter (`target` a part, or `model NAME` for a shared model), largest first.
 */
export interface SensitivityResult {
  /** The relative step of the central differences. */
  step: number;
  figures: Record<string, { target: string; param: string; s: number }[]>;
}

/** `analyze temp over …`: `runs[i]` at `values_c[i]` °C. */
export interface TempResult {
  values_c: number[];
  runs: SweepRun[];
}
