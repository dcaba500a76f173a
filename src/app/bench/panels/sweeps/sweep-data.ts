/**
 * The figures of `analyze vary` and `analyze temp`, read once for the Sweeps tab: each value with
 * its label ("rt = 4.65 kΩ", "-40 °C"), its ports figures in dB, its measures, its checks and, where
 * the circuit did not solve, why. Free of the DOM, so the table, the measure plot and the overlaid
 * curves all read the same rows.
 */
import type { CheckResult, SolveResult, SweepRun } from '../../../../../solver';
import { formatSi, type Unit } from '../si-format';
import { checkParts } from '../units';

export type SweepKind = 'vary' | 'temp';

/** One value of the sweep and what the solver gave there. */
export interface SweepRow {
  index: number;
  value: number;
  /** The value alone: "4.65 kΩ", "-40 °C". */
  valueText: string;
  /** The value with its name, for legends and readouts: "rt = 4.65 kΩ", "-40 °C". */
  label: string;
  run: SweepRun;
  /** Why the circuit did not solve at this value; undefined when it did. */
  failure?: string;
  admDb?: number;
  acmDb?: number;
  cmrrDb?: number;
  passed: number;
  failedChecks: CheckResult[];
}

export interface SweepData {
  kind: SweepKind;
  /** The param's name, or "temperature". */
  name: string;
  /** Unit of the swept value: Ω when the param is a resistor's value, °C for temp, else none. */
  unit: string;
  rows: SweepRow[];
  /** Every measure some value has, in the netlist's order. */
  measures: string[];
  /** How many checks the netlist states. */
  checkCount: number;
}

/** The sweeps the result holds, in the order the tab offers them. */
export function sweepKinds(result: SolveResult | undefined): SweepKind[] {
  return [...(result?.vary ? ['vary' as const] : []), ...(result?.temp ? ['temp' as const] : [])];
}

/** The rows of one sweep of the result, or undefined when the result has no such sweep. */
export function sweepData(result: SolveResult | undefined, kind: SweepKind): SweepData | undefined {
  const vary = kind === 'vary' ? result?.vary : undefined;
  const temp = kind === 'temp' ? result?.temp : undefined;
  const values = vary?.values ?? temp?.values_c;
  const runs = vary?.runs ?? temp?.runs;
  if (!values || !runs) return undefined;
  const name = vary ? vary.param : 'temperature';
  const unit = vary ? paramUnit(vary.param, values, runs) : '°C';
  const rows = values.map((value, index): SweepRow => {
    const run = runs[index] ?? { measures: {}, checks: [] };
    const valueText = temp ? formatCelsius(value) : formatSi(value, unit);
    const failure = run.errors?.length ? run.errors.map((e) => e.message).join(' ') : undefined;
    return {
      index, value, valueText, run, failure,
      label: temp ? valueText : `${name} = ${valueText}`,
      admDb: run.ports?.adm.db, acmDb: run.ports?.acm.db, cmrrDb: run.ports?.cmrr_db,
      passed: run.checks.filter((c) => c.pass).length,
      failedChecks: run.checks.filter((c) => !c.pass),
    };
  });
  // The order of the netlist: a measure missing at one value (no corner there) keeps its place.
  const measures = [...new Set([...Object.keys(result?.measures ?? {}), ...runs.flatMap((r) => Object.keys(r.measures))])];
  const checkCount = Math.max(result?.checks.length ?? 0, ...runs.map((r) => r.checks.length));
  return { kind, name, unit, rows, measures, checkCount };
}

/** "27 °C", "-40 °C", "26.85 °C": as written, not rounded to three digits. */
export function formatCelsius(value: number): string {
  return `${Number(value.toPrecision(6))} °C`;
}

/**
 * The unit of a varied param, when the result shows it: a part of the same name whose
 * voltage over current equals the param at every solved value is a resistor set by it (Ω).
 * Otherwise the param's unit is not known and its values are plain figures.
 */
function paramUnit(param: string, values: readonly number[], runs: readonly SweepRun[]): Unit {
  let seen = 0;
  for (const [k, run] of runs.entries()) {
    const part = run.op?.parts[param];
    if (!run.op) continue;
    if (!part || part.i === 0) return '';
    const ohms = part.v / part.i;
    if (Math.abs(ohms - values[k]) > 1e-6 * Math.abs(values[k])) return '';
    seen++;
  }
  return seen > 0 ? 'Ω' : '';
}

/** A quantity the measure plot can show: a ports figure in dB or a measure. */
export interface SweepQuantity {
  key: string;
  /** "adm dB", "cmrr dB", "a0". */
  name: string;
  unit: Unit;
  /** How checks write it: `cmrr_db`, `db(adm)`, `a0` (spaces left out). */
  subjects: string[];
  value(row: SweepRow): number | undefined;
}

/** adm, acm and cmrr in dB, then every measure with its unit. */
export function sweepQuantities(data: SweepData, units: Record<string, Unit>): SweepQuantity[] {
  const ports: SweepQuantity[] = [
    { key: 'port:adm', name: 'adm dB', unit: 'dB', subjects: ['db(adm)'], value: (r) => r.admDb },
    { key: 'port:acm', name: 'acm dB', unit: 'dB', subjects: ['db(acm)'], value: (r) => r.acmDb },
    { key: 'port:cmrr', name: 'cmrr dB', unit: 'dB', subjects: ['cmrr_db', 'db(cmrr)'], value: (r) => r.cmrrDb },
  ];
  const hasPorts = data.rows.some((r) => r.run.ports);
  const measures = data.measures.map((m): SweepQuantity => ({
    key: `measure:${m}`, name: m, unit: units[m] ?? '', subjects: [m], value: (r) => r.run.measures[m],
  }));
  return [...(hasPorts ? ports : []), ...measures];
}

/** A check's limit on a quantity: one line, or two for `= centre ± tolerance`. */
export interface SweepLimit {
  value: number;
  text: string;
  line: number;
}

const SIGNS: Record<string, string> = { '>=': '≥', '<=': '≤', '>': '>', '<': '<', '=': '=' };

/**
 * The limits the netlist's checks put on a quantity, from the first value that solved (the
 * checks are read once, with the written params). `x = c ± t` gives its two edges: the margin is
 * t − |x − c|, so t is the margin plus the distance from the centre.
 */
export function sweepLimits(data: SweepData, quantity: SweepQuantity, format: (v: number) => string): SweepLimit[] {
  const checks = data.rows.find((r) => !r.failure && r.run.checks.length > 0)?.run.checks ?? [];
  const out: SweepLimit[] = [];
  for (const c of checks) {
    const { subject, op } = checkParts(c.text);
    if (!quantity.subjects.includes(subject.replace(/\s+/g, ''))) continue;
    if (op === '=') {
      const tol = c.margin + Math.abs(c.value - c.limit);
      out.push({ value: c.limit - tol, text: `check ${subject} ≥ ${format(c.limit - tol)}`, line: c.line });
      out.push({ value: c.limit + tol, text: `check ${subject} ≤ ${format(c.limit + tol)}`, line: c.line });
    } else {
      out.push({ value: c.limit, text: `check ${subject} ${SIGNS[op] ?? op} ${format(c.limit)}`, line: c.line });
    }
  }
  return out;
}

/** A log axis when the values are all positive and span more than a decade. */
export function wantsLogAxis(values: readonly number[]): boolean {
  if (values.length < 2 || values.some((v) => !(v > 0))) return false;
  return Math.max(...values) / Math.min(...values) > 10;
}
