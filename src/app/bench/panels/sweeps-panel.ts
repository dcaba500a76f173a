import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import type { OutlineMeasure, SolveResult } from '../../../../solver';
import { PanelNotice, panelNotice } from './panel-notice';
import { sweepData, sweepKinds, type SweepKind } from './sweeps/sweep-data';
import { SweepMeasurePlot } from './sweeps/sweep-measure-plot';
import { SweepOverlay } from './sweeps/sweep-overlay';
import { SweepTable } from './sweeps/sweep-table';
import { measureUnits } from './units';

let groupIds = 0;

/**
 * *Sweeps*: what `analyze vary` and `analyze temp` give — a table of the ports figures, measures
 * and checks at each value (and why a value did not solve), a chosen figure plotted against the
 * swept value with its check limits, and the adm and CMRR curves of every value overlaid. With
 * both sweeps in the netlist a toggle chooses between them.
 */
@Component({
  selector: 'nw-sweeps-panel',
  imports: [PanelNotice, SweepTable, SweepMeasurePlot, SweepOverlay],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (updating()) {
      <p class="updating" role="status">{{ data() ? 'Updating for the newest text — these figures are from the one before.' : 'Solving the sweep…' }}</p>
    }
    @if (notice(); as n) {
      @if (!updating()) { <nw-panel-notice [notice]="n" /> }
    } @else if (data(); as d) {
      <div class="head">
        @if (kinds().length > 1) {
          <div class="toggle" role="radiogroup" aria-label="Sweep shown">
            @for (k of kinds(); track k) {
              <label class="option" [class.on]="k === kind()">
                <input type="radio" [name]="groupName" [value]="k" [checked]="k === kind()" (change)="choose(k)" />
                {{ k === 'vary' ? 'vary ' + varyParam() : 'temperature' }}
              </label>
            }
          </div>
        }
        <p class="summary">{{ summary() }}</p>
      </div>
      <nw-sweep-table [data]="d" [units]="units()" [stale]="stale()" />
      <h2 class="sub">{{ d.kind === 'temp' ? 'A figure against temperature' : 'A figure against ' + d.name }}</h2>
      <nw-sweep-measure-plot [data]="d" [units]="units()" [title]="result()?.title" />
      @if (hasAc()) {
        <h2 class="sub">Curves at each value</h2>
        <nw-sweep-overlay [data]="d" [title]="result()?.title" />
      } @else {
        <p class="note">Add <code>analyze ac from 10 Hz to 1 GHz per decade 20</code> to overlay the adm and CMRR curves of every value.</p>
      }
    }
  `,
  styles: `
    :host { display: block; }
    .head { display: flex; flex-wrap: wrap; align-items: center; gap: 6px 14px; margin: 0 0 6px; }
    .toggle { display: inline-flex; border: 1px solid var(--mat-sys-outline); border-radius: 16px; overflow: hidden; }
    .option { display: inline-flex; align-items: center; gap: 4px; padding: 2px 12px 2px 8px; font-size: 0.875rem; cursor: pointer;
      color: var(--mat-sys-on-surface); }
    .option.on { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); font-weight: 600; }
    .option + .option { border-left: 1px solid var(--mat-sys-outline); }
    .option:has(input:focus-visible) { outline: 2px solid var(--mat-sys-tertiary); outline-offset: -2px; }
    .updating { margin: 0 0 6px; padding: 2px 8px; font-size: 0.8125rem; color: #6b4600; background: #fbecc8; border-radius: 4px; }
    .summary { margin: 0; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .sub { font: var(--mat-sys-title-small); margin: 16px 0 6px; color: var(--mat-sys-on-surface-variant); }
    .note { font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    code { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.8125rem; background: var(--mat-sys-surface-container-high); padding: 1px 4px; border-radius: 3px; }
  `,
})
export class SweepsPanel {
  readonly result = input<SolveResult | undefined>();
  /** The measure lines of the result's text, for the units of the measures. */
  readonly measureLines = input<readonly OutlineMeasure[]>([]);
  /** The netlist's params (the outline's names), to suggest a sweep of one of them. */
  readonly params = input<readonly string[]>([]);
  /** The result is from an earlier version of the netlist: no pass or fail is coloured. */
  readonly stale = input(false);
  /**
   * The current text's sweeps are still being solved: the figures shown (if any) are the text's
   * before, and say so.
   */
  readonly updating = input(false);

  protected readonly groupName = `nw-sweep-kind-${++groupIds}`;
  private readonly chosen = signal<SweepKind | undefined>(undefined);

  readonly notice = computed(() => panelNotice(this.result(), (r) => (r.vary || r.temp ? undefined : {
    title: 'No sweep yet',
    text: `Solve the circuit again at several values of a param${this.paramHint()}, or over temperature with “analyze temp over -40 27 125” (°C), and compare the figures here, for example:`,
    code: `analyze vary ${this.params()[0] ?? 'PARAM'} over v1 v2 v3`,
  })));

  private readonly paramHint = computed(() => {
    const p = this.params();
    return p.length > 0 ? ` (this netlist has ${p.join(', ')})` : ' (a “param” line)';
  });

  readonly kinds = computed(() => sweepKinds(this.result()));
  readonly kind = computed<SweepKind | undefined>(() => {
    const kinds = this.kinds();
    const chosen = this.chosen();
    return chosen && kinds.includes(chosen) ? chosen : kinds[0];
  });
  readonly data = computed(() => {
    const k = this.kind();
    return k ? sweepData(this.result(), k) : undefined;
  });
  protected readonly varyParam = computed(() => this.result()?.vary?.param ?? '');
  protected readonly hasAc = computed(() => this.data()?.rows.some((r) => r.run.ac) ?? false);
  protected readonly units = computed(() => measureUnits(this.measureLines()));

  /** "4 values of rt, 1 did not solve." */
  readonly summary = computed(() => {
    const d = this.data();
    if (!d) return '';
    const failed = d.rows.filter((r) => r.failure).length;
    const what = d.kind === 'temp' ? `${d.rows.length} temperatures` : `${d.rows.length} values of ${d.name}`;
    return `${what}${failed > 0 ? `; ${failed} did not solve` : ', all solved'}.`;
  });

  choose(kind: SweepKind): void {
    this.chosen.set(kind);
  }
}
