/**
 * Netlists the poles specs solve with the real solver (no hand-written results).
 */

/** An RC low-pass of 1 kΩ and 1 nF: one real pole at −1/(2πRC) = −159.155 kHz, no finite zero. */
export const RC_POLE = `title  RC pole
vin: vsrc(in, gnd) 0 ac=1
r1: res(in, out) 1k
c1: cap(out, gnd) 1n
analyze poles out out
`;

/**
 * A series RLC low-pass, R = 100 Ω, L = 1 mH, C = 1 nF: a complex pair with ω0 = 1/√(LC) =
 * 10⁶ rad/s (f0 = 159.155 kHz) and Q = (1/R)·√(L/C) = 10.
 */
export const RLC_PAIR = `title  RLC pair
vin: vsrc(in, gnd) 0 ac=1
r1: res(in, m) 100
l1: ind(m, out) 1m
c1: cap(out, gnd) 1n
analyze poles out out
`;

/**
 * 1 kΩ ∥ 1 nF with a 2 mS transconductor feeding its own node back (a negative conductance of
 * −2 mS): net conductance −1 mS, a pole at s = +1 mS/1 nF = +10⁶ rad/s, +159.155 kHz —
 * in the right half-plane. The operating point (0 V) still solves: the net conductance is not 0.
 */
export const NEGATIVE_CONDUCTANCE = `title  Negative conductance
ib: isrc(gnd, x) 0
r1: res(x, gnd) 1k
c1: cap(x, gnd) 1n
g1: vccs(gnd, x, x, gnd) 2m
analyze poles
`;

/** Two RC sections on their own sources: poles near −10 Hz and −1 GHz, eight decades apart. */
export const FAR_APART = `title  Far apart
va: vsrc(a, gnd) 0 ac=1
r1: res(a, n1) 1k
c1: cap(n1, gnd) 15.9155u
vb: vsrc(b, gnd) 0
r2: res(b, n2) 1k
c2: cap(n2, gnd) 159.155f
analyze poles
`;
