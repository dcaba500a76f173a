import { TestBed } from '@angular/core/testing';
import { solveNetlist, type SolveResult } from '../../../../solver';
import { SensitivityTable } from './sensitivity-table';

async function render(result: SolveResult | undefined) {
  const fixture = TestBed.createComponent(SensitivityTable);
  fixture.componentRef.setInput('result', result);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement };
}

const rows = (el: HTMLElement) => [...el.querySelectorAll('tbody tr')].map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent!.trim()));

// A divider: ratio = rb/(ra + rb), so S(ra) = −ra/(ra + rb) = −0.25 and S(rb) = +0.25 (Ohm's law);
// v(mid) also moves with vin (S = +1).
const DIVIDER = 'vin: vsrc(top, gnd) 3\nra: res(top, mid) 10k\nrb: res(mid, gnd) 30k\nanalyze sensitivity\nmeasure ratio = v(mid) / v(top)\nmeasure vmid = v(mid)\n';

describe('SensitivityTable', () => {
  it('ranks what moves a figure, with its sign in symbol and words', async () => {
    const { el } = await render(solveNetlist(DIVIDER));
    expect(rows(el).slice(0, 2)).toEqual([
      ['1', 'ra', 'value', '−0.250', '↓ lowers it'],
      ['2', 'rb', 'value', '+0.250', '↑ raises it'],
    ]);
    expect(el.querySelector('.how')!.textContent).toContain('±0.01 %');
  });

  it('switches to another figure', async () => {
    const { fixture, el } = await render(solveNetlist(DIVIDER));
    const select = el.querySelector('select') as HTMLSelectElement;
    expect([...select.options].map((o) => o.value)).toEqual(['ratio', 'vmid']);
    select.value = 'vmid';
    select.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    expect(rows(el)[0].slice(1, 4)).toEqual(['vin', 'dc', '+1.000']);
  });

  it('shows nothing without a sensitivity analysis', async () => {
    const { el } = await render(solveNetlist('vin: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\n'));
    expect(el.querySelector('table')).toBeNull();
  });
});
