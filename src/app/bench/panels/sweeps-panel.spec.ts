import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { solveNetlist, solveWithOutline, type SolveResult } from '../../../../solver';
import { SweepsPanel } from './sweeps-panel';
import { SweepMeasurePlot } from './sweeps/sweep-measure-plot';
import { BROKEN, RESISTOR_TAIL_PAIR, SWEPT_PAIR } from './testing/netlists';

const solved = solveWithOutline(SWEPT_PAIR);
const swept = solved.result;

async function render(result: SolveResult | undefined, inputs: Record<string, unknown> = {}): Promise<{ fixture: ComponentFixture<SweepsPanel>; el: HTMLElement }> {
  const fixture = TestBed.createComponent(SweepsPanel);
  fixture.componentRef.setInput('result', result);
  fixture.componentRef.setInput('measureLines', solved.outline.measures);
  for (const [name, value] of Object.entries(inputs)) fixture.componentRef.setInput(name, value);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement };
}

const text = (el: Element | null) => (el?.textContent ?? '').replace(/\s+/g, ' ').trim();
const tableRows = (el: HTMLElement) => [...el.querySelectorAll('nw-sweep-table tbody tr')].map((tr) => [...tr.children].map(text));
const db = (v: number) => `${v.toFixed(2)} dB`;

async function chooseKind(fixture: ComponentFixture<SweepsPanel>, el: HTMLElement, label: RegExp): Promise<void> {
  const radio = [...el.querySelectorAll<HTMLInputElement>('.toggle input[type="radio"]')].find((r) => label.test(text(r.parentElement)))!;
  radio.click();
  await fixture.whenStable();
}

describe('SweepsPanel', () => {
  it('tabulates each value of rt: the ports figures, the measures in their units, the checks, and why 0 Ω did not solve', async () => {
    expect(swept.errors).toEqual([]);
    const { el } = await render(swept);
    const runs = swept.vary!.runs;
    expect([...el.querySelectorAll('nw-sweep-table thead th')].map(text)).toEqual(['rt', 'adm', 'acm', 'cmrr', 'a0', 'f3', 'Checks']);
    const rows = tableRows(el);
    expect(rows.length).toBe(4);
    // rt = 0 Ω is refused by the solver; the row keeps its place and says why.
    expect(rows[0][0]).toBe('0 Ω');
    expect(rows[0][1]).toBe('✗ did not solve The resistance of `rt` must be greater than zero; it is 0.');
    expect(el.querySelector('nw-sweep-table tbody tr td.failure')!.getAttribute('colspan')).toBe('6');
    // The written value, 4.65 kΩ: the very figures of the plain solve, which runs at the written params.
    expect(rows[2]).toEqual(['4.65 kΩ', db(swept.ports!.adm.db), db(swept.ports!.acm.db), db(swept.ports!.cmrr_db),
      `${swept.measures['a0'].toFixed(1)} dB`, `${(swept.measures['f3'] / 1e6).toPrecision(3)} MHz`, '✓ 3 of 3 pass']);
    // A 1 kΩ tail carries too little current for the pair to amplify (|adm| < 1): no −3 dB corner,
    // every check failing, each named.
    expect(rows[1].slice(0, 4)).toEqual(['1.00 kΩ', db(runs[1].ports!.adm.db), db(runs[1].ports!.acm.db), db(runs[1].ports!.cmrr_db)]);
    expect(rows[1][5]).toBe('—');
    expect(rows[1][6]).toBe('✗ 0 of 3 pass fails: cmrr_db >= 40; ic(q1) = 1m ± 5%; a0 >= 40');
    expect(rows[3][0]).toBe('20.0 kΩ');
    expect(rows[3][6]).toMatch(/^✗ 1 of 3 pass fails: /);
    // Pass and fail by word and symbol as well as colour.
    const tags = [...el.querySelectorAll('nw-sweep-table tbody .tag')];
    expect(tags.map((t) => t.classList.contains('pass') ? 'pass' : t.classList.contains('fail') ? 'fail' : '?')).toEqual(['fail', 'fail', 'pass', 'fail']);
    expect(text(el.querySelector('.summary'))).toBe('4 values of rt; 1 did not solve.');
  });

  it('overlays adm and CMRR over frequency for every value that solved, with a legend naming the values', async () => {
    const { fixture, el } = await render(swept);
    const legend = [...el.querySelectorAll('nw-sweep-overlay .legend button')];
    expect(legend.map(text)).toEqual(['✓rt = 1.00 kΩ', '✓rt = 4.65 kΩ', '✓rt = 20.0 kΩ']);
    expect(text(el.querySelector('nw-sweep-overlay .legend .note'))).toBe('Not plotted (did not solve): rt = 0 Ω.');
    const plots = [...el.querySelectorAll('nw-sweep-overlay nw-bode-plot')];
    expect(plots.length).toBe(2);
    for (const [k, key] of ['adm', 'cmrr'].entries()) {
      const curves = [...plots[k].querySelectorAll('path.curve')];
      expect(curves.map((c) => c.getAttribute('data-key'))).toEqual([`${key}@1`, `${key}@2`, `${key}@3`]);
      // Each value its own colour and dash (never colour alone).
      expect(new Set(curves.map((c) => c.getAttribute('stroke'))).size).toBe(3);
      expect(new Set(curves.map((c) => c.getAttribute('stroke-dasharray') ?? '')).size).toBe(3);
      expect(plots[k].querySelector('.panel-phase')).toBeNull();
    }
    // The exported file's legend names the values too.
    const svg = plots[0].querySelector('svg.plot')!.outerHTML;
    expect(svg).toContain('>rt = 4.65 kΩ</text>');
    // Hiding a value takes its curve off both plots and leaves the others' styles as they were.
    const before = plots[0].querySelector('path.curve[data-key="adm@3"]')!.getAttribute('stroke');
    (legend[0] as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(legend[0].getAttribute('aria-pressed')).toBe('false');
    expect(el.querySelectorAll('nw-sweep-overlay path.curve').length).toBe(4);
    expect(plots[0].querySelector('path.curve[data-key="adm@3"]')!.getAttribute('stroke')).toBe(before);
  });

  it('plots a measure against rt, one point per value that has it, on a log axis with its check limit', async () => {
    const { fixture, el } = await render(swept);
    const runs = swept.vary!.runs;
    const plot = fixture.debugElement.query((d) => d.componentInstance instanceof SweepMeasurePlot).componentInstance as SweepMeasurePlot;
    // a0, the first measure, by default: rt = 1k, 4.65k, 20k solved (0 did not).
    expect(plot.quantity()!.name).toBe('a0');
    expect(plot.points()).toEqual({ x: [1000, 4650, 20000], y: [1, 2, 3].map((k) => runs[k].measures['a0']) });
    // 1k … 20k spans more than a decade: a log axis, so 4.65k sits log(4.65)/log(20) of the way along.
    expect(plot.log()).toBe(true);
    const dots = [...el.querySelectorAll('nw-sweep-measure-plot g.points circle')].map((c) => Number(c.getAttribute('cx')));
    expect(dots.length).toBe(3);
    expect((dots[1] - dots[0]) / (dots[2] - dots[0])).toBeCloseTo(Math.log(4.65) / Math.log(20), 2);
    // check a0 >= 40 is drawn across, at 40 dB.
    expect([...el.querySelectorAll('nw-sweep-measure-plot .rule-label')].map(text)).toEqual(['check a0 ≥ 40.0 dB']);
    expect(text(el.querySelector('nw-sweep-measure-plot .limits'))).toBe('Dashed: check a0 ≥ 40.0 dB (line 21).');
    expect(text(el.querySelector('nw-sweep-measure-plot .axis-title'))).toBe('a0 (dB)');
    // f3: the 1 kΩ tail has no corner, so two points; no check on it.
    const select = el.querySelector<HTMLSelectElement>('nw-sweep-measure-plot select')!;
    expect([...select.options].map((o) => o.textContent)).toEqual(['adm dB', 'acm dB', 'cmrr dB', 'a0', 'f3']);
    select.value = 'measure:f3';
    select.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    expect(plot.points().x).toEqual([4650, 20000]);
    expect(el.querySelectorAll('nw-sweep-measure-plot .rule-label').length).toBe(0);
    // cmrr dB with check cmrr_db >= 40; exported as CSV with the exact numbers.
    select.value = 'port:cmrr';
    select.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    expect([...el.querySelectorAll('nw-sweep-measure-plot .rule-label')].map(text)).toEqual(['check cmrr_db ≥ 40.0 dB']);
    expect(plot.csvText().split('\r\n')).toEqual(['rt_ohm,cmrr_db', ...[1, 2, 3].map((k) => `${swept.vary!.values[k]},${runs[k].ports!.cmrr_db}`), '']);
    expect(plot.stem()).toBe('swept-pair-cmrr-db-vs-rt');
  });

  it('draws both edges of a check with a tolerance', async () => {
    const netlist = SWEPT_PAIR.replace('measure f3 = corner(adm)', 'measure f3 = corner(adm)\nmeasure i1 = ic(q1)').replace('check ic(q1) = 1m ± 5%', 'check i1 = 1m ± 5%');
    const { fixture, el } = await render(solveNetlist(netlist), { measureLines: solveWithOutline(netlist).outline.measures });
    const select = el.querySelector<HTMLSelectElement>('nw-sweep-measure-plot select')!;
    select.value = 'measure:i1';
    select.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    // 1 mA ± 5 %: 950 µA and 1.05 mA.
    expect([...el.querySelectorAll('nw-sweep-measure-plot .rule-label')].map(text)).toEqual(['check i1 ≥ 950 µA', 'check i1 ≤ 1.05 mA']);
  });

  it('switches to the temperature sweep: rows in °C, a linear axis through 0', async () => {
    const { fixture, el } = await render(swept);
    expect([...el.querySelectorAll('.toggle label')].map(text)).toEqual(['vary rt', 'temperature']);
    await chooseKind(fixture, el, /temperature/);
    const rows = tableRows(el);
    expect(rows.map((r) => r[0])).toEqual(['-40 °C', '27 °C', '125 °C']);
    expect(el.querySelector('nw-sweep-table thead th')!.textContent).toBe('Temperature');
    // 27 °C is the written temperature: the plain solve's figures.
    expect(swept.temp_c).toBe(27);
    expect(rows[1][1]).toBe(db(swept.ports!.adm.db));
    // gm = IC/VT and VT = kT/q grows with T, so the differential gain falls as it warms (common practice).
    const adm = swept.temp!.runs.map((r) => r.ports!.adm.db);
    expect(adm[0]).toBeGreaterThan(adm[1]);
    expect(adm[1]).toBeGreaterThan(adm[2]);
    expect(text(el.querySelector('.summary'))).toBe('3 temperatures, all solved.');
    expect([...el.querySelectorAll('nw-sweep-overlay .legend button')].map(text)).toEqual(['✓-40 °C', '✓27 °C', '✓125 °C']);
    const plot = fixture.debugElement.query((d) => d.componentInstance instanceof SweepMeasurePlot).componentInstance as SweepMeasurePlot;
    expect(plot.log()).toBe(false);
    expect(plot.points().x).toEqual([-40, 27, 125]);
    expect(plot.csvText().split('\r\n')[0]).toBe('temp_c,a0_db');
  });

  it('marks nothing as passing or failing when the figures are from an earlier version', async () => {
    const { el } = await render(swept, { stale: true });
    const tags = [...el.querySelectorAll('nw-sweep-table tbody .tag')];
    expect(tags.every((t) => t.classList.contains('stale') && !t.classList.contains('pass') && !t.classList.contains('fail'))).toBe(true);
    expect(text(tags[2])).toBe('✓ 3 of 3 pass');
  });

  it('explains how to ask for a sweep, naming the netlist’s own params', async () => {
    const plain = await render(solveNetlist(RESISTOR_TAIL_PAIR));
    expect(text(plain.el)).toContain('analyze vary PARAM over v1 v2 v3');
    expect(text(plain.el)).toContain('analyze temp over -40 27 125');
    const named = await render(solveNetlist(RESISTOR_TAIL_PAIR), { params: ['rt', 'rc'] });
    expect(text(named.el)).toContain('this netlist has rt, rc');
    expect(text(named.el)).toContain('analyze vary rt over v1 v2 v3');
    expect(text((await render(solveNetlist(BROKEN))).el)).toContain('The netlist has 2 errors');
  });
});
