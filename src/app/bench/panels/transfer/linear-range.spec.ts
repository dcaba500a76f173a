import { solveNetlist } from '../../../../../solver';
import { linearRange, LINEAR_SLOPE_FRACTION, slopes } from './linear-range';
import { currentTailPair } from './testing';

/** Thermal voltage kT/q at 27 °C (300.15 K), CODATA 2018 constants. */
const VT = (1.380649e-23 * 300.15) / 1.602176634e-19;

/** Evenly spaced values from `from` to `to` by `step`. */
function sweep(from: number, to: number, step: number): number[] {
  const n = Math.round((to - from) / step);
  return Array.from({ length: n + 1 }, (_, k) => from + k * step);
}

describe('linear input range', () => {
  /*
   * A bipolar differential pair steers its tail current I_EE as
   *   ΔiC = iC1 − iC2 = α·I_EE·tanh(vid / 2V_T)
   * (Sedra & Smith, Microelectronic Circuits, 7th ed., §9.2, large-signal operation of the BJT
   * differential pair; equation number from memory not given). Its slope is
   *   dΔiC/dvid = (α·I_EE / 2V_T)·sech²(vid / 2V_T),
   * largest at vid = 0. The slope is a fraction f of that peak where sech²(u) = f, that is
   * 1 − tanh²(u) = f, so tanh(u) = √(1 − f) and
   *   |vid| = 2V_T·atanh(√(1 − f)),
   * for f = 0.9: 2V_T·atanh(√0.1) = 2V_T·0.32745 ≈ 0.655·V_T ≈ 16.9 mV at 27 °C.
   */
  const edge = (f: number) => 2 * VT * Math.atanh(Math.sqrt(1 - f));
  const IEE = 2e-3;

  it('finds 2V_T·atanh(√0.1) on each side for the tanh of a bipolar pair', () => {
    const x = sweep(-0.1, 0.1, 0.5e-3);
    const y = x.map((v) => IEE * Math.tanh(v / (2 * VT)));
    const r = linearRange(x, y)!;
    expect(LINEAR_SLOPE_FRACTION).toBe(0.9);
    expect(edge(0.9) / VT).toBeCloseTo(0.6549, 4);
    expect(r.hi / edge(0.9)).toBeCloseTo(1, 3);
    expect(r.lo / -edge(0.9)).toBeCloseTo(1, 3);
    expect(r.peakX).toBeCloseTo(0, 12);
    // Peak slope I_EE / 2V_T (the pair's large-signal gm at balance).
    expect(r.peakSlope / (IEE / (2 * VT))).toBeCloseTo(1, 3);
    expect(r.loOpen || r.hiOpen).toBe(false);
  });

  it('follows the stated fraction, an inverting output, an offset and a downward sweep', () => {
    const x = sweep(-0.1, 0.1, 0.25e-3);
    const offset = 5e-3;
    const y = x.map((v) => 7.5 - 5e3 * IEE / 2 * Math.tanh((v - offset) / (2 * VT)));
    const r = linearRange(x, y, 0.5)!;
    expect((r.hi - offset) / edge(0.5)).toBeCloseTo(1, 3);
    expect((offset - r.lo) / edge(0.5)).toBeCloseTo(1, 3);
    expect(r.peakSlope).toBeLessThan(0);
    const down = linearRange([...x].reverse(), [...y].reverse(), 0.5)!;
    expect(down.lo).toBeCloseTo(r.lo, 12);
    expect(down.hi).toBeCloseTo(r.hi, 12);
  });

  it('says when the sweep ends before the slope falls, and gives no range for a flat curve', () => {
    const x = sweep(-0.01, 0.01, 0.5e-3);
    const r = linearRange(x, x.map((v) => Math.tanh(v / (2 * VT))))!;
    expect(r.loOpen && r.hiOpen).toBe(true);
    expect([r.lo, r.hi]).toEqual([x[0], x[x.length - 1]]);
    expect(linearRange(x, x.map(() => 10))).toBeUndefined();
    expect(linearRange([0, 1], [0, 1])).toBeUndefined();
  });

  it('takes slopes that are exact for a parabola on uneven steps', () => {
    const x = [0, 0.1, 0.3, 0.35, 0.8];
    const s = slopes(x, x.map((v) => 3 * v * v - v));
    // d/dx (3x² − x) = 6x − 1 inside; the ends are one-sided.
    for (const k of [1, 2, 3]) expect(s[k]).toBeCloseTo(6 * x[k] - 1, 12);
  });

  it('measures the solver’s own pair: the range of v(outa) matches 2V_T·atanh(√0.1)', () => {
    // An ideal 2 mA tail and no Early effect: the collector currents split exactly as tanh
    // (up to α), so the linear range of either output is the analytic one.
    const result = solveNetlist(currentTailPair({ model: 'is=1e-16, beta=200', ports: false, step: '0.5m' }));
    expect(result.errors).toEqual([]);
    const t = result.transfer!;
    const r = linearRange(t.x, t.curves['v(outa)'])!;
    expect(r.hi / edge(0.9)).toBeCloseTo(1, 2);
    expect(r.lo / -edge(0.9)).toBeCloseTo(1, 2);
  });
});
