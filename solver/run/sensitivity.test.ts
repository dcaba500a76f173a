import { describe, expect, it } from 'vitest';
import { solveNetlist } from '../index';
import { streamFor } from '../numeric/random';
import { expectNearlyEqual } from '../testing/nearly-equal';
import { RESISTOR_PAIR } from '../testing/pair-netlist';
import { SENSITIVITY_STEP } from './sensitivity';

describe('analyze sensitivity', () => {
  it('gives the divider ratio’s normalised sensitivities of the closed form: S(ra) = −ra/(ra + rb), S(rb) = ra/(ra + rb)', () => {
    // ratio = rb/(ra + rb) (Ohm's law); (∂ratio/ratio)/(∂ra/ra) = −ra/(ra + rb), and +ra/(ra + rb) for rb.
    const r = solveNetlist('vin: vsrc(top, gnd) 3\nra: res(top, mid) 10k\nrb: res(mid, gnd) 30k\nanalyze sensitivity\nmeasure ratio = v(mid) / v(top)\n');
    expect(r.errors).toEqual([]);
    const rows = r.sensitivity!.figures.ratio;
    expect(rows[0].target).toBe('ra');
    expectNearlyEqual(rows.find((x) => x.target === 'ra')!.s, -0.25, 1e-6, 1e-9);
    expectNearlyEqual(rows.find((x) => x.target === 'rb')!.s, 0.25, 1e-6, 1e-9);
    expect(r.sensitivity!.step).toBe(SENSITIVITY_STEP);
  });

  it('obeys the sum rule on random resistor ladders: the resistor sensitivities of a voltage ratio add up to 0', () => {
    // A dimensionless network function of resistors alone is unchanged when every resistance is
    // scaled by the same factor, so Σ S = 0 over the resistors (Euler's theorem on homogeneous
    // functions; the sensitivity sum rules of network theory, e.g. Vlach & Singhal, Computer
    // Methods for Circuit Analysis and Design, 2nd ed., sensitivity chapter — from memory).
    for (let trial = 0; trial < 5; trial++) {
      const rng = streamFor(2024, trial);
      const value = () => (1e3 * 10 ** (2 * rng.uniform())).toPrecision(4);
      const lines = ['vin: vsrc(n0, gnd) 1'];
      for (let k = 0; k < 4; k++) {
        lines.push(`rs${k}: res(n${k}, n${k + 1}) ${value()}`);
        lines.push(`rp${k}: res(n${k + 1}, gnd) ${value()}`);
      }
      const text = `${lines.join('\n')}\nanalyze sensitivity\nmeasure ratio = v(n4) / v(n0)\n`;
      const rows = solveNetlist(text).sensitivity!.figures.ratio.filter((x) => x.target.startsWith('r'));
      expect(rows).toHaveLength(8);
      const sum = rows.reduce((acc, x) => acc + x.s, 0);
      expect(Math.abs(sum)).toBeLessThan(1e-6);
      // And each entry against central differences of the full solve of the edited text.
      const rs2 = rows.find((x) => x.target === 'rs2')!;
      const at = (factor: number) => {
        const edited = text.replace(/^(rs2: res\(n2, n3\) )(\S+)$/m, (_, head: string, v: string) => `${head}${Number(v) * factor}`);
        return solveNetlist(edited.replace('analyze sensitivity\n', '')).measures.ratio;
      };
      const h = 1e-4;
      const direct = (at(1 + h) - at(1 - h)) / (2 * h * at(1));
      expectNearlyEqual(rs2.s, direct, 1e-4, 1e-9, `trial ${trial}`);
    }
  });

  it('ranks a pair’s figures by what moves them, devices’ own parameters and shared models included', () => {
    const r = solveNetlist(`${RESISTOR_PAIR}analyze sensitivity\n`);
    expect(r.errors).toEqual([]);
    const adm = r.sensitivity!.figures.adm;
    expect(adm.some((x) => x.target === 'q1' && x.param === 'va')).toBe(true);
    expect(adm.some((x) => x.target === 'model qn' && x.param === 'beta')).toBe(true);
    // adm = −gm·(RC ‖ ro) with gm = IC/VT and IC ≈ (10 V − VBE)/(2·rt): the tail resistor and the
    // loads lead, each near ±1 (Sedra & Smith, 7th ed., differential pair, from memory).
    const top = adm.slice(0, 4).map((x) => x.target);
    expect(top).toEqual(expect.arrayContaining(['rtail']));
    for (let k = 1; k < adm.length; k++) expect(Math.abs(adm[k].s)).toBeLessThanOrEqual(Math.abs(adm[k - 1].s));
  });
});
