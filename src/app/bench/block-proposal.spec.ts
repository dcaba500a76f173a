import { parseNetlist, solveNetlist } from '../../../solver';
import { blockAtCursor, definedBlocks, drivenNodes, suggestedPath, wrapAsBlock } from './block-proposal';

const PAIR = `title  Resistor-loaded pair
model qn: npn(is=1e-16, beta=100, va=80)
param rc = 10k
vcc: vsrc(vcc, gnd) 5
vee: vsrc(vee, gnd) -5
va: vsrc(inp, gnd) 0
vb: vsrc(inn, gnd) 0
q1: npn(c=o1, b=inp, e=t) qn
q2: npn(c=o2, b=inn, e=t) qn
r1: res(vcc, o1) rc
r2: res(vcc, o2) rc
rt: res(t, vee) 4.3k
ports in=(va, vb) out=(o1, o2)
measure gain = ic(q1) / 1m
check vce(q1) >= 0.3
`;

describe('propose as block', () => {
  it('finds the block at the cursor, else the first', () => {
    const text = 'block a(x)\n  r1: res(x, gnd) 1k\nend\n\nblock b(y)\n  r1: res(y, gnd) 1k\nend\n';
    const blocks = definedBlocks(text);
    expect(blocks).toEqual([{ name: 'a', line: 1 }, { name: 'b', line: 5 }]);
    expect(blockAtCursor(blocks, 6)?.name).toBe('b');
    expect(blockAtCursor(blocks, 2)?.name).toBe('a');
    expect(blockAtCursor([], 1)).toBeUndefined();
  });

  it('suggests a path the server accepts, by the seed library categories', () => {
    expect(suggestedPath('Wilson_Mirror')).toBe('mirrors/wilson_mirror');
    expect(suggestedPath('pair3')).toBe('pairs/pair3');
    expect(suggestedPath('9x')).toBe('blocks/x');
    expect(suggestedPath('widget')).toBe('blocks/widget');
  });

  it('offers the nodes the sources drive as pins', () => {
    const parsed = parseNetlist(PAIR);
    const parts = [['vcc', 'vsrc'], ['vee', 'vsrc'], ['va', 'vsrc'], ['vb', 'vsrc'], ['q1', 'npn']].map(([name, kind]) => ({ name, kind }));
    expect(drivenNodes(parts, PAIR, parsed.symbols.nodes)).toEqual(expect.arrayContaining(['vcc', 'vee', 'inp', 'inn']));
    expect(drivenNodes(parts, PAIR, parsed.symbols.nodes)).not.toContain('gnd');
  });

  it('wraps a netlist without blocks so the file solves to the same operating point', () => {
    const kinds = new Map([['vcc', 'vsrc'], ['vee', 'vsrc'], ['va', 'vsrc'], ['vb', 'vsrc']]);
    const wrapped = wrapAsBlock(PAIR, 'rpair', ['vcc', 'vee', 'inp', 'inn', 'o1', 'o2'], kinds);
    expect(wrapped).toContain('block rpair(vcc, vee, inp, inn, o1, o2)');
    expect(wrapped).toContain('x1: rpair(vcc=vcc, vee=vee, inp=inp, inn=inn, o1=o1, o2=o2)');
    expect(wrapped).toContain('# measure gain = ic(q1) / 1m');
    // The block documents every pin, so the server reads no doc problems about them.
    const doc = definedBlocks(wrapped)[0];
    expect(doc.name).toBe('rpair');
    const before = solveNetlist(PAIR);
    const after = solveNetlist(wrapped);
    expect(after.errors).toEqual([]);
    // Same circuit, so the same node voltages (the wrapped one's parts live inside x1).
    for (const node of ['o1', 'o2', 't']) {
      const name = node === 't' ? 'x1.t' : node;
      expect(after.op!.nodes[name]).toBeCloseTo(before.op!.nodes[node], 9);
    }
  });
});
