/**
 * A version's checks: as the author's browser solved them at submission, beside the same source
 * solved now in this browser, line by line, with "same" or a clear mismatch and why. Before a
 * first submission there are only this browser's checks.
 */
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { OutlineMeasure, SolveResult } from '../../../solver';
import { STATUS_STYLES } from '../bench/panels/panel-styles';
import { formatQuantity } from '../bench/panels/si-format';
import { checkParts, guessUnit, measureUnits } from '../bench/panels/units';
import type { SolveStatus } from '../bench/solver-client';
import { compareChecks, comparisonCounts, outcomesOf, type CheckComparison } from './check-compare';
import type { CheckOutcome } from './library-api';

@Component({
  selector: 'nw-block-checks',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="summary" role="status">
      @if (failure(); as f) {
        <span class="tag fail">✗ not re-solved</span> The solver did not run in this browser: {{ f }}
      } @else if (!result()) {
        <span class="tag ok">…</span> Solving the checks in this browser…
      } @else if (errors().length) {
        <span class="tag fail">✗ {{ errors().length }} error{{ errors().length === 1 ? '' : 's' }}</span>
        This browser's solve stops at line {{ errors()[0].line }}: {{ errors()[0].message }}
      } @else if (author() === null) {
        <span class="tag ok">not submitted</span> The author's checks arrive with the first submission; these are solved here.
      } @else if (counts().mismatched === 0) {
        <span class="tag pass">✓ all {{ counts().same }} the same</span> Re-solved here: every check agrees with the author's.
      } @else {
        <span class="tag fail">⚠ {{ counts().mismatched }} mismatch{{ counts().mismatched === 1 ? '' : 'es' }}</span>
        {{ counts().same }} of {{ rows().length }} agree with the author's; look at the flagged lines before vetting.
      }
    </p>
    @if (rows().length) {
      <table class="table">
        <caption class="visually-hidden">Checks: the author's beside this browser's</caption>
        <thead><tr><th scope="col">Line</th><th scope="col">Check</th>@if (author() !== null) {<th scope="col">Author</th>}<th scope="col">Here</th>@if (author() !== null) {<th scope="col">Agreement</th>}</tr></thead>
        <tbody>
          @for (r of rows(); track $index) {
            <tr [class.mismatch]="author() !== null && !!result() && !r.same">
              <td class="num"><button type="button" class="line" (click)="lineSelected.emit(r.line)" [attr.aria-label]="'Go to line ' + r.line">{{ r.line }}</button></td>
              <td class="mono text">{{ r.text }}</td>
              @if (author() !== null) { <td>@if (r.author; as a) { <span class="tag" [class.pass]="a.pass" [class.fail]="!a.pass">{{ a.pass ? '✓ pass' : '✗ fail' }}</span> <span class="num">{{ value(r, a) }}</span> } @else { — }</td> }
              <td>@if (r.here; as h) { <span class="tag" [class.pass]="h.pass" [class.fail]="!h.pass">{{ h.pass ? '✓ pass' : '✗ fail' }}</span> <span class="num">{{ value(r, h) }}</span> } @else { — }</td>
              @if (author() !== null) {
                <td>@if (!result()) { <span class="tag ok">…</span> } @else if (r.same) { <span class="tag ok">same</span> } @else { <span class="tag fail">⚠ mismatch</span><div class="why">{{ r.reason }}</div> }</td>
              }
            </tr>
          }
        </tbody>
      </table>
    } @else if (result() && !errors().length) {
      <p class="none">The fixture has no <code>check</code> lines. A reviewer can only vet what the checks state: add a few, such as <code>check ratio = 1 ± 1%</code>.</p>
    }
  `,
  styles: [STATUS_STYLES, `
    :host { display: block; font-size: 0.875rem; }
    .summary { margin: 0 0 8px; display: flex; flex-wrap: wrap; gap: 6px; align-items: baseline; }
    .table { width: 100%; border-collapse: collapse; }
    th { text-align: left; font-size: 0.75rem; text-transform: uppercase; letter-spacing: 0.04em; color: var(--mat-sys-on-surface-variant);
      border-bottom: 1px solid var(--mat-sys-outline-variant); padding: 4px 6px; }
    td { padding: 5px 6px; border-bottom: 1px solid var(--mat-sys-outline-variant); vertical-align: top; }
    tr.mismatch { background: #FCF1EF; }
    .text { overflow-wrap: anywhere; }
    .line { border: 0; background: none; font: inherit; color: var(--mat-sys-tertiary); text-decoration: underline; cursor: pointer; padding: 0; }
    .why { margin-top: 2px; color: #7a1812; }
    .none { color: var(--mat-sys-on-surface-variant); }
  `],
})
export class BlockChecks {
  /** The author's checks; null before the first submission. */
  readonly author = input<CheckOutcome[] | null>(null);
  /** This browser's solve of the same source. */
  readonly result = input<SolveResult | undefined>();
  /** The measure lines of the solved source (for the units of measures the checks name). */
  readonly measureLines = input<readonly OutlineMeasure[]>([]);
  readonly status = input<SolveStatus>('idle');
  readonly failure = input<string | undefined>();
  readonly lineSelected = output<number>();

  protected readonly errors = computed(() => this.result()?.errors ?? []);
  /** This browser's checks; none while its solve has errors. */
  private readonly here = computed(() => (this.result() && !this.errors().length ? outcomesOf(this.result()!.checks) : []));
  protected readonly rows = computed<CheckComparison[]>(() => {
    const author = this.author();
    if (author === null) return this.here().map((h) => ({ line: h.line, text: h.text, here: h, same: true }));
    // Not solved here yet: the author's rows, to be compared when the solve lands.
    if (!this.result()) return author.map((a) => ({ line: a.line, text: a.text, author: a, same: true }));
    return compareChecks(author, this.here());
  });
  protected readonly counts = computed(() => comparisonCounts(this.rows()));
  private readonly units = computed(() => measureUnits(this.measureLines()));

  protected value(row: CheckComparison, o: CheckOutcome): string {
    return formatQuantity(o.value ?? undefined, guessUnit(checkParts(row.text).subject, this.units()));
  }
}
