import {
  afterRenderEffect, ChangeDetectionStrategy, Component, computed, ElementRef, inject, input, signal, untracked, viewChild,
} from '@angular/core';
import { formatSi } from '../si-format';
import { exportSize, serializeSvg } from './plot-export';
import { PlotSize } from './plot-fit';
import { drawXy, drawXyCursor, type XyBand } from './xy-draw';
import { layoutXy, nearestSample, type XyGeometry, type XyRule, type XySeries } from './xy-geometry';

let helpCounter = 0;

/** Past this a taller plot shows nothing more. */
const MAX_HEIGHT = 900;

/**
 * A plot on linear axes (either may be logarithmic): curves over a swept value, one panel per unit (volts above amperes),
 * an optional marked span of the x axis, and a crosshair cursor that follows the mouse and the
 * arrow keys with a readout of every curve. It takes the height its panel leaves free. Drawn as
 * SVG, exported through `svgText()`.
 */
@Component({
  selector: 'nw-xy-plot',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="readout" aria-live="polite" aria-atomic="true">
      @if (readout(); as r) {
        <span class="at">{{ r.at }}</span>
        @for (row of r.rows; track row.key) {
          <span class="row">
            <svg class="swatch" width="22" height="8" aria-hidden="true"><line x1="1" y1="4" x2="21" y2="4" [attr.stroke]="row.color" stroke-width="2.5" [attr.stroke-dasharray]="row.dash || null" /></svg>
            <span class="name">{{ row.label }}</span> <span class="num">{{ row.value }}</span>
          </span>
        }
        @if (r.extra) { <span class="extra">{{ r.extra }}</span> }
      } @else {
        <span class="hint">Point at the plot, or focus it and use the arrow keys, to read values.</span>
      }
    </div>
    <div class="surface" tabindex="0" role="application" aria-roledescription="plot"
         [attr.aria-label]="ariaLabel()" [attr.aria-describedby]="helpId"
         (keydown)="onKey($event)" (focus)="onFocus()" (pointermove)="onPointerMove($event)">
      <svg #svg class="plot" aria-hidden="true"></svg>
    </div>
    <p class="help" aria-hidden="true">Point to read values; focused: ← → one point, Page Up/Down a tenth of the sweep, Home/End the ends.</p>
    <p class="visually-hidden" [id]="helpId">
      Left and right arrows move the cursor one point, Page Up and Page Down a tenth of the sweep, Home and End to the ends.
    </p>
  `,
  styles: `
    :host { display: block; }
    .readout { display: flex; flex-wrap: wrap; gap: 4px 14px; align-items: baseline; min-height: 1.5em;
      font-size: 0.875rem; color: var(--mat-sys-on-surface); margin: 0 0 4px; }
    .readout .at { font-weight: 700; color: var(--mat-sys-tertiary); }
    .readout .row { display: inline-flex; gap: 4px; align-items: baseline; }
    .readout .swatch { align-self: center; }
    .readout .num { font-variant-numeric: tabular-nums; }
    .readout .hint, .readout .extra { color: var(--mat-sys-on-surface-variant); }
    .surface { position: relative; cursor: crosshair; touch-action: none; border-radius: 4px; user-select: none; }
    .surface:focus-visible { outline: 2px solid var(--mat-sys-tertiary); outline-offset: 2px; }
    .plot { display: block; width: 100%; }
    .help { margin: 2px 0 0; font-size: 0.75rem; color: var(--mat-sys-on-surface-variant); }
    .visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap; }
  `,
})
export class XyPlot {
  /** The swept values (x axis). */
  readonly x = input.required<readonly number[]>();
  readonly series = input.required<readonly XySeries[]>();
  /** A span of the x axis to mark (the linear input range). */
  readonly band = input<XyBand>();
  /** A logarithmic x axis (used only when every x is positive). */
  readonly xLog = input(false);
  /** Logarithmic y axes, in whole decades (values ≤ 0 are left out; a panel with none stays linear). */
  readonly yLog = input(false);
  /** Horizontal lines to draw (a check's limits), each in the panel of its unit. */
  readonly rules = input<readonly XyRule[]>([]);
  /** Title of the y axis of a one-panel plot, instead of the unit's (e.g. "a0 (dB)"). */
  readonly yTitle = input<string>();
  /** Name of the swept quantity, e.g. `va`. */
  readonly xName = input('x');
  /** Unit of x: V or A. */
  readonly xUnit = input('');
  readonly ariaLabel = input('Plot');
  /** Caption of the exported file, e.g. the netlist's title. */
  readonly caption = input<string>();
  /** A fixed height in pixels; by default the plot takes the height its panel leaves free. */
  readonly height = input<number>();
  /** The least height when filling the panel: 220 px for one panel, 300 for volts above amperes. */
  readonly minHeight = input<number>();
  /** An extra readout line for the sample under the cursor (e.g. the slope there). */
  readonly readoutExtra = input<(index: number) => string | undefined>();

  readonly helpId = `nw-xy-help-${++helpCounter}`;
  readonly cursorIndex = signal<number | undefined>(undefined);
  /** Ids of labels left off for lack of room (their text stays in a tooltip). */
  droppedLabels: readonly string[] = [];

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly least = computed(() => this.minHeight() ?? (new Set(this.series().map((s) => s.unit)).size > 1 ? 300 : 220));
  /** Width from the host, height from the panel (or fixed). */
  private readonly box = new PlotSize(this.host.nativeElement, {
    fixed: () => this.height(), least: () => this.least(), initial: () => 360, max: MAX_HEIGHT,
  });

  readonly geometry = computed<XyGeometry>(() => layoutXy({
    width: this.box.width(),
    height: this.box.height(),
    x: this.x(),
    series: this.series(),
    xLog: this.xLog(),
    yLog: this.yLog(),
    rules: this.rules(),
    yTitle: this.yTitle(),
  }));

  readonly readout = computed(() => {
    const k = this.cursorIndex();
    const xs = this.x();
    if (k === undefined || k >= xs.length) return undefined;
    return {
      at: `${this.xName()} = ${formatSi(xs[k], this.xUnit(), 4)}`,
      rows: this.series().map((s) => ({ key: s.key, label: s.label, color: s.style.color, dash: s.style.dash, value: formatSi(s.values[k], s.unit, 4) })),
      extra: this.readoutExtra()?.(k),
    };
  });

  constructor() {
    afterRenderEffect(() => {
      const geo = this.geometry();
      const svg = this.svgRef().nativeElement;
      this.droppedLabels = drawXy(svg, geo, this.x(), this.series(), this.band(), {
        x: `${this.xName()}${this.xUnit() ? ` (${this.xUnit()})` : ''}`, xUnit: this.xUnit(), caption: this.caption(),
      }, this.rules());
      drawXyCursor(svg, geo, this.x(), this.series(), untracked(this.cursorIndex), this.xUnit());
    });
    afterRenderEffect(() => {
      drawXyCursor(this.svgRef().nativeElement, this.geometry(), this.x(), this.series(), this.cursorIndex(), this.xUnit());
    });
  }

  /** The plot as a standalone SVG document (the cursor left out). */
  svgText(): string {
    return serializeSvg(this.svgRef().nativeElement);
  }

  /** Size of the exported file in CSS pixels (the plot and its legend). */
  size(): { width: number; height: number } {
    return exportSize(this.svgRef().nativeElement);
  }

  /** Moves the cursor to the sample nearest `value` on the x axis. */
  moveCursorTo(value: number): void {
    if (this.x().length > 0) this.cursorIndex.set(nearestSample(this.x(), value));
  }

  onFocus(): void {
    if (this.cursorIndex() === undefined && this.x().length > 0) this.cursorIndex.set(0);
  }

  onKey(event: KeyboardEvent): void {
    const last = this.x().length - 1;
    if (last < 0) return;
    const current = this.cursorIndex() ?? 0;
    const page = Math.max(1, Math.round(last / 10));
    const to = (k: number) => this.cursorIndex.set(Math.min(last, Math.max(0, k)));
    switch (event.key) {
      case 'ArrowRight': to(current + 1); break;
      case 'ArrowLeft': to(current - 1); break;
      case 'PageUp': to(current + page); break;
      case 'PageDown': to(current - page); break;
      case 'Home': to(0); break;
      case 'End': to(last); break;
      default: return;
    }
    event.preventDefault();
  }

  onPointerMove(event: PointerEvent): void {
    const geo = this.geometry();
    const rect = this.svgRef().nativeElement.getBoundingClientRect();
    const scale = rect.width > 0 ? geo.width / rect.width : 1;
    const px = Math.min(geo.innerWidth, Math.max(0, (event.clientX - rect.left) * scale - geo.left));
    // Nearest on the screen, which on a log axis is not nearest in value.
    if (this.x().length > 0) this.cursorIndex.set(nearestSample(this.x().map((v) => geo.x(v)), px));
  }
}
