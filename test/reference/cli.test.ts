/**
 * The command line (§5): exit status 0 solved, 1 netlist errors, 2 usage; --json is one object
 * with the §5 members.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const ROOT = resolve(__dirname, '..', '..');
const dir = mkdtempSync(join(tmpdir(), 'nodewright-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function file(name: string, text: string): string {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}

function solve(...args: string[]) {
  const r = spawnSync('npx', ['tsx', 'tools/solve.ts', ...args], { cwd: ROOT, encoding: 'utf8', timeout: 60_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

const PAIR = `title CLI pair
model qn: npn(is=1e-16, beta=100, va=80)
vcc: vsrc(vcc, gnd) 10
vee: vsrc(vee, gnd) -10
va:  vsrc(ina, gnd) 0
vb:  vsrc(inb, gnd) 0
rca: res(vcc, outa) 5k
rcb: res(vcc, outb) 5k
q1:  npn(c=outa, b=ina, e=tail) qn
q2:  npn(c=outb, b=inb, e=tail) qn
rt:  res(tail, vee) 4.65k
ports in=(va, vb) out=(outa, outb)
analyze ac from 1 kHz to 1 MHz per decade 5
measure a0 = db(adm)
check cmrr_db >= 80
`;

describe('command line', { timeout: 120_000 }, () => {
  it('prints a readable report and exits 0 for a solved netlist', () => {
    const r = solve(file('pair.nwl', PAIR));
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/CLI pair/);
    expect(r.stdout).toMatch(/First-order device models/);
    expect(r.stdout).toMatch(/FAIL\s+cmrr_db >= 80/);
    expect(r.stdout).toMatch(/mA/);
    expect(r.stdout).toMatch(/adm = vod\/vid/);
  });

  it('--json prints one object with the §5 members', () => {
    const r = solve(file('pair2.nwl', PAIR), '--json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout);
    for (const k of ['title', 'temp_c', 'op', 'ports', 'ac', 'measures', 'checks', 'warnings', 'errors']) expect(j).toHaveProperty(k);
    expect(j.title).toBe('CLI pair');
    expect(j.temp_c).toBe(27);
    expect(Object.keys(j.op)).toEqual(expect.arrayContaining(['nodes', 'sources', 'parts', 'devices']));
    expect(j.ports.adm).toEqual(expect.objectContaining({ re: expect.any(Number), im: 0, mag: expect.any(Number), db: expect.any(Number), phase_deg: 180 }));
    expect(j.ac.freq_hz).toHaveLength(16);
    expect(Object.keys(j.ac.curves)).toEqual(expect.arrayContaining(['adm', 'acm', 'cmrr', 'ac(outa)', 'ac(tail)']));
    expect(j.checks[0]).toEqual(expect.objectContaining({ text: 'cmrr_db >= 80', pass: false, line: 15 }));
    expect(j.measures.a0).toBeGreaterThan(40);
  });

  it('exits 1 with errors in the JSON for a bad netlist', () => {
    const r = solve(file('bad.nwl', 'r1: res(a, gnd) 1meg\n'), '--json');
    expect(r.status).toBe(1);
    const j = JSON.parse(r.stdout);
    expect(j.errors.length).toBeGreaterThan(0);
    expect(j.errors[0]).toEqual(expect.objectContaining({ line: 1, col: expect.any(Number), message: expect.any(String) }));
    const text = solve(file('bad2.nwl', 'r1: res(a, gnd) 1meg\n'));
    expect(text.status).toBe(1);
    expect(text.stdout).toMatch(/1:\d+/);
  });

  it('exits 2 for usage errors', () => {
    expect(solve().status).toBe(2);
    expect(solve(join(dir, 'missing.nwl')).status).toBe(2);
    expect(solve(file('ok.nwl', PAIR), '--frobnicate').status).toBe(2);
    expect(solve(file('ok2.nwl', PAIR), '--lib').status).toBe(2);
  });

  it('--lib reads blocks from another library folder', () => {
    const lib = join(dir, 'lib');
    mkdirSync(join(lib, 'misc'), { recursive: true });
    writeFileSync(join(lib, 'misc', 'divider@2.nwl'), 'block divider(top, mid, bot)\n  ra: res(top, mid) 1k\n  rb: res(mid, bot) 3k\nend\n');
    writeFileSync(join(lib, 'manifest.json'), JSON.stringify({ blocks: [{ path: 'misc/divider', version: 2, file: 'misc/divider@2.nwl', category: 'misc', tags: [], summary: 'divider' }] }));
    const net = file('div.nwl', 'use misc/divider@2\nv1: vsrc(a, gnd) 4\nd1: divider(top=a, mid=m, bot=gnd)\nmeasure vm = v(m)\n');
    const r = solve(net, '--json', '--lib', lib);
    expect(r.status).toBe(0);
    // min_g (1e-12 S per node) loads the divider by parts in 1e9.
    expect(JSON.parse(r.stdout).measures.vm).toBeCloseTo(3, 6);
    // The same netlist against the seed library: no such block, an error, exit 1.
    expect(solve(net, '--json').status).toBe(1);
  });
});
