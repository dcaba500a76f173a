import { namesOf } from './netlist-names';

describe('namesOf (editor completion names)', () => {
  const text = ['model qn: npn(beta=100)', 'use mirrors/two@1', 'q1: npn(c=a, b=b, e=gnd) qn', 'r1: res(a, gnd) 1k', 'measure va = v(a)'].join('\n');
  const library = 'block two(in, out, rail)\n  param ratio = 1\n  qa: npn(c=in, b=in, e=rail)\n  qb: npn(c=out, b=in, e=rail) area=ratio\nend\n';

  it('lists models with their kinds, parts, nodes and measures', () => {
    const names = namesOf(text);
    expect(names.models).toEqual([{ name: 'qn', kind: 'npn' }]);
    expect(names.parts.map((p) => p.name)).toContain('q1');
    expect(names.measures).toEqual(['va']);
  });

  it('includes the pins and params of a block brought in by `use` when a resolver is given', () => {
    expect(namesOf(text).blocks).toEqual([]);
    const names = namesOf(text, (path, version) => (path === 'mirrors/two' && version === 1 ? library : undefined));
    expect(names.blocks).toEqual([{ name: 'two', pins: ['in', 'out', 'rail'], params: ['ratio'] }]);
  });
});
