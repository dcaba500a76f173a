/**
 * The resistor-loaded bipolar pair the run tests share: ±10 V, 5 kΩ loads, a 4.65 kΩ tail, the
 * ports on the two base sources and the two collectors. Lines 1–11 (the analyze line of a test
 * comes after them).
 */
export const RESISTOR_PAIR = `model qn: npn(is=1e-16, beta=100, va=80)
vcc: vsrc(vcc, gnd) 10
vee: vsrc(vee, gnd) -10
va: vsrc(ina, gnd) 0
vb: vsrc(inb, gnd) 0
q1: npn(c=outa, b=ina, e=tail) qn
q2: npn(c=outb, b=inb, e=tail) qn
rca: res(vcc, outa) 5k
rcb: res(vcc, outb) 5k
rtail: res(tail, vee) 4.65k
ports in=(va, vb) out=(outa, outb)
`;
