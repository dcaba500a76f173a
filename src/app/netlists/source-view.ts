/**
 * One revision's text, read-only, with line numbers and the bench's colours.
 */
import { afterRenderEffect, ChangeDetectionStrategy, Component, DestroyRef, ElementRef, inject, input, viewChild } from '@angular/core';
import { EditorView } from '@codemirror/view';
import { readOnlyNetlist } from './code-view-setup';

@Component({
  selector: 'nw-source-view',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<div #host class="host"></div>`,
  styles: `
    :host { display: block; border: 1px solid var(--mat-sys-outline-variant); border-radius: 6px; overflow: hidden; }
    .host { max-height: 62vh; overflow: auto; }
  `,
})
export class SourceView {
  readonly text = input.required<string>();
  /** Names the text for screen readers, e.g. "Version 4 of Mirror-loaded pair". */
  readonly label = input('Netlist text');

  private readonly host = viewChild.required<ElementRef<HTMLElement>>('host');
  private view: EditorView | undefined;

  constructor() {
    afterRenderEffect({
      write: () => {
        const doc = this.text();
        const label = this.label();
        this.view?.destroy();
        this.view = new EditorView({ doc, extensions: readOnlyNetlist(label), parent: this.host().nativeElement });
      },
    });
    inject(DestroyRef).onDestroy(() => this.view?.destroy());
  }
}
