import { solveNetlist, type BjtOp, type SolveResult } from '../../../../solver';
import { EXAMPLES, exampleById } from './index';

function bjt(r: SolveResult, name: string): BjtOp {
  return r.op!.devices[name] as BjtOp;
}

describe('the Strainlab examples', () => {
  const solved = new Map(EXAMPLES.map((e) => [e.id, solveNetlist(e.text)]));

  it('are four, with distinct ids, titles and blurbs', () => {
    expect(EXAMPLES.map((e) => e.id)).toEqual(['resistor-tail', 'mirrored-tail', 'mirror-loaded', 'cascoded-follower']);
    expect(exampleById('mirror-loaded')?.label).toBe('Mirror-loaded pair');
    expect(exampleById('nope')).toBeUndefined();
  });

  for (const e of EXAMPLES) {
    it(`${e.id}: solves without errors or warnings, with ports, an ac sweep, measures and checks that all pass`, () => {
      const r = solved.get(e.id)!;
      expect(r.errors).toEqual([]);
      expect(r.warnings).toEqual([]);
      expect(r.ports).toBeDefined();
      expect(r.ac?.freq_hz.length).toBeGreaterThan(100);
      expect(Object.keys(r.measures).length).toBeGreaterThanOrEqual(3);
      expect(r.checks.length).toBeGreaterThanOrEqual(4);
      expect(r.checks.filter((c) => !c.pass)).toEqual([]);
      for (const d of Object.values(r.op!.devices)) expect(d.region).toBe('active');
    });
  }

  it('each asks one of the sweeping analyses, and its checks mean something there', () => {
    // Over −40…85 °C, across the bridge arms and the load values, every check holds in every run.
    for (const [id, member] of [['resistor-tail', 'temp'], ['mirrored-tail', 'vary'], ['cascoded-follower', 'vary']] as const) {
      const sweep = solved.get(id)![member]!;
      expect(sweep.runs.length, id).toBe(3);
      for (const run of sweep.runs) expect(run.checks.filter((c) => !c.pass), id).toEqual([]);
    }
    // Mismatched silicon: some parts fail the headroom checks of the high-gain single-ended
    // output (it rails), so the yield is a real figure, neither 0 nor 1.
    // The noise of the front end beside the bridge's own.
    expect(solved.get('resistor-tail')!.noise?.freq_hz.length).toBe(61);
    const m = solved.get('mirror-loaded')!.mismatch!;
    expect(m.failed_runs).toBe(0);
    expect(m.yield).toBeGreaterThan(0.5);
    expect(m.yield).toBeLessThan(1);
    expect(m.stats['vos'].sd).toBeLessThan(5e-3);
  });

  it('resistor tail: adm matches the half-circuit gain −gm·(RC ∥ ro)·rπ/(rπ + RG)', () => {
    // Sedra & Smith, Microelectronic Circuits, 7th ed., differential-amplifier chapter
    // (differential half circuit, from memory), with the source resistance RG in series with rπ.
    const r = solved.get('resistor-tail')!;
    const q = bjt(r, 'q1');
    const rcRo = (8e3 * q.ro) / (8e3 + q.ro);
    const expected = -q.gm * rcRo * (q.rpi / (q.rpi + 350));
    expect(Math.abs(r.ports!.adm.re / expected - 1)).toBeLessThan(0.01);
  });

  it('the mirrored tail raises CMRR over the resistor tail by more than 25 dB', () => {
    // Common practice: a tail of output resistance ro (≈ 80 kΩ here) instead of 1.8 kΩ cuts the
    // common-mode gain by roughly the ratio of the two, about 33 dB.
    const gain = solved.get('mirrored-tail')!.ports!.cmrr_db - solved.get('resistor-tail')!.ports!.cmrr_db;
    expect(gain).toBeGreaterThan(25);
  });

  it('mirror-loaded: adm ≈ gm·(ro2 ∥ ro4)·rπ/(rπ + RG), single-ended', () => {
    // Sedra & Smith, Microelectronic Circuits, 7th ed., differential pair with active load (from memory): Gm ≈ gm1,
    // Ro = ro2 ∥ ro4, so |adm| ≈ gm·(ro2 ∥ ro4); within 10% (mirror pole-free at 0 Hz, β errors).
    const r = solved.get('mirror-loaded')!;
    const q2 = bjt(r, 'q2');
    const q4 = bjt(r, 'q4');
    const ro = (q2.ro * q4.ro) / (q2.ro + q4.ro);
    const expected = q2.gm * ro * (q2.rpi / (q2.rpi + 350));
    expect(r.ports!.output).toBe('single-ended');
    expect(Math.abs(r.ports!.adm.mag / expected - 1)).toBeLessThan(0.1);
  });

  it('cascoded pair: the followers shift the level down by about one VBE', () => {
    const r = solved.get('cascoded-follower')!;
    expect(Math.abs(r.measures['shift'] / bjt(r, 'q5').vbe - 1)).toBeLessThan(0.01);
  });
});
