/**
 * The plots' one small stylesheet, written into every plot's SVG as a `<style>` element. The
 * page and an exported file read the same rules, so the file looks as the plot on screen without
 * repeating colours and fonts on every element. Rules are scoped to `svg.nw-plot` because a
 * `<style>` inside inline SVG applies to the whole HTML document. Per-curve colours and dashes
 * stay attributes on their one path each.
 */
import { PLOT_COLORS, PLOT_FONT } from './palette';

/** The class of a plot's root `<svg>`, which scopes the stylesheet. */
export const PLOT_CLASS = 'nw-plot';

const c = PLOT_COLORS;
const s = `svg.${PLOT_CLASS}`;

/** The rules, minified by hand (they travel in every exported file). */
export const PLOT_STYLESHEET = [
  `${s}{font-family:${PLOT_FONT};font-size:12px}`,
  `${s} text{fill:${c.ink}}`,
  `${s} .paper{fill:${c.paper}}`,
  `${s} .grid{fill:none;stroke:${c.grid}}`,
  `${s} .grid-minor{fill:none;stroke:${c.gridMinor}}`,
  `${s} .frame{fill:none;stroke:${c.inkMuted}}`,
  `${s} .ticks{fill:none;stroke:${c.inkMuted}}`,
  `${s} .zero{stroke:${c.inkMuted};stroke-dasharray:3 3}`,
  `${s} .axis-title{font-weight:600}`,
  `${s} .y-labels text{text-anchor:end}`,
  `${s} .x-labels text,${s} .axis-title{text-anchor:middle}`,
  `${s} .curve{fill:none;stroke-width:2;stroke-linejoin:round}`,
  `${s} .marker .drop{stroke:${c.marker};stroke-dasharray:2 3}`,
  `${s} .marker circle{fill:${c.paper};stroke:${c.marker};stroke-width:2}`,
  `${s} .marker-label{fill:${c.marker};font-weight:600}`,
  `${s} .halo{stroke:${c.paper};stroke-width:4px;paint-order:stroke;stroke-linejoin:round}`,
  `${s} .band{fill:${c.band}}`,
  `${s} .band-edge{stroke:${c.marker};stroke-dasharray:4 3}`,
  `${s} .rule-line{stroke:${c.marker};stroke-dasharray:6 3}`,
  `${s} .rule-label{fill:${c.marker};font-weight:600}`,
  `${s} .points circle{stroke:${c.paper};stroke-width:1}`,
  `${s} .caption{font-weight:700}`,
  `${s} .swatch{stroke-width:2.5}`,
].join('\n');

/** Rules for what only the page shows (the cursor, the zoom box): left out of exported files with them. */
export const PLOT_PAGE_STYLESHEET = [
  `${s} .cursor-line{stroke:${c.cursor};stroke-width:1.5}`,
  `${s} .cursor circle{stroke:${c.paper};stroke-width:1.5}`,
  `${s} .cursor-label{fill:${c.cursor};font-weight:600}`,
  `${s} .zoom-box{fill:${c.zoomBox};stroke:${c.cursor};stroke-dasharray:4 2}`,
].join('\n');
