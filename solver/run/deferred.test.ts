/**
 * The two-stage solve the bench uses (`defer`): the first stage leaves out the analyses that
 * re-solve the circuit many times, and `finish` gives exactly the one-stage result.
 */
import { describe, expect, it } from 'vitest';
import { solveNetlist, solveWithOutline } from '../index';
import { RESISTOR_PAIR } from '../testing/pair-netlist';

const PAIR = `title  Resistor-loaded pair
${RESISTOR_PAIR}measure a0 = db(adm)
check a0 >= 38
`;

describe('the deferred stage of a solve', () => {
  it('runs the deferred stage in steps, one per sweep value and per sensitivity knob, to the very same result', () => {
    const text = `${PAIR}analyze temp over -40 27 85\nanalyze vary rc over 5k 10k\nanalyze sensitivity\n`;
    const staged = solveWithOutline(text, { defer: true });
    const steps = staged.finishSteps!();
    let yields = 0;
    let next = steps.next();
    for (; !next.done; next = steps.next()) yields++;
    // 3 temperatures + 2 values + a step per knob (the resistors' values and the transistors' parameters).
    expect(yields).toBeGreaterThan(3 + 2 + 5);
    expect(JSON.stringify(next.value)).toBe(JSON.stringify(solveNetlist(text)));
    // Steps dropped midway (newer text) leave nothing behind: a fresh run gives the same.
    const dropped = solveWithOutline(text, { defer: true }).finishSteps!();
    dropped.next();
    dropped.next();
    expect(dropped.return(undefined as never).done).toBe(true);
    expect(JSON.stringify(solveWithOutline(text, { defer: true }).finish!())).toBe(JSON.stringify(next.value));
  });

  it('leaves vary, temp and sensitivity to finish(), which then gives exactly the one-stage result', () => {
    const text = `${PAIR}analyze temp over -40 27 85\nanalyze vary rc over 5k 10k\nanalyze sensitivity\nanalyze vary bogus over 1 2\n`;
    const staged = solveWithOutline(text, { defer: true });
    expect(staged.result.op).toBeDefined();
    expect(staged.result.ports).toBeDefined();
    expect(staged.result.temp).toBeUndefined();
    expect(staged.result.vary).toBeUndefined();
    expect(staged.result.sensitivity).toBeUndefined();
    expect(staged.result.checks).toEqual(solveNetlist(text).checks);
    const whole = staged.finish!();
    expect(whole).toEqual(solveNetlist(text));
    expect(JSON.stringify(whole)).toBe(JSON.stringify(solveNetlist(text)));
    expect(whole.temp?.runs).toHaveLength(3);
    expect(whole.sensitivity).toBeDefined();
  });

  it('has nothing to finish when the text asks for none of them, or its circuit does not solve', () => {
    expect(solveWithOutline(PAIR, { defer: true }).finish).toBeUndefined();
    const broken = solveWithOutline(`${PAIR.replace('rca: res', 'rca: rez')}analyze temp over 0 50\n`, { defer: true });
    expect(broken.result.errors.length).toBeGreaterThan(0);
    expect(broken.finish).toBeUndefined();
  });

  it('runs everything at once without defer', () => {
    const text = `${PAIR}analyze temp over 0 50\n`;
    const once = solveWithOutline(text);
    expect(once.finish).toBeUndefined();
    expect(once.result.temp?.runs).toHaveLength(2);
  });
});
