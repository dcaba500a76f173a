import { ChangeDetectionStrategy, Component, computed, input, viewChild } from '@angular/core';
import { ExportBar } from '../plot/export-bar';
import { columnsCsv, fileStem } from '../plot/plot-export';
import { HistogramPlot } from './histogram-plot';
import { histogram, type MismatchFigure } from './mismatch-figures';

/**
 * One figure's histogram with its heading, the limits left off the plot (too far from the
 * samples) and its export bar: SVG, PNG, and CSV of the samples.
 */
@Component({
  selector: 'nw-mismatch-card',
  imports: [HistogramPlot, ExportBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="head">
      <h3><span class="mono">{{ figure().name }}</span>&ngsp;<span class="what">{{ figure().label }}</span></h3>
      <nw-export-bar [plot]="plot()" [stem]="stem()" [csvAll]="csvFn" />
    </div>
    <nw-histogram-plot [data]="data()" [xTitle]="xTitle()" [unit]="figure().unit"
      [ariaLabel]="'Histogram of ' + figure().name + ' over ' + figure().samples.length + ' runs' + limitsText()" />
    @if (data().off.length > 0) {
      <p class="off">Off the plot, far from every run: {{ offText() }}.</p>
    }
  `,
  styles: `
    :host { display: block; min-width: 0; }
    .head { display: flex; align-items: center; gap: 6px; min-width: 0; }
    h3 { margin: 0; font: var(--mat-sys-title-small); white-space: nowrap; overflow: hidden; text-overflow: ellipsis; }
    .mono { font-family: ui-monospace, "DejaVu Sans Mono", monospace; }
    .what { font-weight: 400; color: var(--mat-sys-on-surface-variant); }
    .off { margin: 2px 0 0; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
  `,
})
export class MismatchCard {
  readonly figure = input.required<MismatchFigure>();
  /** Title of the netlist, for the file names. */
  readonly title = input<string>();

  readonly plot = viewChild(HistogramPlot);
  protected readonly data = computed(() => histogram(this.figure().samples, this.figure().limits));
  protected readonly xTitle = computed(() => `${this.figure().name}${this.figure().unit ? ` (${this.figure().unit})` : ''}`);
  protected readonly stem = computed(() => `${fileStem(this.title())}-mismatch-${this.figure().name.replace(/[^\w-]+/g, '_')}`);
  protected readonly limitsText = computed(() => (this.figure().limits.length ? `, check limits ${this.figure().limits.map((l) => l.label).join(', ')}` : ''));
  protected readonly offText = computed(() => this.data().off.map((l) => `limit ${l.label}`).join(', '));
  protected readonly csvFn = () => this.csvText();

  /** The samples, one run per row, full precision. */
  csvText(): string {
    const f = this.figure();
    const suffix = f.unit && !f.name.toLowerCase().endsWith(`_${f.unit.toLowerCase()}`) ? `_${f.unit.toLowerCase()}` : '';
    return columnsCsv([{ name: f.name + suffix, values: f.samples }]);
  }
}
