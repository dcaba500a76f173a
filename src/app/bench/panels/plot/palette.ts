/**
 * Plot colours: the Okabe–Ito colour-blind-safe palette (Okabe & Ito, "Color Universal Design",
 * 2008), ordered so the first curves have the most contrast against the paper background,
 * each paired with its own dash pattern so curves never differ by colour alone.
 * The concrete colours are written into the SVG (not CSS variables) so an exported plot
 * looks the same outside the app.
 */

export interface CurveStyle {
  color: string;
  /** SVG stroke-dasharray; '' is a solid line. */
  dash: string;
}

/** Okabe–Ito blue, vermillion, bluish green, reddish purple, then ink, orange, sky blue. */
export const CURVE_STYLES: readonly CurveStyle[] = [
  { color: '#0072B2', dash: '' },
  { color: '#D55E00', dash: '7 4' },
  { color: '#009E73', dash: '2 3' },
  { color: '#CC79A7', dash: '9 3 2 3' },
  { color: '#1D2230', dash: '4 2' },
  { color: '#E69F00', dash: '12 4' },
  { color: '#56B4E9', dash: '1 2' },
];

/**
 * The style of the n-th curve. The first seven are the pairs above; past them each colour comes
 * back with another palette's dash (shifted by three per round, and 3 is prime to 7), so the
 * first 49 curves all differ in colour or dash or both.
 */
export function curveStyle(index: number): CurveStyle {
  const n = CURVE_STYLES.length;
  const k = Math.max(0, Math.floor(index));
  if (k < n) return CURVE_STYLES[k];
  const round = Math.floor(k / n) % n;
  const color = CURVE_STYLES[k % n].color;
  const dash = CURVE_STYLES[(k + 3 * round) % n].dash;
  return { color, dash };
}

/** The plot's own neutral colours, matching the app theme's paper and ink. */
export const PLOT_COLORS = {
  paper: '#FFFDF8',
  ink: '#1D2230',
  inkMuted: '#444A58',
  grid: '#E4DCCB',
  gridMinor: '#EFE9DC',
  cursor: '#1F5F7A',
  marker: '#A8481F',
  zoomBox: 'rgba(31, 95, 122, 0.12)',
  /** A marked span of the x axis (the linear input range): the marker's colour, faint. */
  band: 'rgba(168, 72, 31, 0.09)',
} as const;

export const PLOT_FONT = '"Source Sans 3", "Source Sans Pro", Arial, sans-serif';
