/**
 * The engine's capacity, checked while blocks expand (issue 11, item 4): a binary tree of nested
 * blocks with private nodes — under 1 kB of text — names 16k nodes, whose dense matrices would
 * take gigabytes. The elaborator counts the unknowns as it goes and refuses the circuit with the
 * size and the cap before any matrix exists. Robustness tests: the bounds are generous guards.
 */
import { performance } from 'node:perf_hooks';
import { describe, expect, it } from 'vitest';
import { MAX_UNKNOWNS as ENGINE_MAX_UNKNOWNS } from '../analysis/engine-api';
import { MAX_UNKNOWNS, partExtraUnknowns } from '../circuit/capacity';
import { buildLayout } from '../analysis/mna';
import { solveNetlist } from '../solve';
import { parseNetlist } from './parse-netlist';

/** Blocks b0 … b`depth`, each bk two instances of b(k−1) in series through a private node m. */
function tree(depth: number): string {
  let text = 'block b0(a, b)\n  r: res(a, b) 1k\n  c: cap(a, gnd) 1p\nend\n';
  for (let k = 1; k <= depth; k++) text += `block b${k}(a, b)\n  x: b${k - 1}(a=a, b=m)\n  y: b${k - 1}(a=m, b=b)\nend\n`;
  return `${text}v1: vsrc(in, gnd) 1\nt: b${depth}(a=in, b=gnd)\n`;
}

describe('the unknowns the engine can hold', () => {
  it('is one named constant, the engine\'s', () => {
    expect(ENGINE_MAX_UNKNOWNS).toBe(MAX_UNKNOWNS);
  });

  it('a binary tree of nested blocks (under 1 kB, 16,385 unknowns) is refused quickly, naming its size and the cap, without allocating', () => {
    const text = tree(14);
    expect(text.length).toBeLessThan(1024);
    const heapBefore = process.memoryUsage().heapUsed;
    const t0 = performance.now();
    const r = solveNetlist(text);
    const ms = performance.now() - t0;
    const grown = process.memoryUsage().heapUsed - heapBefore;
    // 2^14 leaves: 2^14 − 1 private nodes m, plus `in`, plus the source's branch current.
    expect(r.errors.map((e) => e.code)).toEqual(['too-large']);
    expect(r.errors[0].message).toContain('16,385 unknowns');
    expect(r.errors[0].message).toContain(`at most ${MAX_UNKNOWNS.toLocaleString('en-US')}`);
    // At the top-level instance whose expansion crossed the cap.
    expect(r.errors[0].line).toBe(text.split('\n').findIndex((l) => l.startsWith('t: ')) + 1);
    expect(r.op).toBeUndefined();
    expect(r.warnings).toEqual([]);
    // Generous guards: the dense matrices of 16k unknowns are 2 GB each; the elaboration
    // itself takes well under a second on an idle machine.
    expect(grown).toBeLessThan(400e6);
    expect(ms).toBeLessThan(30_000);
  }, 60_000);

  it('a deeper tree stops counting at ten times the cap and says "more than"', () => {
    const r = parseNetlist(tree(20));
    expect(r.circuit).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(['too-large']);
    expect(r.diagnostics[0].message).toContain(`more than ${(10 * MAX_UNKNOWNS).toLocaleString('en-US')} unknowns`);
  }, 60_000);

  it('counts as the engine lays out: nodes, branch currents and internal base nodes', () => {
    const text = `model qb: npn(rb=100)
vcc: vsrc(vcc, gnd) 5
l1: ind(vcc, a) 1u
e1: vcvs(o, gnd, a, gnd) 2
q1: npn(c=a, b=o, e=gnd) qb
r1: res(a, gnd) 1k
r2: res(o, gnd) 1k`;
    const c = parseNetlist(text).circuit!;
    const counted = c.nodes.length + c.parts.reduce((sum, p) => sum + partExtraUnknowns(p), 0);
    expect(counted).toBe(buildLayout(c).size);
  });

  it('a flat circuit at the cap elaborates; one unknown more is refused', () => {
    // A ladder of k rungs has k + 1 nodes and the source's branch current: k + 2 unknowns.
    const ladder = (rungs: number) => {
      const lines = ['v0: vsrc(n0, gnd) 1'];
      for (let k = 0; k < rungs; k++) lines.push(`r${k}: res(n${k}, n${k + 1}) 1k`);
      return [...lines, `rl: res(n${rungs}, gnd) 1k`].join('\n');
    };
    expect(parseNetlist(ladder(MAX_UNKNOWNS - 2)).circuit).toBeDefined();
    const over = parseNetlist(ladder(MAX_UNKNOWNS - 1));
    expect(over.circuit).toBeUndefined();
    expect(over.diagnostics.map((d) => [d.code, d.line])).toEqual([['too-large', MAX_UNKNOWNS]]);
  }, 60_000);
});
