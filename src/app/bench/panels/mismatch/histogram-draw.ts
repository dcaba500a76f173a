/**
 * Draws a mismatch histogram into an SVG: bars of runs per bin, the check limits as dashed
 * vertical lines labelled with the comparison, and the axes — with the plots' one stylesheet
 * (plot-style.ts), so the exported file looks as the page.
 */
import { scaleLinear } from 'd3';
import { haloText, horizontals, prepareSvg, round, verticals } from '../plot/draw-common';
import { CURVE_STYLES, PLOT_COLORS } from '../plot/palette';
import { formatTick } from '../si-format';
import type { HistogramData } from './mismatch-figures';

export const HISTOGRAM_MARGIN = { left: 48, right: 18, top: 24, bottom: 40 } as const;

/** The colour of the bars: the palette's first curve colour. */
const BAR = CURVE_STYLES[0].color;

export interface HistogramLabels {
  /** The x axis' title, e.g. `vos (V)`. */
  x: string;
  unit: string;
  caption?: string;
}

/** Draws `data` at width × height; returns the label texts it had to leave off for lack of room. */
export function drawHistogram(svgEl: SVGSVGElement, width: number, height: number, data: HistogramData, labels: HistogramLabels): string[] {
  const { svg } = prepareSvg(svgEl, width, height);
  const m = HISTOGRAM_MARGIN;
  const innerW = Math.max(40, width - m.left - m.right);
  const innerH = Math.max(40, height - m.top - m.bottom);
  const x = scaleLinear().domain(data.domain).range([m.left, m.left + innerW]);
  const most = Math.max(1, ...data.bins.map((b) => b.count));
  const y = scaleLinear().domain([0, most]).nice(5).range([m.top + innerH, m.top]);
  const xTicks = x.ticks(Math.max(2, Math.min(8, Math.floor(innerW / 80))));
  const yTicks = y.ticks(Math.min(5, most)).filter((t) => Number.isInteger(t));

  svg.append('path').attr('class', 'grid').attr('d', horizontals(yTicks.map((t) => y(t)), m.left, m.left + innerW));
  const bars = svg.append('g').attr('class', 'bars');
  for (const b of data.bins) {
    if (b.count === 0) continue;
    const x0 = x(b.lo);
    const x1 = x(b.hi);
    bars.append('rect').attr('x', round(x0 + 0.5)).attr('width', round(Math.max(1, x1 - x0 - 1)))
      .attr('y', round(y(b.count))).attr('height', round(y(0) - y(b.count)))
      .attr('fill', BAR).attr('fill-opacity', 0.75).attr('data-count', b.count)
      .append('title').text(`${b.count} run${b.count === 1 ? '' : 's'} from ${formatTick(b.lo, labels.unit)} to ${formatTick(b.hi, labels.unit)}`);
  }
  svg.append('rect').attr('class', 'frame').attr('x', m.left).attr('y', m.top).attr('width', innerW).attr('height', innerH);
  const ticks = svg.append('path').attr('class', 'ticks');
  ticks.attr('d', verticals(xTicks.map((t) => x(t)), m.top + innerH, m.top + innerH + 4) + horizontals(yTicks.map((t) => y(t)), m.left - 4, m.left));
  const xl = svg.append('g').attr('class', 'x-labels');
  for (const t of xTicks) {
    // A label that would run off either edge is moved in (the stylesheet centres tick labels).
    const text = formatTick(t, labels.unit);
    const half = (text.length * 6.2) / 2;
    const at = Math.min(width - 2 - half, Math.max(2 + half, x(t)));
    xl.append('text').attr('x', round(at)).attr('y', m.top + innerH + 16).text(text);
  }
  const yl = svg.append('g').attr('class', 'y-labels');
  for (const t of yTicks) yl.append('text').attr('x', m.left - 6).attr('y', round(y(t) + 4)).text(String(t));
  svg.append('text').attr('class', 'axis-title').attr('x', m.left + innerW / 2).attr('y', height - 6).text(labels.x);
  svg.append('text').attr('class', 'axis-title').attr('transform', `translate(13 ${m.top + innerH / 2}) rotate(-90)`).text('runs');

  // The limits: a dashed line each, its label above the plot, kept clear of the one before.
  const limits = svg.append('g').attr('class', 'limits');
  const dropped: string[] = [];
  const placed: Array<[number, number]> = [];
  for (const l of [...data.shown].sort((a, b) => a.value - b.value)) {
    const at = x(l.value);
    limits.append('path').attr('class', 'rule-line limit').attr('d', `M${round(at)} ${m.top}V${m.top + innerH}`)
      .attr('stroke', PLOT_COLORS.marker).attr('stroke-dasharray', '6 3').attr('stroke-width', 1.5)
      .append('title').text(`check limit ${l.label}`);
    const w = l.label.length * 6.6 + 4;
    const anchor = at + w / 2 > width - 2 ? 'end' : at - w / 2 < 2 ? 'start' : 'middle';
    const left = anchor === 'end' ? at - w : anchor === 'start' ? at : at - w / 2;
    if (placed.some(([a, b]) => left < b && a < left + w)) {
      dropped.push(l.label);
      continue;
    }
    placed.push([left, left + w]);
    const g = limits.append('g').attr('class', 'limit-label');
    haloText(g, 'rule-label', at, m.top - 7, anchor, l.label);
    g.select('text').attr('fill', PLOT_COLORS.marker).attr('font-weight', 600);
  }
  if (labels.caption) svg.attr('data-caption', labels.caption);
  return dropped;
}
