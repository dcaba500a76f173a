import { TestBed } from '@angular/core/testing';
import { solveNetlist, type BjtOp, type SolveResult } from '../../../../solver';
import { solveReply } from '../solve-reply';
import { SOLVER_WORKER_FACTORY, SolverClient } from '../solver-client';
import type { SolveReply } from '../solver-protocol';
import { BiasPanel } from './bias-panel';
import { formatSi } from './si-format';
import { BROKEN, HEADROOM_TROUBLE, LOW_HEADROOM, RESISTOR_TAIL_PAIR } from './testing/netlists';

async function render(result: SolveResult | undefined) {
  const fixture = TestBed.createComponent(BiasPanel);
  fixture.componentRef.setInput('result', result);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement };
}

function table(el: HTMLElement, label: string): HTMLTableElement {
  const t = el.querySelector(`table[aria-label="${label}"]`);
  if (!t) throw new Error(`no table ${label}`);
  return t as HTMLTableElement;
}

/** Cell texts of a table's body rows, keyed by header text. */
function rows(t: HTMLTableElement): Array<Record<string, string>> {
  const headers = [...t.querySelectorAll('th')].map((h) => h.textContent!.trim());
  return [...t.querySelectorAll('tbody tr')].map((tr) =>
    Object.fromEntries([...tr.querySelectorAll('td')].map((td, k) => [headers[k], td.textContent!.replace(/\s+/g, ' ').trim()])));
}

// Boltzmann constant and elementary charge: CODATA 2018 exact values.
const VT_27C = (1.380649e-23 * 300.15) / 1.602176634e-19;

describe('BiasPanel', () => {
  it('shows the pair\'s transistors with SI-prefixed currents, voltages and hybrid-pi values', async () => {
    const result = solveNetlist(RESISTOR_TAIL_PAIR);
    const { el } = await render(result);
    const q1 = result.op!.devices['q1'] as BjtOp;
    const [r1] = rows(table(el, 'Bipolar transistors'));
    expect(r1['Name']).toBe('q1');
    expect(r1['Kind']).toBe('npn');
    expect(r1['Region']).toBe('active');
    expect(r1['IC']).toBe(`${(q1.ic * 1e6).toPrecision(3)} µA`);
    // gm = IC/VT: Sedra & Smith, Microelectronic Circuits, 7th ed., eq. 6.37 (from memory);
    // the Early factor multiplies IC and so leaves gm = IC/VT exact.
    expect(r1['gm']).toBe(`${(q1.ic / VT_27C * 1e3).toPrecision(3)} mS`);
    // rπ = β/gm (same source) with β = 100; the Early factor (1 + VCE/VA) sits on the transport
    // current only (netlist language §2), so IB lacks it and rπ = β·(1 + VCE/VA)/gm, VA = 80 V.
    expect(r1['rπ']).toBe(`${((100 * (1 + q1.vce / 80)) / (q1.ic / VT_27C) / 1e3).toPrecision(3)} kΩ`);
    // Cπ = cje + gm·τF (netlist language §2) = 1 pF + gm · 0.3 ns.
    expect(r1['Cπ']).toBe(`${((1e-12 + (q1.ic / VT_27C) * 0.3e-9) * 1e12).toPrecision(3)} pF`);
    expect(r1['Cμ']).toBe('500 fF');
    expect(r1['VCE']).toBe(`${q1.vce.toPrecision(3)} V`);
    expect(el.querySelector('.all-good')!.textContent).toContain('✓ All 2 devices in their intended regions');
  });

  it('lists node voltages, sources with the power they deliver, and part currents', async () => {
    const result = solveNetlist(RESISTOR_TAIL_PAIR);
    const { el } = await render(result);
    const nodes = rows(table(el, 'Node voltages'));
    expect(nodes.find((n) => n['Name'] === 'vee')!['Voltage']).toBe('-10.0 V');
    expect(nodes.find((n) => n['Name'] === 'tail')!['Voltage']).toBe(`${(result.op!.nodes['tail'] * 1e3).toPrecision(3)} mV`);
    const vcc = rows(table(el, 'Sources')).find((s) => s['Name'] === 'vcc')!;
    const ivcc = result.op!.sources['vcc'].i;
    expect(ivcc).toBeLessThan(0);
    expect(vcc['Current p→n']).toBe(`-${(-ivcc * 1e3).toPrecision(3)} mA`);
    expect(vcc['Power']).toBe(`${(-ivcc * 10 * 1e3).toPrecision(3)} mW delivered`);
    const rc1 = rows(table(el, 'Parts')).find((p) => p['Name'] === 'rc1')!;
    // Ohm's law across rc1 = 5 kΩ.
    expect(result.op!.parts['rc1'].v / result.op!.parts['rc1'].i).toBeCloseTo(5000, 6);
    expect(rc1['Power']).toMatch(/ µW absorbed$|mW absorbed$/);
  });

  it('flags saturated, cut-off and triode devices with a word and a symbol, and shows ro = ∞ without Early effect', async () => {
    const result = solveNetlist(HEADROOM_TROUBLE);
    const { el } = await render(result);
    const bjt = rows(table(el, 'Bipolar transistors'));
    expect(bjt.map((r) => [r['Name'], r['Region']])).toEqual([['q1', '⚠ saturated'], ['q2', '⚠ cut off'], ['q3', 'active']]);
    // q3 uses the built-in model: va = ∞, so ro is infinite (netlist language §2).
    expect(bjt[2]['ro']).toBe('∞');
    const mos = rows(table(el, 'MOS transistors'));
    expect(mos.map((r) => [r['Name'], r['Region']])).toEqual([['m1', '⚠ triode'], ['m2', '⚠ cut off'], ['m3', 'saturation']]);
    // Square law, Vov = VGS − Vth = 0.9 − 0.5 V (Razavi, Design of Analog CMOS ICs, 2nd ed., §2.2, from memory).
    expect(mos[2]['Vov']).toBe('400 mV');
    const summary = el.querySelector('.problems')!.textContent!.replace(/\s+/g, ' ');
    expect(summary).toContain('⚠ 4 devices need attention');
    expect(summary).toContain('q1: saturated (VCE = 43.8 mV');
    expect(summary).toContain('m2: cut off');
    expect(el.querySelectorAll('tr.flagged').length).toBe(4);
    expect(rows(table(el, 'Diodes'))[0]['Region']).toBe('forward');
  });

  it('warns of VCE < 0.3 V and of |VDS| close to Vov while the devices are still in their regions', async () => {
    const result = solveNetlist(LOW_HEADROOM);
    expect(result.op!.devices['q1'].region).toBe('active');
    const { el } = await render(result);
    const [q1] = rows(table(el, 'Bipolar transistors'));
    expect(q1['Region']).toBe('active');
    expect(q1['VCE']).toBe('⚠ 242 mV: VCE < 0.3 V');
    const [m1] = rows(table(el, 'MOS transistors'));
    expect(m1['VDS']).toContain('|VDS| − Vov < 0.1 V');
    expect(el.querySelector('.problems')!.textContent).toContain('q1: VCE < 0.3 V');
  });

  it('filters every table by name, kind or region', async () => {
    const { fixture, el } = await render(solveNetlist(HEADROOM_TROUBLE));
    const input = el.querySelector('input[type="search"]') as HTMLInputElement;
    input.value = 'cut off';
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(rows(table(el, 'Bipolar transistors')).map((r) => r['Name'])).toEqual(['q2']);
    expect(rows(table(el, 'MOS transistors')).map((r) => r['Name'])).toEqual(['m2']);
    expect(el.querySelector('table[aria-label="Parts"]')).toBeNull();
    expect(el.textContent).toContain('2 rows match');
    // A problem's name in the summary narrows the tables to that device.
    fixture.componentInstance.filter.set('');
    await fixture.whenStable();
    const q1Link = [...el.querySelectorAll('.problems button.link')].find((b) => b.textContent === 'q1') as HTMLButtonElement;
    q1Link.click();
    await fixture.whenStable();
    expect(input.value).toBe('q1');
    expect(rows(table(el, 'Bipolar transistors')).map((r) => r['Name'])).toEqual(['q1']);
  });

  it('sorts a table by a column header, numerically', async () => {
    const { fixture, el } = await render(solveNetlist(HEADROOM_TROUBLE));
    const header = [...table(el, 'Bipolar transistors').querySelectorAll('th')].find((h) => h.textContent!.trim() === 'VCE')!;
    (header.querySelector('.mat-sort-header-container') as HTMLElement ?? header).click();
    await fixture.whenStable();
    expect(rows(table(el, 'Bipolar transistors')).map((r) => r['Name'])).toEqual(['q1', 'q3', 'q2']);
    (header.querySelector('.mat-sort-header-container') as HTMLElement ?? header).click();
    await fixture.whenStable();
    expect(rows(table(el, 'Bipolar transistors')).map((r) => r['Name'])).toEqual(['q2', 'q3', 'q1']);
  });

  it('shows no device as fine in green when the result is from an earlier version of the netlist', async () => {
    const { fixture, el } = await render(solveNetlist(RESISTOR_TAIL_PAIR));
    expect(el.querySelector('.all-good .tag.pass')).not.toBeNull();
    fixture.componentRef.setInput('stale', true);
    await fixture.whenStable();
    expect(el.querySelector('.all-good .tag.pass')).toBeNull();
    expect(el.querySelector('.all-good .tag.stale')!.textContent).toContain('in an earlier version');
  });

  it('shows the tables, not an error, when only a request line is broken (the circuit solved)', async () => {
    const result = solveNetlist(RESISTOR_TAIL_PAIR + 'measure broken = vce(q9)\n');
    expect(result.errors).toHaveLength(1);
    const { el } = await render(result);
    expect(rows(table(el, 'Bipolar transistors')).map((r) => r['Name'])).toEqual(['q1', 'q2']);
  });

  it('shows the first error instead of tables when the netlist does not solve', async () => {
    const { el } = await render(solveNetlist(BROKEN));
    expect(el.querySelector('table')).toBeNull();
    expect(el.textContent).toContain('`meg` is not a prefix.');
  });

  it('says what to add when the netlist has nothing to bias yet (a new netlist)', async () => {
    const { el } = await render(solveNetlist('title  Untitled netlist\n\n'));
    expect(el.querySelector('input[type="search"]')).toBeNull();
    const notice = el.querySelector('nw-panel-notice')!.textContent!;
    expect(notice).toContain('Nothing to bias yet');
    expect(el.querySelector('nw-panel-notice code')!.textContent).toBe('vcc: vsrc(vcc, gnd) 5 V');
  });

  it('lists the nodes in the order the netlist first names them, not alphabetically', async () => {
    const { el } = await render(solveNetlist(RESISTOR_TAIL_PAIR));
    expect(rows(table(el, 'Node voltages')).map((r) => r['Name'])).toEqual(['vcc', 'vee', 'ina', 'inb', 'outa', 'outb', 'tail']);
  });

  it('heads its tables one level below the bench title', async () => {
    const { el } = await render(solveNetlist(RESISTOR_TAIL_PAIR));
    expect([...el.querySelectorAll('h2')].map((h) => h.textContent!.trim())).toEqual(['Bipolar transistors', 'Node voltages', 'Sources', 'Parts']);
    expect(el.querySelector('h3')).toBeNull();
  });

  it('groups every source together — voltage, current and controlled — in netlist order, apart from the parts', async () => {
    const text = [
      'title Sources',
      'vcc: vsrc(vcc, gnd) 5 V',
      'r1:  res(vcc, a) 1k',
      'ib:  isrc(a, gnd) 1m',
      'g1:  vccs(b, gnd, a, gnd) 1m',
      'rb:  res(b, gnd) 1k',
      'e1:  vcvs(c, gnd, a, gnd) 2',
      'rc:  res(c, gnd) 1k',
    ].join('\n');
    // The reply the bench's worker would send for this text: the same solve, with its names.
    const { result } = answer(solveReply(1, text));
    expect(result.errors).toEqual([]);
    const { el } = await render(result);
    const sources = rows(table(el, 'Sources'));
    expect(sources.map((r) => [r['Name'], r['Kind']])).toEqual([['vcc', 'vsrc'], ['ib', 'isrc'], ['g1', 'vccs'], ['e1', 'vcvs']]);
    expect(rows(table(el, 'Parts')).map((r) => [r['Name'], r['Kind']])).toEqual([['r1', 'res'], ['rb', 'res'], ['rc', 'res']]);
    // What the sources deliver equals what the resistors absorb (Tellegen's theorem; from memory).
    const op = result.op!;
    const absorbed = ['r1', 'rb', 'rc'].reduce((sum, n) => sum + op.parts[n].v * op.parts[n].i, 0);
    const delivered = -[op.sources['vcc'], op.sources['e1'], op.parts['ib'], op.parts['g1']].reduce((sum, b) => sum + b.v * b.i, 0);
    expect(Math.abs(delivered - absorbed) / absorbed).toBeLessThan(1e-6);
    expect(el.querySelector('.note')!.textContent).toContain(`The sources deliver ${formatSi(absorbed, 'W')} in all`);
  });

  it('gives the kind of every part inside a block instance, as the solver elaborated it', async () => {
    const block = ['block divider(top, mid)', '  r1: res(top, mid) 1k', '  r2: res(mid, gnd) 1k', 'end', ''].join('\n');
    const text = ['title Instance kinds', 'use lib/divider@1', 'vcc: vsrc(vcc, gnd) 5 V', 'd1:  divider(top=vcc, mid=mid)', 'rl:  res(mid, gnd) 10k'].join('\n');
    const { result } = answer(solveReply(1, text, { resolveUse: (path, version) => (path === 'lib/divider' && version === 1 ? { ok: true, text: block } : { ok: false, message: 'no such block' }) }));
    expect(result.errors).toEqual([]);
    const { el } = await render(result);
    expect(rows(table(el, 'Parts')).map((r) => [r['Name'], r['Kind']])).toEqual([['d1.r1', 'res'], ['d1.r2', 'res'], ['rl', 'res']]);
    expect(rows(table(el, 'Sources')).map((r) => [r['Name'], r['Kind']])).toEqual([['vcc', 'vsrc']]);
  });
});

/** Hands `reply` to the bench's solver client, as its worker would, with no worker behind it. */
function answer(reply: SolveReply): SolveReply {
  TestBed.configureTestingModule({
    providers: [SolverClient, { provide: SOLVER_WORKER_FACTORY, useValue: () => { throw new Error('no worker in a unit test'); } }],
  });
  TestBed.inject(SolverClient).reply.set(reply);
  return reply;
}
