import { describe, expect, it } from 'vitest';
import { solveNetlist } from '../solve';

// A divider with one source: small enough that every problem below is the only one.
const DIVIDER = ['va: vsrc(a, gnd) 1', 'r1: res(a, out) 1k', 'r2: res(out, gnd) 1k'].join('\n');

function codesOf(extra: string): [number, string][] {
  const result = solveNetlist(`${DIVIDER}\n${extra}`);
  return [...result.errors, ...result.warnings].map((d) => [d.line, d.code]);
}

describe('a request is checked once, where it is resolved', () => {
  it('a transfer over a part that is not a source: one error', () => {
    expect(codesOf('analyze transfer r1 from 0 to 1 step 0.1')).toEqual([[4, 'not-a-source']]);
    expect(codesOf('analyze transfer vz from 0 to 1 step 0.1')).toEqual([[4, 'unknown-name']]);
  });

  it('a transfer whose step leads nowhere: one error', () => {
    expect(codesOf('analyze transfer va from 1 to 1 step 0')).toEqual([[4, 'bad-transfer']]);
    expect(codesOf('analyze transfer va from 0 to 0.5m step 1m')).toEqual([[4, 'bad-transfer']]);
    expect(codesOf('analyze transfer va from 0 to 1 step 20u')).toEqual([[4, 'bad-transfer']]);
  });

  it('an ac sweep with too many points: one error, and the measures that need it stay quiet', () => {
    expect(codesOf('analyze ac from 1 Hz to 1 THz per decade 2000\nmeasure f = corner(ac(out))')).toEqual([[4, 'bad-ac-sweep']]);
  });

  it('a second ac or transfer line: one warning, the first runs', () => {
    const result = solveNetlist(`${DIVIDER}\nanalyze transfer va from 0 to 1 step 0.5\nanalyze transfer va from 0 to 2 step 1`);
    expect(result.warnings.map((d) => [d.line, d.code])).toEqual([[5, 'duplicate-analysis']]);
    expect(result.transfer?.x).toEqual([0, 0.5, 1]);
  });
});
