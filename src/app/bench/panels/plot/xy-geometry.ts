/**
 * The geometry of a plot on linear axes (the transfer curves), free of the DOM: one panel per
 * unit stacked over a shared x axis (volts above amperes), each y scale fitted to its curves
 * with round ticks, a left margin wide enough for the longest tick label, and the sample
 * nearest to a point. Either axis may be logarithmic (`xLog`, `yLog`: a noise density over
 * frequency is read log–log). Kept pure so it is tested without a browser.
 */
import { scaleLinear, scaleLog, type ScaleContinuousNumeric } from 'd3';
import { formatTick } from '../si-format';
import { textWidth } from './label-place';
import { linearTicks, logTicks } from './log-ticks';
import type { CurveStyle } from './palette';
import type { PanelBox } from './plot-geometry';

/** One curve on a linear plot. */
export interface XySeries {
  key: string;
  label: string;
  /** Its unit: the panel it goes to. */
  unit: string;
  values: readonly number[];
  style: CurveStyle;
  /** A dot at every sample too: few samples (the values of a sweep) read as points, not as a curve. */
  points?: boolean;
}

/** A horizontal line across a panel at a y value: a check's limit on the plotted quantity. */
export interface XyRule {
  value: number;
  /** The panel it goes to. */
  unit: string;
  /** Written at its right end, e.g. "check a0 ≥ 40.0 dB". */
  label: string;
}

export interface XyPanel {
  unit: string;
  title: string;
  box: PanelBox;
  /** Linear, or logarithmic when asked (`yLog`). */
  y: ScaleContinuousNumeric<number, number>;
  /** Labelled ticks. */
  ticks: number[];
  /** Unlabelled ticks of a log axis (2…9 of each decade), drawn as a faint grid; empty on a linear one. */
  minorTicks: number[];
  /** Whether `y` is logarithmic: values ≤ 0 have no place on it and are left out. */
  log: boolean;
}

export interface XyGeometry {
  width: number;
  height: number;
  left: number;
  innerWidth: number;
  /** Linear, or logarithmic when asked (`xLog`). */
  x: ScaleContinuousNumeric<number, number>;
  xTicks: number[];
  /** Unlabelled ticks of a log x axis, drawn as a faint grid; empty on a linear one. */
  xMinorTicks: number[];
  panels: XyPanel[];
}

const MARGIN = { right: 24, top: 14, bottom: 42, gap: 22 } as const;
/** Room left of the tick labels for the rotated axis title. */
const TITLE_ROOM = 26;

/** Axis titles for the units the plots have: a transfer sweep's volts and amperes, noise densities. */
const UNIT_TITLES: Record<string, string> = {
  V: 'Voltage (V)', A: 'Current (A)', 'V/√Hz': 'Noise density (V/√Hz)', 'A/√Hz': 'Noise density (A/√Hz)',
};
/** Height per labelled tick of a log y axis: a decade label every 26 px at most. */
const LOG_LABEL_ROOM = 26;

export interface XyLayoutInput {
  width: number;
  height: number;
  x: readonly number[];
  series: readonly XySeries[];
  /** A logarithmic x axis (every x must be positive). */
  xLog?: boolean;
  /** Lines whose values the y axis must show as well as the curves'. */
  rules?: readonly XyRule[];
  /** Title of the y axis when there is one panel, instead of the unit's. */
  yTitle?: string;
  /**
   * Logarithmic y axes, fitted to whole decades around the positive values (a panel with none
   * falls back to linear). Values ≤ 0 are left out of the fit and of the curves.
   */
  yLog?: boolean;
}

/** Lays out the plot: one panel per unit in order of first appearance, sharing the height evenly. */
export function layoutXy(input: XyLayoutInput): XyGeometry {
  const { width, height, series } = input;
  const units = [...new Set(series.map((s) => s.unit))];
  if (units.length === 0) units.push('V');
  const innerHeight = Math.max(60, height - MARGIN.top - MARGIN.bottom);
  const panelHeight = (innerHeight - MARGIN.gap * (units.length - 1)) / units.length;
  const xExtent = extent([input.x]) ?? [0, 1];
  const xLog = input.xLog === true && xExtent[0] > 0;
  const xFit = xLog ? logFit(xExtent) : fit(xExtent, false);
  const rules = input.rules ?? [];
  const fitted = units.map((unit, k) => {
    const box: PanelBox = { top: MARGIN.top + k * (panelHeight + MARGIN.gap), height: panelHeight };
    const columns = [...series.filter((s) => s.unit === unit).map((s) => s.values), rules.filter((r) => r.unit === unit).map((r) => r.value)];
    const positive = input.yLog ? extent(columns, true) : undefined;
    const yFit = positive ? decadeFit(positive, Math.max(2, Math.floor(box.height / LOG_LABEL_ROOM))) : { ...fit(extent(columns) ?? [0, 1], true), minor: [] };
    return { unit, box, yFit, log: positive !== undefined };
  });
  // Wide enough for the longest tick label and the rotated title beside it.
  const labelWidth = Math.max(...fitted.flatMap((p) => p.yFit.ticks.map((v) => textWidth(formatTick(v, p.unit)))), 20);
  const left = Math.ceil(Math.max(58, labelWidth + 8 + TITLE_ROOM));
  const innerWidth = Math.max(40, width - left - MARGIN.right);
  const x = (xLog ? scaleLog() : scaleLinear()).domain(xFit.domain as [number, number]).range([0, innerWidth]);
  const panels = fitted.map(({ unit, box, yFit, log }) => ({
    unit, box, title: (fitted.length === 1 ? input.yTitle : undefined) ?? UNIT_TITLES[unit] ?? (unit ? `(${unit})` : 'Value'),
    ticks: yFit.ticks, minorTicks: yFit.minor, log,
    y: (log ? scaleLog() : scaleLinear()).domain(yFit.domain as [number, number]).range([box.top + box.height, box.top]),
  }));
  const labels = Math.max(3, Math.floor(innerWidth / 80));
  const xAxis = xLog ? logTicks(xFit.domain[0], xFit.domain[1], labels) : linearTicks(xFit.domain[0], xFit.domain[1], labels);
  return { width, height, left, innerWidth, x, xTicks: xAxis.major, xMinorTicks: xLog ? xAxis.minor : [], panels };
}

/**
 * A log axis over whole decades around [lo, hi] (lo > 0): the decades below and above, so a
 * density of 4.07 nV/√Hz … 64.8 pV/√Hz gets 10 pV … 10 nV. A single value gets the decade
 * either side when it is a whole decade itself. Labels as logTicks gives them for `maxLabels`.
 */
function decadeFit([lo, hi]: [number, number], maxLabels: number): { domain: [number, number]; ticks: number[]; minor: number[] } {
  let a = Math.floor(Math.log10(lo) + 1e-9);
  let b = Math.ceil(Math.log10(hi) - 1e-9);
  // Only when every value is the same whole decade: a decade either side of it.
  if (b <= a) {
    a -= 1;
    b = a + 2;
  }
  const domain: [number, number] = [Number(`1e${a}`), Number(`1e${b}`)];
  const t = logTicks(domain[0], domain[1], maxLabels);
  return { domain, ticks: t.major, minor: t.minor };
}

/** A log axis over the values exactly, widened to a factor of two each way when it is a single value. */
function logFit([lo, hi]: [number, number]): { domain: [number, number] } {
  return hi > lo ? { domain: [lo, hi] } : { domain: [lo / 2, lo * 2] };
}

/** Min and max of the finite values (only the positive ones when `positive`) of all columns. */
function extent(columns: readonly (readonly number[])[], positive = false): [number, number] | undefined {
  let lo = Infinity;
  let hi = -Infinity;
  for (const values of columns) {
    for (const v of values) {
      if (!Number.isFinite(v) || (positive && !(v > 0))) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo <= hi ? [lo, hi] : undefined;
}

/**
 * A domain with round ticks: for y, padded and rounded outward to whole tick steps; for x, the
 * sweep exactly (its ends are the data's). A flat span is widened so that it has ticks.
 */
function fit([lo, hi]: [number, number], outward: boolean): { domain: [number, number]; ticks: number[] } {
  if (!(hi > lo)) {
    const half = Math.max(Math.abs(lo) * 0.05, 1e-12);
    lo -= half;
    hi += half;
  }
  const step = tickStep(lo, hi);
  if (outward) {
    lo = Math.floor(lo / step - 1e-9) * step;
    hi = Math.ceil(hi / step + 1e-9) * step;
  }
  const ticks: number[] = [];
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi + step * 1e-9; k++) ticks.push(Number((k * step).toPrecision(12)));
  return { domain: [lo, hi], ticks };
}

function tickStep(lo: number, hi: number): number {
  const t = linearTicks(lo, hi, 5).major;
  return t.length > 1 ? t[1] - t[0] : (hi - lo) / 4;
}

/** Index of the sample nearest to `value` on the x axis. */
export function nearestSample(x: readonly number[], value: number): number {
  let best = 0;
  let distance = Infinity;
  for (let k = 0; k < x.length; k++) {
    const d = Math.abs(x[k] - value);
    if (d < distance) {
      distance = d;
      best = k;
    }
  }
  return best;
}
