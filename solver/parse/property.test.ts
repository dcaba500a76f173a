/**
 * Property tests: the parser never throws, whatever the input (netlist-language.md §4: "No input
 * may make the solver hang, throw an uncaught exception …"), and every diagnostic points at a
 * real place (line ≥ 1, col ≥ 1).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MAX_UNKNOWNS } from '../circuit/capacity';
import type { Part } from '../circuit/types';
import { parseNetlist } from '../elaborate/parse-netlist';
import type { ParseResult } from './parse-netlist';
import { EXAMPLE } from './test-netlists';

const BLOCKS = `model qm: npn(beta=50)
block mirror2(in, out, rail)
  param ratio = 1
  qa: npn(c=in, b=in, e=rail) qm
  qb: npn(c=out, b=in, e=rail) qm area=ratio
end
use mirrors/wilson_npn@3
m1: mirror2(in=ref, out=tail, rail=vee) ratio=4
m2: wilson_npn(in=ref2, out=tail2, rail=vee)
m3: nmos(d=x, g=y, s=gnd) w=2u l=1u
rg: res(y, gnd) 1M
c1: cap(x, y) 1 pF \\
  # continued
analyze mismatch runs 5 seed 7 beta 5%
analyze noise out outa outb in va from 10 Hz to 1 MHz per decade 5
check zin(va, 1k) = 1k ± 1%
`;
const VALID = EXAMPLE + BLOCKS;
const LIBRARY = 'model q: npn(beta=80)\nblock wilson_npn(in, out, rail)\n  qa: npn(c=in, b=mid, e=rail) q\n  qb: npn(c=mid, b=mid, e=rail) q\n  qc: npn(c=out, b=in, e=mid) q\nend';
const resolveUse = (path: string): string | undefined => (path === 'mirrors/wilson_npn' ? LIBRARY : undefined);

/** Everything a result must satisfy, whatever the input. */
function checkResult(r: ParseResult): void {
  for (const d of r.diagnostics) {
    expect(d.line).toBeGreaterThanOrEqual(1);
    expect(d.col).toBeGreaterThanOrEqual(1);
    expect(Number.isInteger(d.line) && Number.isInteger(d.col)).toBe(true);
    expect(d.message.length).toBeGreaterThan(0);
  }
  const sorted = [...r.diagnostics].sort((a, b) => a.line - b.line || a.col - b.col);
  expect(r.diagnostics).toEqual(sorted);
  if (r.circuit) {
    // With a circuit, the only errors allowed are those confined to request lines
    // (analyze, ports, measure, check): they drop the request, not the circuit.
    const requestCodes = r.diagnostics.filter((d) => d.severity === 'error').map((d) => d.code);
    expect(requestCodes).not.toContain('internal');
    expect(r.diagnostics.filter((d) => d.severity === 'error').every((d) => r.requestLines.has(d.line))).toBe(true);
    for (const p of r.circuit.parts) expectFiniteValues(p);
  }
}

/** Every number of an elaborated part is finite (an absent Early voltage is the one ∞). */
function expectFiniteValues(p: Part): void {
  const walk = (o: object, path: string): void => {
    for (const [k, v] of Object.entries(o)) {
      if (typeof v === 'number' && !(k === 'va' && v === Infinity)) expect(Number.isFinite(v), `${path}.${k}`).toBe(true);
      else if (v && typeof v === 'object') walk(v, `${path}.${k}`);
    }
  };
  walk(p, p.name);
}

/** Character-level mutations of a text: deletions, insertions and duplications. */
const mutation = fc.oneof(
  fc.record({ op: fc.constant('delete' as const), at: fc.nat(), len: fc.integer({ min: 1, max: 6 }) }),
  fc.record({ op: fc.constant('insert' as const), at: fc.nat(), text: fc.string({ unit: fc.constantFrom(...'()=,:{}\\#@±%.-+*/ \n\tµΩabcgknpm019') , maxLength: 4 }) }),
  fc.record({ op: fc.constant('duplicate' as const), at: fc.nat(), len: fc.integer({ min: 1, max: 30 }) }),
);

type Mutation = typeof mutation extends fc.Arbitrary<infer T> ? T : never;

function mutate(text: string, ops: Mutation[]): string {
  let t = text;
  for (const m of ops) {
    const at = t.length === 0 ? 0 : m.at % t.length;
    if (m.op === 'delete') t = t.slice(0, at) + t.slice(at + m.len);
    else if (m.op === 'insert') t = t.slice(0, at) + m.text + t.slice(at);
    else t = t.slice(0, at) + t.slice(at, at + m.len) + t.slice(at);
  }
  return t;
}

describe('parseNetlist never throws', () => {
  it('the valid base netlist parses cleanly', () => {
    const r = parseNetlist(VALID, { resolveUse });
    expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });

  it('on random strings', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 300 }), (text) => {
        checkResult(parseNetlist(text, { resolveUse }));
      }),
      { numRuns: 300 },
    );
  });

  it('on random strings built from netlist characters and words', () => {
    const piece = fc.constantFrom('q1', ':', ' ', 'npn', 'res', '(', ')', 'c=', 'b=', 'e=', ',', '1k', '\n', 'block', 'end', 'param', 'x', '=',
      '{', '}', '\\\n', '#', 'meg', 'gnd', 'ports', 'in=', 'out=', 'measure', 'check', '>=', '±', 'analyze', 'ac', 'from', 'to', 'per', 'decade', 'use', 'a/b@1', 'v(', 'ic(');
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 80 }), (pieces) => {
        checkResult(parseNetlist(pieces.join(''), { resolveUse }));
      }),
      { numRuns: 300 },
    );
  });

  it('on random mutations of a valid netlist', () => {
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 5 }), (ops) => {
        checkResult(parseNetlist(mutate(VALID, ops), { resolveUse }));
      }),
      { numRuns: 300 },
    );
  });

  it('on pathological inputs, without hanging', () => {
    const cases = [
      '('.repeat(20000),
      `r1: res(a, gnd) ${'('.repeat(5000)}1${')'.repeat(5000)}`,
      `param x = ${'1+'.repeat(20000)}1`,
      '\\\n'.repeat(5000),
      'block b(x)\n'.repeat(200),
      'end\n'.repeat(5000),
      `q1: npn(${'c=a, '.repeat(3000)})`,
      '{'.repeat(1000),
      `measure m = ${'v('.repeat(3000)}a${')'.repeat(3000)}`,
      'x'.repeat(100000),
      '\u0000\ud800\udfff\u202e',
    ];
    for (const text of cases) checkResult(parseNetlist(text, { resolveUse }));
  });

  it('on a huge number of lines (a parameter chain, a resistor ladder)', () => {
    const params = ['param p0 = 1'];
    for (let k = 1; k < 5000; k++) params.push(`param p${k} = p${k - 1}+1`);
    const chain = parseNetlist(params.join('\n'));
    checkResult(chain);
    expect(chain.requests.params.p4999).toBe(5000);
    // As long a ladder as the engine holds (its rungs + 1 nodes and the source's branch current),
    // up to 10,000 rungs; a longer one is refused with `too-large` (elaborate.test.ts).
    const rungs = Math.min(10_000, MAX_UNKNOWNS - 2);
    const ladder = ['v0: vsrc(n0, gnd) 1'];
    for (let k = 0; k < rungs; k++) ladder.push(`r${k}: res(n${k}, n${k + 1}) 1k`);
    ladder.push(`rl: res(n${rungs}, gnd) 1k`);
    const r = parseNetlist(ladder.join('\n'));
    checkResult(r);
    expect(r.circuit?.nodes).toHaveLength(rungs + 1);
  }, 60_000); // a generous bound that only a hang (e.g. quadratic scope copying) exceeds
});
