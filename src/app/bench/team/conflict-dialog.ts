/**
 * The conflict view: a save found that the team copy moved on since the version the draft is
 * based on. Both texts side by side — the team's on the left (read only), the user's on the
 * right (editable; arrows between them bring a change across) — and three ways out, none of
 * which overwrites anything unseen. Closing the dialog leaves everything as it was, unsaved.
 */
import { afterNextRender, ChangeDetectionStrategy, Component, DestroyRef, ElementRef, inject, signal, viewChild } from '@angular/core';
import { defaultKeymap, history, historyKeymap } from '@codemirror/commands';
import { MergeView } from '@codemirror/merge';
import { EditorState, type Extension } from '@codemirror/state';
import { EditorView, keymap, lineNumbers } from '@codemirror/view';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import type { StaleCurrent } from '../../core/team-api';
import { editorTheme } from '../editor/editor-theme';
import { nodewright } from '../editor/nodewright-language';
import { timeAgo } from '../time-ago';
import { BEFORE_CONFLICT, type ConflictChoice } from './team-sync';

export interface ConflictData {
  /** The team copy sent with the 409. */
  current: StaleCurrent;
  /** The user's text as it is in the bench. */
  mine: string;
  /** The version the user's text is based on. */
  baseVersion: number;
}

/** "Team copy · v5 by Mei Tanaka, 2 min ago". */
export function teamCopyLabel(current: StaleCurrent, now = Date.now()): string {
  return `Team copy · v${current.version} by ${current.author.name}, ${timeAgo(Date.parse(current.updatedAt), now)}`;
}

/** The merge view in the bench's colours: the team's changes teal, the user's orange. */
const mergeLook = EditorView.theme({
  '&.cm-merge-a .cm-changedLine': { backgroundColor: 'rgba(31, 95, 122, 0.08)' },
  '&.cm-merge-b .cm-changedLine': { backgroundColor: 'rgba(168, 72, 31, 0.08)' },
  '&.cm-merge-a .cm-changedText': { background: 'linear-gradient(#1f5f7a99, #1f5f7a99) bottom/100% 2px no-repeat' },
  '&.cm-merge-b .cm-changedText': { background: 'linear-gradient(#963f1a99, #963f1a99) bottom/100% 2px no-repeat' },
  '&.cm-merge-a .cm-changedLineGutter': { background: '#1f5f7a' },
  '&.cm-merge-b .cm-changedLineGutter': { background: '#963f1a' },
  '.cm-collapsedLines': { color: 'var(--mat-sys-on-surface-variant)', background: 'var(--mat-sys-surface-container)' },
  // The default marks are a glyph the editor's fonts may lack; plain dots read the same.
  '.cm-collapsedLines:before': { content: '"··· "' },
  '.cm-collapsedLines:after': { content: '" ···"' },
});

@Component({
  selector: 'nw-conflict-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>The team copy changed since your version</h2>
    <mat-dialog-content class="body">
      <p class="lead">Your text is based on v{{ data.baseVersion }}; {{ data.current.author.name }} saved v{{ data.current.version }} since.
        Nothing has been overwritten. Compare the two and choose; the arrows between them bring one change from the team copy into yours.</p>
      <div class="heads">
        <span class="head team">{{ teamLabel }}</span>
        <span class="head mine">Your text @if (edited() !== data.mine) { <span class="note">(edited here)</span> }</span>
      </div>
      <div #host class="merge"></div>
    </mat-dialog-content>
    <mat-dialog-actions class="actions">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <span class="spacer"></span>
      <button mat-stroked-button type="button" (click)="takeTheirs()" aria-describedby="nw-conflict-take">Take the team's</button>
      <button mat-stroked-button type="button" (click)="keepMine()" aria-describedby="nw-conflict-keep">Keep mine</button>
      <button mat-flat-button type="button" (click)="saveMerged()" aria-describedby="nw-conflict-merged">Save merged</button>
    </mat-dialog-actions>
    <p class="hints">
      <span id="nw-conflict-take">Take the team's: your text is kept as a separate draft “… ({{ beforeConflict }})”.</span>
      <span id="nw-conflict-keep">Keep mine: saves your text as it was, as v{{ data.current.version + 1 }}.</span>
      <span id="nw-conflict-merged">Save merged: saves the right-hand side as edited here.</span>
    </p>
  `,
  styles: `
    :host { display: flex; flex-direction: column; height: 100%; }
    .body { flex: 1; display: flex; flex-direction: column; min-height: 0; max-height: none; gap: 6px; }
    .lead { margin: 0; max-width: 110ch; }
    .heads { display: grid; grid-template-columns: 1fr 1.6em 1fr; font-weight: 600; }
    .head { padding: 4px 8px; border-radius: 6px 6px 0 0; }
    .head.team { grid-column: 1; background: #dcebf1; color: #113f52; }
    .head.mine { grid-column: 3; background: #f6e1d5; color: #6e2c0f; }
    .note { font-weight: 400; }
    .merge { flex: 1; min-height: 0; border: 1px solid var(--mat-sys-outline-variant); border-radius: 0 0 6px 6px; }
    .merge ::ng-deep .cm-mergeView { height: 100%; overflow: auto; }
    .merge ::ng-deep .cm-merge-revert button { color: var(--mat-sys-tertiary); font-size: 1.1rem; }
    .actions { gap: 6px; }
    .spacer { flex: 1; }
    .hints { display: flex; flex-wrap: wrap; gap: 4px 18px; margin: 0 24px 14px; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
  `,
})
export class ConflictDialog {
  protected readonly data = inject<ConflictData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<ConflictDialog, ConflictChoice>>(MatDialogRef);
  private readonly host = viewChild.required<ElementRef<HTMLElement>>('host');
  protected readonly teamLabel = teamCopyLabel(this.data.current);
  protected readonly beforeConflict = BEFORE_CONFLICT;
  /** The right-hand side as edited in the merge view. */
  protected readonly edited = signal(this.data.mine);
  private view: MergeView | undefined;

  constructor() {
    afterNextRender(() => {
      this.view = new MergeView({
        parent: this.host().nativeElement,
        a: { doc: this.data.current.source, extensions: this.side(`Team copy, version ${this.data.current.version}, read only`, true) },
        b: { doc: this.data.mine, extensions: this.side('Your text, editable', false) },
        revertControls: 'a-to-b',
        renderRevertControl: () => {
          const button = document.createElement('button');
          button.type = 'button';
          button.textContent = '→';
          button.title = 'Bring this change from the team copy into your text';
          button.setAttribute('aria-label', button.title);
          return button;
        },
        collapseUnchanged: { margin: 3, minSize: 8 },
      });
    });
    inject(DestroyRef).onDestroy(() => this.view?.destroy());
  }

  protected keepMine(): void {
    this.ref.close({ action: 'keep-mine', mine: this.data.mine });
  }

  protected takeTheirs(): void {
    this.ref.close({ action: 'take-theirs', mine: this.data.mine, edited: this.edited() });
  }

  protected saveMerged(): void {
    this.ref.close({ action: 'save-merged', merged: this.edited() });
  }

  private side(label: string, readOnly: boolean): Extension[] {
    return [
      lineNumbers(),
      nodewright(),
      editorTheme,
      mergeLook,
      EditorView.contentAttributes.of({ 'aria-label': label }),
      readOnly
        ? [EditorState.readOnly.of(true), EditorView.editable.of(false), EditorView.contentAttributes.of({ tabindex: '0', 'aria-readonly': 'true' })]
        : [
            history(),
            keymap.of([...defaultKeymap, ...historyKeymap]),
            EditorView.updateListener.of((u) => {
              if (u.docChanged) this.edited.set(u.state.doc.toString());
            }),
          ],
    ];
  }
}
