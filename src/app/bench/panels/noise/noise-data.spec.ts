import { bandPower, solveNetlist } from '../../../../../solver';
import { RESISTOR_TAIL_PAIR } from '../testing/netlists';
import { contributorRows, defaultSpot, largestAt, nearestOnLog, noiseData, suggestedNoise } from './noise-data';
import { CURRENT_INPUT, FLICKER_STAGE, INPUT_APART, RC_LOWPASS, TWELVE_RESISTORS } from './testing';

/** Boltzmann constant (CODATA 2018, exact) and the solve's temperature, 27 °C. */
const K = 1.380649e-23;
const T = 300.15;

/** |a − b| within a relative and an absolute tolerance. */
function near(a: number, b: number, rel: number, abs = 0): boolean {
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b)) + abs;
}

describe('noise data', () => {
  const rc = solveNetlist(RC_LOWPASS);

  it('gives the rms over the band that the noise measures give, and √(kT/C) for an RC', () => {
    expect(rc.errors).toEqual([]);
    const d = noiseData(rc)!;
    // The same band rule as noise_out_rms() and noise_in_rms() (solver/report/noise-band.ts).
    expect(near(d.outRms, rc.measures['vn'], 1e-12)).toBe(true);
    expect(near(d.inRms!, rc.measures['vi'], 1e-12)).toBe(true);
    // kT/C noise: the RC's output noise integrated over all frequencies is √(kT/C), whatever R
    // (Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed., ch. 7, "kT/C noise"; section
    // from memory). 10 Hz … 1 THz at 20 a decade comes within 0.03 % (docs/netlist.md).
    expect(near(d.outRms, Math.sqrt((K * T) / 1e-9), 3e-4)).toBe(true);
    // Input-referred: the resistor's own √(4kTR) (Johnson–Nyquist), flat, so its rms over the
    // band is √(4kTR·(f2 − f1)) exactly under the power-law rule.
    const white = Math.sqrt(4 * K * T * 1e3);
    expect(d.inReferred.every((v) => near(v, white, 1e-9))).toBe(true);
    expect(near(d.inRms!, Math.sqrt(4 * K * T * 1e3 * (1e12 - 10)), 1e-6)).toBe(true);
    expect(d.output).toBe('v(out)');
    expect(d.input).toBe('vin');
    expect(d.inUnit).toBe('V');
    expect(d.undefinedHz).toEqual([]);
  });

  it('ranks the parts by their share of the band power, the shares adding to 100 %', () => {
    const r = solveNetlist(TWELVE_RESISTORS);
    expect(r.errors).toEqual([]);
    const d = noiseData(r)!;
    // Each resistor's noise current 4kT/R meets the one impedance at the output, so its share of
    // the output power is G/ΣG at every frequency and over any band (common practice: noise
    // currents of parallel conductances add in power).
    const g = [1, ...Array.from({ length: 11 }, (_, k) => 1 / (k + 2))];
    const total = g.reduce((a, b) => a + b, 0);
    expect(d.contributors.map((c) => c.part)).toEqual(['rs', ...Array.from({ length: 11 }, (_, k) => `r${k + 2}`)]);
    d.contributors.forEach((c, k) => expect(near(c.share, g[k] / total, 1e-9)).toBe(true));
    expect(d.contributors.every((c, k) => k === 0 || c.share <= d.contributors[k - 1].share)).toBe(true);
    expect(near(d.contributors.reduce((s, c) => s + c.share, 0), 1, 1e-12)).toBe(true);
    // Every part has the same shape here: their band powers add up to the output's exactly.
    expect(near(d.closure, 1, 1e-12)).toBe(true);
    expect(near(d.outRms, r.measures['vn'], 1e-12)).toBe(true);
    expect(near(d.inRms!, r.measures['vi'], 1e-12)).toBe(true);
    // At a spot: the densities as the solver gave them, and the same G/ΣG there.
    const rows = contributorRows(d, d.spot);
    expect(rows.length).toBe(12);
    expect(rows[0]).toEqual(expect.objectContaining({ rank: 1, part: 'rs', spotDensity: r.noise!.contributors['rs'][d.spot] }));
    expect(near(rows[3].spotShare, g[3] / total, 1e-9)).toBe(true);
    expect(near(rows[3].rms, Math.sqrt(bandPower(d.freqHz, r.noise!.contributors['r4'].map((v) => v * v))), 1e-12)).toBe(true);
    expect(largestAt(d, 0)!.part).toBe('rs');
  });

  it('takes shares of the parts’ sum where a 1/f part and a white one make the band rule not quite additive', () => {
    const r = solveNetlist(FLICKER_STAGE);
    expect(r.errors).toEqual([]);
    const d = noiseData(r)!;
    expect(d.contributors.map((c) => c.part)).toEqual(['m1', 'rd']);
    expect(d.contributors[0].share + d.contributors[1].share).toBeCloseTo(1, 14);
    // Measured: 1 − 1.8·10⁻⁶ at 10 points a decade; shares of the output's own band power differ as little.
    expect(Math.abs(d.closure - 1)).toBeLessThan(1e-5);
    expect(near(d.contributors[0].power / (d.outRms ** 2), d.contributors[0].share, 1e-5)).toBe(true);
    expect(near(d.outRms, r.measures['vn'], 1e-12)).toBe(true);
  });

  it('writes a current-source input in amperes', () => {
    const r = solveNetlist(CURRENT_INPUT);
    expect(r.errors).toEqual([]);
    const d = noiseData(r)!;
    expect(d.inUnit).toBe('A');
    // The resistor's noise current √(4kT/R), referred to the input current that drives the same node.
    expect(d.inReferred.every((v) => near(v, Math.sqrt((4 * K * T) / 1e4), 1e-6))).toBe(true);
    expect(near(d.inRms!, r.measures['ni'], 1e-12)).toBe(true);
  });

  it('leaves the input-referred density undefined where the input does not reach the output', () => {
    const r = solveNetlist(INPUT_APART);
    expect(r.warnings.map((w) => w.code)).toContain('noise-no-gain');
    const d = noiseData(r)!;
    expect(d.undefinedHz.length).toBe(61);
    expect(d.inReferred.every(Number.isNaN)).toBe(true);
    expect(d.inRms).toBeUndefined();
    expect(d.outRms).toBeGreaterThan(0);
  });

  it('reads the parts at 1 kHz when the band holds it, else at its middle on the log scale', () => {
    const decade = (from: number, to: number, per: number) =>
      Array.from({ length: Math.round(Math.log10(to / from) * per) + 1 }, (_, k) => from * Math.pow(10, k / per));
    const f = decade(10, 1e7, 10);
    expect(f[defaultSpot(f)]).toBeCloseTo(1e3, 6);
    const high = decade(1e5, 1e9, 10);
    expect(high[defaultSpot(high)]).toBeCloseTo(1e7, 0);
    expect(nearestOnLog([10, 100, 1000], 400)).toBe(2);
    expect(noiseData(rc)!.freqHz[noiseData(rc)!.spot]).toBeCloseTo(1e3, 6);
  });

  it('suggests a noise line from the ports, or from the names of the circuit, that solves as it stands', () => {
    const pair = solveNetlist(RESISTOR_TAIL_PAIR);
    const line = suggestedNoise(pair);
    expect(line).toBe('analyze noise out outa outb in va from 10 Hz to 10 MHz per decade 10');
    const asked = solveNetlist(`${RESISTOR_TAIL_PAIR}${line}\n`);
    expect(asked.errors).toEqual([]);
    expect(asked.noise?.out_ref).toBe('outb');
    const plain = solveNetlist(RC_LOWPASS.replace(/^(analyze|measure).*$/gm, ''));
    expect(suggestedNoise(plain)).toBe('analyze noise out out in vin from 10 Hz to 10 MHz per decade 10');
    const unnamed = solveNetlist('title  Unnamed\nvcc: vsrc(a, gnd) 5\nr1: res(a, b) 1k\nr2: res(b, gnd) 1k\n');
    expect(suggestedNoise(unnamed)).toBe('analyze noise out NODE in SOURCE from 10 Hz to 10 MHz per decade 10');
    expect(noiseData(pair)).toBeUndefined();
  });
});
