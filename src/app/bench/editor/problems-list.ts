/**
 * The problems under the editor: every error and warning with its line, message and hint.
 * Choosing one moves the editor cursor to it.
 */
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { Diagnostic } from '../../../../solver';

@Component({
  selector: 'nw-problems-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="head" id="nw-problems-head">
      @if (errors() + warnings() === 0) {
        <span class="ok"><span class="sym" aria-hidden="true">✓</span> No problems</span>
      } @else {
        <span class="count" [class.has-errors]="errors() > 0">
          {{ errors() }} {{ errors() === 1 ? 'error' : 'errors' }}, {{ warnings() }} {{ warnings() === 1 ? 'warning' : 'warnings' }}
        </span>
      }
    </div>
    @if (diagnostics().length > 0) {
      <ul class="items" aria-labelledby="nw-problems-head">
        @for (d of diagnostics(); track $index) {
          <li>
            <button type="button" class="item" [class.error]="d.severity === 'error'" (click)="selected.emit(d)"
              [attr.aria-label]="(d.severity === 'error' ? 'Error' : 'Warning') + ' on line ' + d.line + ': ' + d.message + (d.hint ? ' Hint: ' + d.hint : '') + '. Go to line.'">
              <span class="badge" aria-hidden="true">{{ d.severity === 'error' ? '✕ Error' : '! Warning' }}</span>
              <span class="where" aria-hidden="true">line {{ d.line }}</span>
              <span class="text" aria-hidden="true">{{ d.message }}
                @if (d.hint) { <span class="hint">Hint: {{ d.hint }}</span> }
              </span>
            </button>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    :host { display: flex; flex-direction: column; min-height: 0; font-size: 0.875rem; }
    .head { padding: 4px 2px; color: var(--mat-sys-on-surface-variant); }
    .ok { color: #116340; }
    .count.has-errors { color: #8c1d18; font-weight: 600; }
    .items { list-style: none; margin: 0; padding: 0; overflow: auto; min-height: 0; }
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
  readonly selected = output<Diagnostic>();
  protected readonly errors = computed(() => this.diagnostics().filter((d) => d.severity === 'error').length);
  protected readonly warnings = computed(() => this.diagnostics().length - this.errors());
}
