/**
 * The wording rules of the solver's messages, end to end through solveNetlist. The messages are
 * ours; each rule below is common practice for compiler-style diagnostics, named where it stands.
 */
import { describe, expect, it } from 'vitest';
import { solveNetlist } from './index';
import { expectNearlyEqual } from './testing/nearly-equal';

const RC = 'v1: vsrc(a, gnd) 0 ac=1\nr1: res(a, b) 1k\nc1: cap(b, gnd) 1n\n';
const lines = (text: string) => solveNetlist(text).errors.map((e) => `${e.line}: ${e.message}`);

describe('(a) no follow-on errors', () => {
  // Common practice: an error is reported where it is made; what merely depends on it stays quiet.
  it('a check on a failed measure says nothing more than the measure', () => {
    const r = solveNetlist(RC + 'measure f3 = corner(ac(b))\ncheck f3 > 1k\nmeasure g = 2*f3\ncheck g < 1');
    expect(r.errors.map((e) => e.line)).toEqual([4]);
    expect(r.errors[0].message).toContain('needs an ac sweep');
    expect(r.checks).toEqual([]);
    expect(JSON.stringify(r.errors)).not.toMatch(/unknown name|error of its own/);
  });

  it('a measure refused when read (unknown node) leaves its check silent, not "unknown name"', () => {
    expect(lines(RC + 'measure z = v(nosuch)\ncheck z > 1')).toEqual(['4: Unknown node `nosuch`.']);
  });

  it('a measure with no expression leaves its users silent', () => {
    expect(lines(RC + 'measure z =\ncheck z > 1\nmeasure y = z + 1')).toEqual(['4: The measure `z` has no expression.']);
  });

  it('a sweep with too many points is the one error: the measure does not say that analyze ac is missing', () => {
    // Beyond the parser's limit (100 000 points) …
    const parsed = solveNetlist(RC + 'analyze ac from 1 Hz to 1 GHz per decade 100000\nmeasure f3 = corner(ac(b))\ncheck f3 > 1');
    expect(parsed.errors.map((e) => e.line)).toEqual([4]);
    expect(parsed.errors[0].message).toContain('more than 100000 points');
    // … and beyond the engine's (20 001 points), reported once the circuit is solved.
    const solved = solveNetlist(RC + 'analyze ac from 1 Hz to 1 GHz per decade 5000\nmeasure f3 = corner(ac(b))');
    expect(solved.errors.map((e) => [e.line, e.code])).toEqual([[4, 'bad-ac-sweep']]);
    expect(solved.op).toBeDefined();
  });

  it('a misspelt analysis kind does not make the measures say that analyze ac is missing', () => {
    expect(lines(RC + 'analyze acc from 10 to 1M per decade 5\nmeasure f3 = corner(ac(b))').map((l) => l.slice(0, 2))).toEqual(['4:']);
  });

  it('a broken ports line leaves measures of adm silent', () => {
    const r = solveNetlist(RC + 'v2: vsrc(c, gnd) 0\nr2: res(c, gnd) 1k\nports in=(v1, vx) out=b\nmeasure a0 = db(adm)\ncheck cmrr_db > 1');
    expect(r.errors.map((e) => [e.line, e.code])).toEqual([[6, 'unknown-name']]);
  });

  it('without an ac line at all, the measure still says what is missing', () => {
    expect(lines(RC + 'measure f3 = corner(ac(b))')[0]).toContain('needs an ac sweep');
  });
});

describe('(b) a DC solve that does not converge names what failed to settle', () => {
  // Common practice: name the places to look at. A latch of two cross-coupled npn transistors
  // cannot be solved in three Newton iterations; vcc is held by its source and must not be named.
  const LATCH = 'option max_iter = 3\nvcc: vsrc(vcc, gnd) 5\nr1: res(vcc, a) 10k\nr2: res(vcc, b) 10k\nq1: npn(c=a, b=b, e=gnd)\nq2: npn(c=b, b=a, e=gnd)\n';

  it('names the nodes whose currents do not add up and the devices still moving, and what was tried', () => {
    const [e] = solveNetlist(LATCH).errors;
    expect(e.code).toBe('op-no-convergence');
    expect(e.message).toMatch(/the currents do not add up at (a|b) \([0-9.]+ [µmn]?A left over\) and (a|b) \(/);
    expect(e.message).toMatch(/q1 \(VBE swinging by [0-9.]+ [µm]?V\)/);
    expect(e.message).toMatch(/q2 \(VBE swinging by/);
    expect(e.message).toMatch(/kept moving; tried Newton–Raphson \(3 of 3 iterations\), then gmin stepping .*, then source stepping/);
    expect(e.message).not.toMatch(/\bvcc\b|0\.00 A|residual 0/);
    // It points at the first device still moving.
    expect(e.line).toBe(5);
    expect(e.hint).toContain('q1');
  });
});

describe('(c) long tokens are shortened in messages', () => {
  // Common practice: a message is one readable sentence; a runaway token is cut with an ellipsis.
  const long = 'n' + 'x'.repeat(499);
  const short = long.slice(0, 24) + '…';

  it.each([
    ['an unknown node in a measure', `${RC}measure m = v(${long})`],
    ['an unknown kind', `${RC}r2: ${long}(a, gnd) 1k`],
    ['an unknown statement', `${long}\n${RC}`],
    ['a unit that is no unit', `${RC}r2: res(a, gnd) 1${'k'.repeat(500)}`],
    ['a number too large', `${RC}r2: res(a, gnd) ${'9'.repeat(500)}`],
  ])('%s', (_what, text) => {
    const r = solveNetlist(text);
    const all = [...r.errors, ...r.warnings];
    expect(all.length).toBeGreaterThan(0);
    for (const d of all) {
      expect(d.message.length + (d.hint?.length ?? 0)).toBeLessThan(300);
      expect(d.message).not.toMatch(/[A-Za-z0-9_]{41}/);
    }
    expect(all.some((d) => d.message.includes(text.includes(long) ? short : '…'))).toBe(true);
  });

  it('keeps names of ordinary length whole, hierarchical ones included', () => {
    const name = 'output_stage_bias_current_source';
    expect(lines(`${RC}measure m = v(${name}.tail)`)).toEqual([`4: Unknown node \`${name}.tail\`.`]);
  });
});

describe('(d) one error per mistake', () => {
  // Common practice; the full table of single mistakes is in parse/one-error.test.ts.
  it('an empty pin is reported once', () => {
    expect(lines(RC + 'q1: npn(c=, b=a, e=gnd)')).toEqual(['4: Pin `c=` has no node.']);
  });
});

describe('(e) a bare param stands in every slot that takes an expression', () => {
  // Common practice (and netlist-language.md §1: "anywhere a quantity may stand, an expression
  // over parameters may stand").
  const P = 'param fhi = 1M\nparam flo = 10\nparam n = 5\n' + RC;

  it('as the frequency of zout and zin', () => {
    const byParam = solveNetlist(P + 'measure z = mag(zout(b, fhi))\nmeasure y = mag(zin(v1, fhi))');
    const byNumber = solveNetlist(P + 'measure z = mag(zout(b, 1M))\nmeasure y = mag(zin(v1, 1M))');
    expect(byParam.errors).toEqual([]);
    expect(byParam.measures).toEqual(byNumber.measures);
    // 1 kΩ in parallel with 1 nF at 1 MHz seen from b: |Z| = R/√(1 + (ωRC)²) (Ohm's law for impedances).
    const w = 2 * Math.PI * 1e6;
    expectNearlyEqual(byParam.measures.z, 1e3 / Math.sqrt(1 + (w * 1e3 * 1e-9) ** 2), 1e-9, 0);
  });

  it('as the frequency of zout in the editor syntax `measure z = zout(x, fhi)`, complex at 1 MHz', () => {
    const r = solveNetlist(P + 'measure z = zout(b, fhi)');
    expect(r.errors.map((e) => e.message)).toEqual([expect.stringContaining('is complex')]);
  });

  it('in the analyze, ports and check slots', () => {
    const r = solveNetlist(
      P + 'v2: vsrc(c, gnd) 0\nr2: res(c, gnd) 1k\nports in=(v1, v2) out=b at flo\nanalyze ac from flo to fhi per decade n\n' +
        'analyze transfer v1 from -flo to flo step n\nmeasure g = mag(at(ac(b), fhi))\ncheck g <= 1 ± flo',
    );
    expect(r.errors).toEqual([]);
    // 10 Hz to 1 MHz is five decades at five points each, both ends included (§3 conventions).
    expect(r.ac?.freq_hz.length).toBe(26);
    expect(r.ports?.at_hz).toBe(10);
    expect(r.transfer?.x.length).toBe(5);
    expect(r.checks[0]?.pass).toBe(true);
  });

  it('a name that is neither param nor measure is still refused there', () => {
    expect(lines(P + 'measure z = mag(zout(b, fhii))')).toEqual(['7: Unknown name `fhii`.']);
  });
});
