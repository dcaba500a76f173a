import { NgTemplateOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { OutlineMeasure, SolveResult } from '../../../../solver';
import { PanelNotice, panelNotice } from './panel-notice';
import { STATUS_STYLES } from './panel-styles';
import { formatQuantity, type Unit } from './si-format';
import { measureUnits } from './units';

interface MeasureRow {
  name: string;
  value: string;
  unit: Unit;
  expr?: string;
  line?: number;
}

/**
 * Measures: each `measure` with its value in the unit its expression implies (db → dB,
 * corner/unity → Hz, margin → °, ic → A, ic·vce → W, v/i → Ω …; a ratio or anything the unit
 * algebra cannot name is a plain figure, never an SI prefix). Given the measure lines of the
 * result's text, each measure shows its expression and choosing it emits its line; without them
 * there is no line to go to, and nothing is emitted.
 */
@Component({
  selector: 'nw-measures-panel',
  imports: [PanelNotice, NgTemplateOutlet],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else {
      <ul class="list" aria-label="Measures">
        @for (row of rows(); track row.name) {
          <li>
            @if (row.line !== undefined) {
              <!-- Named by its visible text, so voice control finds it by what it shows. -->
              <button type="button" class="row" (click)="lineSelected.emit(row.line)">
                <ng-container *ngTemplateOutlet="body; context: { $implicit: row }" />
              </button>
            } @else {
              <div class="row static"><ng-container *ngTemplateOutlet="body; context: { $implicit: row }" /></div>
            }
          </li>
        }
      </ul>
      <ng-template #body let-row>
        <!-- &ngsp; keeps a space between the cells, so the words of the name stay apart. -->
        <span class="name mono">{{ row.name }}</span>&ngsp;<span class="visually-hidden">=</span>&ngsp;<span
          class="value num">{{ row.value }}</span>&ngsp;<span class="expr mono">{{ row.expr ? '= ' + row.expr : '' }}</span>&ngsp;
        <span class="line num">{{ row.line !== undefined ? 'line ' + row.line : '' }}</span>
      </ng-template>
    }
  `,
  styles: [STATUS_STYLES, `
    :host { display: block; }
    .list { list-style: none; margin: 0; padding: 0; }
    .row { position: relative; display: grid; grid-template-columns: minmax(70px, max-content) 110px minmax(0, 1fr) 56px; gap: 12px; align-items: baseline;
      width: 100%; font: inherit; font-size: 0.875rem; text-align: left; color: var(--mat-sys-on-surface);
      background: transparent; border: 0; border-bottom: 1px solid var(--mat-sys-outline-variant); padding: 6px 8px; }
    button.row { cursor: pointer; }
    button.row:hover { background: var(--mat-sys-surface-container); }
    .name { font-weight: 700; }
    .value { font-size: 1rem; font-weight: 600; text-align: right; }
    .expr { color: var(--mat-sys-on-surface-variant); overflow-wrap: anywhere; }
    .line { color: var(--mat-sys-on-surface-variant); text-align: right; font-size: 0.8125rem; }
  `],
})
export class MeasuresPanel {
  readonly result = input<SolveResult | undefined>();
  /** The measure lines of the result's text: each measure's line and expression. */
  readonly measureLines = input<readonly OutlineMeasure[]>([]);
  /** The line of the chosen measure. */
  readonly lineSelected = output<number>();

  readonly notice = computed(() => panelNotice(this.result(), (r) => (Object.keys(r.measures).length > 0 ? undefined : {
    title: 'No measures',
    text: 'Name the figures you care about and they are computed on every solve, for example:',
    code: 'measure f3 = corner(adm)',
  })));

  readonly rows = computed<MeasureRow[]>(() => {
    const lines = this.measureLines();
    const units = measureUnits(lines);
    return Object.entries(this.result()?.measures ?? {}).map(([name, value]) => {
      // The last definition wins, as a redefinition would in the solver's order.
      const def = lines.filter((d) => d.name === name).at(-1);
      const unit = units[name] ?? '';
      // A continued line keeps its breaks in the expression: shown on one line.
      return { name, value: formatQuantity(value, unit), unit, expr: def?.expression.replace(/\s+/g, ' '), line: def?.line };
    });
  });
}
