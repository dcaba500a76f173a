/**
 * The seed block files as the team library stores them: each one file with the block, its models
 * and a fixture with measures and checks. Solved on its own (as the reviewer's bench re-solves it)
 * every check passes; its doc comments document every pin and param; `use`d from a netlist only
 * the block comes in. The mirrors' measured ratios are then held against the textbook formulas.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseNetlist, readBlockDocs, solveNetlist, type SolveResult } from '../../solver/index';
import { DiagnosticBag } from '../../solver/circuit/diagnostic';
import { parseFile } from '../../solver/parse/statements';
import { createLibraryResolver, defaultLibraryDir, readManifest, type ManifestEntry } from '../../tools/library-resolver';
import { expectNearlyEqual } from '../../solver/testing/nearly-equal';
import { bjt, mos, thermalVoltage } from './helpers';

const dir = defaultLibraryDir();
const entries = readManifest(dir).blocks as (ManifestEntry & { title?: string })[];
const lookup = createLibraryResolver(dir);
const source = (e: ManifestEntry): string => readFileSync(join(dir, e.file), 'utf8');
const blockName = (e: ManifestEntry): string => e.path.split('/').pop()!;
const rows = entries.map((e) => [`${e.path}@${e.version}`, e] as const);

const solved = new Map<string, SolveResult>();
/** The seed file `key` (path@version) solved on its own, with the CLI's resolver. */
function solveSeed(key: string): SolveResult {
  let r = solved.get(key);
  if (!r) {
    const e = entries.find((x) => `${x.path}@${x.version}` === key);
    if (!e) throw new Error(`${key} is not in the manifest`);
    r = solveNetlist(source(e), { resolveUse: lookup });
    solved.set(key, r);
  }
  return r;
}

const par = (a: number, b: number): number => (a * b) / (a + b);
/** Early factor (1 + VCE(out)/VA)/(1 + VCE(in)/VA) of the library models' VA. */
const early = (vceOut: number, vceIn: number, va = 80): number => (1 + vceOut / va) / (1 + vceIn / va);
/** The library models' βF (every npn model of the seed mirrors). */
const BETA = 100;

describe('seed library: the set', () => {
  it('holds the twelve-plus seed blocks the catalogue promises', () => {
    const keys = entries.map((e) => `${e.path}@${e.version}`);
    expect(keys.length).toBeGreaterThanOrEqual(12);
    for (const k of ['mirrors/simple_npn@1', 'mirrors/helper_npn@1', 'mirrors/wilson_npn@3', 'mirrors/degenerated_npn@1', 'mirrors/cascode_npn@1',
      'mirrors/widlar_npn@1', 'tails/mirror_tail_npn@1', 'pairs/resistor_tail_npn@1', 'pairs/resistor_load_npn@1', 'pairs/mirror_load_npn@1',
      'pairs/cascode_pair_npn@1', 'shifters/emitter_follower_npn@1']) expect(keys).toContain(k);
  });
});

describe.each(rows)('seed file %s', (key, e) => {
  it('solves on its own, with a ratio, a resistance and a headroom check, all passing', () => {
    const r = solveSeed(key);
    expect(r.errors).toEqual([]);
    expect(r.warnings).toEqual([]);
    expect(r.title.length).toBeGreaterThan(10);
    expect(r.checks.length).toBeGreaterThanOrEqual(3);
    for (const c of r.checks) expect(c.pass, `${c.text}: value ${c.value}, limit ${c.limit}`).toBe(true);
    const text = r.checks.map((c) => c.text).join('\n');
    expect(text).toMatch(/^(ratio|gain|shift|design) = /m);
    expect(text).toMatch(/^(rout|zo) [<>]=/m);
    expect(text).toMatch(/^(vce_\w+|sat|headroom) >= /m);
  });

  it('documents every pin and param, and agrees with the manifest', () => {
    const docs = readBlockDocs(source(e));
    expect(docs.map((d) => d.name)).toEqual([blockName(e)]);
    const [doc] = docs;
    expect(doc.problems).toEqual([]);
    expect(doc.pins.length).toBeGreaterThan(0);
    for (const p of [...doc.pins, ...doc.params]) expect(p.doc?.length ?? 0, p.name).toBeGreaterThan(3);
    expect(doc.title).toBe(e.title);
    expect(doc.tags).toEqual(e.tags);
    expect(doc.summary?.length ?? 0).toBeGreaterThan(40);
  });

  it('used from a netlist brings in only the block: no fixture parts, measures or checks', () => {
    const pins = readBlockDocs(source(e))[0].pins.map((p) => p.name);
    const netlist = [
      `use ${e.path}@${e.version}`,
      `x1: ${blockName(e)}(${pins.map((p) => `${p}=n_${p}`).join(', ')})`,
      ...pins.map((p) => `r_${p}: res(n_${p}, gnd) 1k`),
    ].join('\n');
    const used = parseNetlist(netlist, { resolveUse: lookup });
    expect(used.diagnostics).toEqual([]);
    const names = used.circuit!.parts.map((p) => p.name);
    expect(names.filter((n) => !n.startsWith('x1.') && !n.startsWith('r_'))).toEqual([]);
    expect(names.some((n) => n.startsWith('x1.'))).toBe(true);
    expect(used.circuit!.title).toBe('');
    expect(used.requests.measures).toEqual([]);
    expect(used.requests.checks).toEqual([]);
    expect(used.symbols.models).toEqual([]);
    expect(used.symbols.params).toEqual([]);

    // A library file's top-level params are in its blocks' scope when used: a seed block must not
    // lean on its fixture's. Served with them taken out, the block elaborates to the same parts.
    const stripped = (() => {
      const lines = source(e).split('\n');
      for (const p of parseFile(source(e), new DiagnosticBag()).params) lines[p.loc.line - 1] = '';
      return lines.join('\n');
    })();
    const bare = parseNetlist(netlist, { resolveUse: (p, v) => (p === e.path && v === e.version ? stripped : lookup(p, v)) });
    expect(bare.diagnostics).toEqual([]);
    expect(bare.circuit!.parts).toEqual(used.circuit!.parts);
  });
});

describe('mirror ratios against the textbook (library models: β = 100, VA = 80 V)', () => {
  // Gray et al., 5th ed., §4.2.2 (simple bipolar mirror, section from memory): IO/IIN = n·(1 + VCE2/VA)/(1 + VCE1/VA)
  // / (1 + (1 + n)/βF). Exact for this model but for 2/β·VCE1/VA (2·10⁻⁴) in the base currents.
  it('simple npn mirror, ratio 2', () => {
    const r = solveSeed('mirrors/simple_npn@1');
    const qa = bjt(r, 'm1.qa');
    const qb = bjt(r, 'm1.qb');
    expectNearlyEqual(qb.ic / 100e-6, (2 * early(qb.vce, qa.vce)) / (1 + 3 / BETA), 5e-4, 0);
    // Output resistance: ro of qb (same section); min_g adds 1e-12 S.
    expectNearlyEqual(r.measures.rout, qb.ro, 1e-4, 0);
  });

  // Gray et al., 5th ed., §4.2.3 (beta helper, section from memory): IO/IIN = 1/(1 + 2/(βF(βF + 1))),
  // with the Early factor. The error term is 2·10⁻⁴: a tolerance of 5·10⁻⁵ tells it apart.
  it('base-current helper mirror', () => {
    const r = solveSeed('mirrors/helper_npn@1');
    const e = early(bjt(r, 'm1.qb').vce, bjt(r, 'm1.qa').vce);
    expectNearlyEqual(r.measures.ratio, e / (1 + 2 / (BETA * (BETA + 1))), 5e-5, 0);
    expect(Math.abs(r.measures.ratio - e)).toBeGreaterThan(1e-4 * e);
  });

  // Sedra & Smith, Microelectronic Circuits, 7th ed., Wilson mirror (section from memory):
  // IO/IREF = 1 − 2/(β² + 2β + 2); Gray et al., 5th ed., §4.2.6 (from memory): Rout ≈ β·ro/2.
  // The model's IC/IB = β·(1 + VCE/VA) differs per device by more than the error term, so the
  // ratio is held to 5·10⁻⁴ (a simple mirror's 2 % would fail).
  it('Wilson mirror', () => {
    const r = solveSeed('mirrors/wilson_npn@3');
    const e = early(bjt(r, 'm1.qb').vce, bjt(r, 'm1.qa').vce);
    expectNearlyEqual(r.measures.ratio, e * (1 - 2 / (BETA * BETA + 2 * BETA + 2)), 5e-4, 0);
    const qc = bjt(r, 'm1.qc');
    expectNearlyEqual(r.measures.rout, (qc.gm * qc.rpi * qc.ro) / 2, 0.1, 0);
  });

  // Gray et al., 5th ed., §4.2.4 (mirror with emitter degeneration, section from memory): the
  // resistors set the ratio, IO/IREF = 1/(1 + 2/β) for equal areas, and a VBE mismatch (here the
  // Early effect's VT·ln E) moves it only by (E − 1)/(1 + gm·RE). Rout = ro + R'·(1 + gm·ro·rπ/
  // (rπ + Rb)) with R' = RE ‖ (rπ + Rb) and Rb ≈ 1/gm + RE the diode side (≈ ro·(1 + gm·R')).
  it('emitter-degenerated mirror', () => {
    const r = solveSeed('mirrors/degenerated_npn@1');
    const qa = bjt(r, 'm1.qa');
    const qb = bjt(r, 'm1.qb');
    const RE = 2.5e3;
    const textbook = 1 / (1 + 2 / BETA);
    expectNearlyEqual(r.measures.ratio, textbook, 5e-3, 0);
    const e = early(qb.vce, qa.vce);
    expect(e - 1).toBeGreaterThan(0.015); // what an undegenerated mirror would be off by
    expectNearlyEqual(r.measures.ratio / textbook - 1, (e - 1) / (1 + qa.gm * RE), 0.3, 2e-4);
    const rb = 1 / qa.gm + RE;
    const rp = par(RE, qb.rpi + rb);
    expectNearlyEqual(r.measures.rout, qb.ro + rp * (1 + (qb.gm * qb.ro * qb.rpi) / (qb.rpi + rb)), 0.01, 0);
  });

  // Gray et al., 5th ed., §4.2.5 (cascode mirror, section from memory): IO/IIN ≈ 1 − 4/βF, here
  // in the closed form of KCL with equal β, β²/(β² + 4β + 2); qa and qb share VCE, so no Early
  // factor. Rout ≈ β·ro/2 of qd (same section).
  it('cascode mirror', () => {
    const r = solveSeed('mirrors/cascode_npn@1');
    expectNearlyEqual(r.measures.ratio, BETA ** 2 / (BETA ** 2 + 4 * BETA + 2), 1e-3, 0);
    // The first-order form leaves 14/β² (1.4·10⁻³) of the closed form out.
    expectNearlyEqual(r.measures.ratio, 1 - 4 / BETA, 0, 2.5e-3);
    const qd = bjt(r, 'm1.qd');
    expectNearlyEqual(r.measures.rout, (qd.gm * qd.rpi * qd.ro) / 2, 0.1, 0);
  });

  // Sedra & Smith, 7th ed., Widlar current source (section from memory): IO·RE = VT·ln(IREF/IO),
  // base currents neglected (about 1 % each in IREF and IO); Rout ≈ ro·(1 + gm·(RE ‖ rπ)).
  it('Widlar source', () => {
    const r = solveSeed('mirrors/widlar_npn@1');
    const io = r.measures.io;
    expectNearlyEqual(io * 11.9e3, thermalVoltage(27) * Math.log(1e-3 / io), 0.01, 0);
    const qb = bjt(r, 'w1.qb');
    expectNearlyEqual(r.measures.rout, qb.ro * (1 + qb.gm * par(11.9e3, qb.rpi)), 0.01, 0);
  });

  // Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed., §5.1 (basic current mirror):
  // IO/IREF = (W/L)2/(W/L)1 · (1 + λ·VDS2)/(1 + λ·VDS1), exact for the square law; Rout = 1/gds.
  it('simple nmos mirror, ratio 2', () => {
    const r = solveSeed('mirrors/simple_nmos@1');
    const ma = mos(r, 'm1.ma');
    const mb = mos(r, 'm1.mb');
    expectNearlyEqual(r.measures.ratio, (2 * (1 + 0.05 * mb.vds)) / (1 + 0.05 * ma.vds), 1e-6, 0);
    expectNearlyEqual(r.measures.rout, 1 / mb.gds, 1e-4, 0);
  });

  // The mirrored tail: Ohm's law for the reference, then the simple mirror of §4.2.2 above.
  it('mirrored tail', () => {
    const r = solveSeed('tails/mirror_tail_npn@1');
    const qa = bjt(r, 't1.qa');
    const qb = bjt(r, 't1.qb');
    expectNearlyEqual(r.measures.iref, (10 - qa.vbe) / 9.3e3, 1e-6, 0);
    expectNearlyEqual(r.measures.ratio, early(qb.vce, qa.vce) / (1 + 2 / BETA), 5e-4, 0);
    expectNearlyEqual(r.measures.rout, qb.ro, 1e-4, 0);
  });
});

describe('pairs and the follower against the textbook', () => {
  // Sedra & Smith, 7th ed., differential-amplifier chapter (half circuits, from memory):
  // adm = −gm·(RC ‖ ro) with a differential output; a cascode gives −α·gm·RC.
  it('resistor-loaded pairs: adm = −gm·(rc ‖ ro); cascoded: −α·gm·rc and zout ≈ rc', () => {
    for (const [key, rc] of [['pairs/resistor_tail_npn@1', 5e3], ['pairs/resistor_load_npn@1', 10e3]] as const) {
      const r = solveSeed(key);
      const qa = bjt(r, 'p1.qa');
      expectNearlyEqual(r.ports!.adm.re, -qa.gm * par(rc, qa.ro), 1e-4, 0);
    }
    const c = solveSeed('pairs/cascode_pair_npn@1');
    const q = bjt(c, 'p1.qa');
    const qc = bjt(c, 'p1.qca');
    expectNearlyEqual(c.ports!.adm.re, -(qc.ic / qc.ie) * q.gm * 10e3, 5e-3, 0);
    expectNearlyEqual(c.measures.zo, 10e3, 2e-3, 0);
  });

  // Gray et al., 5th ed., §4.3.5 (mirror-loaded pair, section from memory): Gm ≈ gm, Rout =
  // ro2 ‖ ro4, so adm ≈ gm·(ro2 ‖ ro4); the pnp mirror's 2/βp error and the systematic offset
  // between the halves' currents leave a few per cent.
  it('mirror-loaded pair: adm ≈ gm·(ro(qb) ‖ ro(pb)), zout = ro(qb) ‖ ro(pb)', () => {
    const r = solveSeed('pairs/mirror_load_npn@1');
    const qb = bjt(r, 'p1.qb');
    const pb = bjt(r, 'p1.pb');
    expectNearlyEqual(r.ports!.adm.re, qb.gm * par(qb.ro, pb.ro), 0.03, 0);
    expectNearlyEqual(r.measures.zo, par(qb.ro, pb.ro), 0.01, 0);
  });

  // Sedra & Smith, 7th ed., §7.2 (VBE = VT·ln(IC/IS)), with the model's Early factor on IC and
  // IC = IE·β'/(β' + 1), β' = β·(1 + VCE/VA); Rout of a follower on an ideal source: 1/gm ‖ ro.
  it('emitter follower: the shift is one VBE, the output resistance 1/gm', () => {
    const r = solveSeed('shifters/emitter_follower_npn@1');
    const q = bjt(r, 'ef.qf');
    const ic = (1e-3 * q.ic) / q.ie;
    expectNearlyEqual(r.measures.shift, thermalVoltage(27) * Math.log(ic / (1e-16 * (1 + q.vce / 80))), 1e-5, 0);
    expectNearlyEqual(r.measures.zo, par(1 / (q.gm + 1 / q.rpi), q.ro), 0.01, 0);
  });
});
