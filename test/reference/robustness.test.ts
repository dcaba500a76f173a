/**
 * The contract's promise (§4): bad input gets diagnostics, never an exception, NaN or Infinity.
 */
import { describe, expect, it } from 'vitest';
import { solveNetlist } from '../../solver/index';
import { expectNearlyEqual } from '../../solver/testing/nearly-equal';

function allNumbersFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value)) return value.every(allNumbersFinite);
  if (value && typeof value === 'object') return Object.values(value).every(allNumbersFinite);
  return true;
}

const BAD_INPUTS = [
  '',
  'garbage here',
  'r1: res(a, b) 1meg',
  'r1: res(a, gnd) 10 pF',
  'q1: npn(c=a, b=b, e=gnd) nosuchmodel',
  'v1: vsrc(a, gnd) 1\nv2: vsrc(a, gnd) 2',
  'i1: isrc(gnd, a) 1m\nc1: cap(a, gnd) 1p',
  'v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nmeasure x = 1/0\nmeasure y = ic(q9)\ncheck x > 1',
  'v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nanalyze ac from 1 GHz to 1 Hz per decade 10\nmeasure f = corner(ac(a))',
  'v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nanalyze noise out a in v1 from 10 Hz to 1 MHz per decade 10\nanalyze poles',
  'v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nports in=(v1, v2) out=a',
  'use nowhere/nothing@9\nx1: nothing(a=b)',
  'vcc: vsrc(vcc, gnd) 1e308\nr1: res(vcc, gnd) 1e-300',
];

describe('robustness', () => {
  it.each(BAD_INPUTS.map((t, k) => [k, t]))('input %i gives diagnostics, not an exception', (_k, text) => {
    const r = solveNetlist(text as string);
    expect(allNumbersFinite(r)).toBe(true);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
    expect(Array.isArray(r.errors)).toBe(true);
    expect(Array.isArray(r.warnings)).toBe(true);
    for (const d of [...r.errors, ...r.warnings]) {
      expect(d.line).toBeGreaterThanOrEqual(1);
      expect(d.col).toBeGreaterThanOrEqual(1);
      expect(d.message.length).toBeGreaterThan(0);
    }
  });

  it('every analysis of the language runs now (poles was the last one warned as not yet available), and the rest still runs', () => {
    const r = solveNetlist('v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nanalyze poles\nmeasure x = v(a)');
    expect(r.errors).toEqual([]);
    expect(r.warnings).toEqual([]);
    // A resistor and a source have no natural frequency.
    expect(r.poles?.poles_hz).toEqual([]);
    expect(r.measures.x).toBe(1);
  });

  // Errors only the solved circuit reveals (the parser catches wrong kinds and unknown names
  // before anything is solved, and then nothing is solved).
  it('measure errors sit on their own lines', () => {
    const r = solveNetlist('v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nmeasure x = 1/(v(a) - 1)\nmeasure y = corner(ac(a))\nmeasure z = v(a)\nmeasure w = x + 1');
    // `w` uses the failed `x`: x's own error is the one message, w is dropped silently (common practice).
    expect(r.errors.map((e) => e.line)).toEqual([3, 4]);
    expect(r.measures).toEqual({ z: 1 });
    expect(r.op?.nodes.a).toBe(1);
  });
});

describe('a mistake in a request line loses nothing else', () => {
  const base = [
    'vcc: vsrc(vcc, gnd) 10 V',
    'r1: res(vcc, mid) 1k',
    'r2: res(mid, gnd) 3k',
    'measure vm = v(mid)',
  ];

  it('a measure naming an unknown node is an error on its line, while the operating point and other measures stay', () => {
    const r = solveNetlist([...base, 'measure bad = v(midd)', 'check vm = 7.5 ± 1%'].join('\n'));
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ line: 5, message: expect.stringContaining('midd') });
    // Divider 10 V · 3k/(1k + 3k) = 7.5 V (Ohm's law); 1e-8 relative leaves room for min_g (1e-12 S).
    expectNearlyEqual(r.op?.nodes.mid ?? 0, 7.5, 1e-8, 0);
    expectNearlyEqual(r.measures.vm, 7.5, 1e-8, 0);
    expect(r.checks).toMatchObject([{ pass: true, line: 6 }]);
  });

  it('a mistake in a part line withholds every result, since the circuit itself is wrong', () => {
    const r = solveNetlist([...base, 'r3: res(mid, gnd) 2 F'].join('\n'));
    expect(r.errors.length).toBeGreaterThan(0);
    expect(r.op).toBeUndefined();
  });
});

describe('a `use` that cannot be resolved', () => {
  it('is one error at the use line; the instances of its block are not reported again', () => {
    const r = solveNetlist(
      ['use mirrors/wilson_npn@3', 'vcc: vsrc(vcc, gnd) 5', 'r1: res(vcc, ref) 10k', 'm1: wilson_npn(in=ref, out=o, rail=gnd)', 'rl: res(vcc, o) 1k'].join('\n'),
      { resolveUse: () => ({ ok: false, message: 'The team library is not connected.', hint: 'paste the block' }) },
    );
    expect(r.errors).toEqual([expect.objectContaining({ code: 'unknown-use', line: 1, message: 'The team library is not connected.', hint: 'paste the block' })]);
  });
});
