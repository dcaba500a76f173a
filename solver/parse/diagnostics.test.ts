/**
 * One test per diagnostic kind of netlist-language.md §4 (and the syntax ones of §1–§3), each
 * asserting line, column and message text.
 */
import { describe, expect, it } from 'vitest';
import type { Diagnostic } from '../circuit/diagnostic';
import { parseNetlist } from '../elaborate/parse-netlist';

const SRC = 'v1: vsrc(a, gnd) 1\n';

/** The only diagnostic with `code` (fails when there is none or more than one). */
function only(text: string, code: string): Diagnostic {
  const found = parseNetlist(text, { resolveUse: () => undefined }).diagnostics.filter((d) => d.code === code);
  expect(found, `diagnostics with code ${code}`).toHaveLength(1);
  return found[0];
}

function expectAt(d: Diagnostic, line: number, col: number, message: string, hint?: string): void {
  expect({ line: d.line, col: d.col, message: d.message }).toEqual({ line, col, message });
  if (hint !== undefined) expect(d.hint).toBe(hint);
}

describe('diagnostics (§4)', () => {
  it('unknown kind, with the closest kind', () => {
    const d = only(SRC + 'r1: resx(a, gnd) 1k', 'unknown-kind');
    expectAt(d, 2, 5, 'Unknown part kind or block `resx`.', 'did you mean `res`?');
    expect(d.severity).toBe('error');
  });

  it('unknown model kind', () => {
    expectAt(only('model qx: npm(beta=50)', 'unknown-kind'), 1, 11, 'Unknown model kind `npm`.', 'did you mean `npn`?');
  });

  it('unknown block, with the closest block', () => {
    const text = 'block mirror2(x)\n  r: res(x, gnd) 1k\nend\n' + SRC + 'u1: mirror3(x=a)';
    expectAt(only(text, 'unknown-kind'), 5, 5, 'Unknown part kind or block `mirror3`.', 'did you mean `mirror2`?');
  });

  it('unknown pin', () => {
    expectAt(only(SRC + 'q1: npn(c=a, b=a, x=gnd, e=gnd)', 'unknown-pin'), 2, 19, '`npn` has no pin `x`.', 'did you mean `c`?');
  });

  it('missing pin', () => {
    expectAt(only(SRC + 'q1: npn(c=a, b=a)', 'missing-pin'), 2, 8, '`q1` has no connection for its pin `e`.', 'add e=NODE');
  });

  it('pin connected twice', () => {
    expectAt(only(SRC + 'q1: npn(c=a, b=a, c=gnd, e=gnd)', 'duplicate-pin'), 2, 19, 'The pin `c` of `q1` is connected twice.');
  });

  it('positional pins on a transistor', () => {
    expectAt(only(SRC + 'q1: npn(a, a, gnd)', 'named-pins'), 2, 9, 'The pins of an `npn` are named: write (c=…, b=…, e=…).');
  });

  it('wrong pin count', () => {
    expectAt(only(SRC + 'r1: res(a, gnd, a) 1k', 'pin-count'), 2, 8, '`res` takes 2 connections (a, b); 3 given.');
  });

  it('unknown model, with the closest model', () => {
    const text = 'model qn: npn(beta=50)\n' + SRC + 'q1: npn(c=a, b=a, e=gnd) qm';
    expectAt(only(text, 'unknown-model'), 3, 26, 'Unknown model `qm`.', 'did you mean `qn`?');
  });

  it('a model of the wrong kind', () => {
    const text = 'model qn: npn(beta=50)\n' + SRC + 'q1: pnp(c=gnd, b=a, e=a) qn';
    expectAt(only(text, 'model-kind-mismatch'), 3, 26, '`qn` is an npn model but `q1` is a pnp.', 'use a pnp model');
  });

  it('unknown model parameter', () => {
    expectAt(only('model qn: npn(betta=50)', 'unknown-param'), 1, 15, 'An npn model has no parameter `betta`.', 'did you mean `beta`?');
  });

  it('unknown part parameter', () => {
    expectAt(only(SRC + 'q1: npn(c=a, b=a, e=gnd) aera=2', 'unknown-param'), 2, 26, 'An `npn` has no parameter `aera`.', 'did you mean `area`?');
  });

  it('unknown parameter in an expression', () => {
    expectAt(only('param rc = 1k\n' + SRC + 'r1: res(a, gnd) 2*rcc', 'unknown-param'), 3, 19, 'Unknown parameter `rcc`.', 'did you mean `rc`?');
  });

  it('unknown block parameter at an instance', () => {
    const text = 'block b2(x)\n  param ratio = 1\n  r: res(x, gnd) 1k*ratio\nend\n' + SRC + 'u1: b2(x=a) ration=2';
    expectAt(only(text, 'unknown-param'), 6, 13, 'The block `b2` has no parameter `ration`.', 'did you mean `ratio`?');
  });

  it('unknown option', () => {
    expectAt(only('option tmp = 50', 'unknown-option'), 1, 8, 'Unknown option `tmp`.', 'did you mean `temp`?');
  });

  it('duplicate name', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) 1k\nr1: res(a, gnd) 2k', 'duplicate-name'), 3, 1, 'The name `r1` is already used by another part.');
  });

  it('missing value', () => {
    expectAt(only(SRC + 'r1: res(a, gnd)', 'missing-value'), 2, 8, '`r1` has no resistance.');
  });

  it('missing value after key=', () => {
    expectAt(only(SRC + 'q1: npn(c=a, b=a, e=gnd) area=', 'missing-value'), 2, 30, '`area=` has no value.');
  });

  it('a unit that does not fit, naming the slot and the expected unit', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) 10 pF', 'unit-mismatch'), 2, 21, '`F` does not fit the resistance of `r1`: expected Ω.');
  });

  it('meg, with the hint "write M for mega"', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) 1meg', 'meg-prefix'), 2, 18, '`meg` is not a prefix.', 'write M for mega');
  });

  it('a suffix that is neither prefix nor unit', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) 1kx', 'bad-unit'), 2, 18, '`kx` is neither an SI prefix nor a unit.');
  });

  it('a value out of range', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) -1k', 'bad-value'), 2, 17, 'The resistance of `r1` must be greater than zero; it is -1000.');
  });

  it('redefinition of gnd', () => {
    expectAt(only('param gnd = 1', 'gnd-redefined'), 1, 7, '`gnd` is the reference node and cannot be redefined.');
    expectAt(only('gnd: res(a, b) 1', 'gnd-redefined'), 1, 1, '`gnd` is the reference node and cannot name a part.');
  });

  it('unknown node in ports', () => {
    const text = 'va: vsrc(a, gnd) 0\nvb: vsrc(b, gnd) 0\nr1: res(a, b) 1k\nports in=(va, vb) out=outx';
    expectAt(only(text, 'unknown-node'), 4, 23, 'Unknown node `outx`.');
  });

  it('a ports input that is not a source', () => {
    const text = 'va: vsrc(a, gnd) 0\nvb: vsrc(b, gnd) 0\nr1: res(a, b) 1k\nports in=(r1, vb) out=a';
    expectAt(only(text, 'not-a-source'), 4, 11, '`r1` is a res, not an independent source: `ports in=` needs a vsrc or isrc.');
  });

  it('a node with a single connection is a warning', () => {
    const d = only(SRC + 'r1: res(a, gnd) 1k\nr2: res(a, x) 1k', 'single-connection');
    expectAt(d, 3, 1, 'The node `x` has only one connection (`r2`).');
    expect(d.severity).toBe('warning');
  });

  it('no DC path to ground: a node held by capacitors only', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) 1k\nc1: cap(a, x) 1p\nc2: cap(x, gnd) 1p', 'no-dc-path'), 3, 1, 'The node `x` has no DC path to ground.');
  });

  it('no DC path to ground: a MOS gate is not a DC path', () => {
    const text = 'vdd: vsrc(vdd, gnd) 5\nrd: res(vdd, d) 10k\nm1: nmos(d=d, g=g, s=gnd)\ncg: cap(g, gnd) 1p';
    expectAt(only(text, 'no-dc-path'), 3, 1, 'The node `g` has no DC path to ground.');
  });

  it('no DC path: the error names every node of the floating group', () => {
    const text = SRC + 'r1: res(a, gnd) 1k\ni1: isrc(a, x) 1m\nr2: res(x, y) 1k\nc1: cap(y, gnd) 1p';
    expectAt(only(text, 'no-dc-path'), 3, 1, 'The nodes `x`, `y` have no DC path to ground.');
  });

  it('a loop of voltage sources and inductors, naming the parts', () => {
    const text = 'v1: vsrc(a, gnd) 1\nv2: vsrc(a, b) 1\nl1: ind(b, gnd) 1u\nr1: res(a, gnd) 1k';
    expectAt(only(text, 'vsource-loop'), 3, 1, 'The voltage sources and inductors `v2`, `v1`, `l1` form a loop.');
  });

  it('a voltage source shorted on itself', () => {
    expectAt(only('v1: vsrc(a, a) 1\nr1: res(a, gnd) 1k', 'vsource-loop'), 1, 1, '`v1` is shorted: both of its ends are on the node `a`.');
  });

  it('a block that contains itself', () => {
    const text = 'block a1(x)\n  u: b1(y=x)\nend\nblock b1(y)\n  w: a1(x=y)\nend\n' + SRC + 'top: a1(x=a)';
    expectAt(only(text, 'recursive-block'), 5, 6, 'The block `a1` contains itself (a1 → b1 → a1).');
  });

  it('an unknown library block', () => {
    expectAt(only('use lib/thing@2', 'unknown-use'), 1, 5, 'The block library has no `lib/thing@2`.');
  });

  it('a block without end, and an end without block', () => {
    expectAt(only('block b(x)\n r: res(x, gnd) 1', 'unterminated-block'), 1, 7, 'The block `b` has no `end`.');
    expectAt(only('end', 'stray-end'), 1, 1, '`end` without a `block` to close.');
  });

  it('an unknown statement, with the closest keyword', () => {
    expectAt(only('parm x = 1', 'unknown-statement'), 1, 1, '`parm` does not start a statement.', 'did you mean `param`?');
    expect(only('R1 a b 1k', 'unknown-statement').line).toBe(1);
  });

  it('a statement that does not belong inside a block', () => {
    expectAt(only('block b(x)\n analyze poles\nend', 'not-in-block'), 2, 2, '`analyze` is not allowed inside a block.');
  });

  it('an unknown analysis', () => {
    expectAt(only('analyze acc from 1 to 10 per decade 2', 'unknown-analysis'), 1, 9, 'Unknown analysis `acc`.', 'did you mean `ac`?');
  });

  it('a measure that shadows a built-in, and a measure defined twice', () => {
    expectAt(only('measure adm = 1', 'reserved-name'), 1, 9, '`adm` is a built-in name and cannot name a measure.');
    expectAt(only('measure x = 1\nmeasure x = 2', 'duplicate-name'), 2, 9, 'The measure `x` is defined twice.');
  });

  it('unknown names in measures: node, part, function', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) 1k\nmeasure z = v(aa)', 'unknown-node'), 3, 15, 'Unknown node `aa`.', 'did you mean `a`?');
    expectAt(only(SRC + 'r1: res(a, gnd) 1k\nmeasure z = ic(q9)', 'unknown-name'), 3, 16, 'Unknown part `q9`.');
    expectAt(only(SRC + 'r1: res(a, gnd) 1k\nmeasure z = dbb(v(a))', 'unknown-function'), 3, 13, 'Unknown function `dbb`.', 'did you mean `db`?');
  });

  it('a device function on the wrong kind of part', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) 1k\nmeasure z = ic(r1)', 'wrong-kind'), 3, 16, '`ic` needs a bipolar transistor; `r1` is a res.');
  });

  it('a ports figure without a ports line', () => {
    expectAt(only(SRC + 'r1: res(a, gnd) 1k\ncheck cmrr_db >= 40', 'no-ports'), 3, 7, '`cmrr_db` needs a `ports` line.');
  });

  it('a malformed analyze line', () => {
    expectAt(only('analyze ac from 1 GHz to 10 Hz per decade 10', 'syntax'), 1, 26, 'The stop frequency must be above the start frequency.');
  });

  it('points at the right physical line and column on continued lines', () => {
    const text = SRC + 'r1: res(a, \\\n   gnd) \\\n  10 pF  # comment';
    expectAt(only(text, 'unit-mismatch'), 4, 7, '`F` does not fit the resistance of `r1`: expected Ω.');
  });

  it('reports all problems at once, sorted by line and column', () => {
    const r = parseNetlist('r1: res(a, gnd) 1meg\nq1: npx(c=a, b=a, e=gnd)\noption tmp = 1');
    expect(r.diagnostics.map((d) => d.code)).toEqual(['meg-prefix', 'unknown-kind', 'unknown-option']);
    expect(r.circuit).toBeUndefined();
  });
});
