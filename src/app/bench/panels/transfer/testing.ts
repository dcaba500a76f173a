/**
 * Netlists the transfer specs solve with the real solver (no hand-written results).
 */

/**
 * A bipolar pair on an ideal 2 mA tail with 2 kΩ collector loads, va swept ±100 mV with vb at 0:
 * its collector currents split as tanh(va / 2V_T), so its outputs are tanh-shaped.
 */
export function currentTailPair(options: { model?: string; ports?: boolean; step?: string } = {}): string {
  const { model = 'is=1e-16, beta=100, va=80', ports = true, step = '1m' } = options;
  return `title  Current-tail pair
model  qn: npn(${model})
vcc: vsrc(vcc, gnd) 10 V
vee: vsrc(gnd, vee) 10 V
va: vsrc(ina, gnd) 0
vb: vsrc(inb, gnd) 0
rc1: res(vcc, outa) 2k
rc2: res(vcc, outb) 2k
q1: npn(c=outa, b=ina, e=tail) qn
q2: npn(c=outb, b=inb, e=tail) qn
it: isrc(tail, vee) 2m
${ports ? 'ports in=(va, vb) out=(outa, outb)\n' : ''}analyze transfer va from -100m to 100m step ${step}
`;
}
