import { measureDefinitions, measureUnits } from './measure-lines';
import { checkSubject, guessUnit } from './units';

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

  it('calls a quotient or a mixed sum a plain number', () => {
    expect(guessUnit('ic(q1)/ic(q2)')).toBe('');
    expect(guessUnit('gm(q1)*ro(q1)')).toBe('');
    expect(guessUnit('ic(q1) + vce(q1)')).toBe('');
    expect(guessUnit('1e-3 + ic(q1)')).toBe('A');
  });

  it('uses the units of earlier measures', () => {
    expect(guessUnit('vmin', { vmin: 'V' })).toBe('V');
  });

  it('reads the subject of a check', () => {
    expect(checkSubject('cmrr_db >= 80')).toBe('cmrr_db');
    expect(checkSubject('ic(q1) = 2m ± 1%')).toBe('ic(q1)');
    expect(checkSubject('vmin > 0.3')).toBe('vmin');
    expect(checkSubject('id(m1) <= 100u')).toBe('id(m1)');
  });
});

describe('measureDefinitions', () => {
  it('finds measures with their lines, skipping comments and joining continued lines', () => {
    const text = 'title t\n# measure fake = db(adm)\nmeasure a0 = db(adm)   # gain\nmeasure vmin = min(vce(q1), \\\n   vce(q2))\n  measure f3=corner(adm)\n';
    expect(measureDefinitions(text)).toEqual([
      { name: 'a0', expr: 'db(adm)', line: 3 },
      { name: 'vmin', expr: 'min(vce(q1), vce(q2))', line: 4 },
      { name: 'f3', expr: 'corner(adm)', line: 6 },
    ]);
    expect(measureUnits(measureDefinitions(text))).toEqual({ a0: 'dB', vmin: 'V', f3: 'Hz' });
    expect(measureDefinitions(undefined)).toEqual([]);
  });
});
