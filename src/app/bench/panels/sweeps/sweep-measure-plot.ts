import { ChangeDetectionStrategy, Component, computed, input, signal, viewChild } from '@angular/core';
import { ExportBar } from '../plot/export-bar';
import { curveStyle } from '../plot/palette';
import { columnsCsv, fileStem } from '../plot/plot-export';
import type { XyRule, XySeries } from '../plot/xy-geometry';
import { XyPlot } from '../plot/xy-plot';
import { formatQuantity, type Unit } from '../si-format';
import { sweepLimits, sweepQuantities, wantsLogAxis, type SweepData, type SweepQuantity } from './sweep-data';

let selectIds = 0;

/**
 * A chosen quantity — adm, acm or cmrr in dB, or any measure — against the swept value, one
 * point per value that solved, with the limits of the checks on it drawn across; a log axis when
 * the values span more than a decade. Cursor readout and SVG, PNG and CSV export as every plot.
 */
@Component({
  selector: 'nw-sweep-measure-plot',
  imports: [XyPlot, ExportBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="toolbar">
      <label class="choose" [for]="selectId">Plot</label>
      <select [id]="selectId" (change)="choose($any($event.target).value)">
        @for (q of quantities(); track q.key) { <option [value]="q.key" [selected]="q.key === quantity()?.key">{{ q.name }}</option> }
      </select>
      <span class="against">against {{ xName() }}</span>
      <nw-export-bar [plot]="plot()" [stem]="stem()" [csvAll]="csvFn" [allCount]="1" />
    </div>
    @if (limitsText()) { <p class="limits">{{ limitsText() }}</p> }
    @if (points().x.length > 0) {
      <nw-xy-plot [x]="points().x" [series]="series()" [rules]="rules()" [xLog]="log()" [xName]="xName()" [xUnit]="data().unit"
                  [yTitle]="yTitle()" [height]="260" [ariaLabel]="yTitle() + ' against ' + xName()" [caption]="caption()" />
    } @else {
      <p class="empty">No value of the sweep gives {{ quantity()?.name ?? 'a figure' }}.</p>
    }
  `,
  styles: `
    :host { display: block; }
    .toolbar { display: flex; flex-wrap: wrap; align-items: center; gap: 6px; margin-bottom: 4px; font-size: 0.875rem; }
    .choose, .against { color: var(--mat-sys-on-surface-variant); }
    select { font: inherit; color: var(--mat-sys-on-surface); background: var(--mat-sys-surface-container-lowest);
      border: 1px solid var(--mat-sys-outline); border-radius: 4px; padding: 3px 6px; }
    .limits, .empty { margin: 0 0 4px; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
  `,
})
export class SweepMeasurePlot {
  readonly data = input.required<SweepData>();
  readonly units = input<Record<string, Unit>>({});
  /** The netlist's title, for the exported file. */
  readonly title = input<string>();

  readonly plot = viewChild(XyPlot);
  protected readonly selectId = `nw-sweep-quantity-${++selectIds}`;
  private readonly chosen = signal<string | undefined>(undefined);

  readonly quantities = computed(() => sweepQuantities(this.data(), this.units()));
  /** The chosen quantity while it exists; else the first measure, else adm. */
  readonly quantity = computed<SweepQuantity | undefined>(() => {
    const all = this.quantities();
    return all.find((q) => q.key === this.chosen()) ?? all.find((q) => q.key.startsWith('measure:')) ?? all[0];
  });

  protected readonly xName = computed(() => this.data().name);

  /** The values where the quantity has a number: the plotted points. */
  readonly points = computed(() => {
    const q = this.quantity();
    const x: number[] = [];
    const y: number[] = [];
    for (const row of this.data().rows) {
      const v = q && !row.failure ? q.value(row) : undefined;
      if (v === undefined || !Number.isFinite(v)) continue;
      x.push(row.value);
      y.push(v);
    }
    return { x, y };
  });

  readonly log = computed(() => wantsLogAxis(this.points().x));

  readonly series = computed<XySeries[]>(() => {
    const q = this.quantity();
    return q ? [{ key: q.key, label: q.name, unit: q.unit, values: this.points().y, style: curveStyle(0), points: true }] : [];
  });

  readonly limits = computed(() => {
    const q = this.quantity();
    return q ? sweepLimits(this.data(), q, (v) => formatQuantity(v, q.unit)) : [];
  });
  readonly rules = computed<XyRule[]>(() => this.limits().map((l) => ({ value: l.value, unit: this.quantity()!.unit, label: l.text })));
  protected readonly limitsText = computed(() => {
    const l = this.limits();
    return l.length > 0 ? `Dashed: ${l.map((x) => `${x.text} (line ${x.line})`).join(', ')}.` : '';
  });

  protected readonly yTitle = computed(() => {
    const q = this.quantity();
    if (!q) return '';
    return q.unit && !q.name.endsWith(` ${q.unit}`) ? `${q.name} (${q.unit})` : q.name;
  });
  protected readonly caption = computed(() => `${this.title() ?? ''} — ${this.quantity()?.name ?? ''} against ${this.xName()}`.replace(/^ — /, ''));

  choose(key: string): void {
    this.chosen.set(key);
  }

  /** File names of the exports: `<title>-<quantity>-vs-<name>.svg`. */
  readonly stem = computed(() => `${fileStem(this.title())}-${fileStem(this.quantity()?.name, 'figure')}-vs-${fileStem(this.xName(), 'value')}`);

  /** CSV of the plotted points, full precision: the swept value and the quantity. */
  csvText(): string {
    const q = this.quantity();
    const xUnit = this.data().kind === 'temp' ? 'c' : this.data().unit === 'Ω' ? 'ohm' : '';
    const col = (name: string, unit: string) => (unit ? `${name}_${unit}` : name);
    return columnsCsv([
      { name: col(this.data().kind === 'temp' ? 'temp' : this.xName(), xUnit), values: this.points().x },
      { name: col((q?.name ?? 'value').replace(' dB', ''), q?.unit === 'dB' ? 'db' : ''), values: this.points().y },
    ]);
  }

  protected readonly csvFn = () => this.csvText();
}
