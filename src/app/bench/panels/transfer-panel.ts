import { ChangeDetectionStrategy, Component, computed, input, signal, viewChild } from '@angular/core';
import type { SolveResult } from '../../../../solver';
import { PanelNotice, panelNotice } from './panel-notice';
import { ExportBar } from './plot/export-bar';
import { curveStyle } from './plot/palette';
import { columnsCsv, fileStem } from './plot/plot-export';
import type { XyBand } from './plot/xy-draw';
import type { XySeries } from './plot/xy-geometry';
import { XyPlot } from './plot/xy-plot';
import { portNames } from './modes-panel';
import { formatPlain, formatSi } from './si-format';
import { linearRange, LINEAR_SLOPE_FRACTION, slopeFraction, type LinearRange } from './transfer/linear-range';
import { transferData, type TransferCurve } from './transfer/transfer-curves';

/** "90 %": the fraction of the peak slope that bounds the linear range, as the panel states it. */
const FRACTION_TEXT = `${Math.round(LINEAR_SLOPE_FRACTION * 100)} %`;

/**
 * *Transfer*: the curves of `analyze transfer` — node voltages and part currents over the swept
 * source — with a legend to show or hide each, the linear input range of a chosen curve marked
 * (where its slope falls to 90 % of its peak), a reading cursor, and export as SVG, PNG or CSV.
 */
@Component({
  selector: 'nw-transfer-panel',
  imports: [PanelNotice, XyPlot, ExportBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else if (data(); as d) {
      <div class="toolbar">
        <label class="marks">Linear range of
          <select [value]="markKey()" (change)="chooseMark($any($event.target).value)" aria-label="Curve whose linear input range is marked">
            @for (c of d.curves; track c.key) { <option [value]="c.key" [selected]="c.key === markKey()">{{ c.key }}</option> }
          </select>
        </label>
        <nw-export-bar [plot]="plot()" [stem]="stem()" [csvShown]="csvShownFn" [csvAll]="csvAllFn" [allCount]="d.all.length" />
      </div>
      <p class="range" aria-live="polite">{{ rangeText() }}</p>
      <div class="legend" role="group" aria-label="Curves shown">
        @for (c of d.curves; track c.key; let k = $index) {
          <button type="button" class="chip" [class.on]="isVisible(c.key)" [attr.aria-pressed]="isVisible(c.key)"
                  [attr.data-key]="c.key" (click)="toggle(c.key)" [attr.aria-label]="(isVisible(c.key) ? 'Hide ' : 'Show ') + c.key">
            <svg width="20" height="10" aria-hidden="true"><line x1="1" y1="5" x2="19" y2="5" [attr.stroke]="styleAt(k).color" stroke-width="2.5" [attr.stroke-dasharray]="styleAt(k).dash || null" /></svg>
            @if (isVisible(c.key)) { <span class="tick" aria-hidden="true">✓</span> }{{ c.key }}
          </button>
        }
        @for (c of d.curves; track c.key) { @if (c.definition) { <span class="note">{{ c.definition }}.</span> } }
        @if (d.flat.length > 0) { <span class="note flat">Constant over the sweep: {{ d.flat.join(', ') }}.</span> }
      </div>
      @if (shown().length > 0) {
        <nw-xy-plot [x]="d.x" [series]="shown()" [band]="band()" [xName]="d.source" [xUnit]="d.sourceUnit"
                    [ariaLabel]="'Transfer curves of ' + shownKeys() + ' over ' + d.source" [caption]="result()?.title"
                    [readoutExtra]="slopeAt" />
      } @else {
        <p class="empty">Choose a curve above to plot it.</p>
      }
    }
  `,
  styles: `
    :host { display: block; }
    .toolbar { display: flex; flex-wrap: wrap; align-items: center; gap: 6px; margin-bottom: 4px; }
    .marks { font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); display: inline-flex; align-items: center; gap: 6px; }
    select { font: inherit; color: var(--mat-sys-on-surface); background: var(--mat-sys-surface-container-lowest);
      border: 1px solid var(--mat-sys-outline); border-radius: 4px; padding: 3px 6px; }
    .range { margin: 0 0 6px; font-size: 0.8125rem; color: var(--mat-sys-on-surface); }
    .legend { display: flex; flex-wrap: wrap; align-items: center; gap: 5px; margin: 0 0 6px; }
    .chip { display: inline-flex; align-items: center; gap: 3px; font: inherit; font-size: 0.8125rem; cursor: pointer;
      padding: 1px 9px 1px 6px; border-radius: 14px; border: 1px solid var(--mat-sys-outline-variant);
      background: transparent; color: var(--mat-sys-on-surface-variant); }
    .chip.on { background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface); border-color: var(--mat-sys-outline); font-weight: 600; }
    .chip:not(.on) svg { opacity: 0.45; }
    .note, .empty { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); margin: 0; }
  `,
})
export class TransferPanel {
  readonly result = input<SolveResult | undefined>();

  readonly plot = viewChild(XyPlot);
  /** The user's own show/hide choices, kept across re-solves while the curve names persist. */
  private readonly choices = signal<ReadonlyMap<string, boolean>>(new Map());
  private readonly chosenMark = signal<string | undefined>(undefined);

  readonly notice = computed(() => panelNotice(this.result(), (r) => (r.transfer && r.transfer.x.length > 0 ? undefined : {
    title: 'No transfer curve yet',
    text: 'Add an “analyze transfer SOURCE from START to STOP step STEP” line to see node voltages and part currents over a swept source, with the linear input range marked, for example:',
    code: suggestedSweep(r),
  })));

  readonly data = computed(() => transferData(this.result()));

  isVisible(key: string): boolean {
    return this.choices().get(key) ?? this.data()?.defaults.includes(key) ?? false;
  }

  toggle(key: string): void {
    const next = new Map(this.choices());
    next.set(key, !this.isVisible(key));
    this.choices.set(next);
  }

  chooseMark(key: string): void {
    this.chosenMark.set(key);
  }

  /** A curve's style is fixed by its place in the legend, so toggling one never recolours another. */
  protected styleAt(index: number) {
    return curveStyle(index);
  }

  readonly shown = computed<XySeries[]>(() => (this.data()?.curves ?? []).flatMap((c, k) => (this.isVisible(c.key)
    ? [{ key: c.key, label: c.label, unit: c.unit, values: c.values, style: curveStyle(k) }] : [])));
  readonly shownKeys = computed(() => this.shown().map((s) => s.key).join(', '));

  readonly markKey = computed(() => {
    const d = this.data();
    const chosen = this.chosenMark();
    return d?.curves.some((c) => c.key === chosen) ? chosen! : d?.markKey ?? '';
  });
  private readonly markCurve = computed<TransferCurve | undefined>(() => this.data()?.curves.find((c) => c.key === this.markKey()));

  readonly range = computed<LinearRange | undefined>(() => {
    const d = this.data();
    const c = this.markCurve();
    return d && c ? linearRange(d.x, c.values) : undefined;
  });

  readonly band = computed<XyBand | undefined>(() => {
    const r = this.range();
    const unit = this.data()?.sourceUnit ?? '';
    if (!r || (r.loOpen && r.hiOpen)) return undefined;
    const digits = edgeDigits(r);
    return {
      lo: r.lo, hi: r.hi, curveKey: this.markKey(),
      text: `linear ${spanText(r, unit)} (slope ≥ ${FRACTION_TEXT} of peak)`,
      loLabel: formatSi(r.lo, unit, digits), hiLabel: formatSi(r.hi, unit, digits),
    };
  });

  /** The range in words, with the fraction that defines it and the peak slope. */
  readonly rangeText = computed(() => {
    const d = this.data();
    const c = this.markCurve();
    const r = this.range();
    if (!d || !c) return '';
    if (!r) return `${c.key} does not change over the sweep: it has no linear range.`;
    const unit = d.sourceUnit;
    const digits = edgeDigits(r);
    const what = `Linear input range of ${c.key} (slope at least ${FRACTION_TEXT} of its peak)`;
    const slope = `peak slope ${slopeText(r.peakSlope, c.unit, unit)} at ${d.source} = ${formatSi(r.peakX, unit)}`;
    if (r.loOpen && r.hiOpen) return `${what}: the whole sweep, ${formatSi(r.lo, unit, digits)} … ${formatSi(r.hi, unit, digits)}; the slope never falls that far — widen the sweep to find the ends. ${cap(slope)}.`;
    const open = r.loOpen ? ' (the sweep ends first on the low side)' : r.hiOpen ? ' (the sweep ends first on the high side)' : '';
    return `${what}: ${formatSi(r.lo, unit, digits)} … ${formatSi(r.hi, unit, digits)}, ${formatSi(r.hi - r.lo, unit)} wide${open}; ${slope}.`;
  });

  /** The cursor's extra readout: the marked curve's slope there as a share of its peak. */
  protected readonly slopeAt = (index: number): string | undefined => {
    const d = this.data();
    const c = this.markCurve();
    const r = this.range();
    if (!d || !c || !r) return undefined;
    const f = slopeFraction(d.x, c.values, index, r);
    return Number.isFinite(f) ? `slope of ${c.key}: ${Math.round(f * 100)} % of peak` : undefined;
  };

  /** File names of the exports: `<title>-transfer.svg` … */
  readonly stem = computed(() => `${fileStem(this.result()?.title)}-transfer`);

  /** CSV of the swept values and the shown curves, full precision. */
  csvText(): string {
    return this.csv(this.shown().map((s) => ({ key: s.key, unit: s.unit as 'V' | 'A', values: s.values })));
  }

  /** CSV of every curve of the sweep (flat ones and the derived vod included). */
  csvAllText(): string {
    return this.csv(this.data()?.all ?? []);
  }

  protected readonly csvShownFn = () => this.csvText();
  protected readonly csvAllFn = () => this.csvAllText();

  private csv(curves: ReadonlyArray<Pick<TransferCurve, 'key' | 'unit' | 'values'>>): string {
    const d = this.data();
    if (!d) return '';
    const col = (name: string, unit: string) => (unit ? `${name}_${unit.toLowerCase()}` : name);
    return columnsCsv([{ name: col(d.source, d.sourceUnit), values: d.x }, ...curves.map((c) => ({ name: col(c.key, c.unit), values: c.values }))]);
  }
}

/**
 * "±16.9 mV" for a range centred on zero, "2.50 V ± 16.9 mV" for one centred well away from it
 * (a pair biased at 2.5 V), else "−12.0 mV … 20.1 mV".
 */
function spanText(r: LinearRange, unit: string): string {
  const half = (r.hi - r.lo) / 2;
  const centre = (r.hi + r.lo) / 2;
  if (Math.abs(centre) <= 0.02 * half) return `±${formatSi(half, unit)}`;
  if (Math.abs(centre) >= 2 * half) return `${formatSi(centre, unit, edgeDigits(r))} ± ${formatSi(half, unit)}`;
  return `${formatSi(r.lo, unit)} … ${formatSi(r.hi, unit)}`;
}

/** Digits that tell the two ends apart: 3, and more when the range is narrow beside its offset (2.483 V … 2.517 V). */
function edgeDigits(r: LinearRange): number {
  const width = Math.abs(r.hi - r.lo);
  const offset = Math.max(Math.abs(r.lo), Math.abs(r.hi));
  return width > 0 ? Math.min(6, Math.max(3, Math.ceil(Math.log10(offset / width)) + 2)) : 3;
}

/** A slope with its unit: V/V and A/A are plain gains, A/V siemens, V/A ohms. */
function slopeText(slope: number, yUnit: string, xUnit: string): string {
  if (yUnit === xUnit || !xUnit) return `${formatPlain(slope)} ${yUnit && xUnit ? `${yUnit}/${xUnit}` : ''}`.trim();
  if (yUnit === 'A' && xUnit === 'V') return formatSi(slope, 'S');
  if (yUnit === 'V' && xUnit === 'A') return formatSi(slope, 'Ω');
  return `${formatPlain(slope)} ${yUnit}/${xUnit}`;
}

function cap(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/**
 * A transfer line to copy: the first input the ports line names (else the first voltage source
 * that is not a supply) swept ±100 mV in 1 mV steps around its own DC value, so a pair biased at
 * 2.5 V of common mode is swept 2.4 … 2.6 V and not pulled to ground.
 */
function suggestedSweep(r: SolveResult): string {
  const names = Object.keys(r.op?.sources ?? {});
  const source = r.ports ? portNames(r.ports).inP : names.find((n) => !/^v(cc|dd|ee|ss)/i.test(n)) ?? names[0] ?? 'va';
  const dc = r.op?.sources[source]?.v ?? 0;
  return `analyze transfer ${source} from ${netlistNumber(dc - 0.1)} to ${netlistNumber(dc + 0.1)} step 1m`;
}

/** A value as the netlist writes it: 2.4, -100m, 0. */
function netlistNumber(v: number): string {
  const r = Number(v.toPrecision(6));
  if (Math.abs(r) < 1e-12) return '0';
  return Math.abs(r) < 1 ? `${Number((r * 1e3).toPrecision(6))}m` : String(r);
}
