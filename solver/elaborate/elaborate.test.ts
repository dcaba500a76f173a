/**
 * Elaboration of blocks and library blocks (netlist-language.md §2, Blocks): flattening with
 * dotted names, pins mapped to outer nodes, gnd global, params overridable, nesting, `use`.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseNetlist } from './parse-netlist';
import type { Bjt, Part } from '../circuit/types';

const MIRROR = `model qn: npn(beta=50)
block mirror2(in, out, rail)
  param ratio = 1
  qa: npn(c=in, b=in, e=rail) qn
  qb: npn(c=out, b=in, e=rail) qn area=ratio
end
`;

function byName(parts: Part[] | undefined): Map<string, Part> {
  return new Map((parts ?? []).map((p) => [p.name, p]));
}

describe('blocks', () => {
  it('flattens an instance with dotted names, mapped pins and overridden params', () => {
    const r = parseNetlist(MIRROR + 'vee: vsrc(vee, gnd) -5\nir: isrc(gnd, ref) 1m\nrl: res(gnd, tail) 1k\nm1: mirror2(in=ref, out=tail, rail=vee) ratio=4');
    expect(r.diagnostics).toEqual([]);
    const parts = byName(r.circuit?.parts);
    expect(parts.get('m1.qa')).toMatchObject({ kind: 'npn', c: 'ref', b: 'ref', e: 'vee', area: 1 });
    expect(parts.get('m1.qb')).toMatchObject({ kind: 'npn', c: 'tail', b: 'ref', e: 'vee', area: 4 });
    expect((parts.get('m1.qb') as Bjt).model.beta).toBe(50);
    expect(r.symbols.blocks).toEqual([{ name: 'mirror2', pins: ['in', 'out', 'rail'], params: ['ratio'] }]);
  });

  it('uses the param default when not overridden, and params may use top-level params', () => {
    const text = 'param k = 3\nblock b1(x)\n  param r = 2*k\n  r1: res(x, mid) r\n  r2: res(mid, gnd) r*1k\nend\nv1: vsrc(a, gnd) 1\nu1: b1(x=a)\nu2: b1(x=a) r=7';
    const r = parseNetlist(text);
    expect(r.diagnostics).toEqual([]);
    const parts = byName(r.circuit?.parts);
    expect(parts.get('u1.r1')).toMatchObject({ a: 'a', b: 'u1.mid', value: 6 });
    expect(parts.get('u1.r2')).toMatchObject({ a: 'u1.mid', b: 'gnd', value: 6000 });
    expect(parts.get('u2.r1')).toMatchObject({ value: 7 });
    expect(r.circuit?.nodes).toEqual(['a', 'u1.mid', 'u2.mid']);
  });

  it('nests blocks, instance inside instance, and blocks defined inside blocks', () => {
    const text = MIRROR + [
      'block pair(a, b, rail)',
      '  param k = 2',
      '  block leg(x, y)',
      '    r: res(x, y) 1k',
      '  end',
      '  x1: mirror2(in=a, out=mid, rail=rail) ratio=k',
      '  x2: mirror2(in=mid, out=b, rail=rail) ratio={k * 2}',
      '  l1: leg(x=mid, y=gnd)',
      'end',
      'vee: vsrc(vee, gnd) -5',
      'i1: isrc(gnd, in) 1m',
      'r9: res(gnd, out) 1k',
      'p1: pair(a=in, b=out, rail=vee) k=3',
    ].join('\n');
    const r = parseNetlist(text);
    expect(r.diagnostics).toEqual([]);
    const parts = byName(r.circuit?.parts);
    expect(parts.get('p1.x1.qb')).toMatchObject({ c: 'p1.mid', b: 'in', e: 'vee', area: 3 });
    expect(parts.get('p1.x2.qb')).toMatchObject({ c: 'out', b: 'p1.mid', area: 6 });
    expect(parts.get('p1.l1.r')).toMatchObject({ a: 'p1.mid', b: 'gnd' });
  });

  it('keeps gnd global inside a block', () => {
    const r = parseNetlist('block b(x)\n  r: res(x, gnd) 1k\nend\nv1: vsrc(a, gnd) 1\nu: b(x=a)');
    expect(byName(r.circuit?.parts).get('u.r')).toMatchObject({ a: 'a', b: 'gnd' });
  });

  it('reports mistakes inside a block that is never used', () => {
    const r = parseNetlist('block b(x)\n  r: res(x, gnd) 1kx\nend\nv1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1');
    expect(r.diagnostics.map((d) => [d.code, d.line])).toEqual([['bad-unit', 2]]);
  });

  it('stops a runaway expansion with an error instead of hanging', () => {
    const lines = ['block b0(x)', '  r: res(x, gnd) 1', 'end'];
    for (let k = 1; k <= 8; k++) {
      lines.push(`block b${k}(x)`);
      for (let j = 0; j < 10; j++) lines.push(`  u${j}: b${k - 1}(x=x)`);
      lines.push('end');
    }
    lines.push('v1: vsrc(a, gnd) 1', 'top: b8(x=a)');
    const r = parseNetlist(lines.join('\n'));
    expect(r.circuit).toBeUndefined();
    expect(r.diagnostics.some((d) => d.code === 'too-large')).toBe(true);
  });

  it('the pin order of a transistor line does not change the circuit (property)', () => {
    const pins = ['c=outa', 'b=ina', 'e=tail'];
    const base = 'vcc: vsrc(vcc, gnd) 10\nva: vsrc(ina, gnd) 1\nrc: res(vcc, outa) 1k\nrt: res(tail, gnd) 1k\n';
    const reference = parseNetlist(base + `q1: npn(${pins.join(', ')}) area=2`).circuit;
    expect(reference).toBeDefined();
    fc.assert(
      fc.property(fc.shuffledSubarray(pins, { minLength: 3, maxLength: 3 }), (order) => {
        const c = parseNetlist(base + `q1: npn(${order.join(', ')}) area=2`).circuit;
        expect(c?.nodes).toEqual(reference?.nodes);
        expect(c?.parts.map((p) => ({ ...p, loc: undefined }))).toEqual(reference?.parts.map((p) => ({ ...p, loc: undefined })));
      }),
    );
  });

  it('the pin order of a MOS line does not change the circuit (property)', () => {
    const pins = ['d=out', 'g=in', 's=gnd', 'b=gnd'];
    const base = 'vdd: vsrc(vdd, gnd) 3\nvin: vsrc(in, gnd) 1\nrd: res(vdd, out) 10k\n';
    const reference = parseNetlist(base + `m1: nmos(${pins.join(', ')}) w=10u`).circuit;
    fc.assert(
      fc.property(fc.shuffledSubarray(pins, { minLength: 4, maxLength: 4 }), (order) => {
        const c = parseNetlist(base + `m1: nmos(${order.join(', ')}) w=10u`).circuit;
        expect(c?.nodes).toEqual(reference?.nodes);
        expect(c?.parts.map((p) => ({ ...p, loc: undefined }))).toEqual(reference?.parts.map((p) => ({ ...p, loc: undefined })));
      }),
    );
  });
});

describe('use', () => {
  const library: Record<string, string> = {
    'mirrors/wilson_npn@3': [
      'model q_wilson: npn(is=1e-16, beta=100, va=80)',
      'block wilson_npn(in, out, rail)',
      '  qa: npn(c=in, b=mid, e=rail) q_wilson',
      '  qb: npn(c=mid, b=mid, e=rail) q_wilson',
      '  qc: npn(c=out, b=in, e=mid) q_wilson',
      'end',
    ].join('\n'),
    'broken/bad@1': 'block bad(x)\n  r: res(x, gnd) 1meg\nend',
    'nested/outer@1': 'use mirrors/wilson_npn@3\nblock outer(a, b)\n  w: wilson_npn(in=a, out=b, rail=gnd)\nend',
  };
  const resolveUse = (path: string, version: number): string | undefined => library[`${path}@${version}`];
  const top = 'vcc: vsrc(vcc, gnd) 10\nir: isrc(vcc, ref) 1m\nrl: res(vcc, out) 1k\n';

  it('brings in a block under its last path segment', () => {
    const r = parseNetlist('use mirrors/wilson_npn@3\n' + top + 'm2: wilson_npn(in=ref, out=out, rail=gnd)', { resolveUse });
    expect(r.diagnostics).toEqual([]);
    const parts = byName(r.circuit?.parts);
    expect(parts.get('m2.qc')).toMatchObject({ c: 'out', b: 'ref', e: 'm2.mid' });
    expect((parts.get('m2.qa') as Bjt).model).toMatchObject({ name: 'q_wilson', va: 80 });
    // the library's models do not leak into the netlist
    expect(r.symbols.models).toEqual([]);
    expect(r.symbols.blocks.map((b) => b.name)).toEqual(['wilson_npn']);
  });

  it('lets a library file use another one', () => {
    const r = parseNetlist('use nested/outer@1\n' + top + 'o: outer(a=ref, b=out)', { resolveUse });
    expect(r.diagnostics).toEqual([]);
    expect(byName(r.circuit?.parts).get('o.w.qc')).toMatchObject({ c: 'out', b: 'ref', e: 'o.w.mid' });
  });

  it('reports an unknown version at the use line, and a resolver that gives a reason', () => {
    const r = parseNetlist('use mirrors/wilson_npn@4', { resolveUse });
    expect(r.diagnostics.map((d) => [d.code, d.line, d.col])).toEqual([['unknown-use', 1, 5]]);
    const why = parseNetlist('use a/b@1', { resolveUse: () => ({ ok: false, message: 'The library has no `a/b`.', hint: 'try x' }) });
    expect(why.diagnostics[0]).toMatchObject({ code: 'unknown-use', message: 'The library has no `a/b`.', hint: 'try x' });
  });

  it('reports a library file\'s own mistakes at the user\'s line', () => {
    const r = parseNetlist('use broken/bad@1\nv1: vsrc(a, gnd) 1\nu: bad(x=a)', { resolveUse });
    expect(r.diagnostics.map((d) => [d.code, d.line, d.message])).toEqual([
      ['meg-prefix', 3, 'In `broken/bad@1` line 2: `meg` is not a prefix.'],
    ]);
  });

  it('survives a resolver that throws', () => {
    const r = parseNetlist('use a/b@1', { resolveUse: () => { throw new Error('boom'); } });
    expect(r.diagnostics.map((d) => d.code)).toEqual(['unknown-use']);
  });
});
