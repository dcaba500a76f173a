/**
 * Drawing a Bode plot into an SVG with d3: grid, axes with units, curves, the −3 dB and unity
 * markers, the crosshair cursor and the zoom box. Every colour and font is written as an
 * attribute so that the exported file looks the same as the plot on screen.
 */
import { line, select, type Selection } from 'd3';
import { formatDb, formatDeg, formatTick } from '../si-format';
import { logTicks } from './log-ticks';
import { PLOT_COLORS, PLOT_FONT } from './palette';
import type { PanelBox, PlotGeometry, PlotMarker, PlotSeries } from './plot-geometry';

type G = Selection<SVGGElement, unknown, null, undefined>;

/** Clip-path ids must be unique in the page: several plots may be on screen. */
let clipCounter = 0;

export interface PlotLabels {
  magnitude: string;
  phase: string;
  frequency: string;
  /** A caption for the exported file (the netlist's title). */
  caption?: string;
}

/** Height of one row of the exported legend. */
const LEGEND_ROW = 20;

/** Redraws the whole plot (cursor and zoom box layers are created empty). */
export function drawPlot(svgEl: SVGSVGElement, geo: PlotGeometry, freqHz: readonly number[], series: readonly PlotSeries[], markers: readonly PlotMarker[], labels: PlotLabels): void {
  const svg = select(svgEl);
  svg.selectAll('*').remove();
  svg.attr('width', geo.width).attr('height', geo.height).attr('viewBox', `0 0 ${geo.width} ${geo.height}`)
    .attr('font-family', PLOT_FONT).attr('font-size', 12).attr('fill', PLOT_COLORS.ink);
  svg.append('rect').attr('class', 'paper').attr('width', geo.width).attr('height', geo.height).attr('fill', PLOT_COLORS.paper);

  const root = svg.append('g').attr('transform', `translate(${geo.left},0)`);
  const clipId = `nw-plot-clip-${++clipCounter}`;
  const defs = svg.insert('defs', ':first-child');
  addClip(defs, `${clipId}-mag`, geo.innerWidth, geo.mag);
  if (geo.phase) addClip(defs, `${clipId}-phase`, geo.innerWidth, geo.phase);

  const panels: Array<{ box: PanelBox; y: (v: number) => number; ticks: number[]; values: (s: PlotSeries) => readonly number[]; name: 'mag' | 'phase'; title: string; fmt: (v: number) => string }> = [
    { box: geo.mag, y: geo.yMag, ticks: geo.magTicks, values: (s) => s.db, name: 'mag', title: labels.magnitude, fmt: (v) => `${trim(v)}` },
  ];
  if (geo.phase && geo.yPhase) panels.push({ box: geo.phase, y: geo.yPhase, ticks: geo.phaseTicks, values: (s) => s.phase_deg, name: 'phase', title: labels.phase, fmt: (v) => `${trim(v)}°` });

  const ticks = logTicks(geo.x.domain()[0], geo.x.domain()[1], Math.max(3, Math.floor(geo.innerWidth / 55)));
  for (const [index, panel] of panels.entries()) {
    const g = root.append('g').attr('class', `panel panel-${panel.name}`);
    const bottom = panel.box.top + panel.box.height;
    // Grid: minor decades faint, majors and value ticks stronger.
    g.append('g').selectAll('line').data(ticks.minor).join('line')
      .attr('x1', (f) => geo.x(f)).attr('x2', (f) => geo.x(f)).attr('y1', panel.box.top).attr('y2', bottom)
      .attr('stroke', PLOT_COLORS.gridMinor).attr('stroke-width', 1);
    g.append('g').selectAll('line').data(ticks.major).join('line')
      .attr('x1', (f) => geo.x(f)).attr('x2', (f) => geo.x(f)).attr('y1', panel.box.top).attr('y2', bottom)
      .attr('stroke', PLOT_COLORS.grid).attr('stroke-width', 1);
    const yTicks = panel.ticks.filter((v) => panel.y(v) >= panel.box.top - 0.5 && panel.y(v) <= bottom + 0.5);
    g.append('g').selectAll('line').data(yTicks).join('line')
      .attr('x1', 0).attr('x2', geo.innerWidth).attr('y1', (v) => panel.y(v)).attr('y2', (v) => panel.y(v))
      .attr('stroke', PLOT_COLORS.grid).attr('stroke-width', 1);
    // 0 dB is the unity line: a designer looks for it first.
    if (panel.name === 'mag' && yTicks.includes(0)) {
      g.append('line').attr('x1', 0).attr('x2', geo.innerWidth).attr('y1', panel.y(0)).attr('y2', panel.y(0))
        .attr('stroke', PLOT_COLORS.inkMuted).attr('stroke-width', 1).attr('stroke-dasharray', '3 3');
    }
    // Frame and value labels.
    g.append('rect').attr('x', 0).attr('y', panel.box.top).attr('width', geo.innerWidth).attr('height', panel.box.height)
      .attr('fill', 'none').attr('stroke', PLOT_COLORS.inkMuted).attr('stroke-width', 1);
    g.append('g').attr('class', 'y-labels').selectAll('text').data(yTicks).join('text')
      .attr('x', -6).attr('y', (v) => panel.y(v)).attr('dy', '0.32em').attr('text-anchor', 'end')
      .attr('fill', PLOT_COLORS.ink).text(panel.fmt);
    g.append('text').attr('class', 'axis-title')
      .attr('transform', `translate(${-44},${panel.box.top + panel.box.height / 2}) rotate(-90)`)
      .attr('text-anchor', 'middle').attr('fill', PLOT_COLORS.ink).attr('font-weight', 600).text(panel.title);
    const isLast = index === panels.length - 1;
    if (isLast) {
      g.append('g').attr('class', 'x-labels').selectAll('text').data(ticks.major).join('text')
        .attr('x', (f) => geo.x(f)).attr('y', bottom + 16).attr('text-anchor', 'middle')
        .attr('fill', PLOT_COLORS.ink).text((f) => formatTick(f, 'Hz'));
      g.append('text').attr('class', 'axis-title').attr('x', geo.innerWidth / 2).attr('y', bottom + 34)
        .attr('text-anchor', 'middle').attr('fill', PLOT_COLORS.ink).attr('font-weight', 600).text(labels.frequency);
    }
    // Tick marks on the shared frequency axis, on every panel.
    g.append('g').selectAll('line').data(ticks.major).join('line')
      .attr('x1', (f) => geo.x(f)).attr('x2', (f) => geo.x(f)).attr('y1', bottom).attr('y2', bottom + 4)
      .attr('stroke', PLOT_COLORS.inkMuted);

    // Curves, clipped to the panel.
    const curves = g.append('g').attr('clip-path', `url(#${clipId}-${panel.name})`);
    for (const s of series) {
      const values = panel.values(s);
      const path = line<number>()
        .defined((k) => Number.isFinite(values[k]) && freqHz[k] > 0)
        .x((k) => geo.x(freqHz[k]))
        .y((k) => panel.y(values[k]));
      curves.append('path').attr('class', 'curve').attr('data-key', s.key)
        .attr('d', path(freqHz.map((_, k) => k)) ?? '')
        .attr('fill', 'none').attr('stroke', s.style.color).attr('stroke-width', 2)
        .attr('stroke-dasharray', s.style.dash || null).attr('stroke-linejoin', 'round');
    }
  }
  drawMarkers(root, geo, markers);
  drawExportLegend(svg, geo, series, labels.caption);
  root.append('g').attr('class', 'cursor').attr('data-export', 'skip');
  root.append('rect').attr('class', 'zoom-box').attr('data-export', 'skip').attr('display', 'none')
    .attr('fill', PLOT_COLORS.zoomBox).attr('stroke', PLOT_COLORS.cursor).attr('stroke-dasharray', '4 2');
}

function addClip(defs: Selection<SVGDefsElement, unknown, null, undefined>, id: string, width: number, box: PanelBox): void {
  defs.append('clipPath').attr('id', id).append('rect').attr('x', 0).attr('y', box.top).attr('width', width).attr('height', box.height);
}

/** The −3 dB and unity points: a ring on the curve, a dashed drop line and a label with a halo. */
function drawMarkers(root: G, geo: PlotGeometry, markers: readonly PlotMarker[]): void {
  const [lo, hi] = geo.x.domain();
  const g = root.append('g').attr('class', 'markers');
  const bottom = (geo.phase ?? geo.mag).top + (geo.phase ?? geo.mag).height;
  for (const [k, m] of markers.entries()) {
    if (!(m.freqHz >= lo && m.freqHz <= hi)) continue;
    const x = geo.x(m.freqHz);
    const y = geo.yMag(m.db);
    if (y < geo.mag.top || y > geo.mag.top + geo.mag.height) continue;
    const mg = g.append('g').attr('class', `marker marker-${m.kind}`);
    mg.append('line').attr('x1', x).attr('x2', x).attr('y1', y).attr('y2', bottom)
      .attr('stroke', PLOT_COLORS.marker).attr('stroke-width', 1).attr('stroke-dasharray', '2 3');
    mg.append('circle').attr('cx', x).attr('cy', y).attr('r', 4.5)
      .attr('fill', PLOT_COLORS.paper).attr('stroke', PLOT_COLORS.marker).attr('stroke-width', 2);
    // Labels go to the side with room; the second marker sits lower so the two never overlap.
    const rightSide = x < geo.innerWidth - 130;
    const labelY = Math.min(geo.mag.top + geo.mag.height - 6, Math.max(geo.mag.top + 12, y - 10 + k * 28));
    mg.append('text').attr('class', 'marker-label').attr('x', x + (rightSide ? 8 : -8)).attr('y', labelY)
      .attr('text-anchor', rightSide ? 'start' : 'end').attr('fill', PLOT_COLORS.marker).attr('font-weight', 600)
      .attr('stroke', PLOT_COLORS.paper).attr('stroke-width', 4).attr('paint-order', 'stroke').attr('stroke-linejoin', 'round')
      .text(m.label);
  }
}

/**
 * The legend of the exported file: below the plot, outside the on-screen view box (the page
 * has its own legend), with the caption first. The SVG's `data-export-extra` tells the export
 * how much taller the file must be to show it.
 */
function drawExportLegend(svg: Selection<SVGSVGElement, unknown, null, undefined>, geo: PlotGeometry, series: readonly PlotSeries[], caption?: string): void {
  const g = svg.append('g').attr('class', 'export-legend');
  let x = geo.left;
  let row = 0;
  const place = (width: number) => {
    if (x + width > geo.width - 8 && x > geo.left) {
      row++;
      x = geo.left;
    }
    const at = { x, y: geo.height + 6 + row * LEGEND_ROW + 12 };
    x += width;
    return at;
  };
  if (caption) {
    const at = place(caption.length * 7 + 24);
    g.append('text').attr('x', at.x).attr('y', at.y).attr('font-weight', 700).attr('fill', PLOT_COLORS.ink).text(caption);
  }
  for (const s of series) {
    const at = place(34 + s.label.length * 7 + 18);
    g.append('line').attr('x1', at.x).attr('x2', at.x + 26).attr('y1', at.y - 4).attr('y2', at.y - 4)
      .attr('stroke', s.style.color).attr('stroke-width', 2.5).attr('stroke-dasharray', s.style.dash || null);
    g.append('text').attr('x', at.x + 32).attr('y', at.y).attr('fill', PLOT_COLORS.ink).text(s.label);
  }
  const extra = series.length > 0 || caption ? (row + 1) * LEGEND_ROW + 8 : 0;
  svg.attr('data-export-extra', extra);
}

/** Draws the crosshair at sample `index` (or clears it when undefined). */
export function drawCursor(svgEl: SVGSVGElement, geo: PlotGeometry, freqHz: readonly number[], series: readonly PlotSeries[], index: number | undefined): void {
  const g = select(svgEl).select<SVGGElement>('g.cursor');
  if (g.empty()) return;
  g.selectAll('*').remove();
  if (index === undefined || index < geo.visible[0] || index > geo.visible[1]) return;
  const x = geo.x(freqHz[index]);
  const bottom = (geo.phase ?? geo.mag).top + (geo.phase ?? geo.mag).height;
  g.append('line').attr('class', 'cursor-line').attr('x1', x).attr('x2', x).attr('y1', geo.mag.top).attr('y2', bottom)
    .attr('stroke', PLOT_COLORS.cursor).attr('stroke-width', 1.5);
  const rows: Array<[PanelBox, (v: number) => number, (s: PlotSeries) => number]> = [[geo.mag, geo.yMag, (s) => s.db[index]]];
  if (geo.phase && geo.yPhase) rows.push([geo.phase, geo.yPhase, (s) => s.phase_deg[index]]);
  for (const [box, y, value] of rows) {
    for (const s of series) {
      const v = value(s);
      if (!Number.isFinite(v)) continue;
      const cy = y(v);
      if (cy < box.top || cy > box.top + box.height) continue;
      g.append('circle').attr('cx', x).attr('cy', cy).attr('r', 3.5)
        .attr('fill', s.style.color).attr('stroke', PLOT_COLORS.paper).attr('stroke-width', 1.5);
    }
  }
  // The frequency under the cursor, just above the frequency axis (away from the marker labels).
  const label = formatTick(Number(freqHz[index].toPrecision(3)), 'Hz');
  const onRight = x > geo.innerWidth - 60;
  g.append('text').attr('class', 'cursor-freq').attr('x', x + (onRight ? -4 : 4)).attr('y', bottom - 6).attr('text-anchor', onRight ? 'end' : 'start')
    .attr('fill', PLOT_COLORS.cursor).attr('font-weight', 600)
    .attr('stroke', PLOT_COLORS.paper).attr('stroke-width', 4).attr('paint-order', 'stroke').text(label);
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
