/**
 * Strainlab demo 1: resistor-tail pair. A netlist in the Nodewright language, complete in itself
 * (no library blocks), so it opens and solves offline. Its checks pass as written.
 */
import type { Example } from './example';

export const RESISTOR_TAIL: Example = {
  id: 'resistor-tail',
  label: 'Resistor-tail pair',
  blurb: 'An npn pair with a resistor tail: the baseline, modest CMRR.',
  text: `title  Strainlab front end, step 1: resistor-tail pair
# Strainlab reads a 350 Ω strain-gauge bridge excited from the 5 V reference: the signal is a
# few millivolts riding on 2.5 V of common mode. First try: an npn pair with a resistor tail.

param  rc = 8k                          # collector loads
param  rt = 1.8k                        # tail resistor: (2.5 V − VBE)/rt ≈ 1 mA
param  rg = 350                         # bridge arm resistance seen by each input

model  qn: npn(is=1e-16, beta=120, va=80, cje=2p, cjc=0.6p, tauf=0.25n)

vcc:   vsrc(vcc, gnd) 10 V
va:    vsrc(bra, gnd) 2.5 V ac=1        # bridge half A
vb:    vsrc(brb, gnd) 2.5 V             # bridge half B
rga:   res(bra, ina) rg
rgb:   res(brb, inb) rg

q1:    npn(c=outa, b=ina, e=tail) qn
q2:    npn(c=outb, b=inb, e=tail) qn
rca:   res(vcc, outa) rc
rcb:   res(vcc, outb) rc
rtl:   res(tail, gnd) rt
cla:   cap(outa, gnd) 5p                # ADC driver input, each side
clb:   cap(outb, gnd) 5p

ports   in=(va, vb) out=(outa, outb)
analyze ac from 10 Hz to 1 GHz per decade 20
analyze temp over -40 27 85             # the tail current (2.5 V − VBE)/rt follows VBE: do the checks hold?
analyze noise out outa outb in va from 10 Hz to 10 MHz per decade 10   # next to the bridge's own √(4kT·700 Ω) = 3.4 nV/√Hz

measure a0   = db(adm)
measure f3   = corner(adm)
measure vmin = min(vce(q1), vce(q2))
measure vn   = noise_in(1k)             # input-referred noise density at 1 kHz
check   ic(q1) = 500u ± 10%
check   a0 >= 40
check   vmin > 1
check   vn < 4.5n                       # the amplifier adds little to the bridge's noise
check   cmrr_db >= 30                   # a resistor tail gives only tens of dB
`,
};
