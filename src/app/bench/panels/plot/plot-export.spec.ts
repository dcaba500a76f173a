import { TestBed } from '@angular/core/testing';
import { solveNetlist } from '../../../../../solver';
import { RESISTOR_TAIL } from '../../examples/resistor-tail';
import { ResponsePanel } from '../response-panel';
import { columnsCsv } from './plot-export';
import { PLOT_STYLESHEET } from './plot-style';

/** The demo netlist the bench opens with: its Response tab is "the demo Bode plot". */
const demo = solveNetlist(RESISTOR_TAIL.text);

async function renderDemo() {
  const fixture = TestBed.createComponent(ResponsePanel);
  fixture.componentRef.setInput('result', demo);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement, panel: fixture.componentInstance };
}

describe('exported SVG', () => {
  it('carries no framework attributes, one small stylesheet and no inline styles', async () => {
    expect(demo.errors).toEqual([]);
    const { el, panel } = await renderDemo();
    // On the page Angular marks the SVG as part of its component: the file must not say so.
    const live = el.querySelector('svg.plot')!;
    expect(live.getAttributeNames().some((n) => n.startsWith('_ngcontent'))).toBe(true);
    const text = panel.plot()!.svgText();
    expect(text).not.toMatch(/_ngcontent|_nghost|ng-reflect|ng-version|aria-|tabindex/);
    expect(text).not.toContain(' style="');
    expect(text.match(/<style>/g)?.length).toBe(1);
    // The cursor and zoom box are the page's: neither they nor their rules travel.
    expect(text).not.toMatch(/cursor|zoom-box/);
    expect(text).toContain('<svg xmlns="http://www.w3.org/2000/svg"');
    expect(PLOT_STYLESHEET.length).toBeLessThan(2000);
    // It parses as XML on its own.
    const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
    expect(doc.querySelector('parsererror')).toBeNull();
    expect(doc.documentElement.getAttribute('class')).toBe('nw-plot');
  });

  it('keeps the demo Bode plot (three curves, magnitude and phase, 161 points) under 30 kB', async () => {
    const { panel } = await renderDemo();
    expect(panel.shown().map((e) => e.key)).toEqual(['adm', 'acm', 'cmrr']);
    expect(demo.ac!.freq_hz.length).toBe(161);
    const bytes = new TextEncoder().encode(panel.plot()!.svgText()).length;
    // Measured 114 kB before the stylesheet, one-path grids and 0.1 px coordinates.
    expect(bytes).toBeLessThan(30_000);
    expect(bytes).toBeGreaterThan(5_000);
  });
});

describe('CSV export', () => {
  it('offers every curve of the sweep, shown, hidden and silent, besides the shown ones', async () => {
    const { panel } = await renderDemo();
    const shown = panel.csvText().split('\r\n')[0].split(',');
    const all = panel.csvAllText().split('\r\n');
    const header = all[0].split(',');
    expect(shown).toEqual(['freq_hz', 'adm_mag_db', 'adm_phase_deg', 'acm_mag_db', 'acm_phase_deg', 'cmrr_mag_db', 'cmrr_phase_deg']);
    const keys = Object.keys(demo.ac!.curves);
    expect(header.length).toBe(1 + 2 * keys.length);
    for (const key of keys) expect(header).toContain(`${key}_mag_db`);
    // Hidden curves too: the node curves are off by default, and vcc has no ac response at all.
    expect(panel.isVisible('ac(outa)')).toBe(false);
    expect(header).toContain('ac(vcc)_mag_db');
    expect(all.length - 2).toBe(161);
    const row = all[1 + 40].split(',');
    expect(Number(row[header.indexOf('ac(outa)_mag_db')])).toBe(demo.ac!.curves['ac(outa)'].db[40]);
  });

  it('writes columns of any length with RFC 4180 quoting', () => {
    expect(columnsCsv([{ name: 'va_v', values: [-0.1, 0] }, { name: 'i(a, b)_a', values: [1e-3, 2e-3] }]))
      .toBe('va_v,"i(a, b)_a"\r\n-0.1,0.001\r\n0,0.002\r\n');
  });
});
