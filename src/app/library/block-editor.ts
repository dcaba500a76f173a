/**
 * Writing a block's source: the bench's editor, solved live in a solver worker of its own, with
 * the problems list, the fixture's checks in one line, and what the block doc comment lacks. It
 * keeps no state of the page's: the text goes out through `textChange` at every edit.
 */
import { ChangeDetectionStrategy, Component, computed, effect, input, output, signal, untracked, inject } from '@angular/core';
import { NetlistEditor, type EditorDocument, type RevealRequest } from '../bench/editor/netlist-editor';
import { ProblemsList } from '../bench/editor/problems-list';
import { SolveView } from '../bench/solve-view';
import { SolverClient } from '../bench/solver-client';
import { blockDocCheck } from './block-path';
import { checksSummary } from './block-words';

@Component({
  selector: 'nw-block-editor',
  imports: [NetlistEditor, ProblemsList],
  providers: [SolverClient],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <nw-netlist-editor class="editor" [document]="document()" [diagnostics]="view.diagnostics()" [names]="view.names()"
      [reveal]="reveal()" [label]="label()" (textChange)="edited($event)" />
    <div class="status" aria-live="polite">
      <span class="checks" [class.bad]="failing() > 0">{{ checksLine() }}</span>
      @if (doc(); as d) {
        @if (!d.defined) { <span class="bad">{{ d.problem }}</span> }
        @else if (d.problems.length) { <span class="docs">Doc comment: {{ d.problems[0] }}@if (d.problems.length > 1) { (and {{ d.problems.length - 1 }} more)}</span> }
      }
    </div>
    <nw-problems-list class="problems" [diagnostics]="view.diagnostics()" (selected)="goTo($event.line, $event.col)" />
  `,
  styles: `
    :host { display: flex; flex-direction: column; gap: 6px; min-height: 0; }
    .editor { height: var(--nw-block-editor-height, 52vh); min-height: 200px; }
    .status { display: flex; flex-wrap: wrap; gap: 4px 16px; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .bad { color: #8c1d18; font-weight: 600; }
    .docs { color: #7a5200; }
    .problems { max-height: 18vh; }
  `,
})
export class BlockEditor {
  protected readonly client = inject(SolverClient);
  protected readonly view = new SolveView(this.client);

  /** The text the editor starts from; a new value replaces the text (and its undo history). */
  readonly initial = input.required<string>();
  /** The block the source must define (the path's last part), for the doc comment line. */
  readonly blockName = input<string>();
  readonly label = input('Block source');
  readonly textChange = output<string>();

  /** The text now in the editor. */
  readonly text = signal('');
  protected readonly document = signal<EditorDocument>({ key: 0, text: '' });
  protected readonly reveal = signal<RevealRequest | undefined>(undefined);
  private revealSeq = 0;

  /** Errors of the newest solve of the newest text (Submit refuses while there are any). */
  readonly errorCount = computed(() => this.view.errorCount());
  protected readonly failing = computed(() => this.view.latest()?.checks.filter((c) => !c.pass).length ?? 0);
  protected readonly checksLine = computed(() => {
    const r = this.view.latest();
    if (!r) return this.client.status() === 'failed' ? 'The solver did not start; the text is kept.' : 'Solving…';
    if (r.errors.length) return `${r.errors.length} error${r.errors.length === 1 ? '' : 's'}: the checks cannot be solved yet.`;
    return `Fixture: ${checksSummary(r.checks.length, this.failing())}.`;
  });
  protected readonly doc = computed(() => {
    const name = this.blockName();
    return name ? blockDocCheck(this.text(), name) : undefined;
  });

  constructor() {
    this.client.warmUp();
    effect(() => {
      const text = this.initial();
      untracked(() => {
        this.document.update((d) => ({ key: d.key + 1, text }));
        this.text.set(text);
        this.client.forgetLastSolved();
        this.client.solveNow(text);
      });
    });
  }

  protected edited(text: string): void {
    this.text.set(text);
    this.client.edit(text);
    this.textChange.emit(text);
  }

  protected goTo(line: number, col?: number): void {
    this.reveal.set({ line, col, seq: ++this.revealSeq });
  }
}
