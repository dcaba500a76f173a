import { TestBed } from '@angular/core/testing';
import { solveNetlist, type SolveResult } from '../../../../solver';
import { RESISTOR_TAIL } from '../examples/resistor-tail';
import { formatSi } from './si-format';
import { RESISTOR_TAIL_PAIR } from './testing/netlists';
import { TransferPanel } from './transfer-panel';
import { currentTailPair } from './transfer/testing';

/** A pair with an ideal 2 mA tail, swept ±100 mV on va: the output is tanh-shaped. */
const pair = solveNetlist(currentTailPair());

async function render(result: SolveResult | undefined) {
  const fixture = TestBed.createComponent(TransferPanel);
  fixture.componentRef.setInput('result', result);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement, panel: fixture.componentInstance };
}

describe('TransferPanel', () => {
  it('plots the outputs in volts above the collector currents in amperes, over the swept source', async () => {
    expect(pair.errors).toEqual([]);
    const { el } = await render(pair);
    const pressed = [...el.querySelectorAll('.legend button[aria-pressed="true"]')].map((b) => b.getAttribute('data-key'));
    expect(pressed).toEqual(['vod', 'v(outa)', 'v(outb)', 'i(rc1)', 'i(rc2)']);
    expect([...el.querySelectorAll('svg.plot path.curve')].map((p) => p.getAttribute('data-key'))).toEqual(pressed);
    expect([...el.querySelectorAll('.axis-title')].map((t) => t.textContent)).toEqual(['Voltage (V)', 'Current (A)', 'va (V)']);
    // SI-formatted ticks on a linear axis: −100 mV … 100 mV.
    const xLabels = [...el.querySelectorAll('.x-labels text')].map((t) => t.textContent);
    expect(xLabels[0]).toBe('-100 mV');
    expect(xLabels).toContain('0 V');
    expect(xLabels[xLabels.length - 1]).toBe('100 mV');
    expect([...el.querySelectorAll('.panel-1 .y-labels text')].every((t) => / [mµ]?A$/.test(t.textContent!))).toBe(true);
    // Supplies and the ideal tail source do not move: named, not plotted.
    expect(el.querySelector('.flat')!.textContent).toContain('v(vcc), v(vee), v(inb)');
    expect(el.querySelector('.flat')!.textContent).toContain('i(it)');
  });

  it('marks the linear input range of vod where its slope falls to 90 % of the peak, and says so', async () => {
    const { el, panel } = await render(pair);
    const r = panel.range()!;
    // 2V_T·atanh(√0.1) ≈ 16.9 mV either side for an ideal pair (see transfer/linear-range.spec.ts);
    // the Early effect of va = 80 V moves it by well under a millivolt.
    expect(r.hi).toBeGreaterThan(16e-3);
    expect(r.hi).toBeLessThan(18e-3);
    expect(r.lo).toBeCloseTo(-r.hi, 3);
    expect(el.querySelector('.range')!.textContent).toContain('slope at least 90 % of its peak');
    expect(el.querySelector('.range')!.textContent).toContain(`${formatSi(r.lo, 'V')} … ${formatSi(r.hi, 'V')}`);
    expect(el.querySelectorAll('rect.band').length).toBe(2);
    expect(el.querySelector('.label-range')!.textContent).toBe(`linear ±${formatSi((r.hi - r.lo) / 2, 'V')} (slope ≥ 90 % of peak)`);
    expect(el.querySelectorAll('.marker-range circle').length).toBe(2);
  });

  it('moves the marks to another curve chosen in the list', async () => {
    const { fixture, el, panel } = await render(pair);
    const select = el.querySelector('select') as HTMLSelectElement;
    select.value = 'i(rc1)';
    select.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    expect(panel.markKey()).toBe('i(rc1)');
    expect(el.querySelector('.range')!.textContent).toContain('Linear input range of i(rc1)');
    // A current over a voltage: the peak slope is a transconductance, I_EE/4V_T per side ≈ 19 mS.
    expect(el.querySelector('.range')!.textContent).toMatch(/peak slope 1[89]\.\d mS/);
  });

  it('reads every shown curve and the slope under the cursor from the keyboard', async () => {
    const { fixture, el } = await render(pair);
    const surface = el.querySelector('.surface') as HTMLElement;
    surface.dispatchEvent(new FocusEvent('focus'));
    await fixture.whenStable();
    expect(el.querySelector('.readout .at')!.textContent).toBe('va = -100.0 mV');
    surface.dispatchEvent(new KeyboardEvent('keydown', { key: 'PageUp' }));
    for (let k = 0; k < 80; k++) surface.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight' }));
    await fixture.whenStable();
    // 20 points a page and 80 steps from −100 mV: the 101st point is va = 0.
    const t = pair.transfer!;
    expect(el.querySelector('.readout .at')!.textContent).toBe('va = 0 V');
    const rows = [...el.querySelectorAll('.readout .row')].map((r) => [r.querySelector('.name')!.textContent, r.querySelector('.num')!.textContent]);
    expect(rows[1]).toEqual(['v(outa)', formatSi(t.curves['v(outa)'][100], 'V', 4)]);
    expect(rows[3]).toEqual(['i(rc1)', formatSi(t.curves['i(rc1)'][100], 'A', 4)]);
    expect(el.querySelector('.readout .extra')!.textContent).toBe('slope of vod: 100 % of peak');
    expect(el.querySelector('g.cursor .cursor-label')!.textContent).toBe('0 V');
  });

  it('exports the shown curves or all of them as CSV, and a clean SVG', async () => {
    const { fixture, panel } = await render(pair);
    fixture.componentInstance.toggle('i(rc2)');
    await fixture.whenStable();
    const shown = panel.csvText().split('\r\n');
    expect(shown[0]).toBe('va_v,vod_v,v(outa)_v,v(outb)_v,i(rc1)_a');
    expect(shown.length - 2).toBe(201);
    const all = panel.csvAllText().split('\r\n');
    const header = all[0].split(',');
    expect(header).toContain('i(rc2)_a');
    expect(header).toContain('v(vcc)_v');
    expect(header).toContain('i(it)_a');
    expect(header.length).toBe(1 + 1 + Object.keys(pair.transfer!.curves).length);
    const row = all[1 + 150].split(',');
    // The swept values as written (the solver's 0.05000000000000013 is 50 mV, see tidySweep).
    expect(Number(row[0])).toBe(0.05);
    expect(Number(all[1 + 100].split(',')[0])).toBe(0);
    expect(Number(row[header.indexOf('v(outb)_v')])).toBe(pair.transfer!.curves['v(outb)'][150]);
    const svg = panel.plot()!.svgText();
    expect(svg).not.toMatch(/_ngcontent|ng-reflect|style="/);
    expect(svg).toContain('linear ±');
    expect(svg).not.toContain('cursor-label"');
  });

  it('writes a range centred away from zero as centre ± half-width, with digits enough to tell its ends apart', async () => {
    // The Strainlab demo: inputs at 2.5 V of common mode, swept around it as the notice suggests.
    const demo = solveNetlist(RESISTOR_TAIL.text + 'analyze transfer va from 2.4 to 2.6 step 1m\n');
    expect(demo.errors).toEqual([]);
    const { el } = await render(demo);
    expect(el.querySelector('.label-range')!.textContent).toMatch(/^linear 2\.50\d V ± \d\d\.\d mV \(slope ≥ 90 % of peak\)$/);
    expect(el.querySelector('.range')!.textContent).toMatch(/: 2\.4\d\d V … 2\.5\d\d V, \d\d\.\d mV wide;/);
    expect([...el.querySelectorAll('.x-labels text')].map((t) => t.textContent)).toContain('2.5 V');
  });

  it('explains how to ask for a transfer curve, with the syntax, when there is none', async () => {
    const { el } = await render(solveNetlist(RESISTOR_TAIL_PAIR));
    expect(el.textContent).toContain('No transfer curve yet');
    expect(el.textContent).toContain('analyze transfer SOURCE from START to STOP step STEP');
    expect(el.querySelector('code')!.textContent).toBe('analyze transfer va from -100m to 100m step 1m');
    expect(el.querySelector('svg.plot')).toBeNull();
    // A pair biased at 2.5 V is offered a sweep around its own bias, not one that pulls it to ground.
    const demo = await render(solveNetlist(RESISTOR_TAIL.text));
    expect(demo.el.querySelector('code')!.textContent).toBe('analyze transfer va from 2.4 to 2.6 step 1m');
  });
});
