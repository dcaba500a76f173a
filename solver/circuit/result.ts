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
