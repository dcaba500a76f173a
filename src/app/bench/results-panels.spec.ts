import { TestBed } from '@angular/core/testing';
import { solveWithOutline } from '../../../solver';
import { RESISTOR_TAIL_PAIR } from './panels/testing/netlists';
import { ResultsPanels } from './results-panels';

/** The panels for a text, with the lines of the same parse, as the bench passes them. */
async function render(text: string) {
  const { result, outline } = solveWithOutline(text, { skip: ['mismatch'] });
  const fixture = TestBed.createComponent(ResultsPanels);
  fixture.componentRef.setInput('result', result);
  fixture.componentRef.setInput('lines', { measures: outline.measures, checks: outline.checks, analyses: outline.analyses });
  await fixture.whenStable();
  const el = fixture.nativeElement as HTMLElement;
  return { fixture, el, tabs: () => [...el.querySelectorAll('[role=tab]')].map((t) => t.textContent!.trim().replace(/\s+/g, ' ')) };
}

describe('ResultsPanels', () => {
  it('gives the analyses the text asks for a tab each, and keeps the others under "Other analyses"', async () => {
    const plain = await render(RESISTOR_TAIL_PAIR);
    expect(plain.tabs()).toEqual(['Bias', 'Response', 'Modes', 'Checks & measures', 'Other analyses']);
    const swept = await render(`${RESISTOR_TAIL_PAIR}analyze temp over -40 27 85\nanalyze transfer va from -50m to 50m step 5m\n`);
    expect(swept.tabs()).toEqual(['Bias', 'Response', 'Modes', 'Transfer', 'Sweeps', 'Checks & measures', 'Other analyses']);
    const all = await render(`${RESISTOR_TAIL_PAIR}analyze vary rc over 5k 10k\nanalyze transfer va from -50m to 50m step 5m\nanalyze mismatch runs 10 is 1%\nanalyze noise out outa in va from 10 Hz to 1 MHz per decade 5\nanalyze poles\n`);
    expect(all.tabs()).toEqual(['Bias', 'Response', 'Modes', 'Transfer', 'Sweeps', 'Mismatch', 'Noise', 'Poles', 'Checks & measures']);
  });

  it('keeps a tab while its analyze line is still being typed', async () => {
    const typing = await render(`${RESISTOR_TAIL_PAIR}analyze temp over\n`);
    expect(typing.tabs()).toContain('Sweeps');
  });

  it('keeps the tab the user is on while the text stops asking for it, until another tab is chosen', async () => {
    const { fixture, el, tabs } = await render(`${RESISTOR_TAIL_PAIR}analyze noise out outa in va from 10 Hz to 1 MHz per decade 5\n`);
    const tab = (name: string) => [...el.querySelectorAll<HTMLElement>('[role=tab]')].find((t) => t.textContent!.includes(name))!;
    tab('Noise').click();
    await fixture.whenStable();
    // Select all and delete, before a paste: the text asks for nothing.
    const empty = solveWithOutline('', { skip: ['mismatch'] });
    fixture.componentRef.setInput('result', empty.result);
    fixture.componentRef.setInput('lines', { measures: [], checks: [], analyses: [] });
    await fixture.whenStable();
    expect(tabs()).toContain('Noise');
    expect(tab('Noise').getAttribute('aria-selected')).toBe('true');
    expect(el.querySelector('nw-noise-panel')?.textContent).toContain('No noise analysis');
    tab('Bias').click();
    await fixture.whenStable();
    expect(tabs()).not.toContain('Noise');
  });

  it('says under "Other analyses" how to ask for each analysis the text lacks', async () => {
    const { el, fixture } = await render(`${RESISTOR_TAIL_PAIR}analyze temp over -40 27 85\n`);
    const other = [...el.querySelectorAll<HTMLElement>('[role=tab]')].find((t) => t.textContent!.includes('Other analyses'))!;
    other.click();
    fixture.detectChanges();
    await fixture.whenStable();
    const text = el.textContent!;
    expect(text).toContain('Transfer curve');
    expect(text).toContain('No mismatch analysis yet');
    expect(text).not.toContain('Sweeps: a param or the temperature');
  });

  it('keeps the sweep of the earlier text, marked as updating, while the new one is solved', async () => {
    const text = `${RESISTOR_TAIL_PAIR}analyze temp over -40 27 85\n`;
    const { fixture, el } = await render(text);
    const sweeps = [...el.querySelectorAll<HTMLElement>('[role=tab]')].find((t) => t.textContent!.includes('Sweeps'))!;
    sweeps.click();
    await fixture.whenStable();
    expect(el.querySelector('nw-sweeps-panel table')).not.toBeNull();
    const first = solveWithOutline(text.replace('85', '100'), { skip: ['mismatch'], defer: true });
    expect(first.result.temp).toBeUndefined();
    fixture.componentRef.setInput('result', first.result);
    fixture.componentRef.setInput('pending', true);
    await fixture.whenStable();
    expect(el.querySelector('nw-sweeps-panel .updating')?.textContent).toContain('from the one before');
    expect(el.querySelector('nw-sweeps-panel table')).not.toBeNull();
    expect(el.querySelector('nw-results-summary')?.textContent).toContain('checking the sweeps');
    fixture.componentRef.setInput('whole', first.finish!());
    fixture.componentRef.setInput('pending', false);
    await fixture.whenStable();
    expect(el.querySelector('nw-sweeps-panel .updating')).toBeNull();
    expect(el.querySelector('nw-sweeps-panel')?.textContent).toContain('100 °C');
  });
});
