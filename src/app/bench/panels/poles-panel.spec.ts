import { TestBed } from '@angular/core/testing';
import { solveNetlist, type SolveResult } from '../../../../solver';
import { PolesPanel } from './poles-panel';
import { FAR_APART, NEGATIVE_CONDUCTANCE, RC_POLE, RLC_PAIR } from './poles/testing';
import { BROKEN, RESISTOR_TAIL_PAIR } from './testing/netlists';

async function render(result: SolveResult | undefined) {
  const fixture = TestBed.createComponent(PolesPanel);
  fixture.componentRef.setInput('result', result);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement, panel: fixture.componentInstance };
}

const text = (el: Element | null) => (el?.textContent ?? '').replace(/\s+/g, ' ').trim();
const bodyRows = (el: HTMLElement) => [...el.querySelectorAll('table tbody tr:not(.group)')].map((tr) => [...tr.children].map(text));

describe('PolesPanel', () => {
  it('lists a conjugate pair on one row with |s|/2π and Q, and marks both members on the map', async () => {
    const r = solveNetlist(RLC_PAIR);
    const { el } = await render(r);
    expect([...el.querySelectorAll('thead th')].map(text)).toEqual(['Pole or zero', 'Re s/2π', 'Im s/2π', '|s|/2π', 'Q', 'Half-plane']);
    expect(bodyRows(el)).toEqual([
      ['×pole 1', '-7.96 kHz', '± 159 kHz', '159 kHz', '10.0', 'left'],
      ['none: the transfer has no finite zero'],
    ]);
    expect([...el.querySelectorAll('tr.group th')].map(text)).toEqual(['Poles', 'Zeros of v(out)/vin']);
    expect(el.querySelectorAll('svg.plot g.pz-pole').length).toBe(2);
    expect(el.querySelectorAll('svg.plot g.pz-zero').length).toBe(0);
    expect(text(el.querySelector('svg.plot g.pz-pole title'))).toBe('pole 1: -7.96 kHz ± j 159 kHz, |s|/2π 159 kHz, Q 10.0');
    expect(text(el.querySelector('.summary'))).toBe('1 pole (1 conjugate pair); 0 zeros of v(out)/vin. Every pole is in the left half-plane: the circuit is stable at this operating point.');
  });

  it('is an image with a name for screen readers, the table being its accessible form', async () => {
    const { el } = await render(solveNetlist(RLC_PAIR));
    const svg = el.querySelector('svg.plot')!;
    expect(svg.getAttribute('role')).toBe('img');
    expect(svg.getAttribute('aria-label')).toBe('Pole–zero map on linear axes: 1 pole (1 conjugate pair); 0 zeros of v(out)/vin. Every pole is in the left half-plane: the circuit is stable at this operating point. The table beside it lists every pole and zero.');
    expect(text(el.querySelector('table caption'))).toContain('Poles and zeros');
    expect(el.querySelectorAll('tbody th[scope="row"]').length).toBe(1);
    expect(el.querySelector('.toggle')!.getAttribute('role')).toBe('radiogroup');
  });

  it('flags a pole in the right half-plane in red words, and says the circuit is unstable', async () => {
    const { el } = await render(solveNetlist(NEGATIVE_CONDUCTANCE));
    const [row] = bodyRows(el);
    expect(row.slice(0, 4)).toEqual(['×pole 1', '159 kHz', '0', '159 kHz']);
    const flag = el.querySelector('tbody tr.rhp .tag.fail')!;
    expect(text(flag)).toBe('✗ right half-plane: unstable');
    expect(text(el.querySelector('.summary .tag.fail'))).toBe('✗ unstable');
    expect(text(el.querySelector('.summary'))).toContain('One pole is in the right half-plane');
    expect(el.querySelectorAll('svg.plot g.pz.rhp-mark').length).toBe(1);
    expect(text(el.querySelector('svg.plot .rhp-text'))).toBe('right half-plane: unstable');
    // No zeros asked for: the panel says how to ask.
    expect(text(el.querySelector('.list .note'))).toContain('analyze poles out NODE');
  });

  it('tells a right-half-plane zero from an unstable pole', async () => {
    const { el } = await render(solveNetlist(`${RESISTOR_TAIL_PAIR}analyze poles\n`));
    const zeros = bodyRows(el).filter((r) => r[0].startsWith('○zero'));
    expect(zeros.length).toBe(1);
    expect(zeros[0][5]).toBe('right half-plane (non-minimum phase)');
    expect(el.querySelector('tbody .tag.fail')).toBeNull();
    expect(el.querySelectorAll('svg.plot g.pz-zero').length).toBe(1);
    expect(text(el.querySelector('.summary'))).toContain('Every pole is in the left half-plane');
  });

  it('shows poles eight decades apart on an arcsinh map first, explains it, and switches to linear', async () => {
    const { fixture, el, panel } = await render(solveNetlist(FAR_APART));
    expect(panel.scale()).toBe('asinh');
    expect(text(el.querySelector('figcaption'))).toMatch(/^Arcsinh axes: each is asinh\(f \/ c\) with c = 1\.00 Hz — linear within about ±c of zero, logarithmic beyond/);
    expect([...el.querySelectorAll('svg.plot .axis-title')].map(text)).toEqual(['Re s/2π (Hz, arcsinh scale)', 'Im s/2π (Hz, arcsinh scale)']);
    expect([...el.querySelectorAll('svg.plot .x-labels text')].map(text)).toContain('-1 GHz');
    const linear = el.querySelector('.toggle input[value="linear"]') as HTMLInputElement;
    linear.click();
    await fixture.whenStable();
    expect(panel.scale()).toBe('linear');
    expect(text(el.querySelector('figcaption'))).toMatch(/^Linear axes with the same hertz per pixel on both/);
    expect([...el.querySelectorAll('svg.plot .axis-title')].map(text)).toEqual(['Re s/2π (Hz)', 'Im s/2π (Hz)']);
  });

  it('exports the map as a clean SVG and every pole and zero as CSV', async () => {
    const { panel } = await render(solveNetlist(RLC_PAIR));
    const svg = panel.map()!.svgText();
    expect(svg).not.toMatch(/_ngcontent|ng-reflect|style="|role=|aria-/);
    expect(svg).toContain('RLC pair');
    expect(svg).toContain('right half-plane');
    expect(panel.stem()).toBe('rlc-pair-poles');
    expect(panel.csvText().split('\r\n')[0]).toBe('kind,index,re_hz,im_hz,mag_hz,q,right_half_plane');
    expect(panel.csvText().split('\r\n').length).toBe(4);
  });

  it('explains how to ask for poles, with the line to add', async () => {
    const pair = await render(solveNetlist(RESISTOR_TAIL_PAIR));
    expect(text(pair.el.querySelector('.title'))).toBe('No poles analysis yet');
    expect(text(pair.el.querySelector('code'))).toBe('analyze poles');
    expect(pair.el.querySelector('svg.plot')).toBeNull();
    const rc = await render(solveNetlist(RC_POLE.replace('analyze poles out out\n', '')));
    expect(text(rc.el.querySelector('code'))).toBe('analyze poles out out');
    const broken = await render(solveNetlist(BROKEN));
    expect(text(broken.el.querySelector('.title'))).toMatch(/^The netlist has \d+ errors?$/);
  });

  it('says so when the circuit has no finite pole', async () => {
    const { el } = await render(solveNetlist('title  Divider\nvin: vsrc(in, gnd) 1 ac=1\nr1: res(in, out) 1k\nr2: res(out, gnd) 1k\nanalyze poles\n'));
    expect(text(el.querySelector('.note'))).toMatch(/^No finite poles/);
    expect(el.querySelector('svg.plot')).toBeNull();
  });
});
