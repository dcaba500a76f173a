/**
 * Drawing a plot on linear axes (the transfer curves) or log ones (noise densities) into an SVG
 * with d3: per-unit panels with SI-formatted ticks and unit titles (a log axis with a faint grid
 * at its minor ticks), the curves, a marked x span (the linear input range) with its ends ringed
 * on the marked curve, and the crosshair cursor. Shared looks come from the plot stylesheet
 * embedded in the SVG.
 */
import { line, select } from 'd3';
import { formatTick } from '../si-format';
import {
  addClip, CURSOR_STRIP, drawExportLegend, drawMarkers, haloText, horizontals, PATH_DIGITS, prepareSvg, round, verticals, type G, type MarkerMark,
} from './draw-common';
import type { LabelRequest } from './label-place';
import type { XyGeometry, XyPanel, XyRule, XySeries } from './xy-geometry';

/** A marked span of the x axis and the curve whose range it is. */
export interface XyBand {
  lo: number;
  hi: number;
  /** Written over the band, e.g. "linear ±16.9 mV (slope ≥ 90 % of peak)". */
  text: string;
  /** Key of the curve whose ends are ringed. */
  curveKey?: string;
  /** Labels of the two ends, e.g. "−16.9 mV". */
  loLabel?: string;
  hiLabel?: string;
}

export interface XyLabels {
  /** Title of the x axis, with its unit: "va (V)". */
  x: string;
  xUnit: string;
  caption?: string;
}

/** Redraws the whole plot with an empty cursor layer. Returns the ids of labels dropped for lack of room. */
export function drawXy(
  svgEl: SVGSVGElement, geo: XyGeometry, xs: readonly number[], series: readonly XySeries[], band: XyBand | undefined, labels: XyLabels,
  rules: readonly XyRule[] = [],
): string[] {
  const { svg, clipId } = prepareSvg(svgEl, geo.width, geo.height);
  const root = svg.append('g').attr('transform', `translate(${geo.left},0)`);
  const xPx = geo.xTicks.map((v) => geo.x(v));
  const last = geo.panels[geo.panels.length - 1];
  const bottomOfAll = last.box.top + last.box.height;
  for (const [index, panel] of geo.panels.entries()) {
    const g = root.append('g').attr('class', `panel panel-${index}`).attr('data-unit', panel.unit);
    const top = panel.box.top;
    const bottom = top + panel.box.height;
    const clip = `${clipId}-${index}`;
    addClip(svg, clip, { x: 0, y: top, width: geo.innerWidth, height: panel.box.height });
    const yTicks = panel.ticks.filter((v) => panel.y(v) >= top - 0.5 && panel.y(v) <= bottom + 0.5);
    // Log axes: 2…9 of each decade as a faint grid under the labelled one, as on the Bode plot.
    if (geo.xMinorTicks.length > 0 || panel.minorTicks.length > 0) {
      g.append('path').attr('class', 'grid-minor').attr('d', verticals(geo.xMinorTicks.map((v) => geo.x(v)), top, bottom)
        + horizontals(panel.minorTicks.map((v) => panel.y(v)), 0, geo.innerWidth));
    }
    g.append('path').attr('class', 'grid').attr('d', verticals(xPx, top, bottom) + horizontals(yTicks.map((v) => panel.y(v)), 0, geo.innerWidth));
    if (yTicks.includes(0) && yTicks[0] !== 0 && yTicks[yTicks.length - 1] !== 0) {
      g.append('path').attr('class', 'zero').attr('d', horizontals([panel.y(0)], 0, geo.innerWidth));
    }
    if (band) {
      const x0 = geo.x(band.lo);
      const x1 = geo.x(band.hi);
      g.append('rect').attr('class', 'band').attr('x', round(x0)).attr('y', round(top)).attr('width', round(x1 - x0)).attr('height', round(panel.box.height));
      g.append('path').attr('class', 'band-edge').attr('d', verticals([x0, x1], top, bottom));
    }
    g.append('rect').attr('class', 'frame').attr('x', 0).attr('y', top).attr('width', geo.innerWidth).attr('height', panel.box.height);
    g.append('path').attr('class', 'ticks').attr('d', verticals(xPx, bottom, bottom + 4));
    const yLabels = g.append('g').attr('class', 'y-labels');
    for (const v of yTicks) yLabels.append('text').attr('x', -6).attr('y', round(panel.y(v) + 4)).text(formatTick(v, panel.unit));
    g.append('text').attr('class', 'axis-title')
      .attr('transform', `translate(${-(geo.left - 16)},${round(top + panel.box.height / 2)}) rotate(-90)`).text(panel.title);
    if (index === geo.panels.length - 1) {
      const xLabels = g.append('g').attr('class', 'x-labels');
      for (const v of geo.xTicks) xLabels.append('text').attr('x', round(geo.x(v))).attr('y', bottom + 16).text(formatTick(v, labels.xUnit));
      g.append('text').attr('class', 'axis-title').attr('x', round(geo.innerWidth / 2)).attr('y', bottom + 34).text(labels.x);
    }
    const curves = g.append('g').attr('clip-path', `url(#${clip})`);
    for (const s of series.filter((c) => c.unit === panel.unit)) {
      const path = line<number>()
        .defined((k) => onAxis(panel, s.values[k]) && Number.isFinite(xs[k]))
        .x((k) => geo.x(xs[k]))
        .y((k) => panel.y(s.values[k]))
        .digits(PATH_DIGITS);
      curves.append('path').attr('class', 'curve').attr('data-key', s.key)
        .attr('d', path(xs.map((_, k) => k)) ?? '')
        .attr('stroke', s.style.color).attr('stroke-dasharray', s.style.dash || null);
    }
    drawRules(g, geo, rules.filter((r) => r.unit === panel.unit && onAxis(panel, r.value)), panel.y);
    // Dots are left unclipped: a sweep's end values sit on the frame and would show only half.
    for (const s of series.filter((c) => c.unit === panel.unit && c.points)) {
      const dots = g.append('g').attr('class', 'points').attr('data-key', s.key).attr('fill', s.style.color);
      for (const [k, v] of s.values.entries()) {
        if (!onAxis(panel, v) || !Number.isFinite(xs[k])) continue;
        dots.append('circle').attr('cx', round(geo.x(xs[k]))).attr('cy', round(panel.y(v))).attr('r', 3.5);
      }
    }
  }
  const dropped = band ? bandMarks(root, geo, xs, series, band, bottomOfAll) : [];
  drawExportLegend(svg, geo.width, geo.height, geo.left, series, labels.caption);
  root.append('g').attr('class', 'cursor').attr('data-export', 'skip');
  return dropped;
}

/** Dashed lines at the rules' values, each labelled at its right end (just above, or below near the top). */
function drawRules(g: G, geo: XyGeometry, rules: readonly XyRule[], y: (v: number) => number): void {
  for (const r of rules) {
    const at = round(y(r.value));
    const rule = g.append('g').attr('class', 'rule');
    rule.append('path').attr('class', 'rule-line').attr('d', horizontals([at], 0, geo.innerWidth));
    haloText(rule, 'rule-label', geo.innerWidth - 4, at < 30 ? at + 14 : at - 5, 'end', r.label);
  }
}

/** The band's label and the rings at its ends on the marked curve, placed clear of each other and of the cursor's strip. */
function bandMarks(root: G, geo: XyGeometry, xs: readonly number[], series: readonly XySeries[], band: XyBand, bottomOfAll: number): string[] {
  const first = geo.panels[0];
  const x0 = geo.x(band.lo);
  const x1 = geo.x(band.hi);
  const centre = (x0 + x1) / 2;
  const curve = series.find((s) => s.key === band.curveKey);
  const panel = curve ? geo.panels.find((p) => p.unit === curve.unit) : undefined;
  const marks: MarkerMark[] = [];
  if (curve && panel) {
    for (const [id, at, label] of [['range-lo', band.lo, band.loLabel], ['range-hi', band.hi, band.hiLabel]] as const) {
      const y = interpolate(xs, curve.values, at);
      if (!onAxis(panel, y)) continue;
      marks.push({ id, kind: 'range', x: geo.x(at), y: panel.y(y), label: label ?? formatTick(at), priority: 1 });
    }
  }
  const bandLabel: LabelRequest = {
    id: 'range', text: band.text, x: centre, y: first.box.top, dy: 15, priority: 0,
    spots: [{ dx: 0, anchor: 'middle' }, { dx: x1 - centre + 6, anchor: 'start' }, { dx: x0 - centre - 6, anchor: 'end' }],
  };
  const bounds = { x: 0, y: first.box.top, width: geo.innerWidth, height: bottomOfAll - first.box.top };
  const strip = { x: 0, y: bottomOfAll - CURSOR_STRIP, width: geo.innerWidth, height: CURSOR_STRIP };
  // Panel gaps hold no labels: the tick labels of the x axis are only under the last panel, but a label there would float between frames.
  const gaps = geo.panels.slice(1).map((p, k) => {
    const above = geo.panels[k];
    const top = above.box.top + above.box.height;
    return { x: 0, y: top, width: geo.innerWidth, height: p.box.top - top };
  });
  return drawMarkers(root, marks, bounds, [strip, ...gaps], [bandLabel]);
}

/** Whether a panel's y axis has a place for v: finite, and positive on a log axis. */
function onAxis(panel: XyPanel, v: number): boolean {
  return Number.isFinite(v) && (!panel.log || v > 0);
}

/** y at `at` on the polyline (xs, ys), xs running either way; NaN outside. */
export function interpolate(xs: readonly number[], ys: readonly number[], at: number): number {
  for (let k = 1; k < xs.length; k++) {
    const a = xs[k - 1];
    const b = xs[k];
    if ((at - a) * (at - b) <= 0) return a === b ? ys[k] : ys[k - 1] + ((at - a) / (b - a)) * (ys[k] - ys[k - 1]);
  }
  return NaN;
}

/** Draws the crosshair at sample `index` (or clears it when undefined), with the x value in the strip above the axis. */
export function drawXyCursor(svgEl: SVGSVGElement, geo: XyGeometry, xs: readonly number[], series: readonly XySeries[], index: number | undefined, xUnit: string): void {
  const g = select(svgEl).select<SVGGElement>('g.cursor');
  if (g.empty()) return;
  g.selectAll('*').remove();
  if (index === undefined || index >= xs.length) return;
  const x = round(geo.x(xs[index]));
  const last = geo.panels[geo.panels.length - 1];
  const bottom = last.box.top + last.box.height;
  g.append('line').attr('class', 'cursor-line').attr('x1', x).attr('x2', x).attr('y1', geo.panels[0].box.top).attr('y2', bottom);
  for (const s of series) {
    const panel = geo.panels.find((p) => p.unit === s.unit);
    const v = s.values[index];
    if (!panel || !onAxis(panel, v)) continue;
    g.append('circle').attr('cx', x).attr('cy', round(panel.y(v))).attr('r', 3.5).attr('fill', s.style.color);
  }
  const onRight = x > geo.innerWidth - 70;
  haloText(g, 'cursor-label', x + (onRight ? -4 : 4), bottom - 6, onRight ? 'end' : 'start', formatTick(Number(xs[index].toPrecision(4)), xUnit));
}
