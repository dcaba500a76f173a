/**
 * The netlist editor: CodeMirror 6 with the Nodewright language, the solver's diagnostics inline,
 * completion from the netlist's own names and the block library, block help on hover, bracket
 * matching, undo and line numbers.
 *
 * It owns no netlist state: a new `document` (new key) replaces the text and its undo history;
 * every edit goes out through `textChange`. Shortcuts that belong to the bench (solve, save,
 * open, help) go out through `command`.
 */
import { afterNextRender, ChangeDetectionStrategy, Component, DestroyRef, effect, ElementRef, inject, input, output, signal, untracked, viewChild } from '@angular/core';
import { autocompletion, closeBrackets, closeBracketsKeymap, completionKeymap } from '@codemirror/autocomplete';
import { defaultKeymap, history, historyKeymap } from '@codemirror/commands';
import { bracketMatching } from '@codemirror/language';
import { lintGutter, lintKeymap, setDiagnostics } from '@codemirror/lint';
import { EditorState, type Extension } from '@codemirror/state';
import { drawSelection, EditorView, highlightActiveLine, highlightActiveLineGutter, keymap, lineNumbers, placeholder } from '@codemirror/view';
import type { Diagnostic } from '../../../../solver';
import { NO_NAMES, type LibraryEntry, type NetlistNames } from '../solver-protocol';
import { netlistCompletion } from './completion';
import { toLintDiagnostics } from './diagnostics';
import { editorTheme } from './editor-theme';
import { continuesWithVersions, libraryCompletion, refreshVersionCompletion } from './library-completion';
import { libraryHover } from './library-hover';
import { nodewright } from './nodewright-language';
import type { PinChange } from '../library-notices';
import { applyPinChange } from './pin-change';

/** A whole document to show; a new key means a new document (fresh undo history). */
export interface EditorDocument {
  key: number;
  text: string;
}

/** A place to move the cursor to; `seq` makes asking twice for the same line move it again. */
export interface RevealRequest {
  line: number;
  col?: number;
  seq: number;
}

export type EditorCommand = 'solve' | 'save' | 'open' | 'help';

/** Mark set at every edit; the bench sets `nw-painted` once the results of that edit are on screen. */
export const EDIT_MARK = 'nw-edit';

@Component({
  selector: 'nw-netlist-editor',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<div #host class="host" [class.dragging]="dragging()"></div>
    @if (dragging()) {
      <div class="drop-hint" aria-hidden="true">Drop a .nwl file to open it</div>
    }`,
  styles: `
    :host { display: block; position: relative; min-height: 0; min-width: 0; }
    .host { height: 100%; width: 100%; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; overflow: hidden; }
    .host.dragging { border: 2px dashed var(--mat-sys-tertiary); }
    .drop-hint { position: absolute; inset: auto 12px 12px auto; padding: 6px 10px; border-radius: 6px;
      background: var(--mat-sys-tertiary); color: var(--mat-sys-on-tertiary); pointer-events: none; }
  `,
})
export class NetlistEditor {
  readonly document = input.required<EditorDocument>();
  readonly diagnostics = input<readonly Diagnostic[]>([]);
  readonly names = input<NetlistNames>(NO_NAMES);
  /** The blocks `use` lines may name (LibraryIndex.entries()). */
  readonly library = input<readonly LibraryEntry[]>([]);
  readonly reveal = input<RevealRequest | undefined>(undefined);
  /** Accessible name of the text area. */
  readonly label = input('Netlist');
  /**
   * Shows the text without letting it be changed (the shared view). Read when the editor is
   * created; the text can still be selected, copied and scrolled from the keyboard.
   */
  readonly readOnly = input(false);

  readonly textChange = output<string>();
  readonly command = output<EditorCommand>();
  readonly fileDropped = output<File>();
  /** The line the cursor is on (1-based), as it moves. */
  readonly cursorLine = output<number>();
  /** Completion is offering the versions of this library path: fetch its full list (LibraryIndex.loadVersions). */
  readonly libraryVersionsWanted = output<string>();

  protected readonly dragging = signal(false);
  private readonly host = viewChild.required<ElementRef<HTMLElement>>('host');
  private readonly view = signal<EditorView | undefined>(undefined);
  private shownKey: number | undefined;

  constructor() {
    let resize: ResizeObserver | undefined;
    afterNextRender(() => {
      const doc = untracked(this.document);
      const view = new EditorView({ parent: this.host().nativeElement, state: this.createState(doc.text) });
      this.shownKey = doc.key;
      this.view.set(view);
      // When the editor gets shorter (the problems list grows below it), keep the cursor in sight.
      if (typeof ResizeObserver === 'undefined') return;
      let height = this.host().nativeElement.clientHeight;
      resize = new ResizeObserver(() => {
        const h = this.host().nativeElement.clientHeight;
        if (h < height && view.hasFocus) view.dispatch({ effects: EditorView.scrollIntoView(view.state.selection.main.head, { y: 'nearest', yMargin: 24 }) });
        height = h;
      });
      resize.observe(this.host().nativeElement);
    });
    inject(DestroyRef).onDestroy(() => {
      resize?.disconnect();
      this.view()?.destroy();
    });

    effect(() => {
      const view = this.view();
      const doc = this.document();
      if (!view || doc.key === this.shownKey) return;
      this.shownKey = doc.key;
      view.setState(this.createState(doc.text));
      this.applyDiagnostics(view, untracked(this.diagnostics));
    });
    effect(() => {
      const view = this.view();
      const diagnostics = this.diagnostics();
      if (view) this.applyDiagnostics(view, diagnostics);
    });
    effect(() => {
      const view = this.view();
      const reveal = this.reveal();
      if (view && reveal) this.goTo(view, reveal.line, reveal.col);
    });
    effect(() => {
      this.library();
      const view = untracked(this.view);
      if (view) refreshVersionCompletion(view);
    });
  }

  /** The text now in the editor. */
  text(): string {
    return this.view()?.state.doc.toString() ?? untracked(this.document).text;
  }

  /** Moves a `use` line's pin (one undoable edit); false when that line no longer pins the old version. */
  movePin(change: PinChange): boolean {
    const view = this.view();
    return !!view && applyPinChange(view, change);
  }

  focus(): void {
    this.view()?.focus();
  }

  /** Moves the cursor to a line (and column), scrolls it into the middle and focuses the editor. */
  goToLine(line: number, col?: number): void {
    const view = this.view();
    if (view) this.goTo(view, line, col);
  }

  private goTo(view: EditorView, lineNo: number, col = 1): void {
    const doc = view.state.doc;
    const line = doc.line(Math.min(Math.max(1, Math.floor(lineNo) || 1), doc.lines));
    const pos = line.from + Math.min(Math.max(0, col - 1), line.length);
    view.dispatch({ selection: { anchor: pos }, effects: EditorView.scrollIntoView(pos, { y: 'center' }) });
    view.focus();
  }

  private applyDiagnostics(view: EditorView, diagnostics: readonly Diagnostic[]): void {
    view.dispatch(setDiagnostics(view.state, toLintDiagnostics(view.state.doc, diagnostics)));
  }

  private createState(text: string): EditorState {
    return EditorState.create({ doc: text, extensions: this.extensions() });
  }

  private extensions(): Extension[] {
    const run = (cmd: EditorCommand) => () => {
      this.command.emit(cmd);
      return true;
    };
    const readOnly = untracked(this.readOnly);
    return [
      ...(readOnly
        ? [
            EditorState.readOnly.of(true),
            EditorView.editable.of(false),
            // Not editable means not focusable by default; keep it reachable for reading and copying.
            EditorView.contentAttributes.of({ tabindex: '0', 'aria-readonly': 'true' }),
          ]
        : []),
      lineNumbers(),
      highlightActiveLineGutter(),
      history(),
      drawSelection(),
      bracketMatching(),
      closeBrackets(),
      highlightActiveLine(),
      lintGutter(),
      nodewright(),
      autocompletion({
        override: [netlistCompletion(() => untracked(this.names)), libraryCompletion(() => untracked(this.library), (path) => this.libraryVersionsWanted.emit(path))],
        activateOnCompletion: continuesWithVersions,
        icons: false,
      }),
      libraryHover(() => untracked(this.names), () => untracked(this.library)),
      readOnly ? [] : placeholder('Write a netlist here, or pick an example from the menu above.'),
      keymap.of([
        { key: 'Mod-Enter', run: run('solve'), preventDefault: true },
        { key: 'Mod-s', run: run('save'), preventDefault: true },
        { key: 'Mod-o', run: run('open'), preventDefault: true },
        { key: 'F1', run: run('help'), preventDefault: true },
        ...closeBracketsKeymap,
        ...defaultKeymap,
        ...historyKeymap,
        ...completionKeymap,
        ...lintKeymap,
      ]),
      editorTheme,
      // An explicit tabindex makes the content the scroller's focus target in every checker's eyes
      // (axe: scrollable-region-focusable), so keyboard users can reach and scroll a long netlist.
      EditorView.contentAttributes.of({ 'aria-label': untracked(this.label), 'aria-multiline': 'true', tabindex: '0' }),
      EditorView.updateListener.of((update) => {
        if (update.docChanged) {
          performance.mark(EDIT_MARK);
          this.textChange.emit(update.state.doc.toString());
        }
        if (update.selectionSet || update.docChanged) this.cursorLine.emit(update.state.doc.lineAt(update.state.selection.main.head).number);
      }),
      readOnly ? [] : EditorView.domEventHandlers({
        dragover: (event) => {
          if (!event.dataTransfer?.types.includes('Files')) return false;
          event.preventDefault();
          this.dragging.set(true);
          return true;
        },
        dragleave: () => {
          this.dragging.set(false);
          return false;
        },
        drop: (event) => {
          this.dragging.set(false);
          const file = event.dataTransfer?.files?.[0];
          if (!file) return false;
          event.preventDefault();
          this.fileDropped.emit(file);
          return true;
        },
      }),
    ];
  }
}
