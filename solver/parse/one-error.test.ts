/**
 * One error per mistake (common practice: a compiler that reports one typo as three errors sends
 * the reader after the wrong two). Each netlist below is a valid circuit with exactly one mistake
 * added; the solve must report exactly one error, of the expected code, on the mistaken line.
 * Messages are ours, so the table names no outside source.
 */
import { describe, expect, it } from 'vitest';
import { solveNetlist } from '../index';

/** A valid netlist: a bipolar pair with its supplies, a model of each family and a block. */
const BASE = `param rc = 1k
model qn: npn(is=1e-16, beta=100)
model mn: nmos(ucox=200u, vth=0.5)
block mirror(in, out, rail)
  param ratio = 1
  qa: npn(c=in, b=in, e=rail)
  qb: npn(c=out, b=in, e=rail) area=ratio
end
vcc: vsrc(vcc, gnd) 5
va: vsrc(ina, gnd) 0.7 ac=1
vb: vsrc(inb, gnd) 0.7
ra: res(vcc, outa) rc
rb: res(vcc, outb) rc
q1: npn(c=outa, b=ina, e=gnd) qn
q2: npn(c=outb, b=inb, e=gnd) qn
`;
const BASE_LINES = BASE.split('\n').length - 1;

/** The mistake (appended to BASE), the code of its one error, and its line within the mistake. */
const MISTAKES: [mistake: string, code: string, line: number][] = [
  ["q3: npn(c=, b=ina, e=gnd)", 'missing-value', 1],
  ["r3: res(outa, gnd) 1meg", 'meg-prefix', 1],
  ["r3: res(outa, gnd) 10 pF", 'unit-mismatch', 1],
  ["r3: ress(outa, gnd) 1k", 'unknown-kind', 1],
  ["q3: npn(c=outa, b=ina, x=gnd)", 'unknown-pin', 1],
  ["q3: npn(c=outa, b=ina, e=gnd) qx", 'unknown-model', 1],
  ["r3: res(outa, gnd)", 'missing-value', 1],
  ["ra: res(outa, gnd) 1k", 'duplicate-name', 1],
  ["model qz: npn(iss=1)", 'unknown-param', 1],
  ["param x = y*2", 'unknown-param', 1],
  ["r3: res(outa gnd) 1k", 'syntax', 1],
  ["r3: res(outa, gnd, vcc) 1k", 'pin-count', 1],
  ["v3: vsrc(outa, gnd) 1 ac=", 'missing-value', 1],
  ["measure x = ic(q9)", 'unknown-name', 1],
  ["measure x = foo(q1)", 'unknown-function', 1],
  ["check ic(q1) >", 'missing-value', 1],
  ["analyze ac from 10 to 1 per decade 5", 'syntax', 1],
  ["analyze acc from 10 to 1k per decade 5", 'unknown-analysis', 1],
  ["ports in=(va) out=outa", 'pin-count', 1],
  ["r3: res(outa, gnd) -1k", 'bad-value', 1],
  ["q3: npn(c=outa, b=ina, e=gnd) area=", 'missing-value', 1],
  ["block bb(x)", 'unterminated-block', 1],
  ["end", 'stray-end', 1],
  ["r3 res(outa, gnd) 1k", 'unknown-statement', 1],
  ["q3: npn(c=outa, b=ina, e=gnd, c=outb)", 'duplicate-pin', 1],
  ["r3: res(outa, gnd) 1k 2k", 'syntax', 1],
  ["option tmp = 27", 'unknown-option', 1],
  ["r3: res(outa, gnd) {1k", 'bad-expression', 1],
  ["measure x = v(outa", 'bad-expression', 1],
  ["measure = v(outa)", 'syntax', 1],
  ["r3: res(outa, gnd) rcc", 'unknown-param', 1],
  ["q3: npn(c=outa, b=ina, e=gnd) qp", 'unknown-model', 1],
  ["x1: mirror(in=outa, out=outb)", 'missing-pin', 1],
  ["x1: mirror(in=outa, out=outb, rail=gnd) ratioo=2", 'unknown-param', 1],
  ["check ic(q1) = 1m ± ", 'missing-value', 1],
  ["measure a = 1/0", 'measure-error', 1],
  ["analyze transfer vx from 0 to 1 step 0.1", 'unknown-name', 1],
  ["ports in=(va, vb) out=(outa, outb) at", 'missing-value', 1],
  ["measure a = db(adm)", 'no-ports', 1],
  ["measure a = ic(ra)", 'wrong-kind', 1],
  ["measure a = zout(nowhere)", 'unknown-node', 1],
  ["measure a = v(outa, outb, vcc)", 'bad-expression', 1],
  ["analyze ac from 10 Hz to 1 GHz per decade 0", 'bad-value', 1],
  ["analyze ac from 10 Hz to 1 GHz per decade 1000000", 'syntax', 1],
  ["analyze ac from 10 Hz to 1 GHz per decade 5000", 'bad-ac-sweep', 1],
  ["analyze ac from 10 Hz to 1 GHz per decade 5\nmeasure f = corner(ac(outx))", 'unknown-node', 2],
  ["m3: nmos(d=outa, g=ina, s=gnd) w=1um", 'bad-unit', 1],
  ["r3: res(outa, gnd) 1K", 'bad-unit', 1],
  ["option temp = -300", 'bad-value', 1],
  ["model qn: npn(is=1e-16)", 'duplicate-name', 1],
  ["q3: npn(c=outa, b=ina, e=gnd) qn area=-1", 'bad-value', 1],
  ["q3: npn(c=outa, b=ina) qn", 'missing-pin', 1],
  ["q3: npn(outa, ina, gnd) qn", 'named-pins', 1],
  ["ports in=(va, vq) out=(outa, outb)", 'unknown-name', 1],
  ["ports in=(va, vb) out=(outa, outx)", 'unknown-node', 1],
  ["check foo > 1", 'unknown-name', 1],
  ["measure adm = v(vcc)", 'reserved-name', 1],
  ["v3: vsrc(outa, gnd) 1 ac=1@", 'missing-value', 1],
  ["q3: npn(c=outa, b=ina, e=gnd) qn beta=3", 'unknown-param', 1],
  ["measure a = v(q1)", 'unknown-node', 1],
  ["r3: res(outa, gnd) 1k ac=1", 'unknown-param', 1],
  ["param rc = 2k", 'duplicate-name', 1],
  ["use nope/x@1", 'unknown-use', 1],
  ["x1: mirrorr(in=outa, out=outb, rail=gnd)", 'unknown-kind', 1],
  ["analyze transfer va from 0 to 1 step 0", 'syntax', 1],
  ["measure a = ic(q1)\nmeasure b = a * foo\ncheck b > 1", 'unknown-name', 2],
  ["measure a = ic(q1)) ", 'bad-expression', 1],
  ["measure a = ic(q1, q2)", 'bad-expression', 1],
  ["measure a = ic()", 'bad-expression', 1],
  ["measure a = ic(1k)", 'bad-expression', 1],
  ["measure a = zout(outa, 1k, 2k)", 'bad-expression', 1],
  ["measure a = zin(ra)", 'not-a-source', 1],
  ["measure a = zin(vx)", 'unknown-name', 1],
  ["measure a = zout(gnd)", 'unknown-node', 1],
  ["measure a = gm(ra)", 'wrong-kind', 1],
  ["measure a = i(q1)", 'wrong-kind', 1],
  ["measure a = v(outa) * 2meg", 'meg-prefix', 1],
  ["measure a = at(ac(outa), 1k)", 'measure-error', 1],
  ["analyze ac from 1 to 1M per decade 5\nmeasure a = mag(at(ac(outa), 10M))\ncheck a > 1", 'measure-error', 2],
  ["analyze ac from 1 to 1M per decade 5\nmeasure a = corner(outa)", 'unknown-name', 2],
  ["analyze ac from 1 to 1M per decade 5\nmeasure a = corner(adm)", 'no-ports', 2],
  ["ports in=(va, vb) out=(outa, outb)\nanalyze ac from 1 to 1M per decade 5\nmeasure a = unity(acm)\ncheck a > 1", 'measure-error', 3],
  ["ports in=(va, vx) out=(outa, outb)\nmeasure a = db(adm)\ncheck cmrr_db > 1", 'unknown-name', 1],
  ["ports in=(va, vb) out=(outa, outb) at -1\nmeasure a = db(adm)\ncheck cmrr_db > 1", 'bad-value', 1],
  ["ports in=(va, vb) out=(outa, outx)\nanalyze ac from 1 to 1M per decade 5\nmeasure a = corner(adm)", 'unknown-node', 1],
  ["analyze ac from 1 to 1M per decade\nmeasure a = corner(ac(outa))", 'syntax', 1],
  ["analyze ac from 1 to 1M\nmeasure a = corner(ac(outa))", 'syntax', 1],
  ["analyze ac 1 to 1M per decade 5\nmeasure a = corner(ac(outa))", 'syntax', 1],
  ["analyse ac from 1 to 1M per decade 5\nmeasure a = corner(ac(outa))", 'unknown-statement', 1],
  ["analyze a from 1 to 1M per decade 5\nmeasure a = corner(ac(outa))", 'unknown-analysis', 1],
  ["analyze ac from 1meg to 1G per decade 5\nmeasure a = corner(ac(outa))", 'meg-prefix', 1],
  ["analyze ac from 0 to 1G per decade 5\nmeasure a = corner(ac(outa))", 'bad-value', 1],
  ["analyze ac from 1 Hz to 1 GHz per decade 5000\nmeasure a = corner(ac(outa))", 'bad-ac-sweep', 1],
  ["x1: mirror(in=outa, out=outb, rail=gnd) ratio=1meg", 'meg-prefix', 1],
  ["x1: mirror(in=outa, out=outb, rail=gnd) ratio=", 'missing-value', 1],
  ["x1: mirror(in=outa, out=outb, rail=gnd) 2", 'syntax', 1],
  ["x1: mirror(in=outa, out=outb, rial=gnd)", 'unknown-pin', 1],
  ["x1: mirror(in=outa, out=outb, rail=gnd)\nmeasure a = ic(x1.qc)", 'unknown-name', 2],
  ["x1: mirror(in=outa, out=outb)\nmeasure a = ic(x1.qa)", 'missing-pin', 1],
  ["q3: npn(c=outa, b=ina, e=gnd) qn\nq3: npn(c=outa, b=ina, e=gnd) qn", 'duplicate-name', 2],
  ["q3: npn(c=outa, b=ina, e=gnd) mn", 'model-kind-mismatch', 1],
  ["m1: nmos(d=outa, g=ina, s=gnd) mn w=1u l=0", 'bad-value', 1],
  ["m1: nmos(d=outa, g=ina, s=gnd) mn w=1u l=1u x=2", 'unknown-param', 1],
  ["m1: nmos(d=outa, g=ina) mn", 'missing-pin', 1],
  ["m1: nmos(d=outa, g=ina, s=gnd, b=) mn", 'missing-value', 1],
  ["model qz: npn(is=1meg)\nq3: npn(c=outa, b=ina, e=gnd) qz", 'meg-prefix', 1],
  ["model qz: npn(is=)\nq3: npn(c=outa, b=ina, e=gnd) qz", 'missing-value', 1],
  ["model qz: npn(is=1e-16\nq3: npn(c=outa, b=ina, e=gnd) qz", 'syntax', 1],
  ["model qz: npx(is=1e-16)\nq3: npn(c=outa, b=ina, e=gnd) qz", 'unknown-kind', 1],
  ["model qz npn(is=1e-16)\nq3: npn(c=outa, b=ina, e=gnd) qz", 'syntax', 1],
  ["param x = 1meg\nr3: res(outa, gnd) x\nmeasure a = x*2", 'meg-prefix', 1],
  ["param x = \nr3: res(outa, gnd) x", 'missing-value', 1],
  ["param x = 2*y\nr3: res(outa, gnd) x\ncheck x > 1", 'unknown-param', 1],
  ["r3: res(outa, gnd) 1k\nr3: res(outb, gnd) 1k\nmeasure a = i(r3)", 'duplicate-name', 2],
  ["r3: res(outa, gnd) 1k\nmeasure a = i(r4)\ncheck a > 0", 'unknown-name', 2],
  ["v3: vsrc(x, gnd) 1\nv4: vsrc(x, gnd) 2", 'vsource-loop', 2],
  ["c3: cap(outa, x) 1n\nc4: cap(x, gnd) 1n", 'no-dc-path', 1],
  ["i3: isrc(vcc, x) 1m", 'no-dc-path', 1],
  ["analyze transfer va from 0 to 1 step 1u", 'syntax', 1],
  ["analyze transfer ra from 0 to 1 step 0.1", 'not-a-source', 1],
  ["r3: res(outa, gnd) 1k\noption max_iter = 0.5", 'bad-value', 2],
  ["option temp = abc", 'unknown-param', 1],
  ["check 1 >", 'missing-value', 1],
  ["check > 1", 'missing-value', 1],
  ["check ic(q1) >= 1m ± -5%", 'bad-value', 1],
  ["measure a = ic(q1)\nmeasure a = ic(q2)\ncheck a > 0", 'duplicate-name', 2],
  ["measure ic = ic(q1)", 'reserved-name', 1],
  ["measure a = 1/0\ncheck a > 0", 'measure-error', 1],
  ["measure a = v(outa, outb, vcc)\ncheck a > 0", 'bad-expression', 1],
  ["measure a = fooo(q1)\ncheck a > 0", 'unknown-function', 1],
  ["use lib/x@1\nx1: x(a=outa)\nmeasure z = ic(x1.q)", 'unknown-use', 1],
  ["measure a = adm", 'no-ports', 1],
  ["v3: vsrc(outa, gnd) 1 ac=1@@2", 'bad-expression', 1],
  ["v3: vsrc(outa, gnd) 1 ac=@2", 'missing-value', 1],
  ["r3: res(outa, gnd) 1k\nr3b: res(outa, gnd) r3", 'unknown-param', 2],
  ["r3: res(out a, gnd) 1k", 'syntax', 1],
  ["r3: res(outa, gnd 1k", 'syntax', 1],
  ["r3: res(outa, x) 1k\nr4: res(x, gnd 1k", 'syntax', 2],
  ["r3: res outa, gnd) 1k", 'syntax', 1],
  ["r3: (outa, gnd) 1k", 'syntax', 1],
  ["r3: res(outa, , gnd) 1k", 'syntax', 1],
  ["q3: npn(c=outa b=ina e=gnd) qn", 'syntax', 1],
  ["q3: npn(c=outa, b=ina, e=gnd.x) qn", 'syntax', 1],
];

describe('one error per mistake', () => {
  it('the base netlist itself solves without errors', () => {
    const r = solveNetlist(BASE);
    expect(r.errors).toEqual([]);
    expect(r.op).toBeDefined();
  });

  it.each(MISTAKES)('%j gives exactly one error (%s)', (mistake, code, line) => {
    const r = solveNetlist(BASE + mistake + '\n');
    expect(r.errors.map((e) => `${e.line - BASE_LINES}: ${e.code}: ${e.message}`)).toHaveLength(1);
    expect(r.errors[0].code).toBe(code);
    expect(r.errors[0].line - BASE_LINES).toBe(line);
  });
});
