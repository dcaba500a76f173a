/**
 * Drawing the pole–zero map into an SVG with d3, in the plots' own look (the stylesheet embedded
 * by prepareSvg): the right half-plane tinted and named, the grid, the two axes through the
 * origin, poles as × and zeros as ○ (shape tells them apart, never colour alone; a mark in the
 * right half-plane is drawn in red besides standing in the tinted half), each with its values as
 * a tooltip, and a key. Every colour is an attribute, so an exported file looks the same.
 */
import { PLOT_COLORS } from '../plot/palette';
import { drawExportLegend, haloText, horizontals, prepareSvg, round, verticals, type G } from '../plot/draw-common';
import { PLOT_CLASS } from '../plot/plot-style';
import { formatTick } from '../si-format';
import type { PzPoint } from './pole-zero-data';
import type { PzGeometry } from './pz-geometry';

/** Marks: poles blue and zeros vermillion (Okabe–Ito, as the curves), red in the right half-plane. */
export const PZ_COLORS = { pole: '#0072B2', zero: '#D55E00', rhp: '#A3221B', rhpFill: 'rgba(163, 34, 27, 0.06)' } as const;
/**
 * The map's own rules, beside the plots' stylesheet (text colour is a style, which an attribute
 * cannot override). Scoped like it: a `<style>` in inline SVG applies to the whole page.
 */
const PZ_STYLESHEET = `svg.${PLOT_CLASS} .rhp-text{fill:${PZ_COLORS.rhp};font-weight:600}`;
/** Width of the key, px. */
const KEY_WIDTH = 112;
/** Half the size of a mark, px. */
const MARK = 5;

/** Redraws the map; `caption` (the netlist's title) is written under it in the exported file. */
export function drawPz(svgEl: SVGSVGElement, geo: PzGeometry, points: readonly PzPoint[], caption?: string): void {
  const { svg, clipId } = prepareSvg(svgEl, geo.width, geo.height);
  svg.insert('style', 'defs').text(PZ_STYLESHEET);
  const { left, top, innerWidth: w, innerHeight: h } = geo;
  const right = left + w;
  const bottom = top + h;
  svg.select('defs').append('clipPath').attr('id', clipId).append('rect').attr('x', left).attr('y', top).attr('width', w).attr('height', h);

  // The right half-plane: where a pole means a growing mode.
  const x0 = Math.min(right, Math.max(left, geo.x(0)));
  if (x0 < right) {
    svg.append('rect').attr('class', 'rhp').attr('x', round(x0)).attr('y', top).attr('width', round(right - x0)).attr('height', h).attr('fill', PZ_COLORS.rhpFill);
  }
  const inX = geo.xTicks.filter((v) => geo.x(v) >= left - 0.5 && geo.x(v) <= right + 0.5);
  const inY = geo.yTicks.filter((v) => geo.y(v) >= top - 0.5 && geo.y(v) <= bottom + 0.5);
  svg.append('path').attr('class', 'grid').attr('d', verticals(inX.map(geo.x), top, bottom) + horizontals(inY.map(geo.y), left, right));
  // The axes through the origin: the imaginary axis is the stability boundary.
  svg.append('path').attr('class', 'axes').attr('stroke', PLOT_COLORS.inkMuted).attr('stroke-width', 1.25)
    .attr('d', verticals([geo.x(0)], top, bottom) + horizontals([geo.y(0)], left, right));
  svg.append('rect').attr('class', 'frame').attr('x', left).attr('y', top).attr('width', w).attr('height', h);
  if (right - x0 > 120) {
    haloText(svg.append('g').attr('class', 'rhp-label'), 'rhp-text', right - 6, top + 16, 'end', 'right half-plane: unstable');
  }
  svg.append('path').attr('class', 'ticks').attr('d', verticals(inX.map(geo.x), bottom, bottom + 4) + horizontals(inY.map(geo.y), left - 4, left));

  const xl = svg.append('g').attr('class', 'x-labels');
  for (const v of geo.xLabels.filter((l) => inX.includes(l))) xl.append('text').attr('x', round(geo.x(v))).attr('y', bottom + 16).text(formatTick(v, 'Hz'));
  const yl = svg.append('g').attr('class', 'y-labels');
  for (const v of geo.yLabels.filter((l) => inY.includes(l))) yl.append('text').attr('x', left - 6).attr('y', round(geo.y(v) + 4)).text(formatTick(v, 'Hz'));
  const scaleNote = geo.scale === 'asinh' ? ', arcsinh scale' : '';
  svg.append('text').attr('class', 'axis-title').attr('x', round(left + w / 2)).attr('y', bottom + 34).text(`Re s/2π (Hz${scaleNote})`);
  svg.append('text').attr('class', 'axis-title').attr('transform', `translate(16,${round(top + h / 2)}) rotate(-90)`).text(`Im s/2π (Hz${scaleNote})`);

  const marks = svg.append('g').attr('class', 'marks').attr('clip-path', `url(#${clipId})`);
  // Zeros under poles: a zero that cancels a pole shows as ⊗.
  for (const p of [...points.filter((q) => q.kind === 'zero'), ...points.filter((q) => q.kind === 'pole')]) {
    const cx = round(geo.x(p.re));
    const cy = round(geo.y(p.im));
    const color = p.rhp ? PZ_COLORS.rhp : PZ_COLORS[p.kind];
    const g = marks.append('g').attr('class', `pz pz-${p.kind}${p.rhp ? ' rhp-mark' : ''}`).attr('data-kind', p.kind);
    g.append('title').text(p.label);
    if (p.kind === 'pole') {
      g.append('path').attr('d', `M${cx - MARK} ${cy - MARK}L${cx + MARK} ${cy + MARK}M${cx - MARK} ${cy + MARK}L${cx + MARK} ${cy - MARK}`)
        .attr('stroke', color).attr('stroke-width', 2.25).attr('stroke-linecap', 'round').attr('fill', 'none');
    } else {
      // Filled with paper, so that the grid and the axes do not run through the ring.
      g.append('circle').attr('cx', cx).attr('cy', cy).attr('r', MARK).attr('stroke', color).attr('stroke-width', 2).attr('fill', PLOT_COLORS.paper);
    }
  }
  // The key in the first corner with no mark under it (the top right holds the half-plane's name).
  const corners = [[left + 8, top + 8], [left + 8, bottom - 28], [right - KEY_WIDTH - 8, bottom - 28], [right - KEY_WIDTH - 8, top + 28]];
  const free = corners.find(([kx, ky]) => !points.some((p) => {
    const px = geo.x(p.re);
    const py = geo.y(p.im);
    return px > kx - MARK - 2 && px < kx + KEY_WIDTH + MARK + 2 && py > ky - MARK - 2 && py < ky + 20 + MARK + 2;
  })) ?? corners[0];
  drawKey(svg.append('g').attr('class', 'key'), free[0], free[1]);
  // The caption goes below the map in the exported file only, as the other plots' legends do.
  drawExportLegend(svg, geo.width, geo.height, left, [], caption);
}

/** "× pole  ○ zero" on a paper patch, its top-left corner at (x, y). */
function drawKey(g: G, x: number, y: number): void {
  g.append('rect').attr('x', x).attr('y', y).attr('width', KEY_WIDTH).attr('height', 20).attr('rx', 3)
    .attr('fill', PLOT_COLORS.paper).attr('stroke', PLOT_COLORS.grid);
  const cy = y + 10;
  const px = x + 10;
  g.append('path').attr('d', `M${px - 4} ${cy - 4}L${px + 4} ${cy + 4}M${px - 4} ${cy + 4}L${px + 4} ${cy - 4}`)
    .attr('stroke', PZ_COLORS.pole).attr('stroke-width', 2).attr('stroke-linecap', 'round');
  g.append('text').attr('x', px + 9).attr('y', cy + 4).text('pole');
  const zx = x + 62;
  g.append('circle').attr('cx', zx).attr('cy', cy).attr('r', 4).attr('stroke', PZ_COLORS.zero).attr('stroke-width', 2).attr('fill', 'none');
  g.append('text').attr('x', zx + 9).attr('y', cy + 4).text('zero');
}
