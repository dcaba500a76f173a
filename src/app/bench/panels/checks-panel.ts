import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { CheckResult, OutlineMeasure, SolveResult } from '../../../../solver';
import { PanelNotice, panelNotice, STALE_TAG_STYLES } from './panel-notice';
import { STATUS_STYLES } from './panel-styles';
import { formatQuantity, formatSigned, type Unit } from './si-format';
import { checkParts, guessUnit, measureUnits } from './units';

const OPERATOR_SIGNS: Record<string, string> = { '>=': '≥', '<=': '≤', '>': '>', '<': '<', '=': '=' };

interface CheckRow {
  check: CheckResult;
  unit: Unit;
  value: string;
  limit: string;
  margin: string;
}

/**
 * *Checks*: every `check` of the netlist with pass or fail (word, symbol and colour), its value,
 * limit and margin (signed distance to failing), and a summary "N of M pass". Choosing a check
 * (click, Enter or Space) emits its line so the editor can jump there.
 */
@Component({
  selector: 'nw-checks-panel',
  imports: [PanelNotice],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else {
      <p class="summary" [class.all]="passed() === rows().length" role="status">
        <span class="tag" [class.pass]="!stale() && passed() === rows().length" [class.fail]="!stale() && passed() < rows().length" [class.stale]="stale()">
          {{ passed() === rows().length ? '✓' : '✗' }} {{ passed() }} of {{ rows().length }} {{ stale() ? 'passed' : 'pass' }}
          @if (stale()) { <span class="earlier">in an earlier version</span> }
        </span>
        @if (passed() < rows().length) { <span class="hint">{{ rows().length - passed() }} failing — choose one to go to its line.</span> }
      </p>
      <div class="head" aria-hidden="true">
        <span>Result</span><span>Check</span><span class="r">Value</span><span class="r">Limit</span><span class="r">Margin</span><span class="r">Line</span>
      </div>
      <ul class="list" aria-label="Checks">
        @for (row of rows(); track $index) {
          <li>
            <!-- Named by its visible text (so voice control finds it), with the column names as hidden words between. -->
            <button type="button" class="row" [class.failing]="!stale() && !row.check.pass" (click)="lineSelected.emit(row.check.line)">
              @if (stale()) { <span class="visually-hidden">Earlier version: </span> }
              <!-- &ngsp; keeps a space between the cells, so the words of the name stay apart. -->
              <span><span class="tag" [class.pass]="!stale() && row.check.pass" [class.fail]="!stale() && !row.check.pass" [class.stale]="stale()">{{ row.check.pass ? '✓ pass' : '✗ fail' }}</span></span>&ngsp;<span
                class="mono text">{{ row.check.text }}</span>&ngsp;<span class="visually-hidden">value</span>&ngsp;<span
                class="num r">{{ row.value }}</span>&ngsp;<span class="visually-hidden">limit</span>&ngsp;<span
                class="num r">{{ row.limit }}</span>&ngsp;<span class="visually-hidden">margin</span>&ngsp;<span
                class="num r margin" [class.neg]="row.check.margin < 0">{{ row.margin }}</span>&ngsp;<span class="visually-hidden">line</span>&ngsp;<span
                class="num r line">{{ row.check.line }}</span>
            </button>
          </li>
        }
      </ul>
    }
  `,
  styles: [STATUS_STYLES, STALE_TAG_STYLES, `
    :host { display: block; }
    .summary { display: flex; align-items: center; gap: 10px; margin: 0 0 10px; }
    .summary .tag { font-size: 1rem; padding: 2px 10px; }
    .hint { font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .head, .row { display: grid; grid-template-columns: 76px minmax(140px, 1fr) 84px 96px 90px 40px; gap: 8px; align-items: center; }
    .head { font-size: 0.75rem; font-weight: 700; color: var(--mat-sys-on-surface-variant); padding: 0 8px 4px;
      border-bottom: 1px solid var(--mat-sys-outline-variant); text-transform: uppercase; letter-spacing: 0.04em; }
    .r { text-align: right; }
    .list { list-style: none; margin: 0; padding: 0; }
    .row { position: relative; width: 100%; font: inherit; font-size: 0.875rem; text-align: left; color: var(--mat-sys-on-surface);
      background: transparent; border: 0; border-bottom: 1px solid var(--mat-sys-outline-variant); padding: 6px 8px; cursor: pointer; }
    .row:hover { background: var(--mat-sys-surface-container); }
    .row.failing { background: #FCF1EF; }
    .row.failing:hover { background: #F9E0DD; }
    .text { overflow-wrap: anywhere; }
    .margin.neg { color: #A3221B; font-weight: 600; }
    .line { color: var(--mat-sys-on-surface-variant); }
  `],
})
export class ChecksPanel {
  readonly result = input<SolveResult | undefined>();
  /** The measure lines of the result's text, to learn the units of measures the checks refer to. */
  readonly measureLines = input<readonly OutlineMeasure[]>([]);
  /** The result is from an earlier version of the netlist: no pass or fail is coloured. */
  readonly stale = input(false);
  /** The line of the chosen check. */
  readonly lineSelected = output<number>();

  readonly notice = computed(() => panelNotice(this.result(), (r) => (r.checks.length > 0 ? undefined : {
    title: 'No checks',
    text: 'State the spec as checks and they are verified on every solve, for example:',
    code: 'check cmrr_db >= 80',
  })));

  private readonly knownUnits = computed(() => measureUnits(this.measureLines()));

  readonly rows = computed<CheckRow[]>(() => (this.result()?.checks ?? []).map((check) => {
    const { subject, op, tolerance } = checkParts(check.text);
    const unit = guessUnit(subject, this.knownUnits());
    const value = formatQuantity(check.value, unit);
    const limit = `${OPERATOR_SIGNS[op] ?? op} ${formatQuantity(check.limit, unit)}${tolerance ? ` ± ${tolerance}` : ''}`.trim();
    const margin = formatSigned(check.margin, unit);
    return { check, unit, value, limit, margin };
  }));

  readonly passed = computed(() => this.rows().filter((r) => r.check.pass).length);
}
