import { TestBed } from '@angular/core/testing';
import { solveNetlist, type SolveResult } from '../../../../solver';
import { NoisePanel } from './noise-panel';
import { CURRENT_INPUT, INPUT_APART, RC_LOWPASS, TWELVE_RESISTORS } from './noise/testing';
import { formatSi } from './si-format';
import { BROKEN, RESISTOR_TAIL_PAIR } from './testing/netlists';

const twelve = solveNetlist(TWELVE_RESISTORS);

async function render(result: SolveResult | undefined) {
  const fixture = TestBed.createComponent(NoisePanel);
  fixture.componentRef.setInput('result', result);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement, panel: fixture.componentInstance };
}

const text = (el: Element | null) => (el?.textContent ?? '').replace(/\s+/g, ' ').trim();
const bodyRows = (el: HTMLElement) => [...el.querySelectorAll('table tbody tr')].map((tr) => [...tr.children].map(text));

describe('NoisePanel', () => {
  it('states the rms noise over the band as the measures do, output and input-referred', async () => {
    expect(twelve.errors).toEqual([]);
    const { el } = await render(twelve);
    expect(text(el.querySelector('.context'))).toBe('Noise at v(out), input vin, 100 Hz to 100 MHz (61 points), at 27 °C.');
    expect(text(el.querySelector('[data-figure="out-rms"]'))).toBe(formatSi(twelve.measures['vn'], 'V'));
    expect(text(el.querySelector('[data-figure="in-rms"]'))).toBe(formatSi(twelve.measures['vi'], 'V'));
    // The spot densities beside them are the solver's own at 1 kHz (the point at index 10).
    expect(twelve.noise!.freq_hz[10]).toBeCloseTo(1e3, 6);
    expect(text(el.querySelector('.figure .def'))).toBe(`noise_out_rms(); ${formatSi(twelve.noise!.out_density[10], 'V/√Hz')} at 1.00 kHz`);
  });

  it('plots the output and input-referred densities log–log, and adds a part’s curve from the legend', async () => {
    const { fixture, el, panel } = await render(twelve);
    const pressed = () => [...el.querySelectorAll('.legend button[aria-pressed="true"]')].map((b) => b.getAttribute('data-key'));
    expect(pressed()).toEqual(['out', 'in']);
    expect([...el.querySelectorAll('.legend button')].map(text)).toEqual(['✓output v(out)', '✓input-referred (vin)', 'rs', 'r2', 'r3', 'r4', 'r5']);
    expect([...el.querySelectorAll('svg.plot path.curve')].map((p) => p.getAttribute('data-key'))).toEqual(['out', 'in']);
    expect([...el.querySelectorAll('.axis-title')].map(text)).toEqual(['Noise density (V/√Hz)', 'f (Hz)']);
    const y = [...el.querySelectorAll('.y-labels text')].map(text);
    expect(y.every((t) => /^(1|10|100) [pnµ]V\/√Hz$/.test(t))).toBe(true);
    // Six decades on the 640 px of a page without layout: every second one labelled.
    expect([...el.querySelectorAll('.x-labels text')].map(text)).toEqual(['100 Hz', '10 kHz', '1 MHz', '100 MHz']);
    expect(el.querySelector('path.grid-minor')).not.toBeNull();
    (el.querySelector('.legend button[data-key="part:r2"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(pressed()).toEqual(['out', 'in', 'part:r2']);
    expect(panel.shown().map((s) => s.key)).toEqual(['out', 'in', 'part:r2']);
    expect(el.querySelector('svg.plot path.curve[data-key="part:r2"]')).not.toBeNull();
  });

  it('ranks the parts by their share of the band power, ten first and the rest on demand', async () => {
    const { fixture, el } = await render(twelve);
    let rows = bodyRows(el);
    expect(rows.length).toBe(10);
    expect(rows.map((r) => r[1])).toEqual(['rs', 'r2', 'r3', 'r4', 'r5', 'r6', 'r7', 'r8', 'r9', 'r10']);
    // G/ΣG of 1 kΩ among 1 k, 2 k … 12 kΩ (see noise/noise-data.spec.ts): 32.2 %.
    expect(rows[0][2]).toBe('32.2 %');
    expect(rows[0][3]).toMatch(/ µV$/);
    expect(rows[0][4]).toBe(formatSi(twelve.noise!.contributors['rs'][10], 'V/√Hz'));
    expect(rows[0][5]).toBe('32.2 %');
    const more = el.querySelector('button.more') as HTMLButtonElement;
    expect(text(more)).toBe('and 2 more');
    expect(more.getAttribute('aria-expanded')).toBe('false');
    more.click();
    await fixture.whenStable();
    rows = bodyRows(el);
    expect(rows.length).toBe(12);
    expect(rows[11][1]).toBe('r12');
    expect(more.getAttribute('aria-expanded')).toBe('true');
    expect(text(more)).toBe('Show the top 10 only');
    // The shares as written add up to 100 % (to the rounding of their one decimal).
    const sum = rows.reduce((s, r) => s + Number(r[2].replace(' %', '')), 0);
    expect(Math.abs(sum - 100)).toBeLessThanOrEqual(0.05 * 12);
  });

  it('reads the parts at another swept frequency chosen in the list', async () => {
    const { fixture, el } = await render(twelve);
    const select = el.querySelector('.pick select') as HTMLSelectElement;
    expect(select.options.length).toBe(61);
    expect(select.selectedIndex).toBe(10);
    select.value = '40';
    select.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    const head = [...el.querySelectorAll('thead th')].map(text);
    expect(head[4]).toBe('Density at 1.00 MHz');
    expect(bodyRows(el)[1][4]).toBe(formatSi(twelve.noise!.contributors['r2'][40], 'V/√Hz'));
    // Shares over the band do not move with the spot.
    expect(bodyRows(el)[0][2]).toBe('32.2 %');
  });

  it('reads both densities and the largest part under the cursor from the keyboard', async () => {
    const { fixture, el } = await render(twelve);
    const surface = el.querySelector('.surface') as HTMLElement;
    surface.dispatchEvent(new FocusEvent('focus'));
    await fixture.whenStable();
    expect(text(el.querySelector('.readout .at'))).toBe('f = 100.0 Hz');
    for (let k = 0; k < 10; k++) surface.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight' }));
    await fixture.whenStable();
    expect(text(el.querySelector('.readout .at'))).toBe('f = 1.000 kHz');
    const rows = [...el.querySelectorAll('.readout .row')].map((r) => [text(r.querySelector('.name')), text(r.querySelector('.num'))]);
    expect(rows[0]).toEqual(['output v(out)', formatSi(twelve.noise!.out_density[10], 'V/√Hz', 4)]);
    expect(rows[1]).toEqual(['input-referred (vin)', formatSi(twelve.noise!.in_density[10], 'V/√Hz', 4)]);
    expect(text(el.querySelector('.readout .extra'))).toBe('largest here: rs (32.2 %)');
  });

  it('exports the shown curves or all of them as CSV, and a clean SVG', async () => {
    const { el, panel } = await render(twelve);
    const shown = panel.csvText().split('\r\n');
    expect(shown[0]).toBe('freq_hz,out_density_v_per_rthz,in_density_v_per_rthz');
    expect(shown.length - 2).toBe(61);
    expect(Number(shown[11].split(',')[1])).toBe(twelve.noise!.out_density[10]);
    const all = panel.csvAllText().split('\r\n');
    expect(all[0].split(',').length).toBe(3 + 12);
    expect(all[0]).toContain('r12_v_per_rthz');
    // The button says how many columns of curves the full file holds: both densities and the twelve parts.
    expect([...el.querySelectorAll('nw-export-bar button')].map(text)).toContain('CSV, all 14');
    const svg = panel.plot()!.svgText();
    expect(svg).not.toMatch(/_ngcontent|ng-reflect|style="/);
    expect(svg).toContain('nV/√Hz');
    expect(svg).not.toContain('cursor-label"');
  });

  it('writes the input-referred figures of a current-source input in amperes, on a panel of their own', async () => {
    const r = solveNetlist(CURRENT_INPUT);
    const { el } = await render(r);
    expect(text(el.querySelector('[data-figure="in-rms"]'))).toBe(formatSi(r.measures['ni'], 'A'));
    expect(text(el.querySelector('[data-figure="in-rms"] + .def'))).toMatch(/ pA\/√Hz at 1\.00 kHz$/);
    expect([...el.querySelectorAll('.axis-title')].map(text)).toEqual(['Noise density (V/√Hz)', 'Noise density (A/√Hz)', 'f (Hz)']);
  });

  it('says where the input-referred noise is undefined, and leaves it out of the rms, the curve and the CSV', async () => {
    const { el, panel } = await render(solveNetlist(INPUT_APART));
    expect(text(el.querySelector('[data-figure="in-rms"]'))).toBe('undefined');
    expect(text(el.querySelector('.warn-text'))).toBe('The input-referred noise is undefined at 61 of 61 frequencies (from 10.0 Hz): vin does not reach the output there. The curve leaves them out.');
    expect(el.querySelector('svg.plot path.curve[data-key="in"]')!.getAttribute('d')).toBe('');
    expect(panel.csvText().split('\r\n')[1]).toMatch(/^10,[\d.e-]+,$/);
  });

  it('explains how to ask for noise, with a line built from the ports or the circuit’s names', async () => {
    const pair = await render(solveNetlist(RESISTOR_TAIL_PAIR));
    expect(text(pair.el.querySelector('.title'))).toBe('No noise analysis yet');
    expect(pair.el.textContent).toContain('analyze noise out NODE in SOURCE from START to STOP per decade N');
    expect(text(pair.el.querySelector('code'))).toBe('analyze noise out outa outb in va from 10 Hz to 10 MHz per decade 10');
    expect(pair.el.querySelector('svg.plot')).toBeNull();
    const rc = await render(solveNetlist(RC_LOWPASS.replace(/^(analyze|measure).*$/gm, '')));
    expect(text(rc.el.querySelector('code'))).toBe('analyze noise out out in vin from 10 Hz to 10 MHz per decade 10');
    const broken = await render(solveNetlist(BROKEN));
    expect(text(broken.el.querySelector('.title'))).toMatch(/^The netlist has \d+ errors?$/);
    const none = await render(undefined);
    expect(text(none.el.querySelector('.title'))).toBe('Nothing solved yet');
  });
});
