import { asinhConstant, defaultScale, layoutPz, type PzXY } from './pz-geometry';

/** A dominant pole at −10 Hz, a pair at −50 kHz ± j 200 kHz, and one at −1 GHz. */
const spread: PzXY[] = [{ re: -10, im: 0 }, { re: -5e4, im: 2e5 }, { re: -5e4, im: -2e5 }, { re: -1e9, im: 0 }];
/** A pair of Q = 10 at 159 kHz (the RLC of the specs). */
const pair: PzXY[] = [{ re: -7957.7, im: 158955.9 }, { re: -7957.7, im: -158955.9 }];

describe('pole–zero map geometry', () => {
  it('draws both axes on one scale on a linear map, the origin inside, so a pair’s angle is true', () => {
    const g = layoutPz({ width: 600, height: 340, points: pair, scale: 'linear' });
    // The same pixels per hertz on both axes (y grows downwards).
    const perHzX = (g.x(1e5) - g.x(0)) / 1e5;
    const perHzY = (g.y(0) - g.y(1e5)) / 1e5;
    expect(perHzY).toBeCloseTo(perHzX, 12);
    // The angle from the negative real axis: cos θ = −Re/|s| = 1/(2Q) for Q = 10.
    const dx = g.x(0) - g.x(pair[0].re);
    const dy = g.y(0) - g.y(pair[0].im);
    expect(dx / Math.hypot(dx, dy)).toBeCloseTo(1 / 20, 3);
    for (const p of [...pair, { re: 0, im: 0 }]) {
      expect(g.x(p.re)).toBeGreaterThanOrEqual(g.left);
      expect(g.x(p.re)).toBeLessThanOrEqual(g.left + g.innerWidth);
      expect(g.y(p.im)).toBeGreaterThanOrEqual(g.top);
      expect(g.y(p.im)).toBeLessThanOrEqual(g.top + g.innerHeight);
    }
    // The imaginary axis is the map's tall one: the real one is widened to keep the scale.
    expect(g.y(0)).toBeCloseTo(g.top + g.innerHeight / 2, 9);
    expect(g.xLabels.length).toBeGreaterThanOrEqual(2);
    expect(g.yTicks).toContain(0);
  });

  it('chooses arcsinh when the magnitudes span more than two decades, and linear otherwise', () => {
    expect(defaultScale(spread)).toBe('asinh');
    expect(defaultScale(pair)).toBe('linear');
    expect(defaultScale([])).toBe('linear');
    expect(defaultScale([{ re: -1e3, im: 0 }, { re: -9e4, im: 0 }])).toBe('linear');
  });

  it('keeps a 10 Hz pole and a 1 GHz one apart and clear of the origin on the arcsinh map', () => {
    const g = layoutPz({ width: 600, height: 340, points: spread, scale: 'asinh' });
    // c a decade below the smallest coordinate, 10 Hz.
    expect(asinhConstant(spread)).toBe(1);
    expect(g.c).toBe(1);
    const origin = g.x(0);
    const slow = origin - g.x(-10);
    const fast = origin - g.x(-1e9);
    expect(fast).toBeLessThanOrEqual(origin - g.left);
    // asinh(10) / asinh(10⁹) of the way: about a seventh, tens of pixels.
    expect(slow / fast).toBeCloseTo(Math.asinh(10) / Math.asinh(1e9), 9);
    expect(slow).toBeGreaterThan(20);
    // Symmetric about zero, the same transform on both axes.
    expect(g.y(2e5) - g.y(0)).toBeCloseTo(-(g.y(-2e5) - g.y(0)), 9);
    expect(g.y(0) - g.y(2e5)).toBeCloseTo(origin - g.x(-2e5), 9);
    // Gridlines at 0 and ± powers of ten; labels thinned so that none overlaps the next.
    expect(g.xTicks).toContain(0);
    expect(g.xTicks).toContain(-1e9);
    expect(g.xTicks.filter((v) => v !== 0).every((v) => Number.isInteger(Math.log10(Math.abs(v))))).toBe(true);
    const px = g.xLabels.map(g.x);
    expect(px.every((x, k) => k === 0 || x - px[k - 1] > 30)).toBe(true);
    expect(g.xLabels).toContain(0);
  });

  it('takes no notice of a pair’s rounding-sized real part when it picks c', () => {
    expect(asinhConstant([{ re: -1e-9, im: 1e6 }, { re: -1e-9, im: -1e6 }])).toBe(1e5);
    expect(asinhConstant([])).toBe(1);
  });

  it('lays out an empty plane around the origin', () => {
    const g = layoutPz({ width: 600, height: 340, points: [], scale: 'linear' });
    expect(g.x(0)).toBeGreaterThan(g.left);
    expect(g.x(0)).toBeLessThan(g.left + g.innerWidth);
    expect(Number.isFinite(g.y(0))).toBe(true);
  });
});
