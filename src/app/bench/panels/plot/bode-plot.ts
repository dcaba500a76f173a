import {
  afterRenderEffect, ChangeDetectionStrategy, Component, computed, ElementRef, inject, input, signal, untracked, viewChild,
} from '@angular/core';
import { formatTick } from '../si-format';
import { drawCursor, drawPlot, drawZoomBox, readoutText } from './bode-draw';
import { exportSize, serializeSvg } from './plot-export';
import { PlotSize } from './plot-fit';
import {
  clampDomain, fullDomain, layoutPlot, nearestIndex, panDomain, zoomDomain, type Domain, type PlotGeometry, type PlotMarker, type PlotSeries,
} from './plot-geometry';

/** A drag on the plot: a zoom box, or a pan when Shift is held. */
interface Drag {
  mode: 'box' | 'pan';
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  startDomain: Domain;
}

let helpCounter = 0;

/** Past this a taller plot shows nothing more: the eye reads a Bode plot at about this size. */
const MAX_HEIGHT = 900;

/**
 * A Bode plot: magnitude in dB above, unwrapped phase in degrees below (optional), on one
 * log-frequency axis. A crosshair cursor follows the mouse and the arrow keys with a readout of
 * every curve; the wheel and a dragged box zoom, Shift+drag or Shift+arrows pan, double-click or
 * 0 resets. Drawn as SVG (crisp text, no GPU), exported through `svgText()`.
 */
@Component({
  selector: 'nw-bode-plot',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="readout" aria-live="polite" aria-atomic="true">
      @if (readout(); as r) {
        <span class="freq">f = {{ r.freq }}</span>
        @for (row of r.rows; track row.key) {
          <span class="row">
            <svg class="swatch" width="22" height="8" aria-hidden="true"><line x1="1" y1="4" x2="21" y2="4" [attr.stroke]="row.color" stroke-width="2.5" [attr.stroke-dasharray]="row.dash || null" /></svg>
            <span class="name">{{ row.label }}</span> <span class="num">{{ row.db }}</span>
            @if (showPhase()) { <span class="num">{{ row.phase }}</span> }
          </span>
        }
      } @else {
        <span class="hint">Point at the plot, or focus it and use the arrow keys, to read values.</span>
      }
    </div>
    <div class="surface" tabindex="0" role="application" aria-roledescription="plot"
         [attr.aria-label]="ariaLabel()" [attr.aria-describedby]="helpId"
         (keydown)="onKey($event)" (focus)="onFocus()"
         (pointerdown)="onPointerDown($event)" (pointermove)="onPointerMove($event)" (pointerup)="onPointerUp($event)"
         (pointercancel)="drag.set(undefined)" (wheel)="onWheel($event)" (dblclick)="resetZoom()">
      <svg #svg class="plot" aria-hidden="true"></svg>
    </div>
    <p class="help" aria-hidden="true">Drag a box or turn the wheel to zoom, Shift+drag to pan, double-click to reset; focused: ← → cursor, + − zoom, 0 reset.</p>
    <p class="visually-hidden" [id]="helpId">
      Left and right arrows move the cursor one point, Page Up and Page Down a decade, Home and End to the ends;
      plus and minus zoom around the cursor, Shift with the arrows pans, 0 or Escape resets the zoom.
      With a mouse: drag a box to zoom, turn the wheel to zoom, Shift+drag to pan, double-click to reset.
    </p>
  `,
  styles: `
    :host { display: block; }
    .readout { display: flex; flex-wrap: wrap; gap: 4px 14px; align-items: baseline; min-height: 1.5em;
      font-size: 0.875rem; color: var(--mat-sys-on-surface); margin: 0 0 4px; }
    .readout .freq { font-weight: 700; color: var(--mat-sys-tertiary); }
    .readout .row { display: inline-flex; gap: 4px; align-items: baseline; }
    .readout .swatch { align-self: center; }
    .readout .num { font-variant-numeric: tabular-nums; }
    .readout .hint { color: var(--mat-sys-on-surface-variant); }
    .surface { position: relative; cursor: crosshair; touch-action: none; border-radius: 4px; user-select: none; }
    .surface:focus-visible { outline: 2px solid var(--mat-sys-tertiary); outline-offset: 2px; }
    .plot { display: block; width: 100%; }
    .help { margin: 2px 0 0; font-size: 0.75rem; color: var(--mat-sys-on-surface-variant); }
    .visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap; }
  `,
})
export class BodePlot {
  /** Frequencies of the sweep (Hz, ascending). */
  readonly freqHz = input.required<readonly number[]>();
  /** The curves to draw. */
  readonly series = input.required<readonly PlotSeries[]>();
  /** Whether to draw the phase panel below the magnitude. */
  readonly showPhase = input(true);
  readonly markers = input<readonly PlotMarker[]>([]);
  readonly magnitudeLabel = input('Magnitude (dB)');
  readonly ariaLabel = input('Bode plot');
  /** Caption of the exported file, e.g. the netlist's title. */
  readonly caption = input<string>();
  /** A fixed height in pixels; by default the plot takes the height its panel leaves free. */
  readonly height = input<number>();
  /** The least height when filling the panel: 300 with the phase panel, 220 without. */
  readonly minHeight = input<number>();
  /** Ids of marker labels left off for lack of room (their text stays in the marker's tooltip). */
  droppedLabels: readonly string[] = [];

  readonly helpId = `nw-plot-help-${++helpCounter}`;
  /** Sample under the cursor. */
  readonly cursorIndex = signal<number | undefined>(undefined);
  /** Zoomed frequency span; undefined shows the whole sweep. */
  readonly xDomain = signal<Domain | undefined>(undefined);
  /** Zoomed magnitude span (from a box); undefined fits the visible data. */
  readonly yDomain = signal<Domain | undefined>(undefined);
  readonly zoomed = computed(() => this.xDomain() !== undefined || this.yDomain() !== undefined);
  readonly drag = signal<Drag | undefined>(undefined);

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  /** The height that fills the panel, once measured. */
  private readonly least = computed(() => this.minHeight() ?? (this.showPhase() ? 300 : 220));
  /** Width from the host, height from the panel (or fixed). */
  private readonly box = new PlotSize(this.host.nativeElement, {
    fixed: () => this.height(), least: () => this.least(), initial: () => (this.showPhase() ? 360 : 220), max: MAX_HEIGHT,
  });

  readonly geometry = computed<PlotGeometry>(() => layoutPlot({
    width: this.box.width(),
    height: this.box.height(),
    freqHz: this.freqHz(),
    series: this.series(),
    showPhase: this.showPhase(),
    xDomain: this.xDomain(),
    yDomain: this.yDomain(),
  }));

  readonly readout = computed(() => {
    const k = this.cursorIndex();
    const f = this.freqHz();
    if (k === undefined || k >= f.length) return undefined;
    return {
      freq: formatTick(Number(f[k].toPrecision(4)), 'Hz'),
      rows: this.series().map((s) => ({ key: s.key, label: s.label, color: s.style.color, dash: s.style.dash, ...readoutText(s, k) })),
    };
  });

  constructor() {
    afterRenderEffect(() => {
      const geo = this.geometry();
      const svg = this.svgRef().nativeElement;
      const dropped = drawPlot(svg, geo, this.freqHz(), this.series(), this.markers(), {
        magnitude: this.magnitudeLabel(), phase: 'Phase (°)', frequency: 'Frequency (Hz)', caption: this.caption(),
      });
      this.droppedLabels = dropped;
      drawCursor(svg, geo, this.freqHz(), this.series(), untracked(this.cursorIndex));
    });
    afterRenderEffect(() => {
      drawCursor(this.svgRef().nativeElement, this.geometry(), this.freqHz(), this.series(), this.cursorIndex());
    });
    afterRenderEffect(() => {
      const d = this.drag();
      drawZoomBox(this.svgRef().nativeElement, d?.mode === 'box' ? d : undefined);
    });
  }

  /** The plot as a standalone SVG document (cursor and zoom box left out). */
  svgText(): string {
    return serializeSvg(this.svgRef().nativeElement);
  }

  /** Size of the exported file in CSS pixels (the plot and its legend). */
  size(): { width: number; height: number } {
    return exportSize(this.svgRef().nativeElement);
  }

  resetZoom(): void {
    this.xDomain.set(undefined);
    this.yDomain.set(undefined);
  }

  /** Moves the cursor to the sample nearest `freq` (Hz). */
  moveCursorTo(freq: number): void {
    this.cursorIndex.set(nearestIndex(this.freqHz(), freq, this.geometry().visible));
  }

  onFocus(): void {
    if (this.cursorIndex() === undefined && this.freqHz().length > 0) this.cursorIndex.set(this.geometry().visible[0]);
  }

  onKey(event: KeyboardEvent): void {
    const geo = this.geometry();
    const [first, last] = geo.visible;
    const current = this.cursorIndex() ?? first;
    const perDecade = Math.max(1, Math.round((last - first) / Math.max(0.1, Math.log10(geo.x.domain()[1] / geo.x.domain()[0]))));
    const full = fullDomain(this.freqHz());
    const domain = (this.xDomain() ?? full);
    const centre = this.freqHz()[current] ?? Math.sqrt(domain[0] * domain[1]);
    let handled = true;
    switch (event.key) {
      case 'ArrowLeft':
      case 'ArrowRight': {
        const dir = event.key === 'ArrowRight' ? 1 : -1;
        if (event.shiftKey) this.xDomain.set(panDomain(domain, full, 0.2 * dir));
        else this.cursorIndex.set(Math.min(last, Math.max(first, current + dir)));
        break;
      }
      case 'PageUp':
      case 'PageDown':
        this.cursorIndex.set(Math.min(last, Math.max(first, current + (event.key === 'PageUp' ? perDecade : -perDecade))));
        break;
      case 'Home': this.cursorIndex.set(first); break;
      case 'End': this.cursorIndex.set(last); break;
      case '+':
      case '=':
        this.xDomain.set(zoomDomain(domain, full, centre, 0.5));
        break;
      case '-':
      case '_':
        this.xDomain.set(zoomDomain(domain, full, centre, 2));
        break;
      case '0':
      case 'Escape':
        if (this.zoomed()) this.resetZoom();
        else handled = event.key === '0';
        break;
      default:
        handled = false;
    }
    if (handled) {
      event.preventDefault();
      this.keepCursorVisible();
    }
  }

  onPointerDown(event: PointerEvent): void {
    if (event.button !== 0) return;
    const { x, y } = this.plotPoint(event);
    const startDomain = this.xDomain() ?? fullDomain(this.freqHz());
    this.drag.set({ mode: event.shiftKey ? 'pan' : 'box', x0: x, y0: y, x1: x, y1: y, startDomain });
    (event.currentTarget as Element | null)?.setPointerCapture?.(event.pointerId);
  }

  onPointerMove(event: PointerEvent): void {
    const { x, y } = this.plotPoint(event);
    const geo = this.geometry();
    const d = this.drag();
    if (d) {
      this.drag.set({ ...d, x1: x, y1: y });
      if (d.mode === 'pan') {
        const fraction = -(x - d.x0) / geo.innerWidth;
        this.xDomain.set(panDomain(d.startDomain, fullDomain(this.freqHz()), fraction));
      }
    }
    const clamped = Math.min(geo.innerWidth, Math.max(0, x));
    this.cursorIndex.set(nearestIndex(this.freqHz(), geo.x.invert(clamped), geo.visible));
  }

  onPointerUp(event: PointerEvent): void {
    const d = this.drag();
    this.drag.set(undefined);
    if (!d || d.mode !== 'box') return;
    const { x, y } = this.plotPoint(event);
    const geo = this.geometry();
    const x0 = Math.max(0, Math.min(d.x0, x));
    const x1 = Math.min(geo.innerWidth, Math.max(d.x0, x));
    if (x1 - x0 < 6) return;
    const full = fullDomain(this.freqHz());
    this.xDomain.set(clampDomain([geo.x.invert(x0), geo.x.invert(x1)], full) ?? this.xDomain());
    // A box drawn inside the magnitude panel with some height also zooms the dB axis.
    const top = geo.mag.top;
    const bottom = geo.mag.top + geo.mag.height;
    const y0 = Math.max(top, Math.min(d.y0, y));
    const y1 = Math.min(bottom, Math.max(d.y0, y));
    if (d.y0 >= top && d.y0 <= bottom && y1 - y0 >= 6) this.yDomain.set([geo.yMag.invert(y1), geo.yMag.invert(y0)]);
    this.keepCursorVisible();
  }

  onWheel(event: WheelEvent): void {
    if (event.deltaY === 0) return;
    event.preventDefault();
    const geo = this.geometry();
    const { x } = this.plotPoint(event);
    const full = fullDomain(this.freqHz());
    const centre = geo.x.invert(Math.min(geo.innerWidth, Math.max(0, x)));
    this.xDomain.set(zoomDomain(this.xDomain() ?? full, full, centre, event.deltaY < 0 ? 0.8 : 1.25));
    this.keepCursorVisible();
  }

  /** Pointer position relative to the plot area's left edge and the SVG's top. */
  private plotPoint(event: MouseEvent): { x: number; y: number } {
    const rect = this.svgRef().nativeElement.getBoundingClientRect();
    const scale = rect.width > 0 ? this.geometry().width / rect.width : 1;
    return { x: (event.clientX - rect.left) * scale - this.geometry().left, y: (event.clientY - rect.top) * scale };
  }

  private keepCursorVisible(): void {
    const k = this.cursorIndex();
    if (k === undefined) return;
    const [first, last] = this.geometry().visible;
    if (k < first) this.cursorIndex.set(first);
    else if (k > last) this.cursorIndex.set(last);
  }
}
