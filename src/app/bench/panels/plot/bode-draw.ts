/**
 * Drawing a Bode plot into an SVG with d3: grid, axes with units, curves, the −3 dB and unity
 * markers, the crosshair cursor and the zoom box. Shared looks come from the plot stylesheet
 * (plot-style.ts) embedded in the SVG, so the exported file looks as the plot on screen.
 */
import { line, select } from 'd3';
import { formatDb, formatDeg, formatTick } from '../si-format';
import {
  addClip, CURSOR_STRIP, drawExportLegend, drawMarkers, haloText, horizontals, PATH_DIGITS, prepareSvg, round, verticals, type G,
} from './draw-common';
import { logTicks } from './log-ticks';
import type { PanelBox, PlotGeometry, PlotMarker, PlotSeries } from './plot-geometry';

export interface PlotLabels {
  magnitude: string;
  phase: string;
  frequency: string;
  /** A caption for the exported file (the netlist's title). */
  caption?: string;
}

interface Panel {
  box: PanelBox;
  y: (v: number) => number;
  ticks: number[];
  values: (s: PlotSeries) => readonly number[];
  name: 'mag' | 'phase';
  title: string;
  fmt: (v: number) => string;
}

/** Redraws the whole plot (cursor and zoom box layers are created empty). Returns the ids of marker labels dropped for lack of room. */
export function drawPlot(svgEl: SVGSVGElement, geo: PlotGeometry, freqHz: readonly number[], series: readonly PlotSeries[], markers: readonly PlotMarker[], labels: PlotLabels): string[] {
  const { svg, clipId } = prepareSvg(svgEl, geo.width, geo.height);
  const root = svg.append('g').attr('transform', `translate(${geo.left},0)`);
  const panels: Panel[] = [
    { box: geo.mag, y: geo.yMag, ticks: geo.magTicks, values: (s) => s.db, name: 'mag', title: labels.magnitude, fmt: (v) => `${trim(v)}` },
  ];
  if (geo.phase && geo.yPhase) panels.push({ box: geo.phase, y: geo.yPhase, ticks: geo.phaseTicks, values: (s) => s.phase_deg, name: 'phase', title: labels.phase, fmt: (v) => `${trim(v)}°` });

  const ticks = logTicks(geo.x.domain()[0], geo.x.domain()[1], Math.max(3, Math.floor(geo.innerWidth / 55)));
  for (const [index, panel] of panels.entries()) {
    const g = root.append('g').attr('class', `panel panel-${panel.name}`);
    const bottom = panel.box.top + panel.box.height;
    addClip(svg, `${clipId}-${panel.name}`, { x: 0, y: panel.box.top, width: geo.innerWidth, height: panel.box.height });
    // Grid: minor decades faint, majors and value ticks stronger.
    const yTicks = panel.ticks.filter((v) => panel.y(v) >= panel.box.top - 0.5 && panel.y(v) <= bottom + 0.5);
    g.append('path').attr('class', 'grid-minor').attr('d', verticals(ticks.minor.map((f) => geo.x(f)), panel.box.top, bottom));
    g.append('path').attr('class', 'grid').attr('d', verticals(ticks.major.map((f) => geo.x(f)), panel.box.top, bottom)
      + horizontals(yTicks.map((v) => panel.y(v)), 0, geo.innerWidth));
    // 0 dB is the unity line: a designer looks for it first.
    if (panel.name === 'mag' && yTicks.includes(0)) {
      g.append('path').attr('class', 'zero').attr('d', horizontals([panel.y(0)], 0, geo.innerWidth));
    }
    // Frame, tick marks on the shared frequency axis (on every panel) and value labels.
    g.append('rect').attr('class', 'frame').attr('x', 0).attr('y', panel.box.top).attr('width', geo.innerWidth).attr('height', panel.box.height);
    g.append('path').attr('class', 'ticks').attr('d', verticals(ticks.major.map((f) => geo.x(f)), bottom, bottom + 4));
    const yLabels = g.append('g').attr('class', 'y-labels');
    for (const v of yTicks) yLabels.append('text').attr('x', -6).attr('y', round(panel.y(v) + 4)).text(panel.fmt(v));
    g.append('text').attr('class', 'axis-title')
      .attr('transform', `translate(${-44},${round(panel.box.top + panel.box.height / 2)}) rotate(-90)`).text(panel.title);
    if (index === panels.length - 1) {
      const xLabels = g.append('g').attr('class', 'x-labels');
      for (const f of ticks.major) xLabels.append('text').attr('x', round(geo.x(f))).attr('y', bottom + 16).text(formatTick(f, 'Hz'));
      g.append('text').attr('class', 'axis-title').attr('x', round(geo.innerWidth / 2)).attr('y', bottom + 34).text(labels.frequency);
    }

    // Curves, clipped to the panel.
    const curves = g.append('g').attr('clip-path', `url(#${clipId}-${panel.name})`);
    for (const s of series) {
      const values = panel.values(s);
      const path = line<number>()
        .defined((k) => Number.isFinite(values[k]) && freqHz[k] > 0)
        .x((k) => geo.x(freqHz[k]))
        .y((k) => panel.y(values[k]))
        .digits(PATH_DIGITS);
      curves.append('path').attr('class', 'curve').attr('data-key', s.key)
        .attr('d', path(visibleIndices(geo)) ?? '')
        .attr('stroke', s.style.color).attr('stroke-dasharray', s.style.dash || null);
    }
  }
  const dropped = bodeMarkers(root, geo, markers);
  drawExportLegend(svg, geo.width, geo.height, geo.left, series, labels.caption);
  root.append('g').attr('class', 'cursor').attr('data-export', 'skip');
  root.append('rect').attr('class', 'zoom-box').attr('data-export', 'skip').attr('display', 'none');
  return dropped;
}

/** Indices of the samples to draw: the visible ones and one beyond each end, so the curve reaches the frame. */
function visibleIndices(geo: PlotGeometry): number[] {
  const [first, last] = geo.visible;
  const out: number[] = [];
  for (let k = Math.max(0, first - 1); k <= last + 1; k++) out.push(k);
  return out;
}

/** The −3 dB and unity points: a ring on the curve, a dashed drop line and a label placed clear of the others. */
function bodeMarkers(root: G, geo: PlotGeometry, markers: readonly PlotMarker[]): string[] {
  const [lo, hi] = geo.x.domain();
  const last = geo.phase ?? geo.mag;
  const bottom = last.top + last.height;
  const marks = markers.flatMap((m, k) => {
    const x = geo.x(m.freqHz);
    const y = geo.yMag(m.db);
    if (!(m.freqHz >= lo && m.freqHz <= hi) || y < geo.mag.top || y > geo.mag.top + geo.mag.height) return [];
    return [{ id: `${m.kind}-${k}`, kind: m.kind, x, y, label: m.label, priority: k, dropTo: bottom }];
  });
  const bounds = { x: 0, y: geo.mag.top, width: geo.innerWidth, height: geo.mag.height };
  // The cursor writes its frequency just above the axis: keep marker labels out of that strip.
  const strip = { x: 0, y: bottom - CURSOR_STRIP, width: geo.innerWidth, height: CURSOR_STRIP };
  return drawMarkers(root, marks, bounds, [strip]);
}

/** Draws the crosshair at sample `index` (or clears it when undefined). */
export function drawCursor(svgEl: SVGSVGElement, geo: PlotGeometry, freqHz: readonly number[], series: readonly PlotSeries[], index: number | undefined): void {
  const g = select(svgEl).select<SVGGElement>('g.cursor');
  if (g.empty()) return;
  g.selectAll('*').remove();
  if (index === undefined || index < geo.visible[0] || index > geo.visible[1]) return;
  const x = round(geo.x(freqHz[index]));
  const bottom = (geo.phase ?? geo.mag).top + (geo.phase ?? geo.mag).height;
  g.append('line').attr('class', 'cursor-line').attr('x1', x).attr('x2', x).attr('y1', geo.mag.top).attr('y2', bottom);
  const rows: Array<[PanelBox, (v: number) => number, (s: PlotSeries) => number]> = [[geo.mag, geo.yMag, (s) => s.db[index]]];
  if (geo.phase && geo.yPhase) rows.push([geo.phase, geo.yPhase, (s) => s.phase_deg[index]]);
  for (const [box, y, value] of rows) {
    for (const s of series) {
      const v = value(s);
      if (!Number.isFinite(v)) continue;
      const cy = y(v);
      if (cy < box.top || cy > box.top + box.height) continue;
      g.append('circle').attr('cx', x).attr('cy', round(cy)).attr('r', 3.5).attr('fill', s.style.color);
    }
  }
  // The frequency under the cursor, in the strip just above the frequency axis that marker labels keep clear of.
  const label = formatTick(Number(freqHz[index].toPrecision(3)), 'Hz');
  const onRight = x > geo.innerWidth - 60;
  haloText(g, 'cursor-label cursor-freq', x + (onRight ? -4 : 4), bottom - 6, onRight ? 'end' : 'start', label);
}

/** Shows the rubber-band rectangle of a box zoom (plot coordinates), or hides it. */
export function drawZoomBox(svgEl: SVGSVGElement, box: { x0: number; y0: number; x1: number; y1: number } | undefined): void {
  const rect = select(svgEl).select<SVGRectElement>('rect.zoom-box');
  if (rect.empty()) return;
  if (!box) {
    rect.attr('display', 'none');
    return;
  }
  rect.attr('display', null)
    .attr('x', Math.min(box.x0, box.x1)).attr('y', Math.min(box.y0, box.y1))
    .attr('width', Math.abs(box.x1 - box.x0)).attr('height', Math.abs(box.y1 - box.y0));
}

/** Readout strings for one curve at a sample. */
export function readoutText(s: PlotSeries, index: number): { db: string; phase: string } {
  return { db: formatDb(s.db[index], 2), phase: formatDeg(s.phase_deg[index], 1) };
}

function trim(v: number): string {
  return String(Number(v.toPrecision(6)));
}
