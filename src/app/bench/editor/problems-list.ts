/**
 * The problems under the editor: every error and warning with its line, message and hint, and a
 * link to its syntax in the language reference. Choosing one moves the editor cursor to it.
 */
import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import type { Diagnostic } from '../../../../solver';
import { syntaxSection, type SyntaxEntry } from '../../reference/syntax-anchors';
import type { PinChange } from '../library-notices';
import { SolverClient } from '../solver-client';
import { pinChangeOf } from './pin-change';

interface ProblemRow {
  d: Diagnostic;
  syntax: SyntaxEntry;
  change?: PinChange;
}

@Component({
  selector: 'nw-problems-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="head" id="nw-problems-head">
      @if (errors() + warnings() === 0 && stale()) {
        <span class="old">No problems in an earlier version of the text</span>
      } @else if (errors() + warnings() === 0) {
        <span class="ok"><span class="sym" aria-hidden="true">✓</span> No problems</span>
      } @else {
        <span class="count" [class.has-errors]="errors() > 0">
          {{ errors() }} {{ errors() === 1 ? 'error' : 'errors' }}, {{ warnings() }} {{ warnings() === 1 ? 'warning' : 'warnings' }}
        </span>
      }
    </div>
    @if (rows().length > 0) {
      <ul class="items" aria-labelledby="nw-problems-head">
        @for (row of rows(); track $index) {
          <li class="entry">
            <!-- The button's name is its visible text, so "click Error line 3" works by voice. -->
            <button type="button" class="item" [class.error]="row.d.severity === 'error'" (click)="selected.emit(row.d)">
              <!-- &ngsp; keeps a space between the cells, so the words of the name stay apart. -->
              <span class="badge"><span aria-hidden="true">{{ row.d.severity === 'error' ? '✕' : '!' }}</span> {{ row.d.severity === 'error' ? 'Error' : 'Warning' }}</span>&ngsp;<span
                class="where">line {{ row.d.line }}</span>&ngsp;<span class="text">{{ row.d.message }}
                @if (row.d.hint) { <span class="hint">Hint: {{ row.d.hint }}</span> }
              </span>
            </button>
            @if (row.change; as change) {
              <button type="button" class="pin" (click)="pinChange.emit(change)"
                [attr.aria-label]="'Pin ' + change.path + ' at version ' + change.to + ' instead of ' + change.from">Use &#64;{{ change.to }}</button>
            }
            <a class="syntax" [href]="'/reference#' + row.syntax.anchor" target="_blank" rel="noopener"
              [title]="'The syntax of ' + row.syntax.topic + ' in the language reference'">Syntax<span class="cdk-visually-hidden"> of {{ row.syntax.topic }} (opens in a new tab)</span></a>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    :host { display: flex; flex-direction: column; min-height: 0; font-size: 0.875rem; }
    .head { padding: 4px 2px; color: var(--mat-sys-on-surface-variant); }
    .ok { color: #116340; }
    .old { color: var(--mat-sys-on-surface-variant); font-style: italic; }
    .count.has-errors { color: #8c1d18; font-weight: 600; }
    .items { list-style: none; margin: 0; padding: 0; overflow: auto; min-height: 0; }
    .entry { display: grid; grid-template-columns: minmax(0, 1fr) auto auto; align-items: start; gap: 4px; }
    .pin { grid-column: 2; padding: 2px 8px; font: inherit; font-size: 0.8125rem; white-space: nowrap; cursor: pointer;
      border: 1px solid var(--mat-sys-outline); border-radius: 4px; background: var(--mat-sys-surface); color: var(--mat-sys-primary); }
    .syntax { grid-column: 3; padding: 3px 6px; font-size: 0.8125rem; white-space: nowrap; }
    .item { display: grid; grid-template-columns: 82px 58px 1fr; gap: 6px; width: 100%; text-align: left; border: 0;
      background: transparent; color: var(--mat-sys-on-surface); font: inherit; padding: 3px 4px; border-radius: 4px; cursor: pointer; }
    .item:hover { background: var(--mat-sys-surface-container); }
    .badge { font-weight: 600; color: #7a5200; }
    .item.error .badge { color: #8c1d18; }
    .where { color: var(--mat-sys-on-surface-variant); font-variant-numeric: tabular-nums; }
    .hint { display: block; color: var(--mat-sys-tertiary); }
  `,
})
export class ProblemsList {
  readonly diagnostics = input<readonly Diagnostic[]>([]);
  /** The diagnostics belong to an earlier text (a cancelled solve): no green "No problems". */
  readonly stale = input(false);
  /**
   * The text the diagnostics were found in, for the statement on each line. Without it the text
   * of the page's solver reply is used: the problems always come from that same reply.
   */
  readonly text = input<string>();
  readonly selected = output<Diagnostic>();
  /** The one-click pin change a library notice offers was asked for. */
  readonly pinChange = output<PinChange>();
  private readonly client = inject(SolverClient, { optional: true });

  private readonly lines = computed(() => (this.text() ?? this.client?.reply()?.text ?? '').split('\n'));
  protected readonly rows = computed<ProblemRow[]>(() => {
    const lines = this.lines();
    return this.diagnostics().map((d) => ({ d, syntax: syntaxSection(d, lines[d.line - 1]), change: pinChangeOf(d) }));
  });
  protected readonly errors = computed(() => this.diagnostics().filter((d) => d.severity === 'error').length);
  protected readonly warnings = computed(() => this.diagnostics().length - this.errors());
}
