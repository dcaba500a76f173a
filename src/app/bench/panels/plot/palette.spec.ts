import { curveStyle, CURVE_STYLES, PLOT_COLORS } from './palette';

/** Relative luminance of an sRGB colour (WCAG 2.1, definition of relative luminance). */
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255)
    .map((v) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('the curve palette', () => {
  it('is Okabe–Ito, and every one of its curves has its own colour and its own dash', () => {
    // Okabe & Ito, "Color Universal Design" (2008): blue, vermillion, bluish green, reddish purple,
    // (black, drawn in the plot's ink), orange, sky blue.
    expect(CURVE_STYLES.map((s) => s.color)).toEqual(['#0072B2', '#D55E00', '#009E73', '#CC79A7', PLOT_COLORS.ink, '#E69F00', '#56B4E9']);
    expect(new Set(CURVE_STYLES.map((s) => s.color)).size).toBe(CURVE_STYLES.length);
    expect(new Set(CURVE_STYLES.map((s) => s.dash)).size).toBe(CURVE_STYLES.length);
    // The first curve is solid: the one a designer reads first is the plainest.
    expect(CURVE_STYLES[0].dash).toBe('');
  });

  it('never repeats a colour-and-dash pair over the first 49 curves', () => {
    const looks = Array.from({ length: 49 }, (_, k) => curveStyle(k)).map((s) => `${s.color}|${s.dash}`);
    expect(new Set(looks).size).toBe(49);
    expect(curveStyle(3)).toBe(CURVE_STYLES[3]);
    // The eighth curve takes the first colour back with another dash.
    expect(curveStyle(7).color).toBe(CURVE_STYLES[0].color);
    expect(curveStyle(7).dash).not.toBe(CURVE_STYLES[0].dash);
  });

  it('draws the first five curves at 3:1 contrast or more against the paper', () => {
    // WCAG 2.1, success criterion 1.4.11 (non-text contrast): 3:1 for graphics. Orange and sky
    // blue fall short (about 2.2:1) and are used from the sixth curve on, always dashed.
    for (const s of CURVE_STYLES.slice(0, 5)) expect(contrast(s.color, PLOT_COLORS.paper)).toBeGreaterThanOrEqual(3);
    for (const s of CURVE_STYLES.slice(5)) expect(s.dash).not.toBe('');
  });
});
