/**
 * readBlockDocs: the `#:` doc convention (docs/netlist.md §3, "Documenting a block") read against
 * the block headers that the solver's own parser finds.
 */
import { describe, expect, it } from 'vitest';
import { readBlockDocs } from './block-doc';

const MIRROR = `#: Simple npn mirror
#: qa is diode-connected; qb copies its current
#: at \`out\`.
#:
#: A second paragraph.
#: pin in — reference current in
#: pin out - mirrored current in; keep it a few tenths
#:     of a volt above rail
#: pin rail: emitters
#: param ratio — emitter-area ratio qb : qa
#: param w – a width
#: tags npn, mirror,  bipolar
#: tags small current

model q: npn(beta=100)

block mirror2(in, out, rail)
  param ratio = 1
  param w = {2*ratio}
  qa: npn(c=in, b=in, e=rail) q
  qb: npn(c=out, b=in, e=rail) q area=ratio
end

# the fixture: parts, measures and checks are not blocks
title Fixture
ir: isrc(gnd, ref) 1m
m1: mirror2(in=ref, out=o, rail=gnd)
vo: vsrc(o, gnd) 1
measure io = i(vo)
check io < 0
`;

describe('readBlockDocs', () => {
  it('reads title, summary, pins, params (with defaults) and tags', () => {
    const docs = readBlockDocs(MIRROR);
    expect(docs).toHaveLength(1);
    expect(docs[0]).toEqual({
      name: 'mirror2',
      line: 17,
      title: 'Simple npn mirror',
      summary: 'qa is diode-connected; qb copies its current at `out`.\nA second paragraph.',
      pins: [
        { name: 'in', doc: 'reference current in' },
        { name: 'out', doc: 'mirrored current in; keep it a few tenths of a volt above rail' },
        { name: 'rail', doc: 'emitters' },
      ],
      params: [
        { name: 'ratio', default: '1', doc: 'emitter-area ratio qb : qa' },
        { name: 'w', default: '{2*ratio}', doc: 'a width' },
      ],
      tags: ['npn', 'mirror', 'bipolar', 'small current'],
      problems: [],
    });
  });

  it('names an undocumented pin or param, and a documented one the block lacks', () => {
    const docs = readBlockDocs(`#: Pair
#: pin ina — one base
#: pin inx — a pin that is not there
#: param rcc — no such param
block pair(ina, inb)
  param rc = 5k
  q1: npn(c=gnd, b=ina, e=t)
  q2: npn(c=gnd, b=inb, e=t)
  r1: res(t, gnd) rc
end
`);
    expect(docs[0].pins).toEqual([{ name: 'ina', doc: 'one base' }, { name: 'inb' }]);
    expect(docs[0].params).toEqual([{ name: 'rc', default: '5k' }]);
    const p = docs[0].problems;
    expect(p).toHaveLength(4);
    expect(p).toContainEqual(expect.stringMatching(/^Line 3: `#: pin inx` names no pin of `pair` \(its pins: ina, inb\)/));
    expect(p).toContainEqual(expect.stringMatching(/^Line 4: `#: param rcc` names no param of `pair` \(its params: rc\)/));
    expect(p).toContainEqual(expect.stringMatching(/pin `inb` of `pair` is not documented/));
    expect(p).toContainEqual(expect.stringMatching(/param `rc` of `pair` is not documented/));
  });

  it('a block without any doc comment is one problem, its pins undocumented', () => {
    const docs = readBlockDocs('block d(a, b)\n  r: res(a, b) 1k\nend\n');
    expect(docs[0].pins).toEqual([{ name: 'a' }, { name: 'b' }]);
    expect(docs[0].title).toBeUndefined();
    expect(docs[0].problems).toEqual(['The block `d` (line 1) has no `#:` doc comment (title; pins a, b).']);
  });

  it('a doc group at the top of the file documents the first block, across models and comments', () => {
    const docs = readBlockDocs(`# licence text, an ordinary comment
#: Divider
#: pin a — top
#: pin b — tap

model unused: npn(beta=50)
param k = 2
block div(a, b)
  r1: res(a, b) 1k
  r2: res(b, gnd) 1k
end
`);
    expect(docs[0].title).toBe('Divider');
    expect(docs[0].problems).toEqual([]);
  });

  it('each of several blocks takes the group right above it; ordinary comments may stand between', () => {
    const docs = readBlockDocs(`#: Outer
#: pin x — the outer pin
block outer(x)
  #: Inner
  #: pin y — the inner pin
  # an ordinary note
  block inner(y)
    r: res(y, gnd) 1k
  end
  i1: inner(y=x)
end
#: Second
#: pin p — p
block second(p)
  r: res(p, gnd) 1k
end
`);
    expect(docs.map((d) => [d.name, d.title, d.problems])).toEqual([
      ['outer', 'Outer', []],
      ['inner', 'Inner', []],
      ['second', 'Second', []],
    ]);
  });

  it('a group that stands above no block is a problem; the top-of-file rule does not steal a block that has its own', () => {
    const docs = readBlockDocs(`#: Stray title

#: Real
#: pin a — a
block b1(a)
  r: res(a, gnd) 1k
end
#: Lost
r9: res(x, gnd) 1k
`);
    expect(docs[0].title).toBe('Real');
    expect(docs[0].problems).toEqual([
      'Line 1: this `#:` doc comment documents no block; put it right above a `block` line, or at the top of the file for the file\'s block.',
      'Line 8: this `#:` doc comment documents no block; put it right above a `block` line, or at the top of the file for the file\'s block.',
    ]);
  });

  it('takes the pins from the parser, not from the look of the line', () => {
    const docs = readBlockDocs(`#: Odd spacing
#: pin a — a
#: pin b — b
#: pin c — c
block   odd ( a ,b, \\
   c )   # a comment with block w(z) in it
  r1: res(a, b) 1k
  r2: res(b, c) 1k
end
`);
    expect(docs.map((d) => d.name)).toEqual(['odd']);
    expect(docs[0].pins.map((p) => p.name)).toEqual(['a', 'b', 'c']);
    expect(docs[0].problems).toEqual([]);
  });

  it('a title may start with the word pin; a `pin` line without a name is a problem', () => {
    const docs = readBlockDocs(`#: pin-compatible mirror
#: pin
#: pin a — a
block m(a)
  r: res(a, gnd) 1k
end
`);
    expect(docs[0].title).toBe('pin-compatible mirror');
    expect(docs[0].problems).toEqual(['Line 2: a `#: pin` line names no pin; write `#: pin NAME — what it is`.']);
  });

  it('a group without a title, an empty pin text, a pin documented twice, free text after the entries', () => {
    const docs = readBlockDocs(`#: pin a — first
#: pin a — again
#: pin b
#: a stray sentence
block m(a, b)
  r: res(a, b) 1k
end
`);
    expect(docs[0].title).toBeUndefined();
    expect(docs[0].summary).toBe('a stray sentence');
    expect(docs[0].pins).toEqual([{ name: 'a', doc: 'first' }, { name: 'b', doc: '' }]);
    expect(docs[0].problems).toEqual([
      expect.stringMatching(/^Line 4: free text after the pin, param or tags lines/),
      expect.stringMatching(/^Line 1: the doc comment of `m` has no title/),
      'Line 2: the pin `a` is documented twice.',
      'Line 3: `#: pin b` says nothing about it.',
    ]);
  });

  it('never throws: no blocks, broken text, not a string', () => {
    expect(readBlockDocs('')).toEqual([]);
    expect(readBlockDocs('#: Title only\n')).toEqual([]);
    expect(readBlockDocs('block (\n#:\nend end\n\u0000')).toEqual([]);
    expect(readBlockDocs(undefined as unknown as string)).toEqual([]);
    const broken = readBlockDocs('#: Half\n#: pin a — a\nblock h(a\n  r: res(a, gnd) 1k\n');
    expect(broken.map((d) => d.name)).toEqual(['h']);
  });
});
