/**
 * A version's review thread, oldest first: who did what (submitted, commented, approved, sent
 * back), when, on which line (a link that scrolls the source there), and what they wrote.
 */
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { reviewKindWords } from './block-words';
import type { ReviewEntry } from './library-api';

@Component({
  selector: 'nw-review-thread',
  imports: [AgoPipe, ExactTimePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (entries().length === 0) {
      <p class="none">No review entries yet.</p>
    } @else {
      <ol class="thread" aria-label="Review thread, oldest first">
        @for (e of entries(); track $index) {
          <li class="entry" [class]="e.kind">
            <div class="who">
              <strong>{{ e.author.name }}</strong> {{ words(e.kind) }}
              @if (e.line) {
                on <button type="button" class="line" (click)="lineSelected.emit(e.line)" [attr.aria-label]="'Show line ' + e.line + ' in the source'">line {{ e.line }}</button>
              }
              · <span class="when" [title]="e.createdAt | exactTime">{{ e.createdAt | ago }}</span>
            </div>
            @if (e.comment) { <p class="text">{{ e.comment }}</p> }
          </li>
        }
      </ol>
    }
  `,
  styles: `
    :host { display: block; font-size: 0.875rem; }
    .none { color: var(--mat-sys-on-surface-variant); margin: 0; }
    .thread { list-style: none; margin: 0; padding: 0; display: flex; flex-direction: column; gap: 8px; }
    .entry { padding: 6px 10px; border-left: 3px solid var(--mat-sys-outline-variant); background: var(--mat-sys-surface-container-lowest); border-radius: 2px; }
    .entry.approve { border-left-color: var(--mat-sys-tertiary); }
    .entry.send_back { border-left-color: #b3261e; }
    .entry.submit { border-left-color: var(--mat-sys-primary); }
    .when { color: var(--mat-sys-on-surface-variant); }
    .line { border: 0; background: none; padding: 0; font: inherit; color: var(--mat-sys-tertiary); text-decoration: underline; cursor: pointer; }
    .text { margin: 4px 0 0; white-space: pre-wrap; overflow-wrap: anywhere; }
  `,
})
export class ReviewThread {
  readonly entries = input.required<readonly ReviewEntry[]>();
  readonly lineSelected = output<number>();

  protected words(kind: string): string {
    return reviewKindWords(kind);
  }
}
