import { ChangeDetectionStrategy, Component, computed, input, signal, viewChild } from '@angular/core';
import type { SolveResult } from '../../../../solver';
import { contributorRows, largestAt, noiseData, suggestedNoise, type NoiseData } from './noise/noise-data';
import { PanelNotice, panelNotice } from './panel-notice';
import { STATUS_STYLES } from './panel-styles';
import { ExportBar } from './plot/export-bar';
import { curveStyle } from './plot/palette';
import { columnsCsv, fileStem, type CsvColumn } from './plot/plot-export';
import type { XySeries } from './plot/xy-geometry';
import { XyPlot } from './plot/xy-plot';
import { formatSi } from './si-format';

/** Contributors listed before "and N more". */
export const NOISE_TOP_ROWS = 10;
/** Contributors offered as curves in the legend (the largest shares). */
const CURVE_CONTRIBUTORS = 5;

let panelIds = 0;

/** A curve the legend offers. */
interface NoiseCurve {
  key: string;
  label: string;
  unit: string;
  values: readonly number[];
  /** Shown before the user chooses. */
  initial: boolean;
}

/**
 * *Noise*: what `analyze noise` gives — the output and input-referred noise densities over
 * frequency on log–log axes (the largest contributors' own curves to add from the legend), a
 * reading cursor, export as SVG, PNG or CSV; the rms noise over the band, output and
 * input-referred, by the solver's own band rule; and the parts ranked by their share of the
 * band's noise power, with their densities at a spot frequency the user picks.
 */
@Component({
  selector: 'nw-noise-panel',
  imports: [PanelNotice, XyPlot, ExportBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else if (data(); as d) {
      <p class="context">Noise at <strong>{{ d.output }}</strong>, input <strong>{{ d.input }}</strong>, {{ bandText() }} ({{ d.freqHz.length }} points), at {{ result()?.temp_c }} °C.</p>
      <div class="figures">
        <section class="figure" [attr.aria-labelledby]="ids + '-out'">
          <h2 [id]="ids + '-out'">Output noise, rms over the band</h2>
          <p class="big num" data-figure="out-rms">{{ si(d.outRms, 'V') }}</p>
          <p class="def"><code>noise_out_rms()</code>; {{ si(d.out[spot()], 'V/√Hz') }} at {{ spotText() }}</p>
        </section>
        <section class="figure" [attr.aria-labelledby]="ids + '-in'">
          <h2 [id]="ids + '-in'">Input-referred noise, rms over the band</h2>
          <p class="big num" data-figure="in-rms">{{ d.inRms === undefined ? 'undefined' : si(d.inRms, d.inUnit) }}</p>
          <p class="def"><code>noise_in_rms()</code>; {{ si(d.inReferred[spot()], d.inUnit + '/√Hz') }} at {{ spotText() }}</p>
        </section>
      </div>
      @if (d.undefinedHz.length > 0) {
        <p class="note warn-text">The input-referred noise is undefined at {{ d.undefinedHz.length }} of {{ d.freqHz.length }} frequencies
          (from {{ si(d.undefinedHz[0], 'Hz') }}): {{ d.input }} does not reach the output there. The curve leaves them out.</p>
      }
      <div class="plot-head">
        <h2 class="plot-title">Density over frequency</h2>
        <nw-export-bar [plot]="plot()" [stem]="stem()" [csvShown]="csvShownFn" [csvAll]="csvAllFn" [allCount]="2 + d.contributors.length" />
      </div>
      <div class="legend" role="group" aria-label="Curves shown">
        @for (c of curves(); track c.key; let k = $index) {
          @if (k === 2) { <span class="note">Parts:</span> }
          <button type="button" class="chip" [class.on]="isVisible(c.key)" [attr.aria-pressed]="isVisible(c.key)"
                  [attr.data-key]="c.key" (click)="toggle(c.key)" [attr.aria-label]="(isVisible(c.key) ? 'Hide ' : 'Show ') + c.label">
            <svg width="20" height="10" aria-hidden="true"><line x1="1" y1="5" x2="19" y2="5" [attr.stroke]="styleAt(k).color" stroke-width="2.5" [attr.stroke-dasharray]="styleAt(k).dash || null" /></svg>
            @if (isVisible(c.key)) { <span class="tick" aria-hidden="true">✓</span> }{{ c.label }}
          </button>
        }
      </div>
      @if (shown().length > 0) {
        <nw-xy-plot [x]="d.freqHz" [series]="shown()" [xLog]="true" [yLog]="true" xName="f" xUnit="Hz" [minHeight]="260"
                    [ariaLabel]="'Noise density over frequency, log–log: ' + shownLabels()" [caption]="caption()"
                    [readoutExtra]="largestHere" />
      } @else {
        <p class="note">Choose a curve above to plot it.</p>
      }

      <h2 class="plot-title contributors-title">Where the noise comes from</h2>
      <div class="pick">
        <label [for]="spotId">Densities at</label>
        <select [id]="spotId" (change)="chooseSpot(+$any($event.target).value)">
          @for (f of d.freqHz; track $index) { <option [value]="$index" [selected]="$index === spot()">{{ si(f, 'Hz') }}</option> }
        </select>
        <span class="how">Share = ∫ part² df ÷ ∫ total² df over the band (power law between points, as the solver integrates).</span>
      </div>
      @if (rows().length > 0) {
        <table class="table" [id]="ids + '-table'">
          <caption class="visually-hidden">Noise contributors, largest share of the band's noise power first, with their densities at {{ spotText() }}</caption>
          <thead><tr>
            <th scope="col" class="num">Rank</th><th scope="col">Part</th><th scope="col">Share of the band's noise power</th>
            <th scope="col" class="num">rms over the band</th><th scope="col" class="num">Density at {{ spotText() }}</th><th scope="col" class="num">Share at {{ spotText() }}</th>
          </tr></thead>
          <tbody>
            @for (r of visibleRows(); track r.part) {
              <tr>
                <td class="num">{{ r.rank }}</td>
                <td class="mono">{{ r.part }}</td>
                <td><div class="share"><span class="bar" aria-hidden="true"><span [style.width.%]="r.share * 100"></span></span><span class="num">{{ percent(r.share) }}</span></div></td>
                <td class="num">{{ si(r.rms, 'V') }}</td>
                <td class="num">{{ si(r.spotDensity, 'V/√Hz') }}</td>
                <td class="num">{{ percent(r.spotShare) }}</td>
              </tr>
            }
          </tbody>
        </table>
        @if (rows().length > topRows) {
          <button type="button" class="more" [attr.aria-expanded]="expanded()" [attr.aria-controls]="ids + '-table'" (click)="expanded.set(!expanded())">
            {{ expanded() ? 'Show the top ' + topRows + ' only' : 'and ' + (rows().length - topRows) + ' more' }}
          </button>
        }
      } @else {
        <p class="note">Nothing in the circuit is noisy: it has no resistor, transistor or diode.</p>
      }
    }
  `,
  styles: [STATUS_STYLES, `
    :host { display: block; }
    .context { margin: 0 0 8px; font-size: 0.875rem; color: var(--mat-sys-on-surface); }
    .figures { display: grid; grid-template-columns: repeat(auto-fit, minmax(200px, 1fr)); gap: 8px; margin-bottom: 8px; }
    .figure { padding: 6px 10px 8px; border-radius: 8px; background: var(--mat-sys-surface-container-lowest);
      border: 1px solid var(--mat-sys-outline-variant); }
    .figure h2 { margin: 0; font-size: 0.875rem; font-weight: 700; color: var(--mat-sys-on-surface-variant); }
    .figure p { margin: 0; }
    .big { font-size: 1.5rem; font-weight: 600; line-height: 1.2; color: var(--mat-sys-on-surface); }
    .def { margin-top: 4px !important; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .plot-head { display: flex; flex-wrap: wrap; align-items: center; gap: 6px; margin: 4px 0 2px; }
    .plot-title { margin: 0; font-size: 0.9375rem; font-weight: 700; }
    .contributors-title { margin-top: 16px; }
    .legend { display: flex; flex-wrap: wrap; align-items: center; gap: 5px; margin: 0 0 6px; }
    .chip { display: inline-flex; align-items: center; gap: 3px; font: inherit; font-size: 0.8125rem; cursor: pointer;
      padding: 1px 9px 1px 6px; border-radius: 14px; border: 1px solid var(--mat-sys-outline-variant);
      background: transparent; color: var(--mat-sys-on-surface-variant); }
    .chip.on { background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface); border-color: var(--mat-sys-outline); font-weight: 600; }
    .chip:not(.on) svg { opacity: 0.45; }
    .note { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); margin: 0 0 6px; }
    .warn-text { color: #7A4A00; }
    .pick { display: flex; align-items: baseline; gap: 8px; flex-wrap: wrap; margin: 6px 0 8px; font-size: 0.875rem; }
    .how { color: var(--mat-sys-on-surface-variant); font-size: 0.8125rem; }
    select { font: inherit; color: var(--mat-sys-on-surface); background: var(--mat-sys-surface-container-lowest);
      border: 1px solid var(--mat-sys-outline); border-radius: 4px; padding: 3px 6px; }
    .table { border-collapse: collapse; font-size: 0.875rem; }
    th, td { padding: 4px 10px; border-bottom: 1px solid var(--mat-sys-outline-variant); text-align: left; }
    th { font-weight: 600; color: var(--mat-sys-on-surface-variant); }
    th.num, td.num { text-align: right; }
    .share { display: flex; align-items: center; gap: 8px; min-width: 150px; }
    .share .num { margin-left: auto; }
    .bar { flex: 1; height: 8px; min-width: 60px; border-radius: 4px; background: var(--mat-sys-surface-container-high); overflow: hidden; }
    .bar span { display: block; height: 100%; background: #0072B2; }
    .more { margin-top: 6px; font: inherit; font-size: 0.875rem; color: var(--mat-sys-primary); background: transparent;
      border: 1px solid var(--mat-sys-outline-variant); border-radius: 14px; padding: 2px 12px; cursor: pointer; }
    .more:focus-visible, .chip:focus-visible { outline: 2px solid var(--mat-sys-tertiary); outline-offset: 2px; }
    code { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.8125rem; }
  `],
})
export class NoisePanel {
  readonly result = input<SolveResult | undefined>();

  readonly plot = viewChild(XyPlot);
  /** Stem of the ids the labels point at (unique: a page may show two noise panels). */
  protected readonly ids = `nw-noise-${++panelIds}`;
  protected readonly spotId = `${this.ids}-spot`;
  protected readonly topRows = NOISE_TOP_ROWS;
  /** The user's own show/hide choices, kept across re-solves while the curve names persist. */
  private readonly choices = signal<ReadonlyMap<string, boolean>>(new Map());
  /** The spot frequency the user chose, in Hz (kept across re-solves: the nearest point of a new grid). */
  private readonly chosenSpotHz = signal<number | undefined>(undefined);
  readonly expanded = signal(false);

  readonly notice = computed(() => panelNotice(this.result(), (r) => (r.noise && r.noise.freq_hz.length > 0 ? undefined : {
    title: 'No noise analysis yet',
    text: 'Add an “analyze noise out NODE in SOURCE from START to STOP per decade N” line to see the output and input-referred noise densities, their rms over the band and the parts the noise comes from, for example:',
    code: suggestedNoise(r),
  })));

  readonly data = computed<NoiseData | undefined>(() => noiseData(this.result()));

  /** The swept point the contributors are read at. */
  readonly spot = computed(() => {
    const d = this.data();
    if (!d) return 0;
    const hz = this.chosenSpotHz();
    if (hz === undefined) return d.spot;
    const k = d.freqHz.findIndex((f) => Math.abs(f - hz) <= 1e-9 * hz);
    return k >= 0 ? k : d.spot;
  });
  readonly spotText = computed(() => this.si(this.data()?.freqHz[this.spot()], 'Hz'));
  readonly bandText = computed(() => {
    const f = this.data()?.freqHz ?? [];
    return f.length > 0 ? `${this.si(f[0], 'Hz')} to ${this.si(f[f.length - 1], 'Hz')}` : '';
  });

  /** Output, input-referred, then the parts with the largest shares. */
  readonly curves = computed<NoiseCurve[]>(() => {
    const d = this.data();
    if (!d) return [];
    return [
      { key: 'out', label: `output ${d.output}`, unit: 'V/√Hz', values: d.out, initial: true },
      { key: 'in', label: `input-referred (${d.input})`, unit: `${d.inUnit}/√Hz`, values: d.inReferred, initial: true },
      ...d.contributors.slice(0, CURVE_CONTRIBUTORS).filter((c) => c.power > 0)
        .map((c) => ({ key: `part:${c.part}`, label: c.part, unit: 'V/√Hz', values: c.density, initial: false })),
    ];
  });

  isVisible(key: string): boolean {
    return this.choices().get(key) ?? this.curves().find((c) => c.key === key)?.initial ?? false;
  }

  toggle(key: string): void {
    const next = new Map(this.choices());
    next.set(key, !this.isVisible(key));
    this.choices.set(next);
  }

  chooseSpot(index: number): void {
    const f = this.data()?.freqHz[index];
    if (f !== undefined) this.chosenSpotHz.set(f);
  }

  /** A curve's style is fixed by its place in the legend, so toggling one never recolours another. */
  protected styleAt(index: number) {
    return curveStyle(index);
  }

  readonly shown = computed<XySeries[]>(() => this.curves().flatMap((c, k) => (this.isVisible(c.key)
    ? [{ key: c.key, label: c.label, unit: c.unit, values: c.values, style: curveStyle(k) }] : [])));
  protected readonly shownLabels = computed(() => this.shown().map((s) => s.label).join(', '));
  protected readonly caption = computed(() => `${this.result()?.title ?? ''} — noise density`.replace(/^ — /, ''));

  readonly rows = computed(() => {
    const d = this.data();
    return d ? contributorRows(d, this.spot()) : [];
  });
  readonly visibleRows = computed(() => (this.expanded() ? this.rows() : this.rows().slice(0, NOISE_TOP_ROWS)));

  /** The cursor's extra readout: the part contributing most at that frequency. */
  protected readonly largestHere = (index: number): string | undefined => {
    const d = this.data();
    const top = d ? largestAt(d, index) : undefined;
    return top ? `largest here: ${top.part} (${this.percent(top.share)})` : undefined;
  };

  /** File names of the exports: `<title>-noise.svg` … */
  readonly stem = computed(() => `${fileStem(this.result()?.title)}-noise`);

  /** CSV of the frequencies and the shown curves, full precision (an undefined input-referred point is an empty field). */
  csvText(): string {
    return this.csv(this.curves().filter((c) => this.isVisible(c.key)));
  }

  /** CSV of the output, the input-referred density and every part's density. */
  csvAllText(): string {
    const d = this.data();
    if (!d) return '';
    const parts = d.contributors.map((c) => ({ key: `part:${c.part}`, unit: 'V/√Hz', values: c.density }));
    return this.csv([...this.curves().slice(0, 2), ...parts]);
  }

  protected readonly csvShownFn = () => this.csvText();
  protected readonly csvAllFn = () => this.csvAllText();

  private csv(curves: ReadonlyArray<Pick<NoiseCurve, 'key' | 'unit' | 'values'>>): string {
    const d = this.data();
    if (!d) return '';
    const name = (c: Pick<NoiseCurve, 'key' | 'unit'>) => {
      const what = c.key === 'out' ? 'out_density' : c.key === 'in' ? 'in_density' : c.key.slice('part:'.length);
      return `${what}_${c.unit.startsWith('A') ? 'a' : 'v'}_per_rthz`;
    };
    const columns: CsvColumn[] = [{ name: 'freq_hz', values: d.freqHz }, ...curves.map((c) => ({ name: name(c), values: c.values }))];
    return columnsCsv(columns);
  }

  protected si(value: number | undefined, unit: string): string {
    return formatSi(value, unit);
  }

  /** A share as a percentage with one decimal; "< 0.1 %" for a part that is there but small. */
  protected percent(share: number): string {
    if (share > 0 && share < 0.0005) return '< 0.1 %';
    return `${(share * 100).toFixed(1)} %`;
  }
}
