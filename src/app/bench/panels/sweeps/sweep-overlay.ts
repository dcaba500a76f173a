import { ChangeDetectionStrategy, Component, computed, input, signal, viewChildren } from '@angular/core';
import { BodePlot } from '../plot/bode-plot';
import { ExportBar } from '../plot/export-bar';
import { curveStyle, type CurveStyle } from '../plot/palette';
import { curvesCsv, fileStem } from '../plot/plot-export';
import type { PlotSeries } from '../plot/plot-geometry';
import type { SweepData, SweepRow } from './sweep-data';

/** The ports curves overlaid, in the order a designer reads them. */
const FIGURES = [
  { key: 'adm', title: 'adm over frequency', axis: 'adm (dB)' },
  { key: 'cmrr', title: 'CMRR over frequency', axis: 'CMRR (dB)' },
] as const;

interface Overlay {
  key: string;
  title: string;
  axis: string;
  series: PlotSeries[];
}

/**
 * The adm and CMRR magnitudes over frequency at every value of a sweep, overlaid: each value in
 * its own palette colour and dash, a legend naming the values that shows or hides each, the
 * values that did not solve named beside it. Every plot exports like the others.
 */
@Component({
  selector: 'nw-sweep-overlay',
  imports: [BodePlot, ExportBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="legend" role="group" [attr.aria-label]="'Values shown on the curves over frequency'">
      @for (row of solved(); track row.index) {
        <button type="button" class="chip" [class.on]="isVisible(row.index)" [attr.aria-pressed]="isVisible(row.index)"
                [attr.data-index]="row.index" (click)="toggle(row.index)">
          <svg width="26" height="10" aria-hidden="true"><line x1="1" y1="5" x2="25" y2="5" [attr.stroke]="styleOf(row).color" stroke-width="2.5" [attr.stroke-dasharray]="styleOf(row).dash || null" /></svg>
          @if (isVisible(row.index)) { <span aria-hidden="true">✓</span> }{{ row.label }}
        </button>
      }
      @if (unsolved().length > 0) { <span class="note">Not plotted (did not solve): {{ unsolved().join(', ') }}.</span> }
    </div>
    @for (o of overlays(); track o.key; let k = $index) {
      <div class="plot-head">
        <h3 class="plot-title">{{ o.title }}</h3>
        <nw-export-bar [plot]="plots()[k]" [stem]="stem() + '-' + o.key" [csvAll]="csvFns()[k]" [allCount]="o.series.length" />
      </div>
      @if (o.series.length > 0) {
        <nw-bode-plot [freqHz]="freqHz()" [series]="o.series" [showPhase]="false" [height]="240" [magnitudeLabel]="o.axis"
                      [ariaLabel]="o.title + ' at each value of ' + data().name" [caption]="(title() ?? '') + ' — ' + o.title" />
      } @else {
        <p class="note">Choose a value above to plot it.</p>
      }
    }
  `,
  styles: `
    :host { display: block; }
    .legend { display: flex; flex-wrap: wrap; align-items: center; gap: 5px; margin: 0 0 6px; }
    .chip { display: inline-flex; align-items: center; gap: 4px; font: inherit; font-size: 0.8125rem; cursor: pointer;
      padding: 1px 9px 1px 6px; border-radius: 14px; border: 1px solid var(--mat-sys-outline-variant);
      background: transparent; color: var(--mat-sys-on-surface-variant); }
    .chip.on { background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface); border-color: var(--mat-sys-outline); font-weight: 600; }
    .chip:not(.on) svg { opacity: 0.45; }
    .plot-head { display: flex; flex-wrap: wrap; align-items: center; gap: 6px; margin: 8px 0 2px; }
    .plot-title { margin: 0; font-size: 0.9375rem; font-weight: 700; }
    .note { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); margin: 0; }
  `,
})
export class SweepOverlay {
  readonly data = input.required<SweepData>();
  /** The netlist's title, for the exported files. */
  readonly title = input<string>();

  readonly plots = viewChildren(BodePlot);
  private readonly hidden = signal<ReadonlySet<number>>(new Set());

  /** Values with an ac sweep to draw. */
  readonly solved = computed(() => this.data().rows.filter((r) => !r.failure && r.run.ac));
  readonly unsolved = computed(() => this.data().rows.filter((r) => r.failure).map((r) => r.label));

  /** Every value shares the sweep's frequencies (the ac range is read once, with the written params). */
  readonly freqHz = computed(() => this.solved()[0]?.run.ac?.freq_hz ?? []);

  /**
   * A value's style is fixed by its place among the values that solved (a failed value takes no
   * colour it could not show), so hiding one never recolours another.
   */
  private readonly styles = computed(() => new Map(this.solved().map((r, k) => [r.index, curveStyle(k)])));

  styleOf(row: SweepRow): CurveStyle {
    return this.styles().get(row.index) ?? curveStyle(row.index);
  }

  isVisible(index: number): boolean {
    return !this.hidden().has(index);
  }

  toggle(index: number): void {
    const next = new Set(this.hidden());
    if (!next.delete(index)) next.add(index);
    this.hidden.set(next);
  }

  readonly overlays = computed<Overlay[]>(() => FIGURES
    .filter((f) => this.solved().some((r) => r.run.ac?.curves[f.key]))
    .map((f) => ({
      ...f,
      series: this.solved().filter((r) => this.isVisible(r.index) && r.run.ac?.curves[f.key]).map((r) => {
        const curve = r.run.ac!.curves[f.key];
        return { key: `${f.key}@${r.index}`, label: r.label, db: curve.db, phase_deg: curve.phase_deg, style: this.styleOf(r) };
      }),
    })));

  /** File names of the exports: `<title>-<param>-adm.svg` … */
  readonly stem = computed(() => `${fileStem(this.title())}-${fileStem(this.data().name, 'sweep')}`);

  /** CSV of one overlay's shown curves, a column pair per value named by it (`adm@rt=4650_mag_db`). */
  csvText(key: string): string {
    const o = this.overlays().find((x) => x.key === key);
    if (!o) return '';
    const d = this.data();
    const name = (s: PlotSeries) => {
      const row = d.rows[Number(s.key.split('@')[1])];
      return `${key}@${d.kind === 'temp' ? `${row.value}C` : `${d.name}=${row.value}`}`;
    };
    return curvesCsv(this.freqHz(), o.series.map((s) => ({ key: name(s), db: s.db, phase_deg: s.phase_deg })));
  }

  protected readonly csvFns = computed(() => this.overlays().map((o) => () => this.csvText(o.key)));
}
