/**
 * A version's source, read-only, with line numbers and the bench's colours (the netlists pages'
 * read-only set-up), plus review notes: a line with comments gets a marker in a gutter beside
 * its number (its comments in the marker's title) and a tint. When `commentable`, clicking a line
 * number or the notes gutter chooses that line for a new comment.
 */
import { afterRenderEffect, ChangeDetectionStrategy, Component, DestroyRef, effect, ElementRef, inject, input, output, untracked, viewChild } from '@angular/core';
import { RangeSetBuilder } from '@codemirror/state';
import { Decoration, EditorView, gutter, GutterMarker, type DecorationSet } from '@codemirror/view';
import { readOnlyNetlist } from '../netlists/code-view-setup';

/** The comments on one line. */
export interface LineNote {
  line: number;
  texts: string[];
}

/** A place to scroll to; `seq` makes asking twice for the same line scroll again. */
export interface LineReveal {
  line: number;
  seq: number;
}

class NoteMarker extends GutterMarker {
  constructor(private readonly note: LineNote) {
    super();
  }
  override eq(other: NoteMarker): boolean {
    return other.note === this.note;
  }
  override toDOM(): Node {
    const el = document.createElement('span');
    el.className = 'nw-note-mark';
    el.textContent = String(this.note.texts.length);
    el.title = this.note.texts.join('\n—\n');
    return el;
  }
}

const notesTheme = EditorView.theme({
  '.nw-notes-gutter': { minWidth: '22px' },
  '.nw-note-mark': {
    display: 'inline-block', minWidth: '14px', padding: '0 3px', borderRadius: '7px', fontSize: '11px', lineHeight: '15px',
    textAlign: 'center', fontWeight: '700', background: 'var(--mat-sys-primary)', color: 'var(--mat-sys-on-primary)', cursor: 'help',
  },
  '.nw-noted-line': { backgroundColor: 'rgba(168, 72, 31, 0.08)' },
  '&.nw-commentable .cm-lineNumbers .cm-gutterElement, &.nw-commentable .nw-notes-gutter': { cursor: 'pointer' },
  '&.nw-commentable .cm-lineNumbers .cm-gutterElement:hover': { color: 'var(--mat-sys-primary)', textDecoration: 'underline' },
});

@Component({
  selector: 'nw-block-source',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<div #host class="host" (click)="clicked($event)"></div>`,
  styles: `
    :host { display: block; border: 1px solid var(--mat-sys-outline-variant); border-radius: 6px; overflow: hidden; }
    .host { max-height: var(--nw-source-height, 62vh); overflow: auto; }
  `,
})
export class BlockSource {
  readonly text = input.required<string>();
  readonly label = input('Block source');
  readonly notes = input<readonly LineNote[]>([]);
  readonly commentable = input(false);
  readonly reveal = input<LineReveal | undefined>(undefined);
  /** A line was chosen for a comment (only when `commentable`). */
  readonly lineChosen = output<number>();

  private readonly host = viewChild.required<ElementRef<HTMLElement>>('host');
  private view: EditorView | undefined;

  constructor() {
    afterRenderEffect({
      write: () => {
        const doc = this.text();
        const label = this.label();
        const notes = this.notes();
        const commentable = this.commentable();
        this.view?.destroy();
        this.view = new EditorView({ doc, extensions: this.extensions(label, notes, commentable), parent: this.host().nativeElement });
        const r = untracked(this.reveal);
        if (r) this.scrollTo(r.line);
      },
    });
    effect(() => {
      const r = this.reveal();
      if (r) untracked(() => this.scrollTo(r.line));
    });
    inject(DestroyRef).onDestroy(() => this.view?.destroy());
  }

  /** Line numbers are CodeMirror's own; a click on one is read from the number it shows. */
  protected clicked(event: MouseEvent): void {
    if (!this.commentable()) return;
    const el = (event.target as HTMLElement | null)?.closest('.cm-lineNumbers .cm-gutterElement');
    const n = el ? Number.parseInt(el.textContent ?? '', 10) : NaN;
    if (Number.isInteger(n) && n > 0) this.lineChosen.emit(n);
  }

  private extensions(label: string, notes: readonly LineNote[], commentable: boolean) {
    const byLine = new Map(notes.map((n) => [n.line, n]));
    const lines = (state: EditorView['state']): DecorationSet => {
      const b = new RangeSetBuilder<Decoration>();
      for (const n of [...byLine.keys()].sort((x, y) => x - y)) {
        if (n >= 1 && n <= state.doc.lines) b.add(state.doc.line(n).from, state.doc.line(n).from, Decoration.line({ class: 'nw-noted-line' }));
      }
      return b.finish();
    };
    return [
      readOnlyNetlist(label),
      // Doc comments are prose: wrapped, they read without scrolling sideways in a half-width column.
      EditorView.lineWrapping,
      notesTheme,
      commentable ? EditorView.editorAttributes.of({ class: 'nw-commentable' }) : [],
      EditorView.decorations.of((v) => lines(v.state)),
      gutter({
        class: 'nw-notes-gutter',
        lineMarker: (v, block) => {
          const note = byLine.get(v.state.doc.lineAt(block.from).number);
          return note ? new NoteMarker(note) : null;
        },
        lineMarkerChange: () => false,
        domEventHandlers: {
          click: (v, block) => {
            if (!commentable) return false;
            this.lineChosen.emit(v.state.doc.lineAt(block.from).number);
            return true;
          },
        },
      }),
    ];
  }

  private scrollTo(lineNo: number): void {
    const view = this.view;
    if (!view) return;
    const doc = view.state.doc;
    const line = doc.line(Math.min(Math.max(1, Math.floor(lineNo) || 1), doc.lines));
    view.dispatch({ selection: { anchor: line.from, head: line.to }, effects: EditorView.scrollIntoView(line.from, { y: 'center' }) });
  }
}
