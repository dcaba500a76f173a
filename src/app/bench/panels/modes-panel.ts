import { ChangeDetectionStrategy, Component, computed, input, viewChild } from '@angular/core';
import type { ComplexFigure, PortsResult, SolveResult } from '../../../../solver';
import { BodePlot } from './plot/bode-plot';
import { curveMarkers } from './plot/curve-markers';
import { ExportBar } from './plot/export-bar';
import { curveStyle } from './plot/palette';
import { curvesCsv, fileStem } from './plot/plot-export';
import type { PlotSeries } from './plot/plot-geometry';
import { PanelNotice, panelNotice } from './panel-notice';
import { STATUS_STYLES } from './panel-styles';
import { formatDb, formatDeg, formatPlain, formatSi } from './si-format';

/** The names the ports line gave, read back from the solver's stated conventions. */
export interface PortNames {
  inP: string;
  inN: string;
  outP: string;
  outN?: string;
}

/** Reads the drive sources and output nodes out of `ports.conventions`; generic names when it says nothing. */
export function portNames(ports: PortsResult): PortNames {
  const text = ports.conventions ?? '';
  const vid = /vid = ([\w.]+) [−-] ([\w.]+)/.exec(text);
  const diff = /vod = v\(([\w.]+)\) [−-] v\(([\w.]+)\)/.exec(text);
  const single = /vod = voc = v\(([\w.]+)\)/.exec(text);
  return {
    inP: vid?.[1] ?? 'va',
    inN: vid?.[2] ?? 'vb',
    outP: diff?.[1] ?? single?.[1] ?? 'outa',
    outN: ports.output === 'differential' ? (diff?.[2] ?? 'outb') : undefined,
  };
}

interface Figure {
  key: string;
  title: string;
  definition: string;
  magnitude: string;
  db: string;
  phase?: string;
  signed?: string;
}

/**
 * *Modes*: the differential and common-mode figures of the `ports` analysis — adm, acm, cmrr
 * and cmrr_db — as large numbers with their definitions written out, the frequency they are
 * taken at, and CMRR over frequency when the netlist has an ac sweep (exported like every plot).
 */
@Component({
  selector: 'nw-modes-panel',
  imports: [PanelNotice, BodePlot, ExportBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else if (ports(); as p) {
      <p class="context">
        <span class="tag ok">{{ p.output === 'differential' ? 'Differential output' : 'Single-ended output' }}</span>
        <span>Figures at <strong>{{ atText() }}</strong></span>
      </p>
      <div class="figures">
        @for (f of figures(); track f.key) {
          <section class="figure" [attr.aria-label]="f.title">
            <h2>{{ f.title }}</h2>
            <p class="big num">{{ f.db }}</p>
            <p class="sub num">
              <span>{{ f.magnitude }}</span>
              @if (f.phase) { <span>∠ {{ f.phase }}</span> }
              @if (f.signed) { <span>{{ f.signed }}</span> }
            </p>
            <p class="def">{{ f.definition }}</p>
          </section>
        }
      </div>
      <dl class="defs">
        <dt>Drive</dt>
        <dd>vid = {{ names().inP }} − {{ names().inN }}, &nbsp; vic = ({{ names().inP }} + {{ names().inN }})/2 &nbsp;·&nbsp;
          driven by the bench: +½/−½ differential, +1/+1 common mode (their own ac= is ignored).</dd>
        <dt>Output</dt>
        @if (names().outN) {
          <dd>vod = v({{ names().outP }}) − v({{ names().outN }}), &nbsp; voc = (v({{ names().outP }}) + v({{ names().outN }}))/2.</dd>
        } @else {
          <dd>vod = voc = v({{ names().outP }}) (single-ended: the same node serves both modes).</dd>
        }
      </dl>
      @if (cmrrSeries(); as series) {
        <div class="plot-head">
          <h2 class="plot-title">CMRR over frequency</h2>
          <nw-export-bar [plot]="plot()" [stem]="stem()" [csvAll]="csvFn" [allCount]="1" />
        </div>
        <nw-bode-plot [freqHz]="freqHz()" [series]="series" [showPhase]="false" [markers]="cmrrMarkers()"
                      magnitudeLabel="CMRR (dB)" ariaLabel="CMRR over frequency" [caption]="(result()?.title ?? '') + ' — CMRR'" />
      } @else {
        <p class="note">Add <code>analyze ac from 10 Hz to 1 GHz per decade 20</code> to see how CMRR falls with frequency.</p>
      }
    }
  `,
  styles: [STATUS_STYLES, `
    :host { display: block; }
    .context { display: flex; flex-wrap: wrap; gap: 12px; align-items: center; margin: 0 0 8px; font-size: 0.875rem; }
    .figures { display: grid; grid-template-columns: repeat(auto-fit, minmax(150px, 1fr)); gap: 8px; margin-bottom: 8px; }
    .figure { padding: 6px 10px 8px; border-radius: 8px; background: var(--mat-sys-surface-container-lowest);
      border: 1px solid var(--mat-sys-outline-variant); }
    .figure h2 { margin: 0; font-size: 0.875rem; font-weight: 700; color: var(--mat-sys-on-surface-variant); }
    .figure p { margin: 0; }
    .big { font-size: 1.5rem; font-weight: 600; line-height: 1.2; color: var(--mat-sys-on-surface); }
    .sub { display: flex; flex-wrap: wrap; gap: 2px 10px; font-size: 0.875rem; color: var(--mat-sys-on-surface); }
    .def { margin-top: 4px !important; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .defs { display: grid; grid-template-columns: max-content 1fr; gap: 2px 12px; margin: 0 0 8px; font-size: 0.8125rem; }
    .defs dt { font-weight: 700; }
    .defs dd { margin: 0; }
    .plot-head { display: flex; flex-wrap: wrap; align-items: center; gap: 6px; margin: 0 0 2px; }
    .plot-title { margin: 0; font-size: 0.9375rem; font-weight: 700; }
    .note { font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    code { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.8125rem; background: var(--mat-sys-surface-container-high); padding: 1px 4px; border-radius: 3px; }
  `],
})
export class ModesPanel {
  readonly result = input<SolveResult | undefined>();

  readonly notice = computed(() => panelNotice(this.result(), (r) => (r.ports ? undefined : {
    title: 'No ports',
    text: 'Name the two drive sources and the output to get adm, acm and CMRR, for example:',
    code: 'ports in=(va, vb) out=(outa, outb)',
  })));

  readonly ports = computed(() => this.result()?.ports);
  readonly names = computed(() => { const p = this.ports(); return p ? portNames(p) : { inP: 'va', inN: 'vb', outP: 'outa' } as PortNames; });

  readonly atText = computed(() => {
    const at = this.ports()?.at_hz ?? 0;
    return at === 0 ? '0 Hz (DC: capacitors open, inductors shorted)' : formatSi(at, 'Hz');
  });

  readonly figures = computed<Figure[]>(() => {
    const p = this.ports();
    if (!p) return [];
    const n = this.names();
    const out = n.outN ? 'vod' : `v(${n.outP})`;
    return [
      complexFigure('adm', 'Differential gain adm', p.adm, `adm = vod / vid${n.outN ? '' : `, vod = ${out}`}`, p.at_hz),
      complexFigure('acm', 'Common-mode gain acm', p.acm, 'acm = voc / vic', p.at_hz),
      { key: 'cmrr', title: 'CMRR', definition: 'cmrr = |adm / acm|; cmrr_db = 20·log10(cmrr)', magnitude: `cmrr = ${formatPlain(p.cmrr)}`, db: formatDb(p.cmrr_db, 2) },
    ];
  });

  readonly freqHz = computed(() => this.result()?.ac?.freq_hz ?? []);

  readonly cmrrSeries = computed<PlotSeries[] | undefined>(() => {
    const curve = this.result()?.ac?.curves['cmrr'];
    if (!curve || this.freqHz().length < 2) return undefined;
    return [{ key: 'cmrr', label: 'CMRR', db: curve.db, phase_deg: curve.phase_deg, style: { color: curveStyle(2).color, dash: '' } }];
  });

  readonly plot = viewChild(BodePlot);
  /** File names of the exports: `<title>-cmrr.svg` … */
  readonly stem = computed(() => `${fileStem(this.result()?.title)}-cmrr`);

  /** CSV of the CMRR curve over the whole sweep (magnitude in dB and phase), full precision. */
  csvText(): string {
    const curve = this.result()?.ac?.curves['cmrr'];
    return curve ? curvesCsv(this.freqHz(), [{ key: 'cmrr', db: curve.db, phase_deg: curve.phase_deg }]) : '';
  }

  protected readonly csvFn = () => this.csvText();

  /** The CMRR corner: where the common-mode rejection has fallen 3 dB from its low-frequency value. */
  readonly cmrrMarkers = computed(() => {
    const curve = this.result()?.ac?.curves['cmrr'];
    return curve ? curveMarkers('cmrr', this.freqHz(), curve).filter((m) => m.kind === 'corner') : [];
  });
}

/**
 * A gain figure: dB large, then magnitude, phase and — at 0 Hz, where it is real — its signed
 * value. Gains are ratios: plain figures, never SI prefixes ("0.530", not "530 m").
 */
function complexFigure(key: string, title: string, f: ComplexFigure, definition: string, atHz: number): Figure {
  const real = Math.abs(f.im) <= 1e-12 * Math.max(1, Math.abs(f.re));
  return {
    key, title, definition,
    magnitude: `|${key}| = ${formatPlain(f.mag)}`,
    db: formatDb(f.db, 2),
    phase: formatDeg(f.phase_deg),
    signed: atHz === 0 && real ? `${key} = ${formatPlain(f.re)}` : undefined,
  };
}
