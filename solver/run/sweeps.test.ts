import { describe, expect, it } from 'vitest';
import { solveNetlist } from '../index';
import { expectNearlyEqual } from '../testing/nearly-equal';

// Exact SI constants (CODATA 2018, exact since the 2019 SI redefinition).
const K_BOLTZMANN = 1.380649e-23;
const Q_ELECTRON = 1.602176634e-19;
const T0_K = 300.15;

/**
 * VBE of a diode-connected npn carrying I, from the language definition's temperature law
 * (netlist language §2: VT = kT/q; IS(T) = IS·(T/T0)^pt·exp((q·eg/k)·(1/T0 − 1/T)), T0 = 27 °C)
 * and the Ebers–Moll transport form at VBC = 0: IC = IS·(e^(VBE/VT) − 1), IB = IC/β, so
 * I = IC·(1 + 1/β).
 */
function vbeClosedForm(tempC: number, current: number, is: number, beta: number, eg = 1.12, pt = 3): number {
  const t = tempC + 273.15;
  const vt = (K_BOLTZMANN * t) / Q_ELECTRON;
  const isT = is * (t / T0_K) ** pt * Math.exp(((Q_ELECTRON * eg) / K_BOLTZMANN) * (1 / T0_K - 1 / t));
  const ic = (current * beta) / (beta + 1);
  return vt * Math.log1p(ic / isT);
}

const DIODE = (temps: string) => `title  Diode-connected npn at constant current
model qt: npn(is=1e-16, beta=100)
i1: isrc(gnd, d) 100u
q1: npn(c=d, b=d, e=gnd) qt
analyze temp over ${temps}
measure vbe1 = vbe(q1)
`;

describe('analyze temp', () => {
  it('gives VBE at constant current as the §2 temperature law predicts, at each temperature', () => {
    const r = solveNetlist(DIODE('-40 0 27 85 125'));
    expect(r.errors).toEqual([]);
    expect(r.temp!.values_c).toEqual([-40, 0, 27, 85, 125]);
    r.temp!.runs.forEach((run, k) => {
      const t = r.temp!.values_c[k];
      expectNearlyEqual(run.op!.devices.q1.kind === 'npn' ? (run.op!.devices.q1 as { vbe: number }).vbe : NaN, vbeClosedForm(t, 100e-6, 1e-16, 100), 1e-6, 1e-9, `VBE at ${t} °C`);
      expectNearlyEqual(run.measures.vbe1, vbeClosedForm(t, 100e-6, 1e-16, 100), 1e-6, 1e-9, `measure at ${t} °C`);
    });
  });

  it('has dVBE/dT at constant current of the closed form, about −2 mV/°C as practitioners expect', () => {
    // Central difference over ±1 °C around 27 °C, from the solver and from the closed form.
    const r = solveNetlist(DIODE('26 28'));
    const [lo, hi] = r.temp!.runs.map((run) => run.measures.vbe1);
    const slope = (hi - lo) / 2;
    const expected = (vbeClosedForm(28, 100e-6, 1e-16, 100) - vbeClosedForm(26, 100e-6, 1e-16, 100)) / 2;
    expectNearlyEqual(slope, expected, 1e-4, 1e-9, 'dVBE/dT');
    // Gray et al., 5th ed., §1.2 (from memory): about −2 mV/°C near room temperature.
    expect(slope).toBeLessThan(-1.6e-3);
    expect(slope).toBeGreaterThan(-2.4e-3);
  });

  it('leaves the main result at the netlist’s own temperature', () => {
    const r = solveNetlist(DIODE('125'));
    expect(r.temp_c).toBe(27);
    expectNearlyEqual(r.measures.vbe1, vbeClosedForm(27, 100e-6, 1e-16, 100), 1e-6, 1e-9);
  });
});

const DIVIDER = (sweep: string) => `title  Divider with a swept lower resistor
param rb = 10k
vin: vsrc(top, gnd) 3
ra: res(top, mid) 10k
rbot: res(mid, gnd) rb
analyze vary rb ${sweep}
measure vmid = v(mid)
check vmid >= 1
`;

describe('analyze vary', () => {
  it('re-solves the divider at each value: v(mid) = 3 V · rb/(10k + rb) (Ohm’s law)', () => {
    const r = solveNetlist(DIVIDER('over 1k 10k 100k'));
    expect(r.errors).toEqual([]);
    expect(r.vary!.param).toBe('rb');
    expect(r.vary!.values).toEqual([1000, 10000, 100000]);
    r.vary!.runs.forEach((run, k) => {
      const rb = r.vary!.values[k];
      // 1e-7: every node also has min_g = 1e-12 S to ground (option min_g), a few parts in 10⁹ here.
      expectNearlyEqual(run.measures.vmid, (3 * rb) / (10e3 + rb), 1e-7, 1e-12, `rb = ${rb}`);
      expect(run.checks[0].pass).toBe(run.measures.vmid >= 1);
    });
  });

  it('walks a per-decade range on the §3 grid, end included when it falls on the grid', () => {
    const r = solveNetlist(DIVIDER('from 1k to 1M per decade 5'));
    expect(r.vary!.values).toHaveLength(16);
    r.vary!.values.forEach((v, k) => expectNearlyEqual(v, 1e3 * 10 ** (k / 5), 1e-12, 0));
  });

  it('gives each value exactly what a plain solve with that param written gives', () => {
    const r = solveNetlist(DIVIDER('over 2.2k 47k'));
    for (const [k, value] of ['2.2k', '47k'].entries()) {
      const plain = solveNetlist(DIVIDER('over 1k').replace('param rb = 10k', `param rb = ${value}`).replace(/analyze vary.*\n/, '# no sweep\n'));
      expect(r.vary!.runs[k].op).toEqual(plain.op);
      expect(r.vary!.runs[k].measures).toEqual(plain.measures);
      expect(r.vary!.runs[k].checks).toEqual(plain.checks);
    }
  });

  it('keeps a value at which the circuit is invalid, with its error, and warns on the analyze line', () => {
    const r = solveNetlist(DIVIDER('over 10k 0 20k'));
    expect(r.errors).toEqual([]);
    expect(r.vary!.runs[1].errors?.[0].message).toBeTruthy();
    expect(r.vary!.runs[0].measures.vmid).toBeGreaterThan(0);
    expect(r.vary!.runs[2].measures.vmid).toBeGreaterThan(0);
    const warning = r.warnings.find((w) => w.code === 'sweep-value-failed');
    expect(warning?.line).toBe(6);
    expect(warning?.message).toContain('1 of 3 values');
  });

  it('refuses, on its line, a sweep that would solve too many ac points', () => {
    const text = DIVIDER('from 1 to 1T per decade 100').replace('analyze vary', 'analyze ac from 1 Hz to 1 GHz per decade 200\nanalyze vary');
    const r = solveNetlist(text);
    const error = r.errors.find((e) => e.code === 'sweep-too-large');
    expect(error?.line).toBe(7);
    expect(r.vary).toBeUndefined();
    expect(r.op).toBeDefined();
  });
});
