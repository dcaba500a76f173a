/**
 * The tables of §2: part kinds with their pins, main values, keys and a one-line doc; model kinds
 * with their parameters, units and built-in defaults; solver options. The parser and elaborator
 * read them, and so does the editor's completion.
 */
import type { BjtModel, DiodeModel, MosModel, PartKind, SolverOptions } from '../circuit/types';
import type { QuantityUnit } from './vocabulary';

/** How a value must relate to zero. */
export type Range = 'positive' | 'nonnegative' | 'nonzero' | 'any' | 'integer';

export interface KeySpec {
  unit: QuantityUnit;
  /** What the value is, for messages: "the emitter area". */
  what: string;
  range: Range;
}

export interface PartKindSpec {
  kind: PartKind;
  /** Pins in canonical order (also the order of first appearance of nodes). */
  pins: string[];
  /** Transistors and diodes: named pins only. */
  named: boolean;
  /** Pins that may be left out, and the pin whose node they take. */
  defaults?: Record<string, string>;
  /** The main value: a number in `unit`, or a model name. */
  main: { what: string; unit: QuantityUnit; range: Range; optional?: boolean } | 'model';
  keys: Record<string, KeySpec>;
  /** What the part is, with its connections: "resistor (a, b) Ω". */
  doc: string;
}

const OHM = '\u03a9' as const;

export const PART_KINDS: Record<PartKind, PartKindSpec> = {
  res: { kind: 'res', doc: 'resistor (a, b) Ω', pins: ['a', 'b'], named: false, main: { what: 'resistance', unit: OHM, range: 'positive' }, keys: {} },
  cap: { kind: 'cap', doc: 'capacitor (a, b) F', pins: ['a', 'b'], named: false, main: { what: 'capacitance', unit: 'F', range: 'nonnegative' }, keys: {} },
  ind: { kind: 'ind', doc: 'inductor (a, b) H', pins: ['a', 'b'], named: false, main: { what: 'inductance', unit: 'H', range: 'positive' }, keys: {} },
  vsrc: { kind: 'vsrc', doc: 'voltage source (p, n) V', pins: ['p', 'n'], named: false, main: { what: 'DC voltage', unit: 'V', range: 'any', optional: true }, keys: { ac: { unit: 'V', what: 'ac magnitude', range: 'any' } } },
  isrc: { kind: 'isrc', doc: 'current source (from, to) A', pins: ['from', 'to'], named: false, main: { what: 'DC current', unit: 'A', range: 'any', optional: true }, keys: { ac: { unit: 'A', what: 'ac magnitude', range: 'any' } } },
  vcvs: { kind: 'vcvs', doc: 'voltage-controlled voltage source (p, n, cp, cn)', pins: ['p', 'n', 'cp', 'cn'], named: false, main: { what: 'gain', unit: '', range: 'any' }, keys: {} },
  vccs: { kind: 'vccs', doc: 'voltage-controlled current source (from, to, cp, cn)', pins: ['from', 'to', 'cp', 'cn'], named: false, main: { what: 'transconductance', unit: 'S', range: 'any' }, keys: {} },
  npn: { kind: 'npn', doc: 'bipolar (c=, b=, e=)', pins: ['c', 'b', 'e'], named: true, main: 'model', keys: { area: { unit: '', what: 'emitter area', range: 'positive' } } },
  pnp: { kind: 'pnp', doc: 'bipolar (c=, b=, e=)', pins: ['c', 'b', 'e'], named: true, main: 'model', keys: { area: { unit: '', what: 'emitter area', range: 'positive' } } },
  nmos: {
    kind: 'nmos', doc: 'MOS (d=, g=, s=, b=)', pins: ['d', 'g', 's', 'b'], named: true, defaults: { b: 's' }, main: 'model',
    keys: { w: { unit: '', what: 'channel width (m)', range: 'positive' }, l: { unit: '', what: 'channel length (m)', range: 'positive' }, m: { unit: '', what: 'parallel multiplier', range: 'positive' } },
  },
  pmos: {
    kind: 'pmos', doc: 'MOS (d=, g=, s=, b=)', pins: ['d', 'g', 's', 'b'], named: true, defaults: { b: 's' }, main: 'model',
    keys: { w: { unit: '', what: 'channel width (m)', range: 'positive' }, l: { unit: '', what: 'channel length (m)', range: 'positive' }, m: { unit: '', what: 'parallel multiplier', range: 'positive' } },
  },
  diode: { kind: 'diode', doc: 'diode (a=, k=)', pins: ['a', 'k'], named: true, main: 'model', keys: { area: { unit: '', what: 'junction area', range: 'positive' } } },
};

/** Defaults for MOS geometry when `w=` / `l=` are absent: 1 µm by 1 µm (W/L = 1). */
export const DEFAULT_MOS_W = 1e-6;
export const DEFAULT_MOS_L = 1e-6;

export type ModelFamily = 'bjt' | 'mos' | 'diode';

export function modelFamily(kind: string): ModelFamily | undefined {
  if (kind === 'npn' || kind === 'pnp') return 'bjt';
  if (kind === 'nmos' || kind === 'pmos') return 'mos';
  if (kind === 'diode') return 'diode';
  return undefined;
}

/** Device kinds a `model` line may name. */
export const MODEL_KINDS = ['npn', 'pnp', 'nmos', 'pmos', 'diode'];

/** Model keys as written → field of the model type. */
export interface ModelKeySpec extends KeySpec { field: string }

export const MODEL_KEYS: Record<ModelFamily, Record<string, ModelKeySpec>> = {
  bjt: {
    is: { field: 'is', unit: 'A', what: 'saturation current', range: 'positive' },
    beta: { field: 'beta', unit: '', what: 'forward current gain', range: 'positive' },
    beta_r: { field: 'betaR', unit: '', what: 'reverse current gain', range: 'positive' },
    va: { field: 'va', unit: 'V', what: 'Early voltage', range: 'positive' },
    n: { field: 'n', unit: '', what: 'emission coefficient', range: 'positive' },
    rb: { field: 'rb', unit: OHM, what: 'base resistance', range: 'nonnegative' },
    cje: { field: 'cje', unit: 'F', what: 'base-emitter capacitance', range: 'nonnegative' },
    cjc: { field: 'cjc', unit: 'F', what: 'base-collector capacitance', range: 'nonnegative' },
    tauf: { field: 'tauf', unit: 's', what: 'forward transit time', range: 'nonnegative' },
    eg: { field: 'eg', unit: 'V', what: 'band gap (eV)', range: 'positive' },
    pt: { field: 'pt', unit: '', what: 'saturation-current temperature exponent', range: 'any' },
    flicker_corner: { field: 'flickerCorner', unit: 'Hz', what: 'flicker-noise corner frequency', range: 'nonnegative' },
  },
  mos: {
    ucox: { field: 'ucox', unit: '', what: 'process transconductance µ·Cox (A/V²)', range: 'positive' },
    vth: { field: 'vth', unit: 'V', what: 'threshold voltage', range: 'any' },
    lambda: { field: 'lambda', unit: '', what: 'channel-length modulation (1/V)', range: 'nonnegative' },
    gamma: { field: 'gamma', unit: '', what: 'body-effect coefficient (√V)', range: 'nonnegative' },
    phi: { field: 'phi', unit: 'V', what: 'surface potential 2φF', range: 'positive' },
    cgs: { field: 'cgs', unit: 'F', what: 'gate-source capacitance', range: 'nonnegative' },
    cgd: { field: 'cgd', unit: 'F', what: 'gate-drain capacitance', range: 'nonnegative' },
    flicker_corner: { field: 'flickerCorner', unit: 'Hz', what: 'flicker-noise corner frequency', range: 'nonnegative' },
  },
  diode: {
    is: { field: 'is', unit: 'A', what: 'saturation current', range: 'positive' },
    n: { field: 'n', unit: '', what: 'emission coefficient', range: 'positive' },
    cj: { field: 'cj', unit: 'F', what: 'junction capacitance', range: 'nonnegative' },
    eg: { field: 'eg', unit: 'V', what: 'band gap (eV)', range: 'positive' },
    pt: { field: 'pt', unit: '', what: 'saturation-current temperature exponent', range: 'any' },
    flicker_corner: { field: 'flickerCorner', unit: 'Hz', what: 'flicker-noise corner frequency', range: 'nonnegative' },
  },
};

export function defaultBjtModel(name: string): BjtModel {
  return { name, is: 1e-16, beta: 100, betaR: 1, va: Infinity, n: 1, rb: 0, cje: 0, cjc: 0, tauf: 0, eg: 1.12, pt: 3 };
}

export function defaultMosModel(name: string): MosModel {
  return { name, ucox: 100e-6, vth: 0.5, lambda: 0, gamma: 0, phi: 0.7, cgs: 0, cgd: 0 };
}

export function defaultDiodeModel(name: string): DiodeModel {
  return { name, is: 1e-14, n: 1, cj: 0, eg: 1.12, pt: 3 };
}

/** `option` names → SolverOptions fields. */
export const OPTION_KEYS: Record<string, KeySpec & { field: keyof SolverOptions }> = {
  temp: { field: 'temp', unit: '', what: 'temperature (°C)', range: 'any' },
  rel_tol: { field: 'relTol', unit: '', what: 'relative tolerance', range: 'positive' },
  abs_tol: { field: 'absTol', unit: 'V', what: 'absolute tolerance', range: 'positive' },
  min_g: { field: 'minG', unit: 'S', what: 'minimum conductance', range: 'nonnegative' },
  max_iter: { field: 'maxIter', unit: '', what: 'iteration limit', range: 'integer' },
};

/** Why `value` violates `range`, or undefined. */
export function rangeProblem(value: number, range: Range): string | undefined {
  switch (range) {
    case 'positive':
      return value > 0 ? undefined : 'must be greater than zero';
    case 'nonnegative':
      return value >= 0 ? undefined : 'must not be negative';
    case 'nonzero':
      return value !== 0 ? undefined : 'must not be zero';
    case 'integer':
      return Number.isInteger(value) && value >= 1 ? undefined : 'must be a whole number of at least 1';
    default:
      return undefined;
  }
}

/** "a" or "an" before a kind name as it is read aloud (an npn, an nmos, an isrc, a pnp, a res). */
export function article(kind: string): 'a' | 'an' {
  return /^(npn|nmos|isrc|ind|[aeiou])/.test(kind) ? 'an' : 'a';
}
