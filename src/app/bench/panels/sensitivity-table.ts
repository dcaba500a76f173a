/**
 * "What moves each figure most": the normalised sensitivities of `analyze sensitivity`, ranked,
 * with their sign — S = (∂F/F)/(∂x/x), so +0.5 reads "1 % more x gives 0.5 % more F". One figure
 * at a time (a select), its first ten knobs; shown under the measures when the result has them.
 */
import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import type { SolveResult } from '../../../../solver';

/** Knobs listed per figure. */
export const SENSITIVITY_ROWS = 10;

@Component({
  selector: 'nw-sensitivity-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (figures().length) {
      <div class="pick">
        <label for="nw-sens-figure">What moves</label>
        <select id="nw-sens-figure" [value]="figure()" (change)="chosen.set($any($event.target).value)">
          @for (f of figures(); track f) { <option [value]="f">{{ f }}</option> }
        </select>
        <span class="how">most — S = (∂F/F)/(∂x/x), by ±{{ step() }} % re-solves</span>
      </div>
      <table class="table">
        <caption class="visually-hidden">Sensitivities of {{ figure() }}, largest first</caption>
        <thead><tr><th scope="col">Rank</th><th scope="col">Part or model</th><th scope="col">Parameter</th><th scope="col" class="num">S</th><th scope="col">Direction</th></tr></thead>
        <tbody>
          @for (r of rows(); track $index) {
            <tr>
              <td class="num">{{ $index + 1 }}</td>
              <td class="mono">{{ r.target }}</td>
              <td class="mono">{{ r.param }}</td>
              <td class="num">{{ r.s >= 0 ? '+' : '−' }}{{ abs(r.s).toFixed(3) }}</td>
              <td>{{ r.s >= 0 ? '↑ raises it' : '↓ lowers it' }}</td>
            </tr>
          }
        </tbody>
      </table>
    }
  `,
  styles: `
    .pick { display: flex; align-items: baseline; gap: 8px; flex-wrap: wrap; margin: 4px 0 8px; }
    .how { color: var(--mat-sys-on-surface-variant); font-size: 0.8125rem; }
    select { font: inherit; padding: 2px 4px; }
    .table { border-collapse: collapse; font-size: 0.875rem; }
    th, td { padding: 4px 10px; border-bottom: 1px solid var(--mat-sys-outline-variant); text-align: left; }
    th { font-weight: 600; color: var(--mat-sys-on-surface-variant); }
    .num { text-align: right; font-variant-numeric: tabular-nums; }
    .mono { font-family: ui-monospace, "DejaVu Sans Mono", Menlo, monospace; }
    .visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); }
  `,
})
export class SensitivityTable {
  readonly result = input<SolveResult | undefined>();
  protected readonly chosen = signal<string | undefined>(undefined);
  protected readonly figures = computed(() => Object.keys(this.result()?.sensitivity?.figures ?? {}));
  protected readonly figure = computed(() => {
    const all = this.figures();
    const c = this.chosen();
    return c && all.includes(c) ? c : all[0];
  });
  protected readonly step = computed(() => (this.result()?.sensitivity?.step ?? 0) * 100);
  protected readonly rows = computed(() => (this.result()?.sensitivity?.figures[this.figure() ?? ''] ?? []).slice(0, SENSITIVITY_ROWS));
  protected abs(x: number): number {
    return Math.abs(x);
  }
}
