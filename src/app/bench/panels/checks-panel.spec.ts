import { TestBed } from '@angular/core/testing';
import { solveNetlist, solveWithOutline, type SolveResult } from '../../../../solver';
import { ChecksPanel } from './checks-panel';
import { HEADROOM_TROUBLE, RESISTOR_TAIL_PAIR } from './testing/netlists';

async function render(result: SolveResult | undefined, netlist?: string) {
  const fixture = TestBed.createComponent(ChecksPanel);
  fixture.componentRef.setInput('result', result);
  // The measure lines of `netlist`, as the worker's parse hands them over with the result.
  if (netlist !== undefined) fixture.componentRef.setInput('measureLines', solveWithOutline(netlist).outline.measures);
  const lines: number[] = [];
  fixture.componentInstance.lineSelected.subscribe((l) => lines.push(l));
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement, lines };
}

/** The visible cells of a row (the hidden column names between them are for screen readers). */
function cells(row: Element): string[] {
  return [...row.children].filter((c) => !c.classList.contains('visually-hidden')).map((c) => c.textContent!.trim());
}

describe('ChecksPanel', () => {
  it('lists every check of the pair with pass, value, limit and margin in units', async () => {
    const result = solveNetlist(RESISTOR_TAIL_PAIR);
    const { el } = await render(result, RESISTOR_TAIL_PAIR);
    expect(el.querySelector('.summary')!.textContent!.trim()).toContain('✓ 2 of 2 pass');
    const rows = [...el.querySelectorAll('button.row')];
    expect(rows.length).toBe(2);
    const [cmrr, ic] = result.checks;
    // CMRR in dB keeps decimals; the collector current gets SI prefixes and its ± tolerance.
    expect(cells(rows[0])).toEqual(['✓ pass', 'cmrr_db >= 40', `${cmrr.value.toFixed(1)} dB`, '≥ 40.0 dB', `+${cmrr.margin.toFixed(1)} dB`, '16']);
    expect(cells(rows[1])).toEqual(['✓ pass', 'ic(q1) = 1m ± 5%', `${(ic.value * 1e6).toPrecision(3)} µA`, '= 1.00 mA ± 5%', `+${(ic.margin * 1e6).toPrecision(3)} µA`, '17']);
  });

  it('flags failures with a word and a symbol, not colour alone, and counts them', async () => {
    const result = solveNetlist(HEADROOM_TROUBLE);
    const { el } = await render(result, HEADROOM_TROUBLE);
    expect(result.checks.every((c) => !c.pass)).toBe(true);
    expect(el.querySelector('.summary')!.textContent).toContain('✗ 0 of 2 pass');
    const rows = [...el.querySelectorAll('button.row')];
    // vmin is a measure of vce values: its check inherits volts from the measure's expression.
    expect(cells(rows[0])).toEqual(['✗ fail', 'vmin > 0.3', '43.8 mV', '> 300 mV', '-256 mV', '27']);
    expect(cells(rows[1]).slice(0, 2)).toEqual(['✗ fail', 'id(m1) <= 100u']);
    // The row is named by its visible text, with the column names read between the figures.
    expect(rows[1].hasAttribute('aria-label')).toBe(false);
    expect(rows[1].textContent!.replace(/\s+/g, ' ').trim()).toMatch(/^✗ fail id\(m1\) <= 100u value \S+ µA limit ≤ 100 µA margin -\S+ µA line 28$/);
  });

  it('writes dimensionless checks as plain figures and a product of current and voltage in watts', async () => {
    // Ratios take no SI prefix (common practice); W = V·A (SI Brochure, 9th ed., 2019, Table 4).
    const netlist = RESISTOR_TAIL_PAIR + 'check mag(acm) < 1\ncheck ic(q1) * vce(q1) <= 10m\n';
    const result = solveNetlist(netlist);
    expect(result.errors).toEqual([]);
    const { el } = await render(result, netlist);
    const rows = [...el.querySelectorAll('button.row')];
    const [, , acm, power] = result.checks;
    expect(cells(rows[2]).slice(2, 5)).toEqual(['0.530', '< 1.00', `+${acm.margin.toPrecision(3)}`]);
    expect(cells(rows[3]).slice(2, 5)).toEqual([`${(power.value * 1e3).toPrecision(3)} mW`, '≤ 10.0 mW', `+${(power.margin * 1e3).toPrecision(3)} mW`]);
  });

  it('emits the check\'s line on click and on Enter (a native button)', async () => {
    const { el, lines } = await render(solveNetlist(RESISTOR_TAIL_PAIR));
    const rows = [...el.querySelectorAll('button.row')] as HTMLButtonElement[];
    rows[1].click();
    expect(lines).toEqual([17]);
    expect(rows[0].tagName).toBe('BUTTON');
    expect(rows[0].type).toBe('button');
  });

  it('colours no pass or fail when the result is from an earlier version of the netlist', async () => {
    const { fixture, el } = await render(solveNetlist(RESISTOR_TAIL_PAIR), RESISTOR_TAIL_PAIR);
    expect(el.querySelectorAll('.tag.pass')).toHaveLength(3);
    fixture.componentRef.setInput('stale', true);
    await fixture.whenStable();
    expect(el.querySelectorAll('.tag.pass, .tag.fail')).toHaveLength(0);
    expect(el.querySelectorAll('.tag.stale')).toHaveLength(3);
    expect(el.querySelector('.summary')!.textContent!.replace(/\s+/g, ' ')).toContain('2 of 2 passed in an earlier version');
    expect(el.querySelector('button.row')!.textContent).toContain('Earlier version');
  });

  it('says how to write a check when there is none', async () => {
    const { el } = await render(solveNetlist('title t\nv1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\n'));
    expect(el.textContent).toContain('check cmrr_db >= 80');
  });
});
