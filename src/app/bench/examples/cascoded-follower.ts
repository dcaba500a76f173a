/**
 * Strainlab demo 4: cascoded pair + follower shift. A netlist in the Nodewright language, complete in itself
 * (no library blocks), so it opens and solves offline. Its checks pass as written.
 */
import type { Example } from './example';

export const CASCODED_FOLLOWER: Example = {
  id: 'cascoded-follower',
  label: 'Cascoded pair + follower shift',
  blurb: 'Cascodes for bandwidth, emitter followers to shift the level down one VBE.',
  text: `title  Strainlab front end, step 4: cascoded pair with follower level shift
# Cascodes hold the pair's collectors still (less Miller multiplication of Cμ, more bandwidth);
# emitter followers shift the outputs down one VBE and drive the next stage from a low impedance.

param  rc   = 8k
param  rref = 9.3k
param  rg   = 350

model  qn: npn(is=1e-16, beta=120, va=80, cje=2p, cjc=0.6p, tauf=0.25n)

vcc:   vsrc(vcc, gnd) 10 V
vcb:   vsrc(cb, gnd) 4.5 V              # cascode base bias from the reference divider
va:    vsrc(bra, gnd) 2.5 V ac=1
vb:    vsrc(brb, gnd) 2.5 V
rga:   res(bra, ina) rg
rgb:   res(brb, inb) rg

q1:    npn(c=ea, b=ina, e=tail) qn
q2:    npn(c=eb, b=inb, e=tail) qn
q3:    npn(c=ca, b=cb, e=ea) qn         # cascodes
q4:    npn(c=cb2, b=cb, e=eb) qn
rca:   res(vcc, ca) rc
rcb:   res(vcc, cb2) rc

q5:    npn(c=vcc, b=ca, e=outa) qn      # emitter followers
q6:    npn(c=vcc, b=cb2, e=outb) qn

# Tail and follower sinks share one mirror reference
rref:  res(vcc, bias) rref
qr:    npn(c=bias, b=bias, e=gnd) qn
qt:    npn(c=tail, b=bias, e=gnd) qn
qsa:   npn(c=outa, b=bias, e=gnd) qn area=0.5
qsb:   npn(c=outb, b=bias, e=gnd) qn area=0.5
cla:   cap(outa, gnd) 5p
clb:   cap(outb, gnd) 5p

ports   in=(va, vb) out=(outa, outb)
analyze ac from 10 Hz to 1 GHz per decade 20
analyze vary rc over 6k 8k 10k          # gain against bandwidth and headroom

measure a0    = db(adm)
measure f3    = corner(adm)
measure shift = v(ca) - v(outa)
measure vmin  = min(vce(q1), vce(q3))
check   a0 >= 40
check   cmrr_db >= 60
check   vmin > 0.5                      # pair and cascode both keep headroom
check   shift = 0.7 ± 15%
`,
};
