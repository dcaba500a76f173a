/**
 * Netlists the noise specs solve with the real solver (no hand-written results).
 */

/**
 * An RC low-pass of 1 kΩ and 1 nF driven by vin, its noise swept wide enough (10 Hz … 1 THz,
 * 20 a decade) for the rms to reach √(kT/C), with the measures the panel must agree with.
 */
export const RC_LOWPASS = `title  RC low-pass
vin: vsrc(in, gnd) 0 ac=1
r1: res(in, out) 1k
c1: cap(out, gnd) 1n
analyze noise out out in vin from 10 Hz to 1 THz per decade 20
measure vn = noise_out_rms()
measure vi = noise_in_rms()
measure vn1k = noise_out(1k)
`;

/**
 * Twelve resistors all seen from one node: rs from the driven input (an ac ground) and eleven
 * to ground, with 1 nF across. Each one's noise current 4kT/R meets the same impedance, so its
 * share of the output noise is its conductance's share of the total, G/ΣG, at every frequency.
 */
export const TWELVE_RESISTORS = `title  Twelve resistors
vin: vsrc(in, gnd) 0 ac=1
rs: res(in, out) 1k
${Array.from({ length: 11 }, (_, k) => `r${k + 2}: res(out, gnd) ${k + 2}k`).join('\n')}
c1: cap(out, gnd) 1n
analyze noise out out in vin from 100 Hz to 100 MHz per decade 10
measure vn = noise_out_rms()
measure vi = noise_in_rms()
`;

/** A current-source input: 10 kΩ ∥ 10 pF driven by iin, so the input-referred density is in A/√Hz. */
export const CURRENT_INPUT = `title  Current input
iin: isrc(gnd, out) 0 ac=1
r1: res(out, gnd) 10k
c1: cap(out, gnd) 10p
analyze noise out out in iin from 1 kHz to 100 MHz per decade 10
measure ni = noise_in_rms()
`;

/** An input that never reaches the output: the input-referred noise is undefined everywhere. */
export const INPUT_APART = `title  Input apart
vin: vsrc(a, gnd) 0 ac=1
ra: res(a, gnd) 1k
r1: res(out, gnd) 1k
c1: cap(out, gnd) 1n
analyze noise out out in vin from 10 Hz to 10 MHz per decade 10
`;

/**
 * A MOS stage whose channel noise has a 100 kHz flicker corner, behind 10 kΩ and 1 pF: a 1/f
 * part beside a white one, so the parts' shapes differ over the band.
 */
export const FLICKER_STAGE = `title  Flicker stage
model mn: nmos(ucox=200u, vth=0.5, lambda=0.05, cgs=10f, cgd=2f, flicker_corner=100k)
vdd: vsrc(vdd, gnd) 3.3
vg: vsrc(g, gnd) 1 ac=1
rd: res(vdd, d) 10k
m1: nmos(d=d, g=g, s=gnd) mn w=10u l=1u
cl: cap(d, gnd) 1p
analyze noise out d in vg from 10 Hz to 1 GHz per decade 10
measure vn = noise_out_rms()
`;
