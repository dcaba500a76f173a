import { ChangeDetectionStrategy, Component, computed, effect, inject, input, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { SolveResult } from '../../../../solver';
import { MismatchPool } from '../mismatch/mismatch-pool';
import { SolverClient } from '../solver-client';
import { NO_LINES, type MismatchAsk, type RequestLines } from '../solver-protocol';
import { MismatchCard } from './mismatch/mismatch-card';
import { mismatchFigures, statCells, tableFigures, yieldText } from './mismatch/mismatch-figures';
import { PanelNotice, panelNotice } from './panel-notice';

/** The line the empty state offers to copy. */
export const MISMATCH_EXAMPLE = 'analyze mismatch runs 200 seed 1 beta 5% is 2% res 0.5%';

/**
 * *Mismatch*: `analyze mismatch` run over a pool of workers (mismatch/mismatch-pool.ts), not in
 * the live solve. It starts when the tab is opened (or Run is pressed), never per keystroke; a
 * progress bar with Cancel shows while it runs, and a new text makes a running job stale (it is
 * cancelled, and Run offers the new text). Then: the yield, a histogram per figure (vos,
 * cmrr_db, adm, each measure) with the check limits on it, and the statistics table.
 */
@Component({
  selector: 'nw-mismatch-panel',
  imports: [PanelNotice, MatButtonModule, MatProgressBarModule, MismatchCard],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else if (source(); as s) {
      <div class="bar" [attr.data-workers]="job()?.workers ?? 0" [attr.data-answered]="job()?.answered ?? 0">
        <p class="ask">Line {{ s.ask.line }}: {{ s.ask.runs }} runs, seed {{ s.ask.seed }}{{ spreads() ? ' — ' + spreads() : '' }}</p>
        @if (running()) {
          <button mat-stroked-button type="button" class="cancel" (click)="pool.cancel()">Cancel</button>
        } @else {
          <button mat-flat-button type="button" class="run" (click)="run()">{{ current()?.status === 'done' || !current() && job() ? 'Run again' : 'Run' }}</button>
        }
      </div>
      @if (running(); as j) {
        <div class="progress" role="status">
          <mat-progress-bar mode="determinate" [value]="(100 * j.done) / j.total" aria-label="Mismatch runs done" />
          <p class="note">{{ j.done }} of {{ j.total }} runs · {{ j.workers }} {{ j.workers === 1 ? 'worker' : 'workers' }}</p>
        </div>
      }
      @if (current(); as j) {
        @if (j.status === 'cancelled') { <p class="note cancelled" role="status">Cancelled after {{ j.done }} of {{ j.total }} runs. Run starts again from the first run.</p> }
        @if (j.status === 'failed') { <p class="note error" role="alert">{{ j.error }}</p> }
      } @else if (job(); as old) {
        <p class="note stale" role="status">
          The netlist changed{{ old.status === 'running' || old.status === 'cancelled' ? ' while the runs were solving; they were stopped' : ' since these runs' }}. Run to solve the new text.
        </p>
      }
      @if (shownResult(); as r) {
        <div class="results" [class.stale]="!current()">
          <p class="yield" [class.all]="r.yield === 1" role="status">{{ yieldLine() }}</p>
          @if (r.failed_runs > 0) { <p class="note error">{{ r.failed_runs }} {{ r.failed_runs === 1 ? 'run' : 'runs' }} did not solve; the figures are over the other {{ r.runs - r.failed_runs }}.</p> }
          <div class="cards">
            @for (f of figures(); track f.name) { <nw-mismatch-card [figure]="f" [title]="result()?.title" /> }
          </div>
          <table class="stats">
            <caption>Statistics over {{ r.runs - r.failed_runs }} runs (seed {{ r.seed }})</caption>
            <thead><tr><th scope="col">Figure</th><th scope="col">mean</th><th scope="col">sd</th><th scope="col">p5</th><th scope="col">p50</th><th scope="col">p95</th></tr></thead>
            <tbody>
              @for (row of rows(); track row.name) {
                <tr><th scope="row" class="mono">{{ row.name }}</th><td>{{ row.mean }}</td><td>{{ row.sd }}</td><td>{{ row.p5 }}</td><td>{{ row.p50 }}</td><td>{{ row.p95 }}</td></tr>
              }
            </tbody>
          </table>
        </div>
      }
    }
  `,
  styles: `
    :host { display: block; }
    .bar { display: flex; align-items: center; gap: 10px; flex-wrap: wrap; margin-bottom: 6px; --mat-button-filled-container-height: 32px; --mat-button-outlined-container-height: 32px; }
    .ask { margin: 0; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .progress { margin: 4px 0 8px; max-width: 640px; }
    .note { margin: 4px 0; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .note.error { color: #7a1812; }
    .note.stale, .note.cancelled { color: #6b4600; background: #fbecc8; border-radius: 4px; padding: 2px 8px; display: inline-block; }
    .yield { margin: 6px 0 8px; font: var(--mat-sys-title-medium); color: var(--mat-sys-on-surface); }
    .results.stale { opacity: 1; border-left: 3px dashed #c9a24a; padding-left: 8px; }
    .cards { display: grid; grid-template-columns: repeat(auto-fill, minmax(380px, 1fr)); gap: 14px 18px; }
    .stats { margin-top: 14px; border-collapse: collapse; font-size: 0.875rem; }
    .stats caption { text-align: left; font: var(--mat-sys-title-small); color: var(--mat-sys-on-surface-variant); padding-bottom: 4px; }
    .stats th, .stats td { padding: 3px 12px 3px 0; text-align: right; font-variant-numeric: tabular-nums; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .stats th[scope=row], .stats thead th:first-child { text-align: left; }
    .mono { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-weight: 400; }
  `,
})
export class MismatchPanel {
  /** The result the other panels show (for its errors, title, checks). */
  readonly result = input<SolveResult | undefined>();
  /** The measure and check lines of that result's text. */
  readonly lines = input<RequestLines>(NO_LINES);

  protected readonly pool = inject(MismatchPool);
  private readonly client = inject(SolverClient, { optional: true });

  /** The text whose `analyze mismatch` the tab runs: that of the newest reply whose circuit solved. */
  readonly source = computed<{ text: string; ask: MismatchAsk } | undefined>(() => {
    const reply = this.client?.lastSolved();
    return reply?.mismatch ? { text: reply.text, ask: reply.mismatch } : undefined;
  }, { equal: (a, b) => a?.text === b?.text && JSON.stringify(a?.ask) === JSON.stringify(b?.ask) });

  readonly notice = computed(() => panelNotice(this.result(), () => (this.source() ? undefined : {
    title: 'No mismatch analysis yet',
    text: 'Add an “analyze mismatch” line to solve the circuit many times with its parts spread at random, and see histograms of the offset, the gains and every measure, with the yield of the checks, for example:',
    code: MISMATCH_EXAMPLE,
  })));

  readonly job = this.pool.job;
  /** The pool's job when it is for the current text. */
  readonly current = computed(() => {
    const s = this.source();
    const job = this.job();
    return s && job && job.text === s.text && JSON.stringify(job.ask) === JSON.stringify(s.ask) ? job : undefined;
  });
  readonly running = computed(() => (this.current()?.status === 'running' ? this.current() : undefined));
  /** The figures shown: the current text's, or, marked, those of the run before the text changed. */
  readonly shownResult = computed(() => this.current()?.result ?? (this.current() ? undefined : this.job()?.result));

  readonly spreads = computed(() => Object.entries(this.source()?.ask.sigmas ?? {})
    .map(([k, v]) => (k === 'vth' ? `${k} ${formatVolts(v)}` : `${k} ${Number((v * 100).toPrecision(4))} %`)).join(', '));
  private readonly checks = computed(() => this.result()?.checks ?? []);
  readonly figures = computed(() => {
    const r = this.shownResult();
    return r ? mismatchFigures(r, this.lines().measures, this.checks()) : [];
  });
  readonly rows = computed(() => {
    const r = this.shownResult();
    return r ? tableFigures(r, this.lines().measures, this.checks()).map((f) => ({ name: f.name, ...statCells(f) })) : [];
  });
  readonly yieldLine = computed(() => {
    const r = this.shownResult();
    return r ? yieldText(r, this.checks().length) : '';
  });

  private autoStarted = false;

  constructor() {
    // Opening the tab starts the runs once, for the text it finds (or the first to ask for them).
    effect(() => {
      const s = this.source();
      if (!s || this.autoStarted) return;
      this.autoStarted = true;
      untracked(() => {
        if (!this.pool.isFor(s.text, s.ask)) this.pool.start(s.text, s.ask);
      });
    });
    // A new text makes a running job stale: it is stopped, and Run offers the new text.
    effect(() => {
      const s = this.source();
      const job = this.job();
      if (job?.status === 'running' && (!s || job.text !== s.text || JSON.stringify(job.ask) !== JSON.stringify(s.ask))) untracked(() => this.pool.cancel());
    });
  }

  run(): void {
    const s = this.source();
    if (s) this.pool.start(s.text, s.ask);
  }
}

function formatVolts(v: number): string {
  return v >= 1 ? `${v} V` : `${Number((v * 1e3).toPrecision(4))} mV`;
}
