/**
 * What the Mismatch tab shows of a `MismatchResult`: which figures get a histogram and in what
 * unit, the check limits drawn on each, the histogram's bins, the yield in words and the
 * statistics table.
 */
import { bin, scaleLinear } from 'd3';
import type { CheckResult, MismatchResult, OutlineMeasure, SampleStats } from '../../../../../solver';
import { formatPlain, formatSi, type Unit } from '../si-format';
import { checkParts, measureUnits } from '../units';

/** One figure of the analysis with its samples. */
export interface MismatchFigure {
  name: string;
  unit: Unit;
  /** What it is, for the histogram's heading. */
  label: string;
  samples: readonly number[];
  stats: SampleStats;
  limits: Limit[];
}

/** A check's limit on a figure: a vertical line labelled with the comparison. */
export interface Limit {
  value: number;
  /** `≥ 40 dB`, `≤ 2.00 mV`, `max 46.5` … */
  label: string;
  /** Which side passes: the line is a floor (`min`) or a ceiling (`max`). */
  side: 'min' | 'max';
}

const LABELS: Record<string, string> = {
  vos: 'input offset voltage',
  adm: 'differential gain',
  acm: 'common-mode gain',
  cmrr_db: 'common-mode rejection',
};
const PORT_UNITS: Record<string, Unit> = { vos: 'V', adm: '', acm: '', cmrr_db: 'dB' };
/** The port figures with a histogram, in this order; then every measure. (acm is in the table only.) */
const HISTOGRAM_PORTS = ['vos', 'cmrr_db', 'adm'];

/** The figures with a histogram: vos, cmrr_db, adm (with ports), then each measure in statement order. */
export function mismatchFigures(result: MismatchResult, measures: readonly OutlineMeasure[], checks: readonly CheckResult[]): MismatchFigure[] {
  const names = [...HISTOGRAM_PORTS, ...measures.map((m) => m.name)].filter((n, k, all) => all.indexOf(n) === k && (result.samples[n]?.length ?? 0) > 0);
  return names.map((name) => figure(result, name, measures, checks));
}

/** Every figure of the result (acm too), for the statistics table. */
export function tableFigures(result: MismatchResult, measures: readonly OutlineMeasure[], checks: readonly CheckResult[]): MismatchFigure[] {
  const order = ['vos', 'cmrr_db', 'adm', 'acm', ...measures.map((m) => m.name), ...Object.keys(result.stats)];
  return order.filter((n, k, all) => all.indexOf(n) === k && result.stats[n]).map((name) => figure(result, name, measures, checks));
}

function figure(result: MismatchResult, name: string, measures: readonly OutlineMeasure[], checks: readonly CheckResult[]): MismatchFigure {
  const unit = PORT_UNITS[name] ?? measureUnits(measures)[name] ?? '';
  return { name, unit, label: LABELS[name] ?? 'measure', samples: result.samples[name] ?? [], stats: result.stats[name], limits: checkLimits(name, unit, checks) };
}

const SIGNS: Record<string, string> = { '>=': '≥', '>': '>', '<=': '≤', '<': '<' };

/**
 * The limits the checks put on `name` (checks whose left side is that name): `≥`/`>` a floor,
 * `≤`/`<` a ceiling, `= x ± t` both. The solver's own figures are used (the nominal solve's limit,
 * and for `=` its margin, t − |value − x|), so a limit written as an expression is drawn right.
 */
export function checkLimits(name: string, unit: Unit, checks: readonly CheckResult[]): Limit[] {
  const out: Limit[] = [];
  for (const c of checks) {
    const { subject, op } = checkParts(c.text);
    if (subject !== name || !Number.isFinite(c.limit)) continue;
    if (op === '>=' || op === '>') out.push({ value: c.limit, label: `${SIGNS[op]} ${formatSi(c.limit, unit)}`, side: 'min' });
    else if (op === '<=' || op === '<') out.push({ value: c.limit, label: `${SIGNS[op]} ${formatSi(c.limit, unit)}`, side: 'max' });
    else if (op === '=') {
      const tol = c.margin + Math.abs(c.value - c.limit);
      if (!Number.isFinite(tol) || tol < 0) continue;
      out.push({ value: c.limit - tol, label: `min ${formatSi(c.limit - tol, unit)}`, side: 'min' });
      out.push({ value: c.limit + tol, label: `max ${formatSi(c.limit + tol, unit)}`, side: 'max' });
    }
  }
  return out;
}

/** One bar of a histogram: runs with lo ≤ value < hi (the last bar includes its hi). */
export interface HistogramBin {
  lo: number;
  hi: number;
  count: number;
}

/** The histogram's x range: the samples, widened to show limits that lie near them. */
export interface HistogramData {
  domain: [number, number];
  bins: HistogramBin[];
  /** Limits inside the domain, and those left off it (too far away to draw with the samples). */
  shown: Limit[];
  off: Limit[];
}

/**
 * Bins the samples on nice thresholds (about `target` bars). A limit within one span of the
 * samples widens the range to show it; one farther off is reported, not drawn, so the bars keep
 * their width.
 */
export function histogram(samples: readonly number[], limits: readonly Limit[], target = 24): HistogramData {
  let lo = Math.min(...samples);
  let hi = Math.max(...samples);
  const span = hi - lo || Math.max(Math.abs(lo) * 1e-3, 1e-12);
  const shown = limits.filter((l) => l.value >= lo - span && l.value <= hi + span);
  const off = limits.filter((l) => !shown.includes(l));
  for (const l of shown) {
    lo = Math.min(lo, l.value);
    hi = Math.max(hi, l.value);
  }
  if (hi === lo) {
    lo -= span / 2;
    hi += span / 2;
  }
  const x = scaleLinear().domain([lo, hi]).nice(target);
  const [d0, d1] = x.domain() as [number, number];
  const bins = bin().domain([d0, d1]).thresholds(x.ticks(target))(samples as number[]);
  return { domain: [d0, d1], bins: bins.map((b) => ({ lo: b.x0!, hi: b.x1!, count: b.length })), shown, off };
}

/** "yield 93.5 % — 187 of 200 runs pass every check" (the yield is over the runs that solved). */
export function yieldText(result: MismatchResult, checkCount: number): string {
  const solved = result.runs - result.failed_runs;
  const passing = Math.round(result.yield * solved);
  const percent = `${result.yield === 1 ? '100' : result.yield === 0 ? '0' : (result.yield * 100).toFixed(1)} %`;
  if (checkCount === 0) return `yield ${percent} — no checks to fail: add check lines to measure the yield`;
  const of = result.failed_runs > 0 ? `${solved} runs that solved` : `${solved} runs`;
  return `yield ${percent} — ${passing} of ${of} pass every check`;
}

/** The table's figures, formatted in the figure's unit. */
export function statCells(f: MismatchFigure): { mean: string; sd: string; p5: string; p50: string; p95: string } {
  // Decibels take no SI prefix (a spread of 4 mdB reads 0.004189 dB).
  const fmt = (v: number) => (f.unit === 'dB' ? `${formatPlain(v, 4)} dB` : f.unit ? formatSi(v, f.unit, 4) : formatPlain(v, 4));
  return { mean: fmt(f.stats.mean), sd: fmt(f.stats.sd), p5: fmt(f.stats.p5), p50: fmt(f.stats.p50), p95: fmt(f.stats.p95) };
}
