import { solveNetlist, type BjtOp, type PolesResult } from '../../../../../solver';
import { RESISTOR_TAIL_PAIR } from '../testing/netlists';
import { pzCsv, pzPoints, pzRows, pzSummary, rowText, suggestedPoles } from './pole-zero-data';
import { FAR_APART, NEGATIVE_CONDUCTANCE, RC_POLE, RLC_PAIR } from './testing';

/** |a − b| within a relative tolerance. */
function near(a: number, b: number, rel: number): boolean {
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b));
}

describe('pole–zero data', () => {
  it('reads a real pole in hertz as given: −1/(2πRC) for an RC', () => {
    const r = solveNetlist(RC_POLE);
    expect(r.errors).toEqual([]);
    const rows = pzRows(r.poles!);
    expect(rows.length).toBe(1);
    // s = −1/RC, so s/2π = −1/(2π·1 kΩ·1 nF) = −159.155 kHz (common practice: the RC corner).
    expect(near(rows[0].re, -1 / (2 * Math.PI * 1e3 * 1e-9), 1e-6)).toBe(true);
    expect(rows[0]).toEqual(expect.objectContaining({ kind: 'pole', index: 1, im: 0, pair: false, q: undefined, rhp: false }));
    // No further 2π: |s|/2π is the magnitude of the numbers as given.
    expect(rows[0].mag).toBe(Math.abs(rows[0].re));
    expect(rowText(rows[0])).toBe('pole 1: -159 kHz, |s|/2π 159 kHz');
    expect(pzSummary(r.poles!).text).toBe('1 pole; 0 zeros of v(out)/vin. Every pole is in the left half-plane: the circuit is stable at this operating point.');
  });

  it('puts a conjugate pair on one row with its Q, and both of its members on the map', () => {
    const r = solveNetlist(RLC_PAIR);
    expect(r.errors).toEqual([]);
    const rows = pzRows(r.poles!);
    expect(rows.length).toBe(1);
    const [pair] = rows;
    // Series RLC: ω0 = 1/√(LC), Q = (1/R)·√(L/C) (Sedra & Smith, Microelectronic Circuits, 7th
    // ed., ch. 17, second-order filter functions; chapter from memory): f0 = 159.155 kHz, Q = 10,
    // Re s/2π = −f0/(2Q), Im s/2π = f0·√(1 − 1/(4Q²)).
    const f0 = 1 / (2 * Math.PI * Math.sqrt(1e-3 * 1e-9));
    expect(near(pair.mag, f0, 1e-6)).toBe(true);
    expect(near(pair.q!, 10, 1e-6)).toBe(true);
    expect(near(pair.re, -f0 / 20, 1e-6)).toBe(true);
    expect(near(pair.im, f0 * Math.sqrt(1 - 1 / 400), 1e-6)).toBe(true);
    expect(pair.pair).toBe(true);
    const points = pzPoints(r.poles!);
    expect(points.map((p) => Math.sign(p.im))).toEqual([1, -1]);
    expect(points[0].label).toBe(points[1].label);
    expect(points[0].label).toMatch(/^pole 1: -7\.96 kHz ± j 159 kHz, \|s\|\/2π 159 kHz, Q 10\.0$/);
    expect(pzSummary(r.poles!).text).toMatch(/^1 pole \(1 conjugate pair\); 0 zeros of v\(out\)\/vin\./);
  });

  it('flags a pole in the right half-plane as unstable', () => {
    const r = solveNetlist(NEGATIVE_CONDUCTANCE);
    expect(r.errors).toEqual([]);
    const [pole] = pzRows(r.poles!);
    // Net conductance 1 mS − 2 mS = −1 mS across 1 nF: s = +10⁶ rad/s, s/2π = +159.155 kHz.
    expect(near(pole.re, 1e6 / (2 * Math.PI), 1e-6)).toBe(true);
    expect(pole.rhp).toBe(true);
    const summary = pzSummary(r.poles!);
    expect(summary.unstable).toBe(1);
    expect(summary.text).toContain('One pole is in the right half-plane: the circuit is unstable at this operating point');
    expect(summary.text).toContain('no zeros asked for');
  });

  it('flags the right-half-plane zero of a bipolar pair, which leaves it stable', () => {
    const r = solveNetlist(`${RESISTOR_TAIL_PAIR}analyze poles\n`);
    expect(r.errors).toEqual([]);
    const rows = pzRows(r.poles!);
    const zeros = rows.filter((z) => z.kind === 'zero');
    // The feedforward through Cμ gives adm a zero at s = +gm/Cμ: the differential half circuit is
    // a common-emitter stage whose numerator is gm − sCμ (Gray et al., Analysis and Design of
    // Analog Integrated Circuits, 5th ed., §7.2, the common-emitter stage; section from memory),
    // at the solved gm and Cμ of q1.
    const q1 = r.op!.devices['q1'] as BjtOp;
    expect(zeros.length).toBe(1);
    expect(zeros[0].rhp).toBe(true);
    expect(zeros[0].im).toBe(0);
    expect(near(zeros[0].re, q1.gm / (2 * Math.PI * q1.cmu), 1e-4)).toBe(true);
    expect(rows.filter((p) => p.kind === 'pole').every((p) => !p.rhp)).toBe(true);
    expect(pzSummary(r.poles!).unstable).toBe(0);
    expect(pzSummary(r.poles!).text).toMatch(/; 1 zero of adm\. Every pole is in the left half-plane/);
  });

  it('exports every member of every list as CSV, a pair sharing its row number', () => {
    const csv = pzCsv(solveNetlist(RLC_PAIR).poles!).split('\r\n');
    expect(csv[0]).toBe('kind,index,re_hz,im_hz,mag_hz,q,right_half_plane');
    expect(csv.length).toBe(4);
    expect(csv[1]).toMatch(/^pole,1,-7957\.\d+,158955\.\d+,15915[45]\.\d+,9\.99\d*,no$/);
    expect(csv[2]).toMatch(/^pole,1,-7957\.\d+,-158955\.\d+,/);
    const hand: PolesResult = { poles_hz: [{ re: -1, im: 0 }, { re: 2, im: 3, q: -0.9 }, { re: 2, im: -3, q: -0.9 }], zeros_hz: [{ re: 5, im: 0 }], zeros_of: 'adm', conventions: '' };
    expect(pzCsv(hand).split('\r\n').slice(1, 5)).toEqual([
      'pole,1,-1,0,1,,no', `pole,2,2,3,${Math.hypot(2, 3)},-0.9,yes`, `pole,2,2,-3,${Math.hypot(2, 3)},-0.9,yes`, 'zero,1,5,0,5,,yes',
    ]);
    expect(pzRows(hand).map((r) => `${r.kind} ${r.index}`)).toEqual(['pole 1', 'pole 2', 'zero 1']);
    expect(pzSummary(hand).text).toBe('2 poles (1 conjugate pair); 1 zero of adm. One pole is in the right half-plane: the circuit is unstable at this operating point (a growing mode — it would oscillate or latch).');
  });

  it('suggests analyze poles, with an output node when there are no ports, and the line solves', () => {
    const pair = solveNetlist(RESISTOR_TAIL_PAIR);
    expect(suggestedPoles(pair)).toBe('analyze poles');
    const rc = solveNetlist(RC_POLE.replace('analyze poles out out\n', ''));
    const line = suggestedPoles(rc);
    expect(line).toBe('analyze poles out out');
    const asked = solveNetlist(`${RC_POLE.replace('analyze poles out out\n', '')}${line}\n`);
    expect(asked.errors).toEqual([]);
    expect(asked.poles?.zeros_of).toBe('v(out)/vin');
    // 1 kΩ with 15.9155 µF and with 159.155 fF: −10 Hz and −1 GHz.
    const far = pzRows(solveNetlist(FAR_APART).poles!);
    expect(far.length).toBe(2);
    expect(near(far[0].re, -10, 1e-5)).toBe(true);
    expect(near(far[1].re, -1e9, 1e-5)).toBe(true);
  });
});
