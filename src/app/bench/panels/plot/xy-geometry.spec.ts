import { drawXy } from './xy-draw';
import { layoutXy, type XySeries } from './xy-geometry';
import { curveStyle } from './palette';

// A noise sweep of 10 points per decade from 10 Hz to 10 MHz, as `analyze noise … per decade 10` makes.
const freq = Array.from({ length: 61 }, (_, k) => 10 * Math.pow(10, k / 10));
// A white 4.07 nV/√Hz falling as a first-order low-pass above 100 kHz (the RC of the noise specs).
const density = freq.map((f) => 4.07e-9 / Math.sqrt(1 + (f / 1.59e5) ** 2));
const series = (values: readonly number[], unit = 'V/√Hz', key = 'out'): XySeries => ({ key, label: key, unit, values, style: curveStyle(0) });

describe('xy plot geometry on log axes', () => {
  it('fits a log y axis to whole decades around the values, decades evenly spaced', () => {
    const g = layoutXy({ width: 700, height: 360, x: freq, series: [series(density)], xLog: true, yLog: true });
    const p = g.panels[0];
    expect(p.log).toBe(true);
    // 4.07 nV … 64.7 pV/√Hz lies in 10 pV … 10 nV.
    expect(density[60]).toBeCloseTo(6.47e-11, 12);
    expect(p.y.domain()).toEqual([1e-11, 1e-8]);
    expect(p.ticks).toEqual([1e-11, 1e-10, 1e-9, 1e-8]);
    const step = p.y(1e-10) - p.y(1e-9);
    expect(p.y(1e-11) - p.y(1e-10)).toBeCloseTo(step, 9);
    expect(p.y(1e-9) - p.y(1e-8)).toBeCloseTo(step, 9);
    expect(p.y(1e-8)).toBeCloseTo(p.box.top, 9);
    // 2…9 of each decade as minor ticks.
    expect(p.minorTicks).toContain(2e-11);
    expect(p.minorTicks).toContain(9e-9);
    expect(p.minorTicks.length).toBe(3 * 8);
    expect(p.title).toBe('Noise density (V/√Hz)');
  });

  it('gives the log x axis its minor ticks, and a linear one none', () => {
    const log = layoutXy({ width: 700, height: 360, x: freq, series: [series(density)], xLog: true, yLog: true });
    expect(log.xTicks).toEqual([10, 100, 1e3, 1e4, 1e5, 1e6, 1e7]);
    expect(log.xMinorTicks).toContain(20);
    expect(log.xMinorTicks.length).toBe(6 * 8);
    const linear = layoutXy({ width: 700, height: 360, x: [0, 1, 2], series: [series([1, 2, 3], 'V')] });
    expect(linear.xMinorTicks).toEqual([]);
    expect(linear.panels[0].minorTicks).toEqual([]);
    expect(linear.panels[0].log).toBe(false);
  });

  it('leaves zeros and negative values out of the fit, and keeps a panel with no positive value linear', () => {
    const gaps = density.map((d, k) => (k === 30 ? 0 : k === 31 ? -1e-3 : k === 32 ? NaN : d));
    const g = layoutXy({ width: 700, height: 360, x: freq, series: [series(gaps), series([0, -1, 0], 'A/√Hz', 'none')], xLog: true, yLog: true });
    expect(g.panels[0].y.domain()).toEqual([1e-11, 1e-8]);
    expect(g.panels[1].log).toBe(false);
    expect(g.panels[1].title).toBe('Noise density (A/√Hz)');
  });

  it('gives a value that is a whole decade the decade either side, and labels 1-2-5 on a short span', () => {
    const flat = layoutXy({ width: 700, height: 360, x: freq, series: [series(freq.map(() => 1e-9))], xLog: true, yLog: true });
    expect(flat.panels[0].y.domain()).toEqual([1e-10, 1e-8]);
    const within = layoutXy({ width: 700, height: 360, x: freq, series: [series(freq.map(() => 4.07e-9))], xLog: true, yLog: true });
    expect(within.panels[0].y.domain()).toEqual([1e-9, 1e-8]);
    expect(within.panels[0].ticks).toEqual([1e-9, 2e-9, 5e-9, 1e-8]);
  });
});

describe('xy plot drawing on log axes', () => {
  it('labels decades in SI units, draws the minor grid, and breaks a curve where it has no place', () => {
    const svg = document.createElementNS('http://www.w3.org/2000/svg', 'svg');
    const values = density.map((d, k) => (k === 30 ? 0 : d));
    const geo = layoutXy({ width: 700, height: 360, x: freq, series: [series(values)], xLog: true, yLog: true });
    drawXy(svg, geo, freq, [series(values)], undefined, { x: 'f (Hz)', xUnit: 'Hz' });
    expect([...svg.querySelectorAll('.y-labels text')].map((t) => t.textContent)).toEqual(['10 pV/√Hz', '100 pV/√Hz', '1 nV/√Hz', '10 nV/√Hz']);
    expect([...svg.querySelectorAll('.x-labels text')].map((t) => t.textContent)).toEqual(['10 Hz', '100 Hz', '1 kHz', '10 kHz', '100 kHz', '1 MHz', '10 MHz']);
    const minor = svg.querySelector('path.grid-minor')!.getAttribute('d')!;
    // 48 minor verticals and 24 minor horizontals.
    expect(minor.match(/V/g)!.length).toBe(48);
    expect(minor.match(/H/g)!.length).toBe(24);
    // The zero at sample 30 splits the curve in two: two move-tos, and no point off the plot.
    const d = svg.querySelector('path.curve')!.getAttribute('d')!;
    expect(d.match(/M/g)!.length).toBe(2);
    const ys = [...d.matchAll(/[ML][\d.-]+,([\d.-]+)/g)].map((m) => Number(m[1]));
    expect(Math.min(...ys)).toBeGreaterThanOrEqual(geo.panels[0].box.top - 0.1);
    expect(Math.max(...ys)).toBeLessThanOrEqual(geo.panels[0].box.top + geo.panels[0].box.height + 0.1);
  });
});
