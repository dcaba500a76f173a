import { describe, expect, it } from 'vitest';
import type { CheckRequest } from '../circuit/analyses';
import { evaluateCheck } from './checks';

const loc = { line: 7, col: 1 };
const req = (op: CheckRequest['op'], tol?: number, tolRelative?: boolean): CheckRequest => ({ text: `x ${op} y`, lhs: 'x', op, rhs: 'y', tol, tolRelative, loc });

describe('checks', () => {
  it('>= passes at and above the limit with the margin in the value units', () => {
    expect(evaluateCheck(req('>='), 85, 80)).toMatchObject({ pass: true, margin: 5, value: 85, limit: 80, line: 7 });
    expect(evaluateCheck(req('>='), 80, 80)).toMatchObject({ pass: true, margin: 0 });
    expect(evaluateCheck(req('>='), 63.8, 80)).toMatchObject({ pass: false });
    expect((evaluateCheck(req('>='), 63.8, 80) as { margin: number }).margin).toBeCloseTo(-16.2, 12);
  });

  it('strict comparisons fail at equality', () => {
    expect(evaluateCheck(req('>'), 80, 80)).toMatchObject({ pass: false, margin: 0 });
    expect(evaluateCheck(req('<'), 80, 80)).toMatchObject({ pass: false });
    expect(evaluateCheck(req('<'), 79, 80)).toMatchObject({ pass: true, margin: 1 });
    expect(evaluateCheck(req('<='), 81, 80)).toMatchObject({ pass: false, margin: -1 });
  });

  it('= with a relative tolerance is a window around the limit', () => {
    // ic(q1) = 2m ± 1%: the window is 1.98 mA … 2.02 mA.
    const inside = evaluateCheck(req('=', 0.01, true), 2.01e-3, 2e-3) as { pass: boolean; margin: number };
    expect(inside.pass).toBe(true);
    expect(inside.margin).toBeCloseTo(1e-5, 15);
    expect(evaluateCheck(req('=', 0.01, true), 2.03e-3, 2e-3)).toMatchObject({ pass: false });
  });

  it('= with an absolute tolerance, and without one (1 ppm)', () => {
    expect(evaluateCheck(req('=', 0.1), 5.05, 5)).toMatchObject({ pass: true });
    expect(evaluateCheck(req('=', 0.1), 5.2, 5)).toMatchObject({ pass: false });
    expect(evaluateCheck(req('='), 5 * (1 + 1e-7), 5)).toMatchObject({ pass: true });
    expect(evaluateCheck(req('='), 5.001, 5)).toMatchObject({ pass: false });
  });

  it('a tolerance widens an inequality', () => {
    expect(evaluateCheck(req('>=', 1), 79.5, 80)).toMatchObject({ pass: true, margin: 0.5 });
  });
});
