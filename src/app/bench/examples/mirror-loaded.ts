/**
 * Strainlab demo 3: mirror-loaded pair. A netlist in the Nodewright language, complete in itself
 * (no library blocks), so it opens and solves offline. Its checks pass as written.
 */
import type { Example } from './example';

export const MIRROR_LOADED: Example = {
  id: 'mirror-loaded',
  label: 'Mirror-loaded pair',
  blurb: 'A pnp mirror load and a single-ended output: gain ≈ gm·(ro2 ∥ ro4).',
  text: `title  Strainlab front end, step 3: mirror-loaded pair, single-ended output
# A pnp mirror load turns the differential current into one output, and doubles the gain
# against the single-ended resistor-loaded version: adm ≈ gm·(ro2 ∥ ro4).

param  rref = 9.3k
param  rg   = 350

model  qn: npn(is=1e-16, beta=120, va=80, cje=2p, cjc=0.6p, tauf=0.25n)
model  qp: pnp(is=1e-16, beta=80, va=60, cje=2p, cjc=0.8p, tauf=0.6n)

vcc:   vsrc(vcc, gnd) 10 V
va:    vsrc(bra, gnd) 2.5 V ac=1
vb:    vsrc(brb, gnd) 2.5 V
rga:   res(bra, ina) rg
rgb:   res(brb, inb) rg

q1:    npn(c=mir, b=ina, e=tail) qn
q2:    npn(c=out, b=inb, e=tail) qn
q3:    pnp(c=mir, b=mir, e=vcc) qp      # diode side of the load mirror
q4:    pnp(c=out, b=mir, e=vcc) qp

rref:  res(vcc, bias) rref
qr:    npn(c=bias, b=bias, e=gnd) qn
qt:    npn(c=tail, b=bias, e=gnd) qn
cl:    cap(out, gnd) 2p

ports   in=(va, vb) out=out
analyze ac from 10 Hz to 1 GHz per decade 20
analyze mismatch runs 200 seed 1 beta 5% is 2%   # the Mismatch tab: offset, and how many parts pass the checks

measure a0   = db(adm)
measure f3   = corner(adm)
measure fu   = unity(adm)
measure vout = v(out)
check   a0 >= 55
check   cmrr_db >= 70
check   vce(q4) > 0.3
check   vce(q2) > 0.5
`,
};
