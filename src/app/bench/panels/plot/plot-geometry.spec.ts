import { linearTicks, logTicks, phaseTicks } from './log-ticks';
import { clampDomain, fullDomain, layoutPlot, nearestIndex, panDomain, visibleRange, zoomDomain } from './plot-geometry';
import { curveStyle } from './palette';
import { curvesCsv, fileStem } from './plot-export';

// A log sweep of 20 points per decade from 10 Hz to 1 GHz, as `analyze ac … per decade 20` makes.
const sweep = Array.from({ length: 161 }, (_, k) => 10 * Math.pow(10, k / 20));

describe('log-frequency ticks', () => {
  it('labels whole decades over a wide span, with 2…9 as minor ticks', () => {
    const t = logTicks(10, 1e9, 10);
    expect(t.major).toEqual([10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9]);
    expect(t.minor).toContain(20);
    expect(t.minor).toContain(9e8);
    expect(t.minor.length).toBe(8 * 8);
  });

  it('labels every second decade when the plot is too narrow for all', () => {
    expect(logTicks(10, 1e9, 5).major).toEqual([100, 1e4, 1e6, 1e8]);
  });

  it('labels 1-2-5 steps inside a decade or so, and round linear steps in a narrow zoom', () => {
    expect(logTicks(1e3, 2e4, 10).major).toEqual([1e3, 2e3, 5e3, 1e4, 2e4]);
    const narrow = logTicks(1.2e6, 2.5e6, 6).major;
    expect(narrow[0]).toBeGreaterThanOrEqual(1.2e6);
    expect(narrow.every((v, k) => k === 0 || Math.abs(v - narrow[k - 1] - (narrow[1] - narrow[0])) < 1)).toBe(true);
  });

  it('puts phase ticks on multiples of 45° or 90° and dB ticks on round steps', () => {
    expect(phaseTicks(-180, 0, 5).major).toEqual([-180, -135, -90, -45, 0]);
    expect(phaseTicks(-270, 180, 5).major).toEqual([-270, -180, -90, 0, 90, 180]);
    expect(linearTicks(-10, 50, 6).major).toEqual([-10, 0, 10, 20, 30, 40, 50]);
  });
});

describe('plot geometry', () => {
  const series = [{ key: 'adm', label: 'adm', db: sweep.map((f) => 40 - 10 * Math.log10(1 + (f / 1e6) ** 2)), phase_deg: sweep.map((f) => -Math.atan(f / 1e6) * 180 / Math.PI), style: curveStyle(0) }];

  it('maps the sweep onto the plot width on a log scale', () => {
    const g = layoutPlot({ width: 700, height: 360, freqHz: sweep, series, showPhase: true });
    expect(g.x(10)).toBeCloseTo(0, 9);
    expect(g.x(1e9)).toBeCloseTo(g.innerWidth, 9);
    // One decade is an eighth of the width for eight decades.
    expect(g.x(100) - g.x(10)).toBeCloseTo(g.innerWidth / 8, 9);
    expect(g.phase!.top).toBeGreaterThan(g.mag.top + g.mag.height);
  });

  it('fits the dB axis to round steps around the visible data, and phase to 45° steps', () => {
    const g = layoutPlot({ width: 700, height: 360, freqHz: sweep, series, showPhase: true });
    const [lo, hi] = g.yMag.domain();
    expect(lo).toBeLessThanOrEqual(Math.min(...series[0].db));
    expect(hi).toBeGreaterThanOrEqual(40);
    expect(g.phaseTicks.every((t) => t % 15 === 0)).toBe(true);
    // Zoomed to 10 Hz … 1 kHz the flat band alone is fitted.
    const z = layoutPlot({ width: 700, height: 360, freqHz: sweep, series, showPhase: true, xDomain: [10, 1000] });
    expect(z.yMag.domain()[0]).toBeGreaterThan(30);
    expect(z.visible).toEqual([0, 40]);
  });

  it('keeps only the part of an old zoom that overlaps a new sweep', () => {
    const g = layoutPlot({ width: 700, height: 360, freqHz: sweep, series, showPhase: true, xDomain: [1e8, 1e11] });
    expect(g.x.domain()).toEqual([1e8, sweep[160]]);
    const outside = layoutPlot({ width: 700, height: 360, freqHz: sweep, series, showPhase: true, xDomain: [1e10, 1e11] });
    expect(outside.x.domain()).toEqual([10, sweep[160]]);
  });

  it('finds the nearest sample in log frequency', () => {
    expect(nearestIndex(sweep, 100, [0, 160])).toBe(20);
    expect(nearestIndex(sweep, 1.05e3, [0, 160])).toBe(40);
    expect(nearestIndex(sweep, 1e12, [0, 160])).toBe(160);
    expect(visibleRange(sweep, [100, 1000])).toEqual([20, 40]);
  });

  it('zooms around a centre, pans, and falls back to the full span at the edges', () => {
    const full = fullDomain(sweep);
    expect(full).toEqual([10, sweep[160]]);
    const z = zoomDomain(full, full, 1e4, 0.5)!;
    expect(Math.log10(z[1] / z[0])).toBeCloseTo(4, 9);
    expect(Math.sqrt(z[0] * z[1]) / 1e4).toBeGreaterThan(0.1);
    expect(zoomDomain(full, full, 1e4, 2)).toBeUndefined();
    const p = panDomain([1e3, 1e5], full, 0.5)!;
    expect(p[0]).toBeCloseTo(1e4, 6);
    expect(p[1]).toBeCloseTo(1e6, 3);
    // Panned against the end the span is kept and the domain stops at the sweep's edge.
    const end = panDomain([1e7, 1e9 / 2], full, 1)!;
    expect(end[1]).toBe(full[1]);
    expect(end[1] / end[0]).toBeCloseTo(50, 6);
    expect(clampDomain([1, 1e12], full)).toBeUndefined();
  });
});

describe('CSV export', () => {
  it('writes CSV in full precision with quoted names, CRLF rows (RFC 4180)', () => {
    const csv = curvesCsv([10, 100], [{ key: 'ac(a, b)', db: [1 / 3, -2], phase_deg: [0.1, -90] }]);
    expect(csv).toBe('freq_hz,"ac(a, b)_mag_db","ac(a, b)_phase_deg"\r\n10,0.3333333333333333,0.1\r\n100,-2,-90\r\n');
    expect(fileStem('Resistor-tail pair, 4 mA tail')).toBe('resistor-tail-pair-4-ma-tail');
    expect(fileStem('')).toBe('nodewright');
  });
});
