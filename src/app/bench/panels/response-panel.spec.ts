import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { solveNetlist, type SolveResult } from '../../../../solver';
import { ResponsePanel } from './response-panel';
import { BROKEN, HEADROOM_TROUBLE, LOADED_PAIR, RESISTOR_TAIL_PAIR } from './testing/netlists';

const pair = solveNetlist(RESISTOR_TAIL_PAIR);

async function render(result: SolveResult | undefined): Promise<{ fixture: ComponentFixture<ResponsePanel>; el: HTMLElement }> {
  const fixture = TestBed.createComponent(ResponsePanel);
  fixture.componentRef.setInput('result', result);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement };
}

function parseCsv(text: string): string[][] {
  // Minimal RFC 4180 reader for the test: quoted fields may hold commas.
  return text.trim().split('\r\n').map((line) => {
    const out: string[] = [];
    let field = '';
    let quoted = false;
    for (let k = 0; k < line.length; k++) {
      const c = line[k];
      if (quoted) {
        if (c === '"' && line[k + 1] === '"') { field += '"'; k++; } else if (c === '"') quoted = false; else field += c;
      } else if (c === '"') quoted = true;
      else if (c === ',') { out.push(field); field = ''; } else field += c;
    }
    out.push(field);
    return out;
  });
}

describe('ResponsePanel', () => {
  it('plots the ports curves by default, one path per curve in each of the two panels', async () => {
    expect(pair.errors).toEqual([]);
    const { el } = await render(pair);
    const pressed = [...el.querySelectorAll('.legend button[aria-pressed="true"]')].map((b) => b.getAttribute('data-key'));
    expect(pressed).toEqual(['adm', 'acm', 'cmrr']);
    expect(el.querySelectorAll('svg.plot path.curve[data-key="adm"]').length).toBe(2);
    expect(el.querySelectorAll('svg.plot path.curve').length).toBe(6);
    // Nodes with no ac response (the supplies and the grounded input) are named, not plotted.
    expect(el.querySelector('.silent')?.textContent).toContain('vcc, vee, inb');
    expect(el.querySelector('.legend button[data-key="ac(vcc)"]')).toBeNull();
  });

  it('labels the frequency axis in decades with SI-prefixed hertz and the value axes with units', async () => {
    const { el } = await render(pair);
    const labels = [...el.querySelectorAll('.x-labels text')].map((t) => t.textContent);
    // The sweep runs 10 Hz … 1 GHz: eight decades (common practice: decade ticks on a Bode plot).
    expect(labels).toEqual(['10 Hz', '100 Hz', '1 kHz', '10 kHz', '100 kHz', '1 MHz', '10 MHz', '100 MHz', '1 GHz']);
    const titles = [...el.querySelectorAll('.axis-title')].map((t) => t.textContent);
    expect(titles).toEqual(['Magnitude (dB)', 'Phase (°)', 'Frequency (Hz)']);
    expect([...el.querySelectorAll('.panel-phase .y-labels text')].every((t) => t.textContent!.endsWith('°'))).toBe(true);
  });

  it('toggles curves from the legend', async () => {
    const { fixture, el } = await render(pair);
    (el.querySelector('.legend button[data-key="acm"]') as HTMLButtonElement).click();
    (el.querySelector('.legend button[data-key="ac(outa)"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(el.querySelector('.legend button[data-key="acm"]')!.getAttribute('aria-pressed')).toBe('false');
    const keys = new Set([...el.querySelectorAll('svg.plot path.curve')].map((p) => p.getAttribute('data-key')));
    expect([...keys]).toEqual(['adm', 'cmrr', 'ac(outa)']);
  });

  it('marks the −3 dB corner and the unity crossing at the frequencies the measures report', async () => {
    // The same pair with 10 pF loads, so that |adm| falls through 1 inside the sweep.
    const wide = solveNetlist(LOADED_PAIR);
    expect(wide.errors).toEqual([]);
    const { fixture, el } = await render(wide);
    // corner(adm) and unity(adm) are the measures' own functions: the labels must agree with them.
    expect(el.querySelector('.marker-corner .marker-label')?.textContent).toBe(`−3 dB at ${(wide.measures['f3'] / 1e6).toPrecision(3)} MHz`);
    expect(el.querySelector('.marker-unity .marker-label')?.textContent).toBe(`0 dB at ${(wide.measures['fu'] / 1e6).toPrecision(3)} MHz`);
    // Choosing another curve moves the marks: acm starts below 0 dB, so it has no unity crossing.
    const select = el.querySelector('select') as HTMLSelectElement;
    select.value = 'acm';
    select.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    expect(fixture.componentInstance.selectedKey()).toBe('acm');
    expect(el.querySelector('.marker-unity')).toBeNull();
  });

  it('reads f, dB and degrees under the cursor from the keyboard', async () => {
    const { fixture, el } = await render(pair);
    const surface = el.querySelector('.surface') as HTMLElement;
    surface.dispatchEvent(new FocusEvent('focus'));
    await fixture.whenStable();
    expect(el.querySelector('.readout .freq')?.textContent).toBe('f = 10 Hz');
    for (let k = 0; k < 20; k++) surface.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true }));
    await fixture.whenStable();
    // 20 points per decade from 10 Hz: the 21st point is 100 Hz.
    expect(el.querySelector('.readout .freq')?.textContent).toBe('f = 100 Hz');
    const adm = pair.ac!.curves['adm'];
    const first = el.querySelector('.readout .row')!.textContent!;
    expect(first).toContain(`${adm.db[20].toFixed(2)} dB`);
    expect(first).toContain(`${adm.phase_deg[20].toFixed(1)}°`);
    expect(el.querySelector('g.cursor line.cursor-line')).not.toBeNull();
  });

  it('zooms in and resets from the keyboard and the reset button', async () => {
    const { fixture, el } = await render(pair);
    const surface = el.querySelector('.surface') as HTMLElement;
    surface.dispatchEvent(new FocusEvent('focus'));
    surface.dispatchEvent(new KeyboardEvent('keydown', { key: 'End' }));
    surface.dispatchEvent(new KeyboardEvent('keydown', { key: '+' }));
    surface.dispatchEvent(new KeyboardEvent('keydown', { key: '+' }));
    await fixture.whenStable();
    const plot = fixture.componentInstance.plot()!;
    const domain = plot.xDomain()!;
    // Zoomed twice by half around 1 GHz: two decades of the eight remain.
    expect(Math.log10(domain[1] / domain[0])).toBeCloseTo(2, 6);
    const reset = [...el.querySelectorAll('button')].find((b) => b.textContent!.trim() === 'Reset zoom') as HTMLButtonElement;
    expect(reset.disabled).toBe(false);
    reset.click();
    await fixture.whenStable();
    expect(plot.xDomain()).toBeUndefined();
    expect(reset.disabled).toBe(true);
  });

  it('pans with Shift+arrows and zooms to a dragged box with the pointer', async () => {
    const { fixture, el } = await render(pair);
    const surface = el.querySelector('.surface') as HTMLElement;
    const plot = fixture.componentInstance.plot()!;
    surface.dispatchEvent(new KeyboardEvent('keydown', { key: '+' }));
    const before = plot.xDomain()!;
    surface.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight', shiftKey: true }));
    const after = plot.xDomain()!;
    // A pan keeps the span (in decades) and moves towards higher frequencies.
    expect(after[0]).toBeGreaterThan(before[0]);
    expect(Math.log10(after[1] / after[0])).toBeCloseTo(Math.log10(before[1] / before[0]), 9);
    plot.resetZoom();
    await fixture.whenStable();
    // jsdom lays nothing out, so client coordinates are SVG coordinates: the plot area starts at x = 58.
    const geo = plot.geometry();
    const at = (x: number) => ({ clientX: geo.left + x, clientY: geo.mag.top + 5, button: 0, bubbles: true });
    surface.dispatchEvent(new MouseEvent('pointerdown', at(geo.innerWidth * 0.25)));
    surface.dispatchEvent(new MouseEvent('pointermove', at(geo.innerWidth * 0.5)));
    surface.dispatchEvent(new MouseEvent('pointerup', at(geo.innerWidth * 0.5)));
    await fixture.whenStable();
    const box = plot.xDomain()!;
    // A quarter of the width of an eight-decade axis is two decades: 1 kHz … 100 kHz.
    expect(box[0]).toBeCloseTo(1e3, 6);
    expect(box[1]).toBeCloseTo(1e5, 4);
    expect(el.querySelector('.x-labels text')!.textContent).toBe('1 kHz');
  });

  it('exports CSV with exactly the plotted numbers and an SVG without the cursor', async () => {
    const { fixture, el } = await render(pair);
    const rows = parseCsv(fixture.componentInstance.csvText());
    expect(rows[0]).toEqual(['freq_hz', 'adm_mag_db', 'adm_phase_deg', 'acm_mag_db', 'acm_phase_deg', 'cmrr_mag_db', 'cmrr_phase_deg']);
    expect(rows.length).toBe(pair.ac!.freq_hz.length + 1);
    expect(Number(rows[7][0])).toBe(pair.ac!.freq_hz[6]);
    expect(Number(rows[7][1])).toBe(pair.ac!.curves['adm'].db[6]);
    expect(Number(rows[7][6])).toBe(pair.ac!.curves['cmrr'].phase_deg[6]);
    const surface = el.querySelector('.surface') as HTMLElement;
    surface.dispatchEvent(new FocusEvent('focus'));
    await fixture.whenStable();
    const svg = fixture.componentInstance.plot()!.svgText();
    expect(svg).toContain('xmlns="http://www.w3.org/2000/svg"');
    expect(svg).toContain('Magnitude (dB)');
    expect(svg).not.toContain('cursor-line');
    expect(svg.match(/<path class="curve"/g)?.length).toBe(6);
  });

  it('quotes CSV headers of two-node curves that hold a comma', async () => {
    const { fixture } = await render(pair);
    fixture.componentInstance.toggle('ac(outa)');
    const header = fixture.componentInstance.csvText().split('\r\n')[0];
    expect(header.endsWith(',ac(outa)_mag_db,ac(outa)_phase_deg')).toBe(true);
  });

  it('explains what is missing instead of an empty plot', async () => {
    let { el } = await render(undefined);
    expect(el.textContent).toContain('Nothing solved yet');
    ({ el } = await render(solveNetlist(HEADROOM_TROUBLE)));
    expect(el.textContent).toContain('analyze ac from 10 Hz to 1 GHz per decade 20');
    ({ el } = await render(solveNetlist(BROKEN)));
    expect(el.textContent).toContain('The netlist has 2 errors');
    expect(el.textContent).toContain('Line 3');
    expect(el.querySelector('svg.plot')).toBeNull();
  });
});

describe('ResponsePanel without ports', () => {
  it('plots node curves and marks an RC low-pass corner at 1/(2πRC)', async () => {
    const lowPass = solveNetlist('title RC low-pass\nv1: vsrc(in, gnd) 0 ac=1\nr1: res(in, out) 1k\nc1: cap(out, gnd) 1u\nanalyze ac from 1 Hz to 100 kHz per decade 50\n');
    expect(lowPass.errors).toEqual([]);
    const { fixture, el } = await render(lowPass);
    expect(fixture.componentInstance.shown().map((e) => e.key)).toEqual(['ac(in)', 'ac(out)']);
    fixture.componentInstance.selectCurve('ac(out)');
    await fixture.whenStable();
    // First-order low-pass: f(−3 dB) = 1/(2π·R·C) = 159.15 Hz (Horowitz & Hill, The Art of Electronics, 3rd ed., §1.7.1, from memory).
    expect(el.querySelector('.marker-corner .marker-label')!.textContent).toBe(`−3 dB at ${(1 / (2 * Math.PI * 1e3 * 1e-6)).toPrecision(3)} Hz`);
    // ac(in) is the source itself: flat at 0 dB, so it has no corner, and 0 dB from the start is no crossing.
    fixture.componentInstance.selectCurve('ac(in)');
    await fixture.whenStable();
    expect(el.querySelector('.marker-corner')).toBeNull();
  });
});

describe('ResponsePanel curve styles', () => {
  it('never draws two shown curves alike, and the legend swatch matches the plotted curve', async () => {
    const { fixture, el } = await render(pair);
    for (const key of ['ac(ina)', 'ac(outa)', 'ac(outb)', 'ac(tail)']) fixture.componentInstance.toggle(key);
    await fixture.whenStable();
    const paths = [...el.querySelectorAll('.panel-mag path.curve')];
    expect(paths.length).toBe(7);
    const looks = paths.map((p) => `${p.getAttribute('stroke')} ${p.getAttribute('stroke-dasharray') ?? ''}`);
    expect(new Set(looks).size).toBe(7);
    const outa = el.querySelector('.legend button[data-key="ac(outa)"] line')!;
    const plotted = el.querySelector('.panel-mag path.curve[data-key="ac(outa)"]')!;
    expect(outa.getAttribute('stroke')).toBe(plotted.getAttribute('stroke'));
  });
});
