/**
 * The line above the result panels that a designer reads first: do the checks pass, the key
 * figures, how fresh the numbers are — and, while a long solve runs, its progress and a cancel.
 * Figures from an earlier version of the netlist (`stale`) are marked so, and never show a pass
 * in green.
 */
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { SolveResult } from '../../../solver';
import { sweepData, sweepKinds } from './panels/sweeps/sweep-data';
import type { SolveStatus } from './solver-client';

/** "85 °C", "−40 °C and 85 °C", "rg = 120 Ω, rg = 1 kΩ and 1 more". */
function listed(labels: string[]): string {
  if (labels.length <= 2) return labels.join(' and ');
  return `${labels.slice(0, 2).join(', ')} and ${labels.length - 2} more`;
}

function db(value: number | undefined): string {
  return value === undefined || !Number.isFinite(value) ? '—' : `${value.toFixed(1)} dB`;
}

@Component({
  selector: 'nw-results-summary',
  imports: [MatButtonModule, MatProgressBarModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="line" aria-live="polite" [class.old]="stale()">
      @if (checks(); as c) {
        <span class="verdict" [class.fail]="!stale() && c.failed > 0" [class.pass]="!stale() && c.failed === 0 && c.total > 0" [class.stale]="stale()">
          @if (c.total === 0) { No checks }
          @else if (stale()) { <span aria-hidden="true">{{ c.failed === 0 ? '✓' : '✕' }}</span> {{ c.total - c.failed }} of {{ c.total }} {{ c.total === 1 ? 'check' : 'checks' }} passed in an earlier version }
          @else if (c.failed === 0) { <span aria-hidden="true">✓</span> {{ c.total === 1 ? 'The check passes' : 'All ' + c.total + ' checks pass' }} }
          @else { <span aria-hidden="true">✕</span> {{ c.failed }} of {{ c.total }} {{ c.total === 1 ? 'check fails' : 'checks fail' }} }
        </span>
      }
      @if (pending() && !stale() && (result()?.checks?.length ?? 0) > 0) {
        <span class="sweep" role="status">checking the sweeps…</span>
      }
      @for (s of sweeps(); track s.kind) {
        <span class="sweep" [class.fail]="!stale() && s.failing.length > 0" [class.pass]="!stale() && s.failing.length === 0" [class.old]="stale()" [title]="s.detail">
          <span aria-hidden="true">{{ s.failing.length === 0 ? '✓' : '✕' }}</span> {{ s.text }}
        </span>
      }
      @if (result()?.ports; as p) {
        <span class="fig"><abbr title="differential gain vod/vid">adm</abbr> {{ db(p.adm.db) }}</span>
        <span class="fig"><abbr title="common-mode rejection ratio |adm/acm|">CMRR</abbr> {{ db(p.cmrr_db) }}</span>
      }
      <span class="spacer"></span>
      @if (status() === 'failed') {
        <span class="stale" role="alert">The solver stopped: {{ failure() }}</span>
      } @else if (status() === 'cancelled') {
        <span class="stale" role="status">Solve cancelled — press Solve or edit to run it again</span>
      } @else if (stale() && !slow()) {
        <span class="stale" role="status">Showing the last result that solved — fix the {{ errorCount() === 1 ? 'error' : errorCount() + ' errors' }} in the editor</span>
      } @else if (solveMs() !== undefined && status() === 'idle') {
        <span class="time">solved in {{ solveMs()! < 10 ? solveMs()!.toFixed(1) : solveMs()!.toFixed(0) }} ms</span>
      }
      @if (slow()) {
        <span class="solving" role="status">Solving…</span>
        <button mat-stroked-button type="button" class="cancel" (click)="cancel.emit()" aria-label="Cancel the solve">Cancel</button>
      }
    </div>
    @if (slow()) {
      <mat-progress-bar mode="indeterminate" aria-label="Solving the netlist" />
    } @else {
      <div class="bar-space"></div>
    }
  `,
  styles: `
    :host { display: block; }
    .line { display: flex; align-items: center; gap: 14px; min-height: 36px; padding: 0 4px; font-size: 0.9375rem; flex-wrap: wrap; }
    .verdict { font-weight: 700; padding: 2px 10px; border-radius: 12px; background: var(--mat-sys-surface-container-high); }
    .verdict.pass { background: #d7eedf; color: #0c4a2f; }
    .verdict.fail { background: #f7d9d6; color: #7a1812; }
    .sweep { font-size: 0.875rem; font-weight: 600; padding: 1px 8px; border-radius: 12px; border: 1px solid var(--mat-sys-outline-variant); }
    .sweep.pass { color: #0c4a2f; border-color: #9ccfb0; }
    .sweep.fail { color: #7a1812; background: #f7d9d6; border-color: #e3a49e; }
    .sweep.old { color: var(--mat-sys-on-surface-variant); border-style: dashed; font-style: italic; }
    .verdict.stale { background: transparent; color: var(--mat-sys-on-surface-variant); border: 1px dashed var(--mat-sys-outline); font-weight: 600; }
    .old .fig { color: var(--mat-sys-on-surface-variant); font-style: italic; }
    .fig { font-variant-numeric: tabular-nums; }
    abbr { text-decoration: none; color: var(--mat-sys-on-surface-variant); }
    .spacer { flex: 1; }
    .time { color: var(--mat-sys-on-surface-variant); font-size: 0.8125rem; }
    .stale { color: #6b4600; font-size: 0.875rem; background: #fbecc8; padding: 2px 8px; border-radius: 4px; }
    .solving { color: var(--mat-sys-tertiary); font-weight: 600; }
    .cancel { --mat-button-outlined-container-height: 28px; }
    .bar-space { height: 4px; }
  `,
})
export class ResultsSummary {
  readonly result = input<SolveResult | undefined>();
  /** The result is from an earlier version of the netlist (see SolveView). */
  readonly stale = input(false);
  /** The text's sweeps are still being solved: nothing is said of them yet. */
  readonly pending = input(false);
  readonly errorCount = input(0);
  readonly status = input<SolveStatus>('idle');
  readonly slow = input(false);
  readonly solveMs = input<number | undefined>();
  readonly failure = input<string | undefined>();
  readonly cancel = output<void>();

  protected readonly db = db;
  /**
   * The checks over each sweep of the text (`analyze temp`, `analyze vary`): "✓ all hold at the
   * 3 temperatures", or "✕ 1 fails at 85 °C" — a pass at the nominal value alone is not the whole
   * answer when the netlist asks how the figures move.
   */
  protected readonly sweeps = computed(() => {
    const r = this.result();
    if (!r?.op || r.checks.length === 0 || this.pending()) return [];
    return sweepKinds(r).flatMap((kind) => {
      const data = sweepData(r, kind);
      if (!data) return [];
      const failing = data.rows.filter((row) => row.failure !== undefined || row.failedChecks.length > 0);
      const where = kind === 'temp' ? `the ${data.rows.length} temperatures` : `the ${data.rows.length} values of ${data.name}`;
      const text = failing.length === 0
        ? `${data.checkCount === 1 ? 'holds' : 'all hold'} at ${where}`
        : `${failing.length === data.rows.length ? 'fails at every value' : 'fails at ' + listed(failing.map((row) => row.label))}`;
      const detail = failing.map((row) => `${row.label}: ${row.failure ?? row.failedChecks.map((c) => c.text).join('; ')}`).join('\n');
      return [{ kind, failing, text, detail: detail || `The checks pass at ${where}.` }];
    });
  });

  protected readonly checks = computed(() => {
    const r = this.result();
    if (!r || !r.op) return undefined;
    return { total: r.checks.length, failed: r.checks.filter((c) => !c.pass).length };
  });
}
