import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { STALE_TAG_STYLES } from '../panel-notice';
import { STATUS_STYLES } from '../panel-styles';
import { formatDb, formatQuantity, type Unit } from '../si-format';
import type { SweepData, SweepRow } from './sweep-data';

interface Cells {
  row: SweepRow;
  ports: string[];
  measures: string[];
  /** "2 of 2 pass"; empty when the netlist has no checks. */
  checks: string;
  allPass: boolean;
  /** The failing checks' texts, for the cell's title and its hidden words. */
  failing: string;
}

/**
 * One row per value of a sweep: the value, adm, acm and cmrr in dB, each measure in its unit, and
 * the checks passing "n of m" marked with a word and a symbol (not colour alone); a value where the
 * circuit did not solve says why across the row.
 */
@Component({
  selector: 'nw-sweep-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="scroll" role="region" [attr.aria-label]="caption()" tabindex="0">
      <table>
        <caption class="visually-hidden">{{ caption() }}</caption>
        <thead>
          <tr>
            <th scope="col">{{ data().kind === 'temp' ? 'Temperature' : data().name }}</th>
            <th scope="col" class="r">adm</th><th scope="col" class="r">acm</th><th scope="col" class="r">cmrr</th>
            @for (m of data().measures; track m) { <th scope="col" class="r mono">{{ m }}</th> }
            @if (data().checkCount > 0) { <th scope="col">Checks</th> }
          </tr>
        </thead>
        <tbody>
          @for (c of cells(); track c.row.index) {
            <tr [class.unsolved]="c.row.failure">
              <th scope="row" class="num">{{ c.row.valueText }}</th>
              @if (c.row.failure) {
                <td class="failure" [attr.colspan]="span()"><span class="tag" [class.fail]="!stale()" [class.stale]="stale()">✗ did not solve</span>&ngsp;{{ c.row.failure }}</td>
              } @else {
                @for (p of c.ports; track $index) { <td class="num r">{{ p }}</td> }
                @for (m of c.measures; track $index) { <td class="num r">{{ m }}</td> }
                @if (data().checkCount > 0) {
                  <td [attr.title]="c.failing || null">
                    <span class="tag" [class.pass]="!stale() && c.allPass" [class.fail]="!stale() && !c.allPass" [class.stale]="stale()">{{ c.allPass ? '✓' : '✗' }} {{ c.checks }}</span>
                    <!-- &ngsp; keeps a space between the tag and the failing checks, so the words stay apart. -->
                    @if (c.failing) {&ngsp;<span class="failing mono">fails: {{ c.failing }}</span> }
                  </td>
                }
              }
            </tr>
          }
        </tbody>
      </table>
    </div>
  `,
  styles: [STATUS_STYLES, STALE_TAG_STYLES, `
    :host { display: block; }
    .scroll { overflow-x: auto; border-radius: 4px; }
    .scroll:focus-visible { outline: 2px solid var(--mat-sys-tertiary); outline-offset: 2px; }
    table { border-collapse: collapse; font-size: 0.875rem; min-width: 100%; }
    th, td { padding: 4px 10px; border-bottom: 1px solid var(--mat-sys-outline-variant); text-align: left; vertical-align: baseline; }
    thead th { font-size: 0.75rem; font-weight: 700; color: var(--mat-sys-on-surface-variant); white-space: nowrap; }
    tbody th { font-weight: 700; }
    .r { text-align: right; }
    .unsolved { background: #FCF1EF; }
    .failure { color: var(--mat-sys-on-surface); }
    .failing { margin-left: 6px; font-size: 0.75rem; color: var(--mat-sys-on-surface-variant); }
  `],
})
export class SweepTable {
  readonly data = input.required<SweepData>();
  /** The unit of each measure, as the measures panel guesses it. */
  readonly units = input<Record<string, Unit>>({});
  /** From an earlier version of the netlist: no pass or fail is coloured. */
  readonly stale = input(false);

  protected readonly caption = computed(() => {
    const d = this.data();
    return d.kind === 'temp' ? `Figures at each temperature (${d.rows.length} values)` : `Figures at each value of ${d.name} (${d.rows.length} values)`;
  });

  /** Columns after the value: three ports figures, the measures, the checks. */
  protected readonly span = computed(() => 3 + this.data().measures.length + (this.data().checkCount > 0 ? 1 : 0));

  protected readonly cells = computed<Cells[]>(() => {
    const d = this.data();
    const units = this.units();
    return d.rows.map((row) => ({
      row,
      ports: [formatDb(row.admDb, 2), formatDb(row.acmDb, 2), formatDb(row.cmrrDb, 2)],
      measures: d.measures.map((m) => formatQuantity(row.run.measures[m], units[m] ?? '')),
      checks: `${row.passed} of ${row.run.checks.length} pass`,
      allPass: row.passed === row.run.checks.length,
      failing: row.failedChecks.map((c) => c.text).join('; '),
    }));
  });
}
