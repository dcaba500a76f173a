/**
 * Two netlist texts side by side with their differences marked, both read-only; unchanged runs
 * are folded away (click a fold to open it). The older text goes on the left.
 */
import { afterRenderEffect, ChangeDetectionStrategy, Component, DestroyRef, ElementRef, inject, input, signal, viewChild } from '@angular/core';
import { MergeView } from '@codemirror/merge';
import { readOnlyNetlist } from './code-view-setup';

@Component({
  selector: 'nw-diff-view',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="labels">
      <span class="side a"><span class="swatch" aria-hidden="true"></span>{{ leftLabel() }}</span>
      <span class="side b"><span class="swatch" aria-hidden="true"></span>{{ rightLabel() }}</span>
    </div>
    <p class="summary" aria-live="polite">{{ summary() }}</p>
    <div #host class="host"></div>
  `,
  styles: `
    :host { display: block; }
    .labels { display: grid; grid-template-columns: 1fr 1fr; gap: 8px; font-weight: 600; margin-bottom: 4px; }
    .side { display: inline-flex; align-items: center; gap: 6px; }
    .swatch { width: 4px; height: 16px; border-radius: 2px; }
    .a .swatch { background: var(--mat-sys-primary); }
    .b .swatch { background: var(--mat-sys-tertiary); }
    .summary { margin: 0 0 6px; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .host { border: 1px solid var(--mat-sys-outline-variant); border-radius: 6px; overflow: hidden; }
    .host ::ng-deep .cm-mergeView { max-height: 62vh; }
    .host ::ng-deep .cm-mergeViewEditor + .cm-mergeViewEditor { border-left: 1px solid var(--mat-sys-outline-variant); }
  `,
})
export class DiffView {
  readonly left = input.required<string>();
  readonly right = input.required<string>();
  readonly leftLabel = input('Older');
  readonly rightLabel = input('Newer');

  protected readonly summary = signal('');
  private readonly host = viewChild.required<ElementRef<HTMLElement>>('host');
  private view: MergeView | undefined;

  constructor() {
    afterRenderEffect({
      write: () => {
        const [a, b] = [this.left(), this.right()];
        const [la, lb] = [this.leftLabel(), this.rightLabel()];
        this.view?.destroy();
        this.view = new MergeView({
          a: { doc: a, extensions: readOnlyNetlist(`${la} (older, read-only)`) },
          b: { doc: b, extensions: readOnlyNetlist(`${lb} (newer, read-only)`) },
          parent: this.host().nativeElement,
          gutter: true,
          highlightChanges: true,
          collapseUnchanged: { margin: 3, minSize: 6 },
        });
        const n = this.view.chunks.length;
        this.summary.set(n === 0 ? 'The two texts are the same.' : `${n} changed passage${n === 1 ? '' : 's'}; unchanged lines are folded.`);
      },
    });
    inject(DestroyRef).onDestroy(() => this.view?.destroy());
  }
}
