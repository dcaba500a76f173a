/**
 * The geometry of a Bode plot, free of the DOM: panel rectangles, the shared log-frequency
 * scale, the dB and degree scales fitted to what is visible, and the nearest sample to a point.
 * Kept pure so it is tested without a browser and shared by the response and modes plots.
 */
import { scaleLinear, scaleLog, type ScaleLinear, type ScaleLogarithmic } from 'd3';
import type { CurveStyle } from './palette';
import { linearTicks, phaseTicks } from './log-ticks';

/** One curve on the plot. */
export interface PlotSeries {
  /** Its name in the result: `adm`, `ac(outa)`. */
  key: string;
  /** How the legend and readouts name it. */
  label: string;
  db: readonly number[];
  phase_deg: readonly number[];
  style: CurveStyle;
}

/** A labelled point on a curve: its −3 dB corner or its unity crossing. */
export interface PlotMarker {
  kind: 'corner' | 'unity';
  freqHz: number;
  db: number;
  label: string;
  color: string;
}

export type Domain = readonly [number, number];

export interface PanelBox {
  top: number;
  height: number;
}

export interface PlotGeometry {
  width: number;
  height: number;
  left: number;
  innerWidth: number;
  mag: PanelBox;
  phase?: PanelBox;
  x: ScaleLogarithmic<number, number>;
  yMag: ScaleLinear<number, number>;
  yPhase?: ScaleLinear<number, number>;
  magTicks: number[];
  phaseTicks: number[];
  /** Indices of the samples inside the frequency domain. */
  visible: readonly [first: number, last: number];
}

export const MARGIN = { left: 58, right: 24, top: 14, bottom: 42, gap: 22 } as const;

/** Inputs of the layout. */
export interface LayoutInput {
  width: number;
  height: number;
  freqHz: readonly number[];
  series: readonly PlotSeries[];
  showPhase: boolean;
  xDomain?: Domain;
  yDomain?: Domain;
}

/** Lays out the plot: scales fitted to the samples inside the visible frequency span. */
export function layoutPlot(input: LayoutInput): PlotGeometry {
  const { width, height, freqHz, series, showPhase } = input;
  const innerWidth = Math.max(40, width - MARGIN.left - MARGIN.right);
  const innerHeight = Math.max(60, height - MARGIN.top - MARGIN.bottom);
  const magHeight = showPhase ? Math.round((innerHeight - MARGIN.gap) * 0.58) : innerHeight;
  const mag: PanelBox = { top: MARGIN.top, height: magHeight };
  const phase: PanelBox | undefined = showPhase
    ? { top: MARGIN.top + magHeight + MARGIN.gap, height: innerHeight - magHeight - MARGIN.gap }
    : undefined;

  const full = fullDomain(freqHz);
  // A zoom kept from an earlier sweep may lie partly outside this one: keep what overlaps.
  const kept = input.xDomain ? clampDomain(input.xDomain, full) : undefined;
  const xDomain = kept && kept[1] > kept[0] * (1 + 1e-9) ? kept : full;
  const x = scaleLog().domain(xDomain as [number, number]).range([0, innerWidth]);
  const visible = visibleRange(freqHz, xDomain);

  const magFit = input.yDomain ? fixedLinear(input.yDomain) : fitLinear(extent(series.map((s) => s.db), visible), 'db');
  const yMag = scaleLinear().domain(magFit.domain as [number, number]).range([mag.top + mag.height, mag.top]);
  let yPhase: ScaleLinear<number, number> | undefined;
  let phaseFit: { domain: Domain; ticks: number[] } = { domain: [0, 1], ticks: [] };
  if (phase) {
    phaseFit = fitLinear(extent(series.map((s) => s.phase_deg), visible), 'deg');
    yPhase = scaleLinear().domain(phaseFit.domain as [number, number]).range([phase.top + phase.height, phase.top]);
  }
  return {
    width, height, left: MARGIN.left, innerWidth, mag, phase, x, yMag, yPhase,
    magTicks: magFit.ticks, phaseTicks: phaseFit.ticks, visible,
  };
}

/** The whole sweep, widened a little when it is a single point. */
export function fullDomain(freqHz: readonly number[]): Domain {
  const positive = freqHz.filter((f) => f > 0 && Number.isFinite(f));
  if (positive.length === 0) return [1, 10];
  const lo = positive[0];
  const hi = positive[positive.length - 1];
  return hi > lo ? [lo, hi] : [lo / 2, lo * 2];
}

/** First and last sample index inside the domain (at least one sample). */
export function visibleRange(freqHz: readonly number[], domain: Domain): readonly [number, number] {
  let first = freqHz.findIndex((f) => f >= domain[0] * (1 - 1e-9));
  if (first < 0) first = Math.max(0, freqHz.length - 1);
  let last = first;
  for (let k = first; k < freqHz.length && freqHz[k] <= domain[1] * (1 + 1e-9); k++) last = k;
  return [first, last];
}

/** Min and max of the finite values within [first, last]. */
function extent(columns: readonly (readonly number[])[], [first, last]: readonly [number, number]): Domain | undefined {
  let lo = Infinity;
  let hi = -Infinity;
  for (const values of columns) {
    for (let k = first; k <= last && k < values.length; k++) {
      const v = values[k];
      if (!Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo <= hi ? [lo, hi] : undefined;
}

/** A domain padded and rounded outward to whole tick steps, with its ticks. */
function fitLinear(range: Domain | undefined, kind: 'db' | 'deg'): { domain: Domain; ticks: number[] } {
  let [lo, hi] = range ?? (kind === 'db' ? [-20, 20] : [-180, 0]);
  const minSpan = kind === 'db' ? 6 : 30;
  if (hi - lo < minSpan) {
    const mid = (hi + lo) / 2;
    lo = mid - minSpan / 2;
    hi = mid + minSpan / 2;
  }
  const ticks = kind === 'db' ? linearTicks(lo, hi, 5) : phaseTicks(lo, hi, 5);
  const step = ticks.major.length > 1 ? ticks.major[1] - ticks.major[0] : (hi - lo) / 4;
  const nlo = Math.floor(lo / step - 1e-9) * step;
  const nhi = Math.ceil(hi / step + 1e-9) * step;
  const out: number[] = [];
  for (let v = nlo; v <= nhi + step * 1e-6; v += step) out.push(Number(v.toPrecision(10)));
  return { domain: [nlo, nhi], ticks: out };
}

/** A user-chosen (zoomed) domain with round ticks inside it. */
function fixedLinear(domain: Domain): { domain: Domain; ticks: number[] } {
  return { domain, ticks: linearTicks(domain[0], domain[1], 5).major };
}

/** Index of the sample nearest to `freq` in log frequency, within the visible range. */
export function nearestIndex(freqHz: readonly number[], freq: number, [first, last]: readonly [number, number]): number {
  if (!(freq > 0)) return first;
  const target = Math.log(freq);
  let best = first;
  let bestDistance = Infinity;
  for (let k = first; k <= last; k++) {
    const d = Math.abs(Math.log(freqHz[k]) - target);
    if (d < bestDistance) {
      bestDistance = d;
      best = k;
    }
  }
  return best;
}

/** The frequency domain zoomed by `factor` (< 1 zooms in) around `centre`, kept inside `full`. */
export function zoomDomain(current: Domain, full: Domain, centre: number, factor: number): Domain | undefined {
  const logLo = Math.log(current[0]);
  const logHi = Math.log(current[1]);
  const c = Math.log(Math.min(Math.max(centre, current[0]), current[1]));
  let lo = c - (c - logLo) * factor;
  let hi = c + (logHi - c) * factor;
  // Never narrower than ~1/20 decade, never wider than the sweep.
  const minSpan = Math.log(10) / 20;
  if (hi - lo < minSpan) {
    const mid = (hi + lo) / 2;
    lo = mid - minSpan / 2;
    hi = mid + minSpan / 2;
  }
  return clampDomain([Math.exp(lo), Math.exp(hi)], full);
}

/** The domain moved by `fraction` of its own width (positive: towards higher frequencies). */
export function panDomain(current: Domain, full: Domain, fraction: number): Domain | undefined {
  const shift = (Math.log(current[1]) - Math.log(current[0])) * fraction;
  return clampDomain([current[0] * Math.exp(shift), current[1] * Math.exp(shift)], full, true);
}

/** Keeps a domain inside the sweep; undefined when it covers it all (the unzoomed state). */
export function clampDomain(domain: Domain, full: Domain, keepSpan = false): Domain | undefined {
  let [lo, hi] = domain;
  if (keepSpan) {
    const ratio = hi / lo;
    if (lo < full[0]) { lo = full[0]; hi = lo * ratio; }
    if (hi > full[1]) { hi = full[1]; lo = hi / ratio; }
  }
  lo = Math.max(lo, full[0]);
  hi = Math.min(hi, full[1]);
  if (lo <= full[0] * (1 + 1e-9) && hi >= full[1] * (1 - 1e-9)) return undefined;
  return [lo, hi];
}
