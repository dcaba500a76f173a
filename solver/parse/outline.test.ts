import { describe, expect, it } from 'vitest';
import { solveNetlist, solveWithOutline } from '../solve';
import { parseNetlist } from '../elaborate/parse-netlist';

const MIRROR = `block mirror2(in, out, rail)
  param ratio = 1
  qa: npn(c=in, b=in, e=rail) qn
  qb: npn(c=out, b=in, e=rail) qn area=ratio
end
`;

const TEXT = `title outline
param rl = 10k
model qn: npn(is=1e-16, beta=100)
model mn: nmos(vth=0.5)
block mirror2(in, out, rail)
  param ratio = 1
  qa: npn(c=in, b=in, e=rail) qn
  qb: npn(c=out, b=in, e=rail) qn area=ratio
end
use lib/thing@2
vcc: vsrc(vcc, gnd) 5
rr: res(vcc, ref) 10k
r1: res(vcc, \\
        out) rl
m1: mirror2(in=ref, out=out, rail=gnd) ratio=2
measure io = i(r1)
measure ratio_x = io / \\
        i(rr)
check io > 100u
check  ratio_x = 2 ± 5%
`;

const resolveUse = (path: string, version: number) => (path === 'lib/thing' && version === 2 ? 'block thing(a)\n  r: res(a, gnd) 1k\nend\n' : undefined);

describe('the outline of a solve', () => {
  it('carries the names with their kinds, the measure, check and use lines (1-based, first physical line)', () => {
    const { outline } = solveWithOutline(TEXT, { resolveUse });
    expect(outline.symbols.models).toEqual([{ name: 'qn', kind: 'npn' }, { name: 'mn', kind: 'nmos' }]);
    expect(outline.symbols.blocks).toEqual([{ name: 'mirror2', pins: ['in', 'out', 'rail'], params: ['ratio'] }, { name: 'thing', pins: ['a'], params: [] }]);
    expect(outline.symbols.params).toEqual(['rl']);
    expect(outline.symbols.parts).toEqual([
      { name: 'vcc', kind: 'vsrc' }, { name: 'rr', kind: 'res' }, { name: 'r1', kind: 'res' },
      { name: 'm1.qa', kind: 'npn' }, { name: 'm1.qb', kind: 'npn' },
    ]);
    expect(outline.symbols.nodes).toEqual(['vcc', 'ref', 'out']);
    expect(outline.symbols.measures).toEqual(['io', 'ratio_x']);
    expect(outline.measures).toEqual([{ name: 'io', line: 16, expression: 'i(r1)' }, { name: 'ratio_x', line: 17, expression: expect.stringMatching(/^io \/\s+i\(rr\)$/) }]);
    expect(outline.checks).toEqual([{ line: 19, expression: 'io > 100u' }, { line: 20, expression: 'ratio_x = 2 ± 5%' }]);
    expect(outline.uses).toEqual([{ path: 'lib/thing', version: 2, line: 10 }]);
  });

  it('comes with exactly the result solveNetlist gives, from the same text', () => {
    const both = solveWithOutline(TEXT, { resolveUse });
    expect(both.result).toEqual(solveNetlist(TEXT, { resolveUse }));
    expect(JSON.stringify(both.result)).toBe(JSON.stringify(solveNetlist(TEXT, { resolveUse })));
  });

  it('is the parser\'s outline, and agrees with its symbols', () => {
    const parsed = parseNetlist(TEXT, { resolveUse });
    expect(parsed.outline).toEqual(solveWithOutline(TEXT, { resolveUse }).outline);
    expect(parsed.symbols.models).toEqual(parsed.outline.symbols.models.map((m) => m.name));
    expect(parsed.symbols.parts).toEqual(parsed.outline.symbols.parts.map((p) => p.name));
  });

  it('keeps what it can read when the circuit has errors, and names the measures whose lines fail', () => {
    const { result, outline } = solveWithOutline(`${MIRROR}model qn: npn()\nr1: rez(a, gnd) 1k\nmeasure bad = nosuch(1)\nuse lib/missing@1\n`);
    expect(result.errors.length).toBeGreaterThan(0);
    expect(outline.symbols.blocks.map((b) => b.name)).toEqual(['mirror2']);
    expect(outline.symbols.models).toEqual([{ name: 'qn', kind: 'npn' }]);
    expect(outline.measures).toEqual([{ name: 'bad', line: 8, expression: 'nosuch(1)' }]);
    expect(outline.uses).toEqual([{ path: 'lib/missing', version: 1, line: 9 }]);
  });

  it('knows the analyze lines by their kind word, even one still being typed', () => {
    const { outline } = solveWithOutline(`${TEXT}analyze ac from 10 to 1k per decade 5\nanalyze temp over\nanalyze\nanalyze mismatch runs 10 is 1%\n`, { resolveUse });
    expect(outline.analyses).toEqual([{ kind: 'ac', line: 21 }, { kind: 'temp', line: 22 }, { kind: 'mismatch', line: 24 }]);
  });

  it('is empty for empty or non-text input, and never throws', () => {
    for (const text of ['', '   \n', undefined as unknown as string]) {
      const { outline } = solveWithOutline(text);
      expect(outline).toEqual({ symbols: { models: [], blocks: [], params: [], parts: [], nodes: [], measures: [] }, measures: [], checks: [], uses: [], analyses: [] });
    }
  });
});
