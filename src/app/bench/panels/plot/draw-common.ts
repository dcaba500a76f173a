/**
 * Drawing shared by the Bode plot and the transfer plot: the SVG's root (paper, stylesheet,
 * clip paths), grids as one path per kind rather than one line per tick, the marker labels
 * placed clear of each other, and the legend that only the exported file shows.
 */
import { select, type Selection } from 'd3';
import { placeLabels, ringBox, type Box, type LabelRequest } from './label-place';
import type { CurveStyle } from './palette';
import { PLOT_CLASS, PLOT_PAGE_STYLESHEET, PLOT_STYLESHEET } from './plot-style';

export type G = Selection<SVGGElement, unknown, null, undefined>;
export type Svg = Selection<SVGSVGElement, unknown, null, undefined>;

/** Height of one row of the exported legend. */
const LEGEND_ROW = 20;
/** Height of the strip above the x axis that the cursor's label uses: marker labels keep out. */
export const CURSOR_STRIP = 20;
/** Decimals of path coordinates: a tenth of a pixel is finer than any screen or print shows. */
export const PATH_DIGITS = 1;

/** Clip-path ids must be unique in the page: several plots may be on screen. */
let clipCounter = 0;

/** Empties the SVG and gives it its size, class, stylesheet and paper; returns a fresh clip id stem. */
export function prepareSvg(svgEl: SVGSVGElement, width: number, height: number): { svg: Svg; clipId: string } {
  const svg = select(svgEl);
  svg.selectAll('*').remove();
  svg.classed(PLOT_CLASS, true).attr('width', width).attr('height', height).attr('viewBox', `0 0 ${width} ${height}`);
  svg.append('style').text(PLOT_STYLESHEET);
  svg.append('style').attr('data-export', 'skip').text(PLOT_PAGE_STYLESHEET);
  svg.append('defs');
  svg.append('rect').attr('class', 'paper').attr('width', width).attr('height', height);
  return { svg, clipId: `nw-plot-clip-${++clipCounter}` };
}

/** Adds a clip rectangle to the SVG's defs. */
export function addClip(svg: Svg, id: string, box: Box): void {
  svg.select('defs').append('clipPath').attr('id', id).append('rect')
    .attr('x', box.x).attr('y', box.y).attr('width', box.width).attr('height', box.height);
}

/** Vertical lines at `xs` from y0 to y1 as one path `d`. */
export function verticals(xs: readonly number[], y0: number, y1: number): string {
  return xs.map((x) => `M${round(x)} ${round(y0)}V${round(y1)}`).join('');
}

/** Horizontal lines at `ys` from x0 to x1 as one path `d`. */
export function horizontals(ys: readonly number[], x0: number, x1: number): string {
  return ys.map((y) => `M${round(x0)} ${round(y)}H${round(x1)}`).join('');
}

export function round(v: number): number {
  return Math.round(v * 10) / 10;
}

/** A marker to draw: a ring at (x, y), an optional dashed drop line to `dropTo`, a label. */
export interface MarkerMark {
  id: string;
  kind: string;
  x: number;
  y: number;
  label: string;
  priority: number;
  dropTo?: number;
}

/**
 * Draws marker rings, drop lines and labels; the labels go where `placeLabels` finds room inside
 * `bounds`, clear of every ring and of `obstacles`. Each marker carries its text as a `<title>`
 * (a tooltip), so a label dropped for lack of room still tells its value.
 */
export function drawMarkers(root: G, marks: readonly MarkerMark[], bounds: Box, obstacles: readonly Box[], extraLabels: readonly LabelRequest[] = []): string[] {
  const g = root.append('g').attr('class', 'markers');
  const requests: LabelRequest[] = [...extraLabels, ...marks.map((m) => ({ id: m.id, text: m.label, x: m.x, y: m.y, priority: m.priority }))];
  const rings = marks.map((m) => ringBox(m.x, m.y));
  const { placed, dropped } = placeLabels(requests, bounds, [...obstacles, ...rings]);
  const byId = new Map(placed.map((p) => [p.id, p]));
  for (const m of marks) {
    const mg = g.append('g').attr('class', `marker marker-${m.kind}`).attr('data-id', m.id);
    mg.append('title').text(m.label);
    if (m.dropTo !== undefined) {
      mg.append('path').attr('class', 'drop').attr('d', `M${round(m.x)} ${round(m.y)}V${round(m.dropTo)}`);
    }
    mg.append('circle').attr('cx', round(m.x)).attr('cy', round(m.y)).attr('r', 4.5);
    const at = byId.get(m.id);
    if (at) haloText(mg, 'marker-label', at.x, at.y, at.anchor, m.label);
  }
  for (const extra of extraLabels) {
    const at = byId.get(extra.id);
    if (at) haloText(g, `marker-label label-${extra.id}`, at.x, at.y, at.anchor, extra.text);
  }
  return dropped;
}

/** Text with a paper-coloured halo, readable over grid and curves. */
export function haloText(g: G, cls: string, x: number, y: number, anchor: string, text: string): void {
  g.append('text').attr('class', `${cls} halo`).attr('x', round(x)).attr('y', round(y))
    .attr('text-anchor', anchor === 'start' ? null : anchor).text(text);
}

/**
 * The legend of the exported file: below the plot, outside the on-screen view box (the page
 * has its own legend), with the caption first. The SVG's `data-export-extra` tells the export
 * how much taller the file must be to show it.
 */
export function drawExportLegend(svg: Svg, width: number, height: number, left: number, series: ReadonlyArray<{ label: string; style: CurveStyle }>, caption?: string): void {
  const g = svg.append('g').attr('class', 'export-legend');
  let x = left;
  let row = 0;
  const place = (w: number) => {
    if (x + w > width - 8 && x > left) {
      row++;
      x = left;
    }
    const at = { x, y: height + 6 + row * LEGEND_ROW + 12 };
    x += w;
    return at;
  };
  if (caption) {
    const at = place(caption.length * 7 + 24);
    g.append('text').attr('class', 'caption').attr('x', at.x).attr('y', at.y).text(caption);
  }
  for (const s of series) {
    const at = place(34 + s.label.length * 7 + 18);
    g.append('path').attr('class', 'swatch').attr('d', `M${at.x} ${at.y - 4}h26`)
      .attr('stroke', s.style.color).attr('stroke-dasharray', s.style.dash || null);
    g.append('text').attr('x', at.x + 32).attr('y', at.y).text(s.label);
  }
  const extra = series.length > 0 || caption ? (row + 1) * LEGEND_ROW + 8 : 0;
  svg.attr('data-export-extra', extra);
}
