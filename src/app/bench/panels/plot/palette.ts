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

/** The style of the n-th curve (cycling). */
export function curveStyle(index: number): CurveStyle {
  return CURVE_STYLES[((index % CURVE_STYLES.length) + CURVE_STYLES.length) % CURVE_STYLES.length];
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
} as const;

export const PLOT_FONT = '"Source Sans 3", "Source Sans Pro", Arial, sans-serif';
