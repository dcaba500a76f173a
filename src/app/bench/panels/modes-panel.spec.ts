import { TestBed } from '@angular/core/testing';
import { solveNetlist, type SolveResult } from '../../../../solver';
import { ModesPanel } from './modes-panel';
import { HEADROOM_TROUBLE, MOS_PAIR_SINGLE, RESISTOR_TAIL_PAIR } from './testing/netlists';

async function render(result: SolveResult | undefined) {
  const fixture = TestBed.createComponent(ModesPanel);
  fixture.componentRef.setInput('result', result);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement };
}

const figure = (el: HTMLElement, name: string) => el.querySelector(`section.figure[aria-label^="${name}"]`)!;

describe('ModesPanel', () => {
  it('shows adm, acm and CMRR of the resistor-tail pair with their definitions, at 0 Hz', async () => {
    const result = solveNetlist(RESISTOR_TAIL_PAIR);
    const { el } = await render(result);
    const p = result.ports!;
    const adm = figure(el, 'Differential gain');
    expect(adm.querySelector('.big')!.textContent).toBe(`${p.adm.db.toFixed(2)} dB`);
    expect(adm.querySelector('.sub')!.textContent).toContain(`|adm| = ${p.adm.mag.toPrecision(3)}`);
    // At 0 Hz the gain is real with its sign: the pair's differential gain from va to
    // v(outa) − v(outb) is −gm·RC, inverting (common practice), so it reads negative at 180°.
    expect(adm.querySelector('.sub')!.textContent).toContain(`adm = -${p.adm.mag.toPrecision(3)}`);
    expect(adm.querySelector('.sub')!.textContent).toContain('∠ 180.0°');
    expect(adm.querySelector('.def')!.textContent).toContain('adm = vod / vid');
    const cmrr = figure(el, 'CMRR');
    expect(cmrr.querySelector('.big')!.textContent).toBe(`${p.cmrr_db.toFixed(2)} dB`);
    expect(cmrr.querySelector('.sub')!.textContent).toContain(`cmrr = ${p.cmrr.toPrecision(3)}`);
    // cmrr_db = 20·log10(cmrr), the definition of the netlist language (§3).
    expect(p.cmrr_db).toBeCloseTo(20 * Math.log10(p.cmrr), 9);
    const text = el.textContent!.replace(/\s+/g, ' ');
    expect(text).toContain('Differential output');
    expect(text).toContain('0 Hz (DC: capacitors open, inductors shorted)');
    expect(text).toContain('vid = va − vb');
    expect(text).toContain('vic = (va + vb)/2');
    expect(text).toContain('vod = v(outa) − v(outb)');
    expect(text).toContain('voc = (v(outa) + v(outb))/2');
  });

  it('writes gains and CMRR as plain figures or powers of ten, never with SI prefixes', async () => {
    const result = solveNetlist(RESISTOR_TAIL_PAIR);
    const { el } = await render(result);
    // acm of the resistor-tail pair is −gm·RC/(1 + (gm + gπ)·2RT) ≈ −0.53 (Sedra & Smith,
    // differential-amplifier chapter, half circuits; from memory): written "0.530", not "530 m".
    const acm = figure(el, 'Common-mode gain').querySelector('.sub')!.textContent!;
    expect(acm).toContain('|acm| = 0.530');
    expect(acm).toContain('acm = -0.530');
    expect(el.textContent).not.toMatch(/\d [mkMG](?![A-Za-z])/);
    // A current-source tail (2 mA behind a 1 TΩ leak) lifts CMRR past 10⁵: a power of ten.
    const stiff = solveNetlist(RESISTOR_TAIL_PAIR.replace('rt: res(tail, vee) 4.65k', 'it: isrc(tail, vee) 2m\nrt: res(tail, vee) 1T'));
    const p = stiff.ports!;
    expect(p.cmrr).toBeGreaterThan(1e5);
    expect(p.cmrr).toBeLessThan(1e6);
    const cmrr = figure((await render(stiff)).el, 'CMRR').querySelector('.sub')!.textContent!.trim();
    expect(cmrr).toBe(`cmrr = ${p.cmrr.toExponential(2).split('e')[0]} × 10⁵`);
  });

  it('plots CMRR over frequency, magnitude only, with its corner marked', async () => {
    const result = solveNetlist(RESISTOR_TAIL_PAIR);
    const { el } = await render(result);
    expect(el.querySelectorAll('svg.plot path.curve[data-key="cmrr"]').length).toBe(1);
    expect(el.querySelector('.panel-phase')).toBeNull();
    expect([...el.querySelectorAll('.axis-title')].map((t) => t.textContent)).toEqual(['CMRR (dB)', 'Frequency (Hz)']);
    expect(el.querySelector('.marker-corner .marker-label')?.textContent).toMatch(/^−3 dB at [0-9.]+ [kMG]?Hz$/);
  });

  it('exports the CMRR plot like every plot: SVG, PNG and CSV of its curve', async () => {
    const result = solveNetlist(RESISTOR_TAIL_PAIR);
    const { fixture, el } = await render(result);
    const labels = [...el.querySelectorAll('nw-export-bar button')].map((b) => b.getAttribute('aria-label'));
    expect(labels).toEqual(['Export the plot as SVG', 'Export the plot as PNG', 'CSV: export the curves']);
    const rows = fixture.componentInstance.csvText().split('\r\n');
    expect(rows[0]).toBe('freq_hz,cmrr_mag_db,cmrr_phase_deg');
    expect(rows.length - 2).toBe(result.ac!.freq_hz.length);
    expect(Number(rows[21].split(',')[1])).toBe(result.ac!.curves['cmrr'].db[20]);
    const svg = fixture.componentInstance.plot()!.svgText();
    expect(svg).toContain('>CMRR (dB)</text>');
    expect(svg).not.toMatch(/_ngcontent|ng-reflect|style="/);
    expect(fixture.componentInstance.stem()).toBe('resistor-tail-pair-cmrr');
  });

  it('states a single-ended output and the ports frequency, and asks for a sweep to plot', async () => {
    const result = solveNetlist(MOS_PAIR_SINGLE);
    const { el } = await render(result);
    const text = el.textContent!.replace(/\s+/g, ' ');
    expect(text).toContain('Single-ended output');
    expect(text).toContain('Figures at 1.00 kHz');
    expect(text).toContain('vod = voc = v(da)');
    expect(text).toContain('vid = va − vb');
    // At 1 kHz the gains are complex: no signed real value is shown.
    expect(figure(el, 'Differential gain').querySelector('.sub')!.textContent).not.toContain('adm =');
    expect(text).toContain('analyze ac from 10 Hz to 1 GHz per decade 20');
    expect(el.querySelector('svg.plot')).toBeNull();
  });

  it('explains how to ask for the figures when there are no ports', async () => {
    const { el } = await render(solveNetlist(HEADROOM_TROUBLE));
    expect(el.textContent).toContain('ports in=(va, vb) out=(outa, outb)');
  });
});
