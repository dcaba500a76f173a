import { solveNetlist } from '../../../solver';
import { compareChecks, comparisonCounts, outcomesOf, valuesAgree, VALUE_RTOL } from './check-compare';
import type { CheckOutcome } from './library-api';

/** A divider fixture: 2 V over two equal resistors gives 1 V at the tap (Ohm's law). */
const DIVIDER = `block divider(top, mid, bot)
  ra: res(top, mid) 10k
  rb: res(mid, bot) 10k
end
vs: vsrc(in, gnd) 2
d1: divider(top=in, mid=out, bot=gnd)
measure vout = v(out)
check vout = 1 ± 0.1%
check vout >= 1.5
`;

describe('valuesAgree', () => {
  it('takes values within 1e-6 of the larger magnitude as the same, and no further', () => {
    expect(VALUE_RTOL).toBe(1e-6);
    expect(valuesAgree(1, 1 + 0.9e-6)).toBe(true);
    expect(valuesAgree(1, 1 + 1.1e-6)).toBe(false);
    expect(valuesAgree(-2e-3, -2e-3 * (1 + 5e-7))).toBe(true);
    expect(valuesAgree(0, 0)).toBe(true);
    expect(valuesAgree(0, 1e-30)).toBe(false);
  });

  it('treats two missing values as the same and one missing as different', () => {
    expect(valuesAgree(null, undefined)).toBe(true);
    expect(valuesAgree(null, Number.NaN)).toBe(true);
    expect(valuesAgree(null, 1)).toBe(false);
    expect(valuesAgree(1, Number.POSITIVE_INFINITY)).toBe(false);
  });
});

describe('compareChecks', () => {
  const here: CheckOutcome[] = [
    { line: 8, text: 'vout = 1 ± 0.1%', pass: true, value: 0.999999995 },
    { line: 9, text: 'vout >= 1.5', pass: false, value: 0.999999995 },
  ];

  it('finds the author’s checks and the re-solved ones the same when verdicts and values agree', () => {
    const author = here.map((c) => ({ ...c, value: c.value! * (1 + 2e-7) }));
    const rows = compareChecks(author, here);
    expect(rows.map((r) => r.same)).toEqual([true, true]);
    expect(rows.every((r) => r.reason === undefined)).toBe(true);
    expect(comparisonCounts(rows)).toEqual({ same: 2, mismatched: 0, failingHere: 1 });
  });

  it('flags a verdict that differs, even with the same value', () => {
    const author = [{ ...here[0] }, { ...here[1], pass: true }];
    const [, row] = compareChecks(author, here);
    expect(row.same).toBe(false);
    expect(row.reason).toBe('It fails here but passed for the author.');
  });

  it('flags a value beyond the tolerance, saying both values', () => {
    const author = [{ ...here[0], value: 1.2 }, here[1]];
    const [row] = compareChecks(author, here);
    expect(row.same).toBe(false);
    expect(row.reason).toContain('0.999999995 here, 1.2 for the author');
  });

  it('flags checks present on one side only, and sorts by line', () => {
    const author = [{ line: 3, text: 'ic(q1) >= 1m', pass: true, value: 2e-3 }, here[0]];
    const rows = compareChecks(author, here);
    expect(rows.map((r) => [r.line, r.same])).toEqual([[3, false], [8, true], [9, false]]);
    expect(rows[0].reason).toBe('This solve has no check on this line.');
    expect(rows[2].reason).toBe('The author’s checks have none on this line.');
  });

  it('flags a different check text on the same line', () => {
    const [row] = compareChecks([{ ...here[0], text: 'vout = 2 ± 1%' }], [here[0]]);
    expect(row.same).toBe(false);
    expect(row.reason).toContain('reads differently here');
  });

  it('compares the real solver’s checks with what an author’s browser sent for the same source', () => {
    const result = solveNetlist(DIVIDER);
    expect(result.errors).toEqual([]);
    const solved = outcomesOf(result.checks);
    // 2 V across two equal 10 kΩ resistors: 1 V at the tap (Ohm's law; from memory).
    expect(solved.map((c) => [c.line, c.pass])).toEqual([[8, true], [9, false]]);
    expect(Math.abs(solved[0].value! - 1)).toBeLessThan(1e-6);
    const sent = JSON.parse(JSON.stringify(solved)) as CheckOutcome[];
    expect(compareChecks(sent, outcomesOf(solveNetlist(DIVIDER).checks)).every((r) => r.same)).toBe(true);
  });

  it('sends a value that is not a finite number as null', () => {
    expect(outcomesOf([{ line: 1, text: 'x > 0', pass: false, value: Number.NaN, limit: 0, margin: Number.NaN }])[0].value).toBeNull();
  });
});
