import { TestBed } from '@angular/core/testing';
import { solveNetlist, solveWithOutline, type SolveResult } from '../../../../solver';
import { MeasuresPanel } from './measures-panel';
import { HEADROOM_TROUBLE, LOADED_PAIR, MOS_PAIR_SINGLE, RESISTOR_TAIL_PAIR } from './testing/netlists';

async function render(result: SolveResult | undefined, netlist?: string) {
  const fixture = TestBed.createComponent(MeasuresPanel);
  fixture.componentRef.setInput('result', result);
  // The measure lines of `netlist`, as the worker's parse hands them over with the result.
  if (netlist !== undefined) fixture.componentRef.setInput('measureLines', solveWithOutline(netlist).outline.measures);
  const lines: number[] = [];
  fixture.componentInstance.lineSelected.subscribe((l) => lines.push(l));
  await fixture.whenStable();
  return { el: fixture.nativeElement as HTMLElement, lines };
}

const values = (el: HTMLElement) => [...el.querySelectorAll('.row')].map((r) => [r.querySelector('.name')!.textContent, r.querySelector('.value')!.textContent]);

describe('MeasuresPanel', () => {
  it('writes each measure in the unit its expression implies, and emits its line', async () => {
    const result = solveNetlist(LOADED_PAIR);
    const { el, lines } = await render(result, LOADED_PAIR);
    const m = result.measures;
    expect(values(el)).toEqual([
      ['a0', `${m['a0'].toFixed(1)} dB`],
      ['f3', `${(m['f3'] / 1e6).toPrecision(3)} MHz`],
      ['fu', `${(m['fu'] / 1e6).toPrecision(3)} MHz`],
    ]);
    expect(el.querySelector('.row .expr')!.textContent).toBe('= db(adm)');
    (el.querySelectorAll('button.row')[1] as HTMLButtonElement).click();
    const f3Line = LOADED_PAIR.split('\n').findIndex((l) => l.startsWith('measure f3')) + 1;
    expect(f3Line).toBeGreaterThan(1);
    expect(lines).toEqual([f3Line]);
  });

  it('gives volts to a min() of VCEs and siemens to a gm', async () => {
    const result = solveNetlist(HEADROOM_TROUBLE);
    const { el } = await render(result, HEADROOM_TROUBLE);
    expect(values(el)).toEqual([['vmin', '43.8 mV'], ['gm3', '926 µS']]);
  });

  it('works the unit out of products and quotients: W, Ω, S, and a plain figure for a ratio', async () => {
    // W = V·A, Ω = V/A, S = A/V (SI Brochure, 9th ed., 2019, Table 4); a ratio of two voltages
    // has no unit and takes no prefix (common practice).
    const netlist = RESISTOR_TAIL_PAIR + [
      'measure pq = ic(q1) * vce(q1)', 'measure rout = v(outa) / i(rc1)', 'measure gq = ic(q1) / vbe(q1)',
      'measure ratio = v(outa) / v(vcc)', 'measure acm0 = mag(acm)', '',
    ].join('\n');
    const result = solveNetlist(netlist);
    expect(result.errors).toEqual([]);
    const m = result.measures;
    const { el } = await render(result, netlist);
    const shown = Object.fromEntries(values(el));
    expect(shown['pq']).toBe(`${(m['pq'] * 1e3).toPrecision(3)} mW`);
    expect(shown['rout']).toBe(`${(m['rout'] / 1e3).toPrecision(3)} kΩ`);
    expect(shown['gq']).toBe(`${(m['gq'] * 1e3).toPrecision(3)} mS`);
    expect(shown['ratio']).toBe(m['ratio'].toPrecision(3));
    expect(shown['acm0']).toBe('0.530');
  });

  it('without the netlist shows plain figures and emits nothing', async () => {
    const result = solveNetlist(MOS_PAIR_SINGLE);
    const { el, lines } = await render(result);
    expect(el.querySelector('button.row')).toBeNull();
    expect(values(el)).toEqual([['gain', Number(result.measures['gain'].toPrecision(3)).toFixed(2)]]);
    (el.querySelector('.row') as HTMLElement).click();
    expect(lines).toEqual([]);
  });
});
