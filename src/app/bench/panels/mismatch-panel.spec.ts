import { TestBed } from '@angular/core/testing';
import { mismatchSamples, parseNetlist, solveNetlist, summarizeMismatch, type MismatchRequest } from '../../../../solver';
import { MISMATCH_WORKER_COUNT, MISMATCH_WORKER_FACTORY, MismatchPool } from '../mismatch/mismatch-pool';
import { InProcessWorker, mismatchedPair } from '../mismatch/testing';
import { solveReply } from '../solve-reply';
import { SOLVER_WORKER_FACTORY, SolverClient } from '../solver-client';
import { MISMATCH_EXAMPLE, MismatchPanel } from './mismatch-panel';
import { checkLimits, histogram, yieldText } from './mismatch/mismatch-figures';

/** Renders the panel for `text` as the bench would after the live solve's reply (the real solver's). */
async function render(text: string | undefined) {
  InProcessWorker.made = [];
  TestBed.configureTestingModule({
    providers: [
      SolverClient,
      // The live solver is not asked here: the reply is set as the worker would send it.
      { provide: SOLVER_WORKER_FACTORY, useValue: () => { throw new Error('no live solve in this spec'); } },
      { provide: MISMATCH_WORKER_FACTORY, useValue: () => new InProcessWorker() },
      { provide: MISMATCH_WORKER_COUNT, useValue: () => 3 },
    ],
  });
  const client = TestBed.inject(SolverClient);
  const reply = text === undefined ? undefined : solveReply(1, text);
  if (reply) {
    client.reply.set(reply);
    client.lastSolved.set(reply);
  }
  const fixture = TestBed.createComponent(MismatchPanel);
  fixture.componentRef.setInput('result', reply?.result);
  fixture.componentRef.setInput('lines', reply?.lines);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement, client, pool: TestBed.inject(MismatchPool) };
}

async function untilDone(pool: MismatchPool, fixture: { whenStable(): Promise<unknown> }): Promise<void> {
  for (let k = 0; k < 2000 && pool.job()?.status === 'running'; k++) await new Promise((r) => setTimeout(r, 0));
  await fixture.whenStable();
}

describe('MismatchPanel', () => {
  it('says how to ask for it when the netlist has no mismatch line', async () => {
    const { el, pool } = await render(mismatchedPair().replace(/^analyze mismatch.*$/m, ''));
    expect(el.querySelector('nw-panel-notice')!.textContent).toContain(MISMATCH_EXAMPLE);
    expect(pool.job()).toBeUndefined();
  });

  it('starts when opened, shows progress with Cancel, then the yield, histograms with the check limits and the statistics', async () => {
    const text = mismatchedPair();
    const { el, fixture, pool } = await render(text);
    expect(pool.job()!.status).toBe('running');
    expect(el.querySelector('mat-progress-bar')).not.toBeNull();
    expect(el.querySelector('button.cancel')!.textContent).toContain('Cancel');
    await untilDone(pool, fixture);
    const cli = solveNetlist(text).mismatch!;
    expect(pool.job()!.result).toEqual(cli);
    expect(el.querySelector('mat-progress-bar')).toBeNull();
    const passing = Math.round(cli.yield * 200);
    expect(el.querySelector('.yield')!.textContent!.trim()).toBe(`yield ${(cli.yield * 100).toFixed(1)} % — ${passing} of 200 runs pass every check`);
    expect([...el.querySelectorAll('nw-mismatch-card h3 .mono')].map((h) => h.textContent)).toEqual(['vos', 'cmrr_db', 'adm', 'a0']);
    // The a0 histogram: 200 runs in its bars, and `check a0 >= 45` drawn as a labelled line.
    const a0 = el.querySelectorAll('nw-mismatch-card')[3];
    const counts = [...a0.querySelectorAll('.bars rect')].map((r) => Number(r.getAttribute('data-count')));
    expect(counts.reduce((a, b) => a + b, 0)).toBe(200);
    expect(a0.querySelectorAll('path.limit').length).toBe(1);
    expect(a0.querySelector('.rule-label')!.textContent).toBe('≥ 45.0 dB');
    // cmrr_db sits near 50.6 dB: its 40 dB limit is far off, said in words rather than squashing the bars.
    const cmrr = el.querySelectorAll('nw-mismatch-card')[1];
    expect(cmrr.querySelectorAll('path.limit').length).toBe(0);
    expect(cmrr.querySelector('.off')!.textContent).toContain('limit ≥ 40.0 dB');
    const rows = [...el.querySelectorAll('table.stats tbody tr')].map((r) => [...r.children].map((c) => c.textContent));
    expect(rows.map((r) => r[0])).toEqual(['vos', 'cmrr_db', 'adm', 'acm', 'a0']);
    expect([...el.querySelectorAll('table.stats thead th')].map((t) => t.textContent)).toEqual(['Figure', 'mean', 'sd', 'p5', 'p50', 'p95']);
    // vos of a resistor-loaded pair: mean near 0, sd below a millivolt with these spreads (from memory: ~√2·VT·σ_is plus the rest).
    expect(rows[0][2]).toMatch(/µV$/);
    expect(el.querySelector('.run')!.textContent).toContain('Run again');
  });

  it('makes a running job stale when the text changes, and offers to run the new one', async () => {
    const text = mismatchedPair('runs 400 seed 3 beta 5% is 2% res 0.5%');
    const { el, fixture, pool, client } = await render(text);
    expect(pool.job()!.status).toBe('running');
    const next = solveReply(2, text.replace('seed 3', 'seed 4'));
    client.reply.set(next);
    client.lastSolved.set(next);
    await fixture.whenStable();
    expect(pool.job()!.status).toBe('cancelled');
    expect(InProcessWorker.made.every((w) => w.terminated)).toBe(true);
    expect(el.querySelector('.note.stale')!.textContent).toContain('The netlist changed while the runs were solving');
    (el.querySelector('button.run') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(pool.job()!.status).toBe('running');
    expect(pool.job()!.ask.seed).toBe(4);
    pool.cancel();
    await fixture.whenStable();
    expect(el.querySelector('.note.cancelled')!.textContent).toMatch(/^Cancelled after \d+ of 400 runs/);
  });

  it('counts runs that did not solve, and states the yield over those that did', () => {
    const text = mismatchedPair('runs 40 seed 1 beta 5%');
    const p = parseNetlist(text);
    const request = p.requests.analyses.find((a): a is MismatchRequest => a.kind === 'mismatch')!;
    const samples = [...mismatchSamples(p.circuit!, p.requests, request, 0, 38), { run: 38, error: 'did not converge' }, { run: 39, error: 'did not converge' }];
    const r = summarizeMismatch(request, samples);
    expect(r.failed_runs).toBe(2);
    expect(yieldText(r, 2)).toBe(`yield ${r.yield === 1 ? '100' : (r.yield * 100).toFixed(1)} % — ${Math.round(r.yield * 38)} of 38 runs that solved pass every check`);
    expect(yieldText(r, 0)).toMatch(/no checks/);
  });

  it('draws both ends of an `=` check, and bins every sample once', () => {
    const result = solveNetlist(mismatchedPair().replace('check a0 >= 45', 'check a0 = 45.1 ± 0.1'));
    const limits = checkLimits('a0', 'dB', result.checks);
    expect(limits.map((l) => [l.side, Number(l.value.toFixed(6))])).toEqual([['min', 45], ['max', 45.2]]);
    // A limit near the samples widens the range to show it; one far off is left off and named.
    const near = { value: 12, label: '≤ 12', side: 'max' as const };
    const far = { value: 1000, label: '≤ 1000', side: 'max' as const };
    const data = histogram([1, 2, 2, 3, 10], [near, far]);
    expect(data.bins.reduce((a, b) => a + b.count, 0)).toBe(5);
    expect(data.domain[0]).toBeLessThanOrEqual(1);
    expect(data.domain[1]).toBeGreaterThanOrEqual(12);
    expect(data.shown).toEqual([near]);
    expect(data.off).toEqual([far]);
  });
});
