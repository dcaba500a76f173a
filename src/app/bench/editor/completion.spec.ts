import { ANALYSIS_SPECS, FUNCTIONS, PART_KINDS, STATEMENTS, solveWithOutline } from '../../../../solver';
import { NO_NAMES, type NetlistNames } from '../solver-protocol';
import { completionsFor } from './completion';

const labels = (before: string, names: NetlistNames = NO_NAMES) => (completionsFor(before, names) ?? []).map((c) => c.label);

describe('completion reads the language tables', () => {
  it('offers every result function of the table in a measure, log, exp and pow included, with its doc', () => {
    const options = completionsFor('measure x = ', NO_NAMES) ?? [];
    expect(options.filter((o) => o.type === 'function').map((o) => o.label)).toEqual(FUNCTIONS.map((f) => f.name));
    for (const name of ['log', 'exp', 'pow']) {
      const option = options.find((o) => o.label === name);
      expect(option?.detail).toBe(FUNCTIONS.find((f) => f.name === name)?.doc);
      expect(option?.apply).toBe(`${name}(`);
    }
    expect(labels('check ')).toContain('pow');
    expect(labels('measure x = ')).toEqual(expect.arrayContaining(['adm', 'acm', 'cmrr', 'cmrr_db']));
  });

  it('offers the statements, analyses, part kinds and model kinds of the tables', () => {
    expect(labels('')).toEqual(STATEMENTS.map((s) => s.keyword));
    expect(completionsFor('me', NO_NAMES)?.find((o) => o.label === 'measure')?.detail).toBe('measure NAME = EXPRESSION');
    expect(labels('analyze ')).toEqual(ANALYSIS_SPECS.map((a) => a.kind));
    expect(completionsFor('analyze ', NO_NAMES)?.[0].apply).toBe('ac from 10 Hz to 1 GHz per decade 20');
    expect(labels('r1: ')).toEqual(Object.keys(PART_KINDS));
    expect(completionsFor('r1: ', NO_NAMES)?.find((o) => o.label === 'isrc')?.detail).toBe('current source (from, to) A');
    expect(labels('model qn: ')).toEqual(['npn', 'pnp', 'nmos', 'pmos', 'diode']);
    expect(completionsFor('q1: npn(', NO_NAMES)?.map((o) => [o.label, o.detail])).toEqual([['c=', 'collector'], ['b=', 'base / body / second terminal'], ['e=', 'emitter']]);
  });

  it('offers the parts of block instances by their kind inside device functions', () => {
    const block = 'block pair(a, b)\n  q1: npn(c=a, b=b, e=gnd) qn\n  r1: res(a, b) 1k\nend\n';
    const text = ['model qn: npn(beta=100)', block, 'vcc: vsrc(vcc, gnd) 5', 'x1: pair(vcc, mid)'].join('\n');
    const { outline } = solveWithOutline(text);
    const names: NetlistNames = { ...outline.symbols, uses: [] };
    expect(names.parts).toEqual(expect.arrayContaining([{ name: 'x1.q1', kind: 'npn' }, { name: 'x1.r1', kind: 'res' }]));
    expect(labels('measure i1 = ic(', names)).toEqual(['x1.q1']);
    expect(labels('measure i1 = zin(', names)).toEqual(['vcc']);
  });
});
