import { solveWithOutline } from '../../../../solver';
import { checkParts, guessUnit, measureUnits } from './units';

// Units of the result functions as the netlist language defines them (docs: netlist language §3).
describe('guessUnit', () => {
  it('maps each result function to its unit', () => {
    expect(guessUnit('db(adm)')).toBe('dB');
    expect(guessUnit('corner(adm)')).toBe('Hz');
    expect(guessUnit('unity(ac(outa))')).toBe('Hz');
    expect(guessUnit('margin(adm)')).toBe('°');
    expect(guessUnit('ic(q1)')).toBe('A');
    expect(guessUnit('vce(m1.qa)')).toBe('V');
    expect(guessUnit('gm(q1)')).toBe('S');
    expect(guessUnit('ro(q1)')).toBe('Ω');
    expect(guessUnit('cpi(q1)')).toBe('F');
    expect(guessUnit('cmrr_db')).toBe('dB');
    expect(guessUnit('mag(adm)')).toBe('');
  });

  it('passes units through min, max, abs and mag, and through sums with plain numbers', () => {
    expect(guessUnit('min(vce(q1), vce(q2))')).toBe('V');
    expect(guessUnit('mag(zout(outa))')).toBe('Ω');
    expect(guessUnit('vce(q1) - 0.3')).toBe('V');
    expect(guessUnit('2*ic(q1)')).toBe('A');
    expect(guessUnit('(v(outa) - v(outb))')).toBe('V');
  });

  it('calls a ratio of like quantities, an intrinsic gain or a mixed sum a plain number', () => {
    expect(guessUnit('ic(q1)/ic(q2)')).toBe('');
    expect(guessUnit('v(outa)/v(ina)')).toBe('');
    expect(guessUnit('gm(q1)*ro(q1)')).toBe('');
    expect(guessUnit('ic(q1) + vce(q1)')).toBe('');
    expect(guessUnit('1e-3 + ic(q1)')).toBe('A');
  });
});

// The units of products and quotients: W = V·A, Ω = V/A, S = A/V, F = A·s/V, Hz = 1/s (BIPM, The
// International System of Units (SI Brochure), 9th ed., 2019, Table 4, derived units).
describe('guessUnit: the unit algebra', () => {
  it('makes watts of a current times a voltage', () => {
    expect(guessUnit('i(q1.c) * v(out)')).toBe('W');
    expect(guessUnit('ic(q1) * vce(q1)')).toBe('W');
    expect(guessUnit('v(vcc) * -i(vcc)')).toBe('W');
    expect(guessUnit('v(out)^2 / zout(out)')).toBe('W');
  });

  it('makes ohms of a voltage over a current and siemens of a current over a voltage', () => {
    expect(guessUnit('v(out) / i(rl)')).toBe('Ω');
    expect(guessUnit('vce(q1) / ic(q1)')).toBe('Ω');
    expect(guessUnit('1 / gm(q1)')).toBe('Ω');
    expect(guessUnit('ic(q1) / v(out)')).toBe('S');
    expect(guessUnit('1/ro(q1)')).toBe('S');
    expect(guessUnit('ic(q1) / 25.9m')).toBe('A');
  });

  it('gives hertz, seconds and farads where the algebra leads there', () => {
    expect(guessUnit('unity(adm) / 2')).toBe('Hz');
    expect(guessUnit('1 / corner(adm)')).toBe('s');
    expect(guessUnit('gm(q1) / (2*pi*unity(adm))')).toBe('F');
    expect(guessUnit('cpi(q1) + cmu(q1)')).toBe('F');
    expect(guessUnit('sqrt(ic(q1)^2)')).toBe('A');
    expect(guessUnit('pow(vce(q1), 1)')).toBe('V');
  });

  it('reads quantities with units written in the expression', () => {
    expect(guessUnit('ic(q1) * 1 kΩ')).toBe('V');
    expect(guessUnit('v(out) / 10k')).toBe('V');
    expect(guessUnit('v(out) / 10 kΩ')).toBe('A');
  });

  it('keeps dB and degrees through scaling and sums with plain numbers only', () => {
    expect(guessUnit('db(adm) - 6')).toBe('dB');
    expect(guessUnit('cmrr_db - db(adm)')).toBe('dB');
    expect(guessUnit('2 * phase(at(adm, 1k))')).toBe('°');
    expect(guessUnit('db(adm) * db(acm)')).toBe('');
    expect(guessUnit('db(adm) + vce(q1)')).toBe('');
  });

  it('calls gains, logarithms and what it cannot read a plain number', () => {
    expect(guessUnit('mag(at(ac(out), 1k))')).toBe('');
    expect(guessUnit('cmrr')).toBe('');
    expect(guessUnit('log10(ic(q1)/1m)')).toBe('');
    expect(guessUnit('sqrt(vce(q1))')).toBe('');
    expect(guessUnit('ic(q1) *')).toBe('');
    expect(guessUnit('ic(q1)^rc')).toBe('');
  });

  it('takes a param as a bare number and an earlier measure at its unit', () => {
    expect(guessUnit('vce(q1) - vsat')).toBe('V');
    expect(guessUnit('pdiss / vmin', { pdiss: 'W', vmin: 'V' })).toBe('A');
  });

  it('uses the units of earlier measures', () => {
    expect(guessUnit('vmin', { vmin: 'V' })).toBe('V');
  });

  it('splits a check into subject, comparison, limit and tolerance', () => {
    expect(checkParts('cmrr_db >= 80')).toEqual({ subject: 'cmrr_db', op: '>=', limit: '80' });
    expect(checkParts('ic(q1) = 2m ± 1%')).toEqual({ subject: 'ic(q1)', op: '=', limit: '2m', tolerance: '1%' });
    expect(checkParts('ratio == 1 +- 5%')).toEqual({ subject: 'ratio', op: '=', limit: '1', tolerance: '5%' });
    expect(checkParts('vmin > 0.3').subject).toBe('vmin');
    expect(checkParts('id(m1) <= 100u').subject).toBe('id(m1)');
    // Only a comparison outside parentheses splits, as in the solver.
    expect(checkParts('max(v(a) - v(b), 0) < 1m')).toEqual({ subject: 'max(v(a) - v(b), 0)', op: '<', limit: '1m' });
  });
});

describe('measureUnits', () => {
  it('gives each measure of the outline its unit, a later one inheriting from an earlier', () => {
    const text = 'title t\n# measure fake = db(adm)\nmeasure a0 = db(adm)   # gain\nmeasure vmin = min(v(a), \\\n   v(b))\n  measure f3=corner(adm)\nmeasure twice = 2 * vmin\n';
    const { outline } = solveWithOutline(text);
    expect(outline.measures.map((m) => [m.name, m.line])).toEqual([['a0', 3], ['vmin', 4], ['f3', 6], ['twice', 7]]);
    expect(measureUnits(outline.measures)).toEqual({ a0: 'dB', vmin: 'V', f3: 'Hz', twice: 'V' });
    expect(measureUnits([])).toEqual({});
  });
});

describe('guessUnit reads the language table', () => {
  it('knows every result function and device quantity the table gives a unit, log, exp and pow included', () => {
    expect(guessUnit('ib(q1)')).toBe('A');
    expect(guessUnit('gds(m1)')).toBe('S');
    expect(guessUnit('vov(m1)')).toBe('V');
    expect(guessUnit('zin(va)')).toBe('Ω');
    expect(guessUnit('log(ic(q1)/ic(q2))')).toBe('');
    expect(guessUnit('exp(1)')).toBe('');
    expect(guessUnit('pow(v(a), 2) / ro(q1)')).toBe('W');
    expect(guessUnit('nosuch(v(a))')).toBe('');
  });
});

describe('guessUnit with params', () => {
  it('names no unit for a quantity divided by a param (a param’s unit is not written)', () => {
    expect(guessUnit('ic(m1.qb) / iref')).toBe('');
    expect(guessUnit('n * early / (1 + (1 + n)/beta)')).toBe('');
  });
  it('still adopts the unit in a sum and keeps literals as scale factors', () => {
    expect(guessUnit('v(out) + offset')).toBe('V');
    expect(guessUnit('2 * v(out)')).toBe('V');
  });
});
