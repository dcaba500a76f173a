/**
 * Topology checks (netlist-language.md §4): what conducts at DC and what forms a source loop.
 * Which elements conduct at DC is circuit-theory common practice (capacitor open, inductor short,
 * ideal current source open, MOS gate insulated).
 */
import { describe, expect, it } from 'vitest';
import { parseNetlist } from '../elaborate/parse-netlist';

function codes(text: string): string[] {
  return parseNetlist(text).diagnostics.map((d) => d.code);
}

describe('checkTopology', () => {
  it('accepts a pair on a current-source tail: emitters give the tail its DC path', () => {
    const text = 'vcc: vsrc(vcc, gnd) 10\nvee: vsrc(vee, gnd) -10\nva: vsrc(a, gnd) 0\nvb: vsrc(b, gnd) 0\nr1: res(vcc, oa) 1k\nr2: res(vcc, ob) 1k\nq1: npn(c=oa, b=a, e=t)\nq2: npn(c=ob, b=b, e=t)\nit: isrc(t, vee) 1m';
    expect(codes(text)).toEqual([]);
  });

  it('counts inductors, vcvs outputs, diodes and MOS channels as DC paths', () => {
    expect(codes('v1: vsrc(a, gnd) 1\nl1: ind(a, b) 1u\nr1: res(b, gnd) 1k')).toEqual([]);
    expect(codes('v1: vsrc(a, gnd) 1\nr0: res(a, gnd) 1k\ne1: vcvs(o, gnd, a, gnd) 2\nr1: res(o, x) 1k\nd1: diode(a=x, k=gnd)')).toEqual([]);
    expect(codes('vdd: vsrc(vdd, gnd) 3\nm1: nmos(d=vdd, g=vdd, s=src)\nr1: res(src, gnd) 1k')).toEqual([]);
  });

  it('does not count vcvs/vccs inputs or vccs outputs as DC paths', () => {
    expect(codes('v1: vsrc(a, gnd) 1\nr0: res(a, gnd) 1k\ng1: vccs(o, gnd, a, gnd) 1m\nc1: cap(o, gnd) 1p')).toEqual(['no-dc-path']);
    expect(codes('v1: vsrc(a, gnd) 1\nr0: res(a, gnd) 1k\ne1: vcvs(o, gnd, x, gnd) 2\nr1: res(o, gnd) 1k\nc1: cap(x, a) 1p')).toEqual(['no-dc-path']);
  });

  it('finds a loop through a vcvs output', () => {
    expect(codes('v1: vsrc(a, gnd) 1\ne1: vcvs(a, gnd, a, gnd) 2')).toEqual(['vsource-loop']);
  });

  it('does not report a floating node again when its part already failed', () => {
    expect(codes('v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nx1: rez(a, b) 1k')).toEqual(['unknown-kind']);
  });

  it('does not count an implicit MOS bulk as a second connection', () => {
    const text = 'vdd: vsrc(vdd, gnd) 3\nrd: res(vdd, d) 1k\nm1: nmos(d=d, g=vdd, s=s)';
    expect(parseNetlist(text).diagnostics.map((d) => [d.code, d.message])).toEqual([
      ['single-connection', 'The node `s` has only one connection (`m1`).'],
    ]);
  });
});
