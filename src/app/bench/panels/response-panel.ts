import { ChangeDetectionStrategy, Component, computed, input, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { SolveResult } from '../../../../solver';
import { BodePlot } from './plot/bode-plot';
import { curveMarkers } from './plot/curve-markers';
import { ExportBar } from './plot/export-bar';
import { curveStyle, type CurveStyle } from './plot/palette';
import { curvesCsv, fileStem } from './plot/plot-export';
import type { PlotSeries } from './plot/plot-geometry';
import { PanelNotice, panelNotice } from './panel-notice';

/** The figures of the ports analysis, in the order a designer reads them. */
const PORTS_CURVES = ['adm', 'acm', 'cmrr'];

/** Below this everywhere a curve is a node with no ac response (the engine reports 0 as −300 dB). */
const SILENT_DB = -250;

function isSilent(db: readonly number[]): boolean {
  return db.every((v) => v <= SILENT_DB);
}

interface CurveEntry {
  key: string;
  group: 'ports' | 'nodes';
  series: PlotSeries;
}

/**
 * *Response*: the Bode plot of the ac sweep — the ports curves (adm, acm, cmrr) and every node's
 * ac(n) — with a legend to show or hide each curve, the −3 dB and unity points of a chosen curve
 * marked, a reading cursor, zoom and pan, and export as SVG, PNG or CSV (of the shown curves, or of all of them).
 */
@Component({
  selector: 'nw-response-panel',
  imports: [BodePlot, ExportBar, MatButtonModule, PanelNotice],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else {
      <div class="toolbar">
        <label class="marks">Marks on
          <select [value]="selectedKey()" (change)="selectCurve($any($event.target).value)" aria-label="Curve whose −3 dB and 0 dB points are marked">
            @for (e of shown(); track e.key) { <option [value]="e.key" [selected]="e.key === selectedKey()">{{ e.key }}</option> }
          </select>
        </label>
        <button mat-stroked-button type="button" (click)="plot()?.resetZoom()" [disabled]="!plot()?.zoomed()" aria-label="Reset zoom">Reset zoom</button>
        <nw-export-bar [plot]="plot()" [stem]="stem()" [csvShown]="csvShownFn" [csvAll]="csvAllFn" [allCount]="entries().length" />
      </div>
      <div class="legend" role="group" aria-label="Curves shown">
        @for (e of available(); track e.key) {
          <button type="button" class="chip" [class.on]="isVisible(e.key)" [attr.aria-pressed]="isVisible(e.key)"
                  [attr.data-key]="e.key" (click)="toggle(e.key)"
                  [attr.aria-label]="(isVisible(e.key) ? 'Hide ' : 'Show ') + e.key">
            <svg width="20" height="10" aria-hidden="true"><line x1="1" y1="5" x2="19" y2="5" [attr.stroke]="styleOf(e).color" stroke-width="2.5" [attr.stroke-dasharray]="styleOf(e).dash || null" /></svg>
            @if (isVisible(e.key)) { <span class="tick" aria-hidden="true">✓</span> }{{ e.key }}
          </button>
        }
        @if (silent().length > 0) {
          <span class="silent">No ac response at {{ silent().join(', ') }}.</span>
        }
      </div>
      @if (shown().length > 0) {
        <nw-bode-plot [freqHz]="freqHz()" [series]="shownSeries()" [markers]="markers()"
                      [ariaLabel]="'Bode plot of ' + shownKeys()" [caption]="result()?.title" />
      } @else {
        <p class="empty">Choose a curve above to plot it.</p>
      }
    }
  `,
  styles: `
    :host { display: block; }
    .toolbar { display: flex; flex-wrap: wrap; align-items: center; gap: 6px; margin-bottom: 6px;
      --mat-button-outlined-container-height: 32px; --mat-button-text-container-height: 32px; }
    .marks { font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); display: inline-flex; align-items: center; gap: 6px; }
    select { font: inherit; color: var(--mat-sys-on-surface); background: var(--mat-sys-surface-container-lowest);
      border: 1px solid var(--mat-sys-outline); border-radius: 4px; padding: 3px 6px; }
    .legend { display: flex; flex-wrap: wrap; gap: 5px; margin: 0 0 6px; }
    .chip { display: inline-flex; align-items: center; gap: 3px; font: inherit; font-size: 0.8125rem; cursor: pointer;
      padding: 1px 9px 1px 6px; border-radius: 14px; border: 1px solid var(--mat-sys-outline-variant);
      background: transparent; color: var(--mat-sys-on-surface-variant); }
    .chip.on { background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface); border-color: var(--mat-sys-outline); font-weight: 600; }
    .chip:not(.on) svg { opacity: 0.45; }
    .legend { align-items: center; }
    .silent, .empty { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); margin: 0; }
  `,
})
export class ResponsePanel {
  readonly result = input<SolveResult | undefined>();

  readonly plot = viewChild(BodePlot);
  /** The user's own show/hide choices, kept across re-solves while the curve names persist. */
  private readonly choices = signal<ReadonlyMap<string, boolean>>(new Map());
  private readonly chosenMarkKey = signal<string | undefined>(undefined);

  readonly notice = computed(() => panelNotice(this.result(), (r) => (r.ac && r.ac.freq_hz.length > 0 ? undefined : {
    title: 'No frequency response yet',
    text: 'Add an ac sweep to the netlist, for example:',
    code: 'analyze ac from 10 Hz to 1 GHz per decade 20',
  })));

  readonly freqHz = computed(() => this.result()?.ac?.freq_hz ?? []);

  /** Every curve of the sweep in display order: the ports figures first, then the nodes. */
  protected readonly entries = computed<Array<Omit<CurveEntry, 'series'> & { series: Omit<PlotSeries, 'style'> }>>(() => {
    const curves = this.result()?.ac?.curves ?? {};
    const keys = [...PORTS_CURVES.filter((k) => k in curves), ...Object.keys(curves).filter((k) => !PORTS_CURVES.includes(k))];
    return keys.map((key) => ({
      key,
      group: PORTS_CURVES.includes(key) ? 'ports' : 'nodes',
      series: { key, label: key, db: curves[key].db, phase_deg: curves[key].phase_deg },
    }));
  });

  /** Node curves that are zero over the whole sweep (supplies, grounded inputs): named, not plotted. */
  readonly silent = computed(() => this.entries().filter((e) => isSilent(e.series.db)).map((e) => e.key.replace(/^ac\((.*)\)$/, '$1')));

  /**
   * The curves that can be plotted, each with a style fixed by its place in this list (so toggling
   * one never recolours another); only past the palette's length can two shown curves collide,
   * and then the later one takes the next free style.
   */
  readonly available = computed<CurveEntry[]>(() => this.entries()
    .filter((e) => !isSilent(e.series.db))
    .map((e, index) => ({ ...e, series: { ...e.series, style: curveStyle(index) } })));

  /** Shown by default: the ports curves when there are ports, else the first few node curves. */
  private readonly defaults = computed(() => {
    const all = this.available();
    const ports = all.filter((e) => e.group === 'ports');
    return new Set((ports.length > 0 ? ports : all.slice(0, 3)).map((e) => e.key));
  });

  readonly shown = computed(() => {
    const used = new Set<string>();
    return this.available().filter((e) => this.isVisible(e.key)).map((e) => {
      let style = e.series.style;
      for (let k = 0; used.has(style.color + style.dash) && k < 49; k++) style = curveStyle(k);
      used.add(style.color + style.dash);
      return style === e.series.style ? e : { ...e, series: { ...e.series, style } };
    });
  });
  private readonly shownStyles = computed(() => new Map(this.shown().map((e) => [e.key, e.series.style])));
  readonly shownSeries = computed(() => this.shown().map((e) => e.series));
  readonly shownKeys = computed(() => this.shown().map((e) => e.key).join(', '));

  readonly selectedKey = computed(() => {
    const shown = this.shown();
    const chosen = this.chosenMarkKey();
    if (chosen && shown.some((e) => e.key === chosen)) return chosen;
    return shown[0]?.key ?? '';
  });

  readonly markers = computed(() => {
    const entry = this.shown().find((e) => e.key === this.selectedKey());
    const curve = entry ? this.result()?.ac?.curves[entry.key] : undefined;
    return entry && curve ? curveMarkers(entry.key, this.freqHz(), curve) : [];
  });

  /** The style a curve is drawn in (the legend's swatch matches the plot). */
  styleOf(e: CurveEntry): CurveStyle {
    return this.shownStyles().get(e.key) ?? e.series.style;
  }

  isVisible(key: string): boolean {
    return this.choices().get(key) ?? this.defaults().has(key);
  }

  toggle(key: string): void {
    const next = new Map(this.choices());
    next.set(key, !this.isVisible(key));
    this.choices.set(next);
  }

  selectCurve(key: string): void {
    this.chosenMarkKey.set(key);
  }

  /** File names of the exports: `<title>-response.svg` … */
  readonly stem = computed(() => `${fileStem(this.result()?.title)}-response`);

  /** CSV of the shown curves over the whole sweep: exactly the plotted numbers. */
  csvText(): string {
    return curvesCsv(this.freqHz(), this.shown().map((e) => ({ key: e.key, db: e.series.db, phase_deg: e.series.phase_deg })));
  }

  /** CSV of every curve of the sweep, shown, hidden or silent, in the legend's order. */
  csvAllText(): string {
    return curvesCsv(this.freqHz(), this.entries().map((e) => ({ key: e.key, db: e.series.db, phase_deg: e.series.phase_deg })));
  }

  protected readonly csvShownFn = () => this.csvText();
  protected readonly csvAllFn = () => this.csvAllText();
}
