/** Netlists shared by the parser tests. */

/** The example of the parser's brief: netlist-language.md §2–§3 in one file. */
export const EXAMPLE = `title  Resistor-tail pair, 4 mA tail
param  rc = 1.2k
param  rt = 2.5k
model  qn: npn(is=1e-16, beta=100, va=80, cje=1p, cjc=0.5p, tauf=0.3n)
vcc: vsrc(vcc, gnd) 10 V
vee: vsrc(gnd, vee) 10 V
va: vsrc(ina, gnd) 0 ac=1
vb: vsrc(inb, gnd) 0
rc1: res(vcc, outa) rc
rc2: res(vcc, outb) rc
q1: npn(c=outa, b=ina, e=tail) qn
q2: npn(b=inb, c=outb, e=tail) qn
rt: res(tail, vee) {rt * 1}
ports in=(va, vb) out=(outa, outb)
analyze ac from 10 Hz to 1 GHz per decade 20
measure a0 = db(adm)
measure vmin = min(vce(q1), vce(q2))
check cmrr_db >= 40
check ic(q1) = 2m ± 5%
`;
