import { ChangeDetectionStrategy, Component, computed, input, signal, viewChild } from '@angular/core';
import type { SolveResult } from '../../../../solver';
import { PanelNotice, panelNotice } from './panel-notice';
import { STATUS_STYLES } from './panel-styles';
import { ExportBar } from './plot/export-bar';
import { fileStem } from './plot/plot-export';
import { pzCsv, pzPoints, pzRows, pzSummary, suggestedPoles, type PzRow } from './poles/pole-zero-data';
import { asinhConstant, defaultScale, type PzScale } from './poles/pz-geometry';
import { PzMap } from './poles/pz-map';
import { formatPlain, formatSi } from './si-format';

let panelIds = 0;

/**
 * *Poles*: what `analyze poles` gives — the natural frequencies of the circuit at its operating
 * point and the zeros of its transfer, on a pole–zero map of the s-plane in hertz (linear, or
 * arcsinh so that slow and fast ones show together) with a table beside it that is also the map's
 * accessible form: each pole and zero with Re, Im, |s|/2π and the Q of a pair, a pole in the
 * right half-plane flagged as unstable. Exported as SVG, PNG or CSV.
 */
@Component({
  selector: 'nw-poles-panel',
  imports: [PanelNotice, PzMap, ExportBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else if (poles(); as p) {
      <p class="summary" [class.unstable]="summary().unstable > 0">
        @if (summary().unstable > 0) { <span class="tag fail">✗ unstable</span> }
        {{ summary().text }}
      </p>
      @if (p.poles_hz.length === 0 && p.zeros_hz.length === 0) {
        <p class="note">No finite poles: nothing in the small-signal circuit stores energy (no capacitance or inductance), so it responds at once at every frequency.</p>
      } @else {
        <div class="head">
          <div class="toggle" role="radiogroup" aria-label="Scale of the map's axes">
            @for (s of scales; track s.value) {
              <label class="option" [class.on]="s.value === scale()">
                <input type="radio" [name]="ids + '-scale'" [value]="s.value" [checked]="s.value === scale()" (change)="chosenScale.set(s.value)" />
                {{ s.label }}
              </label>
            }
          </div>
          <nw-export-bar [plot]="map()" [stem]="stem()" [csvAll]="csvFn" [allCount]="1" />
        </div>
        <div class="body">
          <figure class="map">
            <nw-pz-map [points]="points()" [scale]="scale()" [ariaLabel]="mapLabel()" [caption]="result()?.title" />
            <figcaption class="caption">{{ scaleCaption() }}</figcaption>
          </figure>
          <div class="list">
            <table class="table">
              <caption class="visually-hidden">Poles and zeros, each list from the slowest (by |s|); a conjugate pair on one row</caption>
              <thead><tr>
                <th scope="col"><span class="visually-hidden">Pole or zero</span></th>
                <th scope="col" class="num">Re s/2π</th><th scope="col" class="num">Im s/2π</th>
                <th scope="col" class="num">|s|/2π</th><th scope="col" class="num">Q</th><th scope="col">Half-plane</th>
              </tr></thead>
              @for (group of groups(); track group.kind) {
                <tbody>
                  <tr class="group"><th scope="rowgroup" colspan="6">{{ group.title }}</th></tr>
                  @if (group.rows.length === 0) { <tr><td colspan="6" class="none">none: the transfer has no finite zero</td></tr> }
                  @for (r of group.rows; track $index) {
                    <tr [class.rhp]="r.rhp">
                      <th scope="row" class="name"><span class="mark" [class.zero]="r.kind === 'zero'" aria-hidden="true">{{ r.kind === 'pole' ? '×' : '○' }}</span>{{ r.kind }} {{ r.index }}</th>
                      <td class="num">{{ si(r.re) }}</td>
                      <td class="num">{{ r.pair ? '± ' + si(r.im) : '0' }}</td>
                      <td class="num">{{ si(r.mag) }}</td>
                      <td class="num">{{ r.q === undefined ? '' : plain(r.q) }}</td>
                      <td>
                        @if (r.rhp && r.kind === 'pole') { <span class="tag fail">✗ right half-plane: unstable</span> }
                        @else if (r.rhp) { <span class="tag warn">right half-plane (non-minimum phase)</span> }
                        @else if (r.re === 0) { <span class="tag warn">on the imaginary axis</span> }
                        @else { <span class="left">left</span> }
                      </td>
                    </tr>
                  }
                </tbody>
              }
            </table>
            @if (!p.zeros_of) {
              <p class="note">Zeros come with <code>ports</code> (those of adm), or with <code>analyze poles out NODE</code> (those of the transfer to a node).</p>
            }
          </div>
        </div>
        @if (p.conventions) { <p class="conventions">{{ p.conventions }}</p> }
      }
    }
  `,
  styles: [STATUS_STYLES, `
    :host { display: block; }
    .summary { margin: 0 0 8px; font-size: 0.875rem; color: var(--mat-sys-on-surface); display: flex; flex-wrap: wrap; gap: 6px; align-items: baseline; }
    .head { display: flex; flex-wrap: wrap; align-items: center; gap: 6px 14px; margin: 0 0 6px; }
    .toggle { display: inline-flex; border: 1px solid var(--mat-sys-outline); border-radius: 16px; overflow: hidden; }
    .option { display: inline-flex; align-items: center; gap: 4px; padding: 2px 12px 2px 8px; font-size: 0.875rem; cursor: pointer;
      color: var(--mat-sys-on-surface); }
    .option.on { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); font-weight: 600; }
    .option + .option { border-left: 1px solid var(--mat-sys-outline); }
    .option:has(input:focus-visible) { outline: 2px solid var(--mat-sys-tertiary); outline-offset: -2px; }
    /* Map and table side by side where there is room, the table below the map where there is not. */
    .body { display: flex; flex-wrap: wrap; gap: 12px 20px; align-items: flex-start; }
    .map { flex: 1 1 380px; min-width: 0; margin: 0; }
    .list { flex: 1 1 360px; min-width: 0; overflow-x: auto; }
    .caption, .note, .conventions { margin: 4px 0 0; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .conventions { margin-top: 10px; }
    .table { border-collapse: collapse; font-size: 0.875rem; }
    th, td { padding: 4px 10px; border-bottom: 1px solid var(--mat-sys-outline-variant); text-align: left; }
    thead th { font-weight: 600; color: var(--mat-sys-on-surface-variant); }
    th.num, td.num { text-align: right; }
    .group th { padding-top: 10px; font-weight: 700; color: var(--mat-sys-on-surface); }
    .name { font-weight: 400; white-space: nowrap; }
    .mark { display: inline-block; width: 1.1em; font-weight: 700; color: #0072B2; }
    /* The map's vermillion, darkened to keep 4.5:1 as text on the warmer surface. */
    .mark.zero { color: #B34F00; }
    tr.rhp .mark { color: #A3221B; }
    .left, .none { color: var(--mat-sys-on-surface-variant); }
    code { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.8125rem; background: var(--mat-sys-surface-container-high); padding: 1px 4px; border-radius: 3px; }
  `],
})
export class PolesPanel {
  readonly result = input<SolveResult | undefined>();

  readonly map = viewChild(PzMap);
  /** Stem of the ids in this panel (unique: a page may show two). */
  protected readonly ids = `nw-poles-${++panelIds}`;
  protected readonly scales: ReadonlyArray<{ value: PzScale; label: string }> = [
    { value: 'linear', label: 'linear' }, { value: 'asinh', label: 'arcsinh' },
  ];
  /** The user's choice of scale; until then the one that suits the points. */
  readonly chosenScale = signal<PzScale | undefined>(undefined);

  readonly notice = computed(() => panelNotice(this.result(), (r) => (r.poles ? undefined : {
    title: 'No poles analysis yet',
    text: 'Add an “analyze poles” line to see the natural frequencies of the circuit at its operating point on the s-plane, with the zeros of adm when there are ports (“analyze poles out NODE” for the zeros of the transfer to a node), for example:',
    code: suggestedPoles(r),
  })));

  readonly poles = computed(() => this.result()?.poles);
  readonly rows = computed<PzRow[]>(() => { const p = this.poles(); return p ? pzRows(p) : []; });
  readonly points = computed(() => { const p = this.poles(); return p ? pzPoints(p) : []; });
  readonly summary = computed(() => { const p = this.poles(); return p ? pzSummary(p) : { text: '', unstable: 0 }; });
  readonly scale = computed<PzScale>(() => this.chosenScale() ?? defaultScale(this.points()));

  protected readonly groups = computed(() => {
    const rows = this.rows();
    const p = this.poles();
    const groups = [{ kind: 'pole', title: 'Poles', rows: rows.filter((r) => r.kind === 'pole') }];
    if (p?.zeros_of) groups.push({ kind: 'zero', title: `Zeros of ${p.zeros_of}`, rows: rows.filter((r) => r.kind === 'zero') });
    return groups.filter((g) => g.rows.length > 0 || g.kind === 'zero');
  });

  /** The map's name for screen readers: what it shows, and where to read it. */
  protected readonly mapLabel = computed(() => {
    const s = this.summary();
    const scale = this.scale() === 'asinh' ? 'arcsinh' : 'linear';
    return `Pole–zero map on ${scale} axes: ${s.text} The table beside it lists every pole and zero.`;
  });

  /** What the axes are, under the map. */
  protected readonly scaleCaption = computed(() => {
    if (this.scale() === 'linear') {
      return 'Linear axes with the same hertz per pixel on both, so a pair’s angle θ from the negative real axis shows its Q = 1/(2·cos θ). × pole, ○ zero; the tinted half is the right half-plane.';
    }
    const c = formatSi(asinhConstant(this.points()), 'Hz');
    return `Arcsinh axes: each is asinh(f / c) with c = ${c} — linear within about ±c of zero, logarithmic beyond — so slow and fast poles show on one map; gridlines at 0 and ± powers of ten, the same scale on both axes. × pole, ○ zero; the tinted half is the right half-plane.`;
  });

  /** File names of the exports: `<title>-poles.svg` … */
  readonly stem = computed(() => `${fileStem(this.result()?.title)}-poles`);

  /** CSV of every pole and zero, both members of a pair. */
  csvText(): string {
    const p = this.poles();
    return p ? pzCsv(p) : '';
  }

  protected readonly csvFn = () => this.csvText();

  protected si(value: number): string {
    return formatSi(value, 'Hz');
  }

  protected plain(value: number): string {
    return formatPlain(value);
  }
}
