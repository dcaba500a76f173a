/**
 * The geometry of the pole–zero map, free of the DOM: the s-plane in hertz (x = Re s/2π,
 * y = Im s/2π) on one scale for both axes — the same hertz per pixel, so a pair's angle from the
 * negative real axis is true and reads its Q (Q = 1/(2·cos θ)) — either linear or "arcsinh".
 *
 * The arcsinh axis maps v to asinh(v / c): linear within about ±c of zero, logarithmic beyond
 * (asinh(v/c) ≈ ln(2v/c)), and defined through zero and for both signs — which a log axis is not,
 * and the s-plane needs both. With c a decade below the smallest coordinate, a 10 Hz pole and a
 * 1 GHz one are both clear of the origin on one map; decades are then evenly spaced except next
 * to zero. Kept pure so it is tested without a browser.
 */
import { formatTick } from '../si-format';
import { textWidth } from '../plot/label-place';
import { linearTicks } from '../plot/log-ticks';

export type PzScale = 'linear' | 'asinh';

/** A point of the map in hertz. */
export interface PzXY {
  re: number;
  im: number;
}

export interface PzGeometry {
  width: number;
  height: number;
  /** The frame: left, top, width and height in pixels. */
  left: number;
  top: number;
  innerWidth: number;
  innerHeight: number;
  scale: PzScale;
  /** The arcsinh axis' linear half-width c, Hz (1 on a linear map, where it plays no part). */
  c: number;
  /** Pixel x of a real part (Hz), pixel y of an imaginary part (Hz). */
  x: (re: number) => number;
  y: (im: number) => number;
  /** Gridlines (Hz) and, among them, the ones labelled. */
  xTicks: number[];
  xLabels: number[];
  yTicks: number[];
  yLabels: number[];
}

const MARGIN = { right: 16, top: 14, bottom: 42 } as const;
/** Room left of the tick labels for the rotated axis title. */
const TITLE_ROOM = 26;
/** Least room between two labels of the x axis, beyond their own widths, and between two of the y axis. */
const X_LABEL_GAP = 12;
const Y_LABEL_ROOM = 20;
/** A coordinate below this fraction of its own point's |s| is rounding, not a scale to show (a pair's tiny re). */
const NEGLIGIBLE = 1e-6;

/**
 * The scale to show first: arcsinh when the magnitudes span more than two decades (a linear map
 * would squeeze the slow ones into the origin), else linear.
 */
export function defaultScale(points: readonly PzXY[]): PzScale {
  const mags = points.map((p) => Math.hypot(p.re, p.im)).filter((m) => m > 0 && Number.isFinite(m));
  if (mags.length < 2) return 'linear';
  return Math.max(...mags) / Math.min(...mags) > 100 ? 'asinh' : 'linear';
}

/**
 * The arcsinh constant: a decade below the smallest coordinate that is not rounding, so every
 * point lies in the logarithmic part of the axis. 1 Hz with nothing to go by.
 */
export function asinhConstant(points: readonly PzXY[]): number {
  const coords = points.flatMap((p) => {
    const mag = Math.hypot(p.re, p.im);
    return [Math.abs(p.re), Math.abs(p.im)].filter((v) => Number.isFinite(v) && v > NEGLIGIBLE * mag);
  });
  if (coords.length === 0) return 1;
  // A hair under a decade counts as the decade: a pole solved at 9.9999964 Hz is a 10 Hz pole.
  return Number(`1e${Math.floor(Math.log10(Math.min(...coords)) + 0.01) - 1}`);
}

export interface PzLayoutInput {
  width: number;
  height: number;
  points: readonly PzXY[];
  scale: PzScale;
}

/** Lays out the map: the points, the origin and a margin of a tenth around them, one scale for both axes. */
export function layoutPz(input: PzLayoutInput): PzGeometry {
  const { width, height, points, scale } = input;
  const c = scale === 'asinh' ? asinhConstant(points) : 1;
  const t = (v: number) => (scale === 'asinh' ? Math.asinh(v / c) : v);
  const inv = (u: number) => (scale === 'asinh' ? c * Math.sinh(u) : u);
  const finite = points.filter((p) => Number.isFinite(p.re) && Number.isFinite(p.im));

  // The data in transformed units, always with the origin (the jω axis is the stability boundary).
  let uLo = Math.min(0, ...finite.map((p) => t(p.re)));
  let uHi = Math.max(0, ...finite.map((p) => t(p.re)));
  let vHi = Math.max(0, ...finite.map((p) => Math.abs(t(p.im))));
  let span = Math.max(uHi - uLo, 2 * vHi);
  if (!(span > 0)) span = 2 * t(1e3);
  const pad = 0.1 * span;
  uLo -= pad;
  uHi += pad;
  vHi += pad;

  // Provisional frame for the label widths, then one pixels-per-unit for both axes: the axis
  // with room to spare is widened about its centre (the real axis' middle, zero for the imaginary).
  const innerHeight = Math.max(60, height - MARGIN.top - MARGIN.bottom);
  const fitted = (left: number) => {
    const innerWidth = Math.max(60, width - left - MARGIN.right);
    const k = Math.min(innerWidth / (uHi - uLo), innerHeight / (2 * vHi));
    const mid = (uLo + uHi) / 2;
    return { innerWidth, k, u0: mid - innerWidth / 2 / k, u1: mid + innerWidth / 2 / k, v1: innerHeight / 2 / k };
  };
  let left = 64;
  let fit = fitted(left);
  const yAxis = () => axisTicks(scale, c, -inv(fit.v1), inv(fit.v1), (a, b) => Math.abs(t(b) - t(a)) * fit.k >= Y_LABEL_ROOM);
  let y = yAxis();
  const labelWidth = Math.max(20, ...y.labels.map((v) => textWidth(formatTick(v, 'Hz'))));
  const wanted = Math.ceil(Math.max(58, labelWidth + 8 + TITLE_ROOM));
  if (wanted !== left) {
    left = wanted;
    fit = fitted(left);
    y = yAxis();
  }
  const { innerWidth, k, u0, u1 } = fit;
  const top = MARGIN.top;
  const x = (re: number) => left + (t(re) - u0) * k;
  const yPx = (im: number) => top + innerHeight / 2 - t(im) * k;
  const xGap = (a: number, b: number) => Math.abs(x(b) - x(a)) >= (textWidth(formatTick(a, 'Hz')) + textWidth(formatTick(b, 'Hz'))) / 2 + X_LABEL_GAP;
  const xAxis = axisTicks(scale, c, inv(u0), inv(u1), xGap);
  return {
    width, height, left, top, innerWidth, innerHeight, scale, c, x, y: yPx,
    xTicks: xAxis.ticks, xLabels: xAxis.labels, yTicks: y.ticks, yLabels: y.labels,
  };
}

/**
 * Gridlines within [lo, hi] (Hz) and the ones to label, each label at least `apart` from the
 * one before. Linear: round steps. Arcsinh: zero and ±1, 10, 100 … times a power of ten from c
 * up, the labels thinned to every second (third …) decade counted from zero, as room allows.
 */
export function axisTicks(scale: PzScale, c: number, lo: number, hi: number, apart: (a: number, b: number) => boolean): { ticks: number[]; labels: number[] } {
  if (scale === 'linear') {
    for (let count = 10; count >= 2; count--) {
      const ticks = linearTicks(lo, hi, count).major;
      if (ticks.every((v, k) => k === 0 || apart(ticks[k - 1], v))) return { ticks, labels: ticks };
    }
    const ticks = linearTicks(lo, hi, 2).major;
    return { ticks, labels: ticks };
  }
  const first = Math.round(Math.log10(c));
  const last = Math.ceil(Math.log10(Math.max(Math.abs(lo), Math.abs(hi), c)));
  const decades: number[] = [];
  for (let e = first; e <= last; e++) decades.push(Number(`1e${e}`));
  const inside = (v: number) => v >= lo && v <= hi;
  const ticks = [...decades.map((d) => -d).reverse(), 0, ...decades].filter(inside);
  // Every n-th decade from the largest on the axis down, so the fastest poles' decade keeps its label.
  const top = Math.max(first, ...ticks.filter((v) => v !== 0).map((v) => Math.round(Math.log10(Math.abs(v)))));
  for (let every = 1; every <= decades.length; every++) {
    const keep = (v: number) => v === 0 || (top - Math.round(Math.log10(Math.abs(v)))) % every === 0;
    const labels = ticks.filter(keep);
    if (labels.every((v, k) => k === 0 || apart(labels[k - 1], v))) return { ticks, labels };
  }
  return { ticks, labels: ticks.filter((v) => v === 0) };
}
