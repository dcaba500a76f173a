/**
 * Strainlab demo 2: mirrored tail. A netlist in the Nodewright language, complete in itself
 * (no library blocks), so it opens and solves offline. Its checks pass as written.
 */
import type { Example } from './example';

export const MIRRORED_TAIL: Example = {
  id: 'mirrored-tail',
  label: 'Mirrored tail',
  blurb: 'The tail becomes a current mirror: CMRR climbs by some 30 dB.',
  text: `title  Strainlab front end, step 2: mirrored tail
# The resistor tail let the common mode through. A current-mirror tail has the output
# resistance ro = VA/IC instead of 1.8 kΩ, so the common-mode gain drops and CMRR climbs.

param  rc   = 8k
param  rref = 9.3k                      # (10 V − VBE)/rref ≈ 1 mA reference
param  rg   = 350

model  qn: npn(is=1e-16, beta=120, va=80, cje=2p, cjc=0.6p, tauf=0.25n)

vcc:   vsrc(vcc, gnd) 10 V
va:    vsrc(bra, gnd) 2.5 V ac=1
vb:    vsrc(brb, gnd) 2.5 V
rga:   res(bra, ina) rg
rgb:   res(brb, inb) rg

q1:    npn(c=outa, b=ina, e=tail) qn
q2:    npn(c=outb, b=inb, e=tail) qn
rca:   res(vcc, outa) rc
rcb:   res(vcc, outb) rc

# Tail: a two-transistor mirror fed from rref
rref:  res(vcc, bias) rref
qr:    npn(c=bias, b=bias, e=gnd) qn
qt:    npn(c=tail, b=bias, e=gnd) qn
cla:   cap(outa, gnd) 5p
clb:   cap(outb, gnd) 5p

ports   in=(va, vb) out=(outa, outb)
analyze ac from 10 Hz to 1 GHz per decade 20
analyze vary rg over 120 350 1k         # bridges with other arm resistances: gain and CMRR hold?

measure a0    = db(adm)
measure f3    = corner(adm)
measure itail = ic(qt)
check   itail = 1m ± 10%
check   vce(qt) > 0.5                   # tail transistor stays out of saturation
check   a0 >= 40
check   cmrr_db >= 60
`,
};
