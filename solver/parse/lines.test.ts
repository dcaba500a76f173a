/**
 * The line splitter: continuations, comments, positions — and a regression guard for issue 11
 * (item 4): a long run of spaces inside a line took quadratic time in the trailing-space trim
 * (`replace(/\s+$/, '')` retries from every space of a run that more text follows; a line of
 * 128k spaces took about 20 s). These are robustness tests, not speed targets: the bounds are
 * generous and only the quadratic form, which would take minutes on a megabyte, exceeds them.
 */
import { performance } from 'node:perf_hooks';
import { describe, expect, it } from 'vitest';
import { solveNetlist } from '../solve';
import { splitLogicalLines } from './lines';

const MEGABYTE = 1 << 20;

/** Runs `fn` and returns its result with the wall time in ms. */
function timed<T>(fn: () => T): { value: T; ms: number } {
  const t0 = performance.now();
  const value = fn();
  return { value, ms: performance.now() - t0 };
}

describe('splitLogicalLines', () => {
  it('joins continued lines, drops comments and blank lines, and keeps physical positions', () => {
    const lines = splitLogicalLines('# title\nr1: res(a, \\\n   b) 1k   # load\n\nv1: vsrc(a, gnd) 1');
    // The `\` becomes a space; the comment goes, the spaces before it stay.
    expect(lines.map((l) => l.text)).toEqual(['r1: res(a,     b) 1k   ', 'v1: vsrc(a, gnd) 1']);
    expect(lines[0].line).toBe(2);
    // "b" stands on physical line 3, column 4.
    expect(lines[0].loc(lines[0].text.indexOf('b)'))).toEqual({ line: 3, col: 4 });
  });

  it('a 1 MB run of spaces inside, before and after a statement, and before a continuation, in linear time', () => {
    const spaces = ' '.repeat(MEGABYTE);
    const cases = [
      `r1: res(a, gnd)${spaces}1k`,
      `${spaces}r1: res(a, gnd) 1k`,
      `r1: res(a, gnd) 1k${spaces}`,
      `r1: res(a, gnd)${spaces}\\${spaces}\n 1k`,
      `r1: res(a, gnd) 1k${spaces}x`,
    ];
    for (const text of cases) {
      const { value, ms } = timed(() => splitLogicalLines(text));
      expect(value).toHaveLength(1);
      expect(value[0].text.trim().replace(/\s+/g, ' ')).toMatch(/^r1: res\(a, gnd\) 1k( x)?$/);
      expect(ms, 'a megabyte of spaces (the quadratic trim took minutes)').toBeLessThan(2000);
    }
  });
});

describe('a megabyte of spaces through the whole solver', () => {
  it('a 1 MB line of spaces and a real statement solve, the numbers unchanged', () => {
    const spaces = ' '.repeat(MEGABYTE);
    const text = `v1: vsrc(a, gnd) 1\n${spaces}\nr1: res(a,${spaces}gnd) 1k${spaces}\nmeasure i1 = ${spaces}i(r1)${spaces}\n`;
    const { value: r, ms } = timed(() => solveNetlist(text));
    expect(r.errors).toEqual([]);
    // Ohm's law: 1 V across 1 kΩ.
    expect(r.op?.parts.r1.i).toBeCloseTo(1e-3, 12);
    expect(r.measures.i1).toBeCloseTo(1e-3, 12);
    expect(ms, 'a megabyte of spaces (the quadratic trim took minutes)').toBeLessThan(2000);
  });
});
