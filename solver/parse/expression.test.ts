import { describe, expect, it } from 'vitest';
import { evaluateExpression, rewriteExpression, rewriteExpressionDetailed } from './expression';

// Behaviour from netlist-language.md §1 (Expressions) and §3 (Measurements).
describe('rewriteExpression', () => {
  it.each([
    ['2*4.7k', '2*4700'],
    ['ic(m1.qa)', 'ic("m1.qa")'],
    ['v(outa, outb)', 'v("outa", "outb")'],
    ['v(outa,outb)', 'v("outa","outb")'],
    ['zin(va, 1k)', 'zin("va", 1000)'],
    ['zout(outa, 1 kHz)', 'zout("outa", 1000)'],
    ['min(vce(q1), vce(q2))', 'min(vce("q1"), vce("q2"))'],
    ['db(at(ac(out), 10k))', 'db(at(ac("out"), 10000))'],
    ['{vcc - 0.7}', 'vcc - 0.7'],
    ['db(adm)', 'db(adm)'],
    ['5% * x', '0.05 * x'],
    ['gm(q1)*rpi(q1)', 'gm("q1")*rpi("q1")'],
  ])('%s → %s', (input, expected) => {
    expect(rewriteExpression(input)).toBe(expected);
  });

  it('reports meg inside an expression', () => {
    const r = rewriteExpressionDetailed('2*1meg');
    expect(r.problems.map((p) => p.code)).toEqual(['meg-prefix']);
    expect(r.problems[0].offset).toBe(3);
  });

  it('reports unbalanced parentheses and stray characters', () => {
    expect(rewriteExpressionDetailed('sqrt(2').problems[0].message).toContain('never closed');
    expect(rewriteExpressionDetailed('2)').problems[0].message).toContain('without its');
    expect(rewriteExpressionDetailed('a = 2').problems.length).toBeGreaterThan(0);
  });
});

describe('evaluateExpression', () => {
  const scope = new Map([['rc', 1200], ['vcc', 10]]);
  it('evaluates over parameters with mathjs', () => {
    const ok = (text: string): number => {
      const r = evaluateExpression(text, scope);
      if (!r.ok) throw new Error(r.problems[0].message);
      return r.value;
    };
    expect(ok('2*rc')).toBe(2400);
    expect(ok('rc/2')).toBe(600);
    expect(ok('{vcc - 0.7}')).toBeCloseTo(9.3, 12);
    expect(ok('sqrt(2)*1k')).toBeCloseTo(1414.2135623730951, 9); // √2 = 1.41421356237…
    expect(ok('2^3')).toBe(8);
    expect(ok('max(1, rc)')).toBe(1200);
    expect(ok('-10 V')).toBe(-10);
  });

  it('names an unknown parameter with a suggestion', () => {
    const r = evaluateExpression('2*rcc', scope);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.problems[0].code).toBe('unknown-param');
      expect(r.problems[0].offset).toBe(2);
      expect(r.problems[0].hint).toBe('did you mean `rc`?');
    }
  });

  it('refuses non-finite results and unknown functions', () => {
    expect(evaluateExpression('1/0', scope).ok).toBe(false);
    expect(evaluateExpression('sqrt(-1)', scope).ok).toBe(false);
    const f = evaluateExpression('foo(2)', scope);
    expect(f.ok).toBe(false);
    if (!f.ok) expect(f.problems[0].code).toBe('unknown-function');
  });
});
