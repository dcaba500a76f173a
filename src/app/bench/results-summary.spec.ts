import { TestBed } from '@angular/core/testing';
import { solveNetlist } from '../../../solver';
import { RESISTOR_TAIL_PAIR } from './panels/testing/netlists';
import { ResultsSummary } from './results-summary';

async function render(inputs: Record<string, unknown>) {
  const fixture = TestBed.createComponent(ResultsSummary);
  for (const [name, value] of Object.entries(inputs)) fixture.componentRef.setInput(name, value);
  await fixture.whenStable();
  const el = fixture.nativeElement as HTMLElement;
  return { el, text: () => el.textContent!.replace(/\s+/g, ' ') };
}

describe('ResultsSummary', () => {
  const result = solveNetlist(RESISTOR_TAIL_PAIR);

  it('shows a passing verdict in green for the current text', async () => {
    expect(result.checks.every((c) => c.pass)).toBe(true);
    const { el, text } = await render({ result });
    expect(el.querySelector('.verdict.pass')).not.toBeNull();
    expect(text()).toContain('All 2 checks pass');
  });

  it('never shows a pass in green for figures from an earlier version, and says why they are shown', async () => {
    const fallback = await render({ result, stale: true, errorCount: 1 });
    expect(fallback.el.querySelector('.verdict.pass')).toBeNull();
    expect(fallback.el.querySelector('.verdict.stale')).not.toBeNull();
    expect(fallback.text()).toContain('2 of 2 checks passed in an earlier version');
    expect(fallback.text()).toContain('Showing the last result that solved — fix the error in the editor');

    const cancelled = await render({ result, stale: true, status: 'cancelled' });
    expect(cancelled.el.querySelector('.verdict.pass')).toBeNull();
    expect(cancelled.text()).toContain('Solve cancelled');
    expect(cancelled.text()).not.toContain('last result that solved');
  });
});
