/**
 * The language's words in one table (netlist-language.md §2–§3): statement keywords, analyses,
 * the result functions of measures and checks, the ports figures and the per-device quantities,
 * each with its syntax or unit and a one-line doc. The parser, the measure evaluator, the text
 * report and the editor's completion all read these tables instead of keeping lists of their own,
 * so a word added here is known everywhere at once.
 */

/** Canonical units a value may carry; `''` means a plain number (a `%` is still accepted). */
export type QuantityUnit = 'V' | 'A' | '\u03a9' | 'F' | 'H' | 'Hz' | 's' | 'S' | '%' | '';

/** One statement keyword: how a line starting with it reads. */
export interface StatementSpec {
  keyword: string;
  /** The line's shape, e.g. `param NAME = VALUE`. */
  syntax: string;
  doc: string;
  /** Allowed inside `block … end`. */
  inBlock: boolean;
}

/** Statement keywords (§2, §3), in the order the language page introduces them. */
export const STATEMENTS: readonly StatementSpec[] = [
  { keyword: 'title', syntax: 'title TEXT', doc: 'free text shown with the results', inBlock: false },
  { keyword: 'param', syntax: 'param NAME = VALUE', doc: 'a parameter; may use earlier ones', inBlock: true },
  { keyword: 'option', syntax: 'option NAME = VALUE', doc: 'a solver option: temp, rel_tol, abs_tol, min_g, max_iter', inBlock: false },
  { keyword: 'model', syntax: 'model NAME: KIND(key=value, …)', doc: 'a device model: npn, pnp, nmos, pmos or diode', inBlock: true },
  { keyword: 'block', syntax: 'block NAME(pins) … end', doc: 'a block (subcircuit) with named pins', inBlock: true },
  { keyword: 'end', syntax: 'end', doc: 'closes a block', inBlock: true },
  { keyword: 'use', syntax: 'use path@version', doc: 'a vetted block from the library, pinned to a version', inBlock: false },
  { keyword: 'analyze', syntax: 'analyze ac | transfer | …', doc: 'asks for an analysis beyond the DC operating point', inBlock: false },
  { keyword: 'ports', syntax: 'ports in=(a, b) out=(x, y)', doc: 'the differential ports: two drive sources, one or two outputs', inBlock: false },
  { keyword: 'measure', syntax: 'measure NAME = EXPRESSION', doc: 'a named figure computed from the results', inBlock: false },
  { keyword: 'check', syntax: 'check EXPRESSION >= LIMIT', doc: 'a spec check: passes or fails with its margin', inBlock: false },
];

/** The analysis keywords of `analyze`. */
export type AnalysisKind = 'ac' | 'transfer' | 'vary' | 'temp' | 'noise' | 'mismatch' | 'sensitivity' | 'poles';

/** One analysis: its keyword, the line that asks for it and what it does. */
export interface AnalysisSpec {
  kind: AnalysisKind;
  /** A complete example line. */
  syntax: string;
  /** What follows the keyword, in words, for completion. */
  detail: string;
  doc: string;
  /** A netlist asks for it once: a further line is ignored with a warning. */
  once?: boolean;
}

export const ANALYSIS_SPECS: readonly AnalysisSpec[] = [
  { kind: 'ac', syntax: 'analyze ac from 10 Hz to 1 GHz per decade 20', detail: 'from 10 Hz to 1 GHz per decade 20', doc: 'small-signal sweep over frequency', once: true },
  { kind: 'transfer', syntax: 'analyze transfer va from -100m to 100m step 1m', detail: 'SOURCE from -100m to 100m step 1m', doc: 'DC transfer curve: one source\'s DC value swept', once: true },
  { kind: 'vary', syntax: 'analyze vary rt over 1k 10k 100k', detail: 'PARAM over … | from … to … per decade N', doc: 're-runs the other analyses per parameter value', once: true },
  { kind: 'temp', syntax: 'analyze temp over -40 27 125', detail: 'over -40 27 125', doc: 're-runs the other analyses per temperature (°C)', once: true },
  { kind: 'noise', syntax: 'analyze noise out outa in va from 10 Hz to 10 MHz per decade 10', detail: 'out NODE [REF] in SOURCE from … to … per decade N', doc: 'output and input-referred noise density, and each part\'s share of it', once: true },
  { kind: 'mismatch', syntax: 'analyze mismatch runs 500 seed 7 beta 5% is 2% res 0.5%', detail: 'runs 500 seed 7 beta 5% is 2% res 0.5%', doc: 'Monte Carlo spreads of the ports figures and measures', once: true },
  { kind: 'sensitivity', syntax: 'analyze sensitivity', detail: 'what moves each figure most', doc: 'normalised sensitivities of the ports figures and measures to every part value and device parameter', once: true },
  { kind: 'poles', syntax: 'analyze poles', detail: '[out NODE]', doc: 'natural frequencies of the linearised circuit (sources zeroed) and the zeros of its transfer', once: true },
];

/** Mismatch keys: what each 1-sigma spread of `analyze mismatch` applies to. */
export const MISMATCH_KEYS = ['beta', 'is', 'va', 'vth', 'ucox', 'lambda', 'res', 'cap'];

/** The ports figures: names that mean something in every expression once `ports` is given. */
export interface FigureSpec {
  name: string;
  doc: string;
  /** Inside at/corner/unity/margin the name stands for its curve over the ac sweep. */
  curve: boolean;
}

export const FIGURES: readonly FigureSpec[] = [
  { name: 'adm', doc: 'differential gain vod/vid', curve: true },
  { name: 'acm', doc: 'common-mode gain voc/vic', curve: true },
  { name: 'cmrr', doc: '|adm/acm|', curve: true },
  { name: 'cmrr_db', doc: '20·log10(cmrr)', curve: false },
];

/** Device families whose operating point the language reads. */
export type DeviceFamily = 'bjt' | 'mos';

/** One per-device quantity: a field of the operating point, its unit and what it is. */
export interface QuantitySpec {
  name: string;
  unit: QuantityUnit;
  doc: string;
}

const OHM = '\u03a9' as const;

/**
 * Every field of a device's operating point that the results carry, with its unit. The report
 * prints them; the measurable ones (MEASURABLE) are also result functions.
 */
export const DEVICE_FIELDS: Record<string, QuantitySpec> = {
  ic: { name: 'ic', unit: 'A', doc: 'collector current' },
  ib: { name: 'ib', unit: 'A', doc: 'base current' },
  ie: { name: 'ie', unit: 'A', doc: 'emitter current' },
  vbe: { name: 'vbe', unit: 'V', doc: 'base-emitter voltage' },
  vce: { name: 'vce', unit: 'V', doc: 'collector-emitter voltage' },
  gm: { name: 'gm', unit: 'S', doc: 'transconductance' },
  rpi: { name: 'rpi', unit: OHM, doc: 'small-signal input resistance rπ' },
  ro: { name: 'ro', unit: OHM, doc: 'small-signal output resistance' },
  cpi: { name: 'cpi', unit: 'F', doc: 'base-emitter capacitance Cπ' },
  cmu: { name: 'cmu', unit: 'F', doc: 'base-collector capacitance Cμ' },
  rb: { name: 'rb', unit: OHM, doc: 'base resistance' },
  id: { name: 'id', unit: 'A', doc: 'drain current (a diode: its current)' },
  vgs: { name: 'vgs', unit: 'V', doc: 'gate-source voltage' },
  vds: { name: 'vds', unit: 'V', doc: 'drain-source voltage' },
  vov: { name: 'vov', unit: 'V', doc: 'overdrive voltage vgs − vth' },
  vth: { name: 'vth', unit: 'V', doc: 'threshold voltage' },
  gds: { name: 'gds', unit: 'S', doc: 'output conductance' },
  gmb: { name: 'gmb', unit: 'S', doc: 'body transconductance' },
  cgs: { name: 'cgs', unit: 'F', doc: 'gate-source capacitance' },
  cgd: { name: 'cgd', unit: 'F', doc: 'gate-drain capacitance' },
  vd: { name: 'vd', unit: 'V', doc: 'diode voltage' },
  gd: { name: 'gd', unit: 'S', doc: 'diode conductance' },
  cj: { name: 'cj', unit: 'F', doc: 'junction capacitance' },
};

/** The quantities a measure may read per device family, in the order messages list them. */
export const MEASURABLE: Record<DeviceFamily, readonly string[]> = {
  bjt: ['ic', 'ib', 'ie', 'vbe', 'vce', 'gm', 'rpi', 'ro', 'cpi', 'cmu'],
  mos: ['id', 'vgs', 'vds', 'vov', 'gm', 'gds'],
};

/**
 * What a result function's first argument is: a name of a node, a part, a bipolar or MOS
 * transistor, either transistor, an independent source; a curve; or a plain value.
 */
export type ArgumentKind = 'node' | 'part' | 'bjt' | 'mos' | 'device' | 'source' | 'curve' | 'value';

/** One function a measure or check expression may call. */
export interface FunctionSpec {
  name: string;
  arg: ArgumentKind;
  /** Unit of the result (`''` plain or the unit of its argument; `dB`, `°` as written). */
  unit: string;
  /** One line for completion and reference: what it returns. */
  doc: string;
  /** How many leading arguments are names (quoted for mathjs): 2 for v(a, b) and ac(a, b). */
  names: number;
  /** A further optional argument after the names (zin, zout: a frequency). */
  optional?: 'frequency';
}

/** Names of the arguments that are names, by kind. */
const NAMED: ReadonlySet<ArgumentKind> = new Set(['node', 'part', 'bjt', 'mos', 'device', 'source']);

function deviceFunctions(): FunctionSpec[] {
  const seen = new Set<string>();
  const out: FunctionSpec[] = [];
  for (const name of [...MEASURABLE.bjt, ...MEASURABLE.mos]) {
    if (seen.has(name)) continue;
    seen.add(name);
    const inBjt = MEASURABLE.bjt.includes(name);
    const inMos = MEASURABLE.mos.includes(name);
    const arg: ArgumentKind = inBjt && inMos ? 'device' : inBjt ? 'bjt' : 'mos';
    const field = DEVICE_FIELDS[name];
    out.push({ name, arg, unit: field.unit, doc: `${field.doc} of ${arg === 'bjt' ? 'a bipolar transistor' : arg === 'mos' ? 'a MOS transistor' : 'a transistor'}`, names: 1 });
  }
  return out;
}

/**
 * The result functions (§3), in the order "did you mean" considers them: the operating point,
 * the devices, impedances and curves, then plain math.
 */
export const FUNCTIONS: readonly FunctionSpec[] = [
  { name: 'v', arg: 'node', unit: 'V', doc: 'DC volts of a node, v(n) or v(a, b)', names: 2 },
  { name: 'i', arg: 'part', unit: 'A', doc: 'DC amps through a part or source', names: 1 },
  ...deviceFunctions(),
  { name: 'zin', arg: 'source', unit: OHM, doc: 'impedance seen by a source', names: 1, optional: 'frequency' },
  { name: 'zout', arg: 'node', unit: OHM, doc: 'impedance from a node to ground', names: 1, optional: 'frequency' },
  { name: 'ac', arg: 'node', unit: 'V', doc: 'small-signal curve of a node', names: 2 },
  { name: 'noise_out', arg: 'value', unit: 'V/√Hz', doc: 'noise_out(f): output noise density at f (analyze noise)', names: 0 },
  { name: 'noise_in', arg: 'value', unit: 'V/√Hz', doc: 'noise_in(f): input-referred noise density at f (A/√Hz for a current-source input)', names: 0 },
  { name: 'noise_out_rms', arg: 'value', unit: 'V', doc: 'rms output noise over the noise sweep, or over a band: noise_out_rms(f1, f2)', names: 0 },
  { name: 'noise_in_rms', arg: 'value', unit: 'V', doc: 'rms input-referred noise over the noise sweep, or over a band: noise_in_rms(f1, f2) (A for a current-source input)', names: 0 },
  { name: 'pole', arg: 'value', unit: 'Hz', doc: 'pole(k): |s|/2π of the k-th pole from the slowest, a conjugate pair counted once (analyze poles)', names: 0 },
  { name: 'zero', arg: 'value', unit: 'Hz', doc: 'zero(k): |s|/2π of the k-th zero from the slowest, a conjugate pair counted once (analyze poles)', names: 0 },
  { name: 'db', arg: 'value', unit: 'dB', doc: '20·log10 of a magnitude', names: 0 },
  { name: 'mag', arg: 'value', unit: '', doc: 'magnitude', names: 0 },
  { name: 'phase', arg: 'value', unit: '°', doc: 'phase in degrees', names: 0 },
  { name: 'at', arg: 'curve', unit: '', doc: 'at(curve, f): a curve at a frequency', names: 0 },
  { name: 'corner', arg: 'curve', unit: 'Hz', doc: '−3 dB frequency of a curve', names: 0 },
  { name: 'unity', arg: 'curve', unit: 'Hz', doc: 'frequency where |curve| crosses 1', names: 0 },
  { name: 'margin', arg: 'curve', unit: '°', doc: '180° + phase at the unity crossing', names: 0 },
  { name: 'min', arg: 'value', unit: '', doc: 'smallest of', names: 0 },
  { name: 'max', arg: 'value', unit: '', doc: 'largest of', names: 0 },
  { name: 'abs', arg: 'value', unit: '', doc: 'absolute value', names: 0 },
  { name: 'sqrt', arg: 'value', unit: '', doc: 'square root', names: 0 },
  { name: 'log10', arg: 'value', unit: '', doc: 'decimal logarithm', names: 0 },
  { name: 'log', arg: 'value', unit: '', doc: 'natural logarithm', names: 0 },
  { name: 'exp', arg: 'value', unit: '', doc: 'e to the power of', names: 0 },
  { name: 'pow', arg: 'value', unit: '', doc: 'pow(x, y): x to the power y', names: 0 },
];

/** A function by name, or undefined. */
export function functionSpec(name: string): FunctionSpec | undefined {
  return FUNCTIONS.find((f) => f.name === name);
}

/** True when the function's first argument is a name (a node, part, device or source). */
export function takesNames(spec: FunctionSpec): boolean {
  return NAMED.has(spec.arg);
}

/** Statement keywords, for the parser and "did you mean". */
export const KEYWORDS: readonly string[] = STATEMENTS.map((s) => s.keyword);
/** Analysis keywords, in the language's order. */
export const ANALYSES: readonly AnalysisKind[] = ANALYSIS_SPECS.map((a) => a.kind);
/** The ports figures' names. */
export const BUILTIN_FIGURES: readonly string[] = FIGURES.map((f) => f.name);
/** The figures that stand for their curves inside curve functions. */
export const PORTS_CURVE_NAMES: readonly string[] = FIGURES.filter((f) => f.curve).map((f) => f.name);
/** Functions whose first argument is a curve. */
export const CURVE_FUNCTIONS: readonly string[] = FUNCTIONS.filter((f) => f.arg === 'curve').map((f) => f.name);
/** Result functions whose name arguments are quoted for mathjs. */
export const RESULT_FUNCTIONS: ReadonlySet<string> = new Set(FUNCTIONS.filter(takesNames).map((f) => f.name));
/** Every function a measure or check may call. */
export const MEASURE_FUNCTIONS: ReadonlySet<string> = new Set(FUNCTIONS.map((f) => f.name));
/** Device quantities of the bipolar family only, and of the MOS family only (gm is both). */
export const BJT_ONLY: ReadonlySet<string> = new Set(FUNCTIONS.filter((f) => f.arg === 'bjt').map((f) => f.name));
export const MOS_ONLY: ReadonlySet<string> = new Set(FUNCTIONS.filter((f) => f.arg === 'mos').map((f) => f.name));

/** Pins of the built-in part kinds, in words. */
export const PIN_DOCS: Record<string, string> = {
  a: 'anode / first terminal', b: 'base / body / second terminal', c: 'collector', e: 'emitter', d: 'drain', g: 'gate', s: 'source', k: 'cathode',
  p: 'positive terminal', n: 'negative terminal', from: 'current leaves here', to: 'current enters here', cp: 'positive control', cn: 'negative control',
};
