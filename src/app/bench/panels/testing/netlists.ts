/**
 * Netlists the panel specs solve with the real solver (no hand-written results).
 */

/** A resistor-tail BJT pair with a differential output and an ac sweep. */
export const RESISTOR_TAIL_PAIR = `title  Resistor-tail pair
model  qn: npn(is=1e-16, beta=100, va=80, cje=1p, cjc=0.5p, tauf=0.3n)
vcc: vsrc(vcc, gnd) 10 V
vee: vsrc(gnd, vee) 10 V
va: vsrc(ina, gnd) 0 ac=1
vb: vsrc(inb, gnd) 0
rc1: res(vcc, outa) 5k
rc2: res(vcc, outb) 5k
q1: npn(c=outa, b=ina, e=tail) qn
q2: npn(c=outb, b=inb, e=tail) qn
rt: res(tail, vee) 4.65k
ports in=(va, vb) out=(outa, outb)
analyze ac from 10 Hz to 1 GHz per decade 20
measure a0 = db(adm)
measure f3 = corner(adm)
check cmrr_db >= 40
check ic(q1) = 1m ± 5%
`;

/** The same pair with 10 pF loads: |adm| crosses 0 dB inside the sweep. */
export const LOADED_PAIR = RESISTOR_TAIL_PAIR.replace('rt: res', 'cl1: cap(outa, gnd) 10p\ncl2: cap(outb, gnd) 10p\nrt: res')
  + 'measure fu = unity(adm)\n';

/** Devices in every region worth flagging: saturated, cut off, triode, low VCE, and one diode. */
export const HEADROOM_TROUBLE = `title  Headroom trouble
model  qn: npn(is=1e-16, beta=100, va=50)
model  mn: nmos(ucox=200u, vth=0.5, lambda=0.05)
vcc: vsrc(vcc, gnd) 5 V
vbias: vsrc(b1, gnd) 0.75
rc: res(vcc, c1) 20k
q1: npn(c=c1, b=b1, e=gnd) qn
vb2: vsrc(b2, gnd) 0.2
rc2: res(vcc, c2) 1k
q2: npn(c=c2, b=b2, e=gnd) qn
vg: vsrc(g1, gnd) 1.5
rd: res(vcc, d1) 20k
m1: nmos(d=d1, g=g1, s=gnd) mn w=10u l=1u
vg2: vsrc(g2, gnd) 0.3
rd2: res(vcc, d2) 10k
m2: nmos(d=d2, g=g2, s=gnd) mn w=10u l=1u
vg3: vsrc(g3, gnd) 0.9
rd3: res(vcc, d3) 10k
m3: nmos(d=d3, g=g3, s=gnd) mn w=10u l=1u
q3: npn(c=c3, b=b3, e=gnd)
vb3: vsrc(b3, gnd) 0.7
rc3: res(vcc, c3) 1k
d1x: diode(a=vcc, k=dk)
rdk: res(dk, gnd) 10k
measure vmin = min(vce(q1), vce(q2))
measure gm3 = gm(m3)
check vmin > 0.3
check id(m1) <= 100u
`;

/** A MOS pair with a single-ended output, figures at 1 kHz, no ac sweep. */
export const MOS_PAIR_SINGLE = `title  MOS pair, single-ended
model  mn: nmos(ucox=200u, vth=0.5, lambda=0.05, cgs=10f, cgd=2f)
vdd: vsrc(vdd, gnd) 3.3 V
va: vsrc(ga, gnd) 1.2
vb: vsrc(gb, gnd) 1.2
rd1: res(vdd, da) 10k
rd2: res(vdd, db) 10k
m1: nmos(d=da, g=ga, s=s) mn w=20u l=1u
m2: nmos(d=db, g=gb, s=s) mn w=20u l=1u
itail: isrc(s, gnd) 200u
ports in=(va, vb) out=da at 1 kHz
measure gain = mag(adm)
check cmrr_db >= 60
`;

/** A netlist with errors: nothing to show but the first of them. */
export const BROKEN = `title  Broken
vcc: vsrc(vcc, gnd) 10 V
r1: res(vcc, out) 4.7 meg
q1: npx(c=out, b=vcc, e=gnd)
`;

/** Both devices in their regions but short of headroom: VCE ≈ 0.24 V; VDS ≈ 0.44 V with Vov = 0.4 V. */
export const LOW_HEADROOM = `title  Low headroom
vcc: vsrc(vcc, gnd) 5
vb: vsrc(b, gnd) 0.62
rc: res(vcc, c) 1.85M
q1: npn(c=c, b=b, e=gnd)
vg: vsrc(g, gnd) 0.9
rd: res(vcc, d) 57k
m1: nmos(d=d, g=g, s=gnd) w=10u l=1u
`;

/**
 * The resistor-tail pair with its tail as a param, swept over four values (the first, 0 Ω, does
 * not solve) and over three temperatures, with an ac sweep of 5 points a decade.
 */
export const SWEPT_PAIR = RESISTOR_TAIL_PAIR
  .replace('title  Resistor-tail pair', 'title  Swept pair')
  .replace('vcc: vsrc', 'param rt = 4.65k\nvcc: vsrc')
  .replace('rt: res(tail, vee) 4.65k', 'rt: res(tail, vee) rt')
  .replace('per decade 20', 'per decade 5')
  .replace('measure a0', 'analyze vary rt over 0 1k 4.65k 20k\nanalyze temp over -40 27 125\nmeasure a0')
  + 'check a0 >= 40\n';
