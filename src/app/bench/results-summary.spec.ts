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

  it('says whether the checks hold over the sweeps, naming the values where they fail', async () => {
    const swept = solveNetlist(RESISTOR_TAIL_PAIR + 'analyze temp over -40 27 85\n');
    const holds = await render({ result: swept });
    expect(holds.text()).toContain('all hold at the 3 temperatures');
    expect(holds.el.querySelector('.sweep.pass')).not.toBeNull();
    // A check that only the cold end breaks: vbe grows as the temperature falls.
    const vbe = (swept.op!.devices['q1'] as { vbe: number }).vbe;
    const cold = solveNetlist(RESISTOR_TAIL_PAIR + `analyze temp over -40 27 85\ncheck vbe(q1) < ${(vbe + 0.02).toFixed(3)}\n`);
    const fails = await render({ result: cold });
    expect(fails.text()).toContain('fails at -40 °C');
    expect(fails.el.querySelector('.sweep.fail')).not.toBeNull();
    expect(fails.el.querySelector('.verdict.pass')).not.toBeNull();
    const old = await render({ result: cold, stale: true, errorCount: 1 });
    expect(old.el.querySelector('.sweep.fail, .sweep.pass')).toBeNull();
  });
});
