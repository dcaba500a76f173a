/**
 * A shared netlist at `/s/:token`, for anyone with the link — no sign-in. The text read-only on
 * the left, and on the right the very panels of the bench, solved in this browser by the same
 * solver, so a reviewer sees the numbers the author saw. "Open a copy in my bench" makes it a
 * draft of the reader's own.
 */
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import { BenchColumns } from '../bench/bench-columns';
import { NetlistEditor, type EditorDocument, type RevealRequest } from '../bench/editor/netlist-editor';
import { ProblemsList } from '../bench/editor/problems-list';
import { ResultsPanels } from '../bench/results-panels';
import { SolveView } from '../bench/solve-view';
import { SolverClient } from '../bench/solver-client';
import { Drafts } from '../core/drafts';
import { apiErrorOf, TeamApi, type SharedNetlist } from '../core/team-api';
import { sharedMeta, shareProblem, SHARED_COPY } from './shared-text';

type Load = { kind: 'loading' } | { kind: 'shown'; shared: SharedNetlist } | { kind: 'problem'; sentence: string; offline: boolean };

@Component({
  selector: 'nw-shared-page',
  imports: [NetlistEditor, ProblemsList, BenchColumns, ResultsPanels, MatButtonModule, RouterLink],
  providers: [SolverClient],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @switch (load().kind) {
      @case ('loading') {
        <p class="quiet pad" role="status">Loading the shared netlist…</p>
      }
      @case ('problem') {
        <section class="problem pad" aria-labelledby="nw-shared-problem">
          <h1 id="nw-shared-problem">Shared netlist</h1>
          <p class="sentence">{{ problem()?.sentence }}</p>
          <p class="next">
            @if (problem()?.offline) { <button mat-stroked-button type="button" (click)="reload()">Try again</button> }
            <a mat-button routerLink="/bench">Go to the bench</a>
          </p>
        </section>
      }
      @case ('shown') {
        @if (shared(); as s) {
          <header class="head">
            <div class="what">
              <h1 class="name">Shared netlist: {{ s.name }}</h1>
              <p class="meta">{{ meta() }}</p>
              @if (s.libraryPins.length) {
                <p class="meta">Library blocks: @for (p of s.libraryPins; track p.path) {<code>{{ p.path }}&#64;{{ p.version }}</code>{{ $last ? '' : ', ' }}}</p>
              }
            </div>
            <button mat-flat-button type="button" (click)="openCopy()" [disabled]="copying()">Open a copy in my bench</button>
          </header>
          <nw-bench-columns>
            <nw-netlist-editor netlist class="editor" [document]="document()" [diagnostics]="view.diagnostics()" [names]="view.names()"
              [reveal]="reveal()" [readOnly]="true" label="Shared netlist, read only" />
            <nw-problems-list problems [diagnostics]="view.diagnostics()" (selected)="goTo($event.line, $event.col)" />
            <nw-results-panels class="results" [result]="view.shown()" [whole]="view.shownWhole()" [lines]="view.shownLines()" [stale]="view.stale()" [pending]="view.pending()" [errorCount]="view.errorCount()"
              [status]="client.status()" [slow]="client.slow()" [solveMs]="view.solveMs()" [failure]="client.failure()"
              (cancel)="client.cancel()" (lineSelected)="goTo($event)" />
          </nw-bench-columns>
        }
      }
    }
  `,
  styles: `
    :host { display: grid; grid-template-rows: auto minmax(0, 1fr); grid-template-columns: minmax(0, 1fr); height: calc(100vh - 65px); min-height: 480px; }
    .pad { padding: 24px; }
    .quiet { color: var(--mat-sys-on-surface-variant); }
    .problem .sentence { font-size: 1.125rem; margin: 0 0 12px; }
    .next { display: flex; gap: 8px; align-items: center; }
    .head { display: flex; align-items: center; gap: 16px; padding: 6px 12px; border-bottom: 1px solid var(--mat-sys-outline-variant);
      background: var(--mat-sys-surface-container-low); }
    .what { flex: 1; min-width: 0; }
    .name { font: var(--mat-sys-title-medium); font-weight: 700; margin: 0; overflow-wrap: anywhere; }
    .meta { margin: 2px 0 0; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .editor { min-height: 0; min-width: 0; height: 100%; }
    .results { flex: 1; }
  `,
})
export class SharedPage {
  private readonly api = inject(TeamApi);
  private readonly drafts = inject(Drafts);
  private readonly router = inject(Router);
  private readonly title = inject(Title);
  protected readonly client = inject(SolverClient);
  protected readonly view = new SolveView(this.client);

  /** The link's token (route parameter). */
  readonly token = input.required<string>();

  protected readonly load = signal<Load>({ kind: 'loading' });
  protected readonly shared = computed(() => {
    const l = this.load();
    return l.kind === 'shown' ? l.shared : undefined;
  });
  protected readonly problem = computed(() => {
    const l = this.load();
    return l.kind === 'problem' ? l : undefined;
  });
  protected readonly meta = computed(() => {
    const s = this.shared();
    return s ? sharedMeta(s) : '';
  });
  protected readonly document = signal<EditorDocument>({ key: 0, text: '' });
  protected readonly reveal = signal<RevealRequest | undefined>(undefined);
  protected readonly copying = signal(false);
  private revealSeq = 0;

  constructor() {
    this.client.warmUp();
    effect(() => {
      const token = this.token();
      untracked(() => void this.fetch(token));
    });
  }

  protected reload(): void {
    void this.fetch(this.token());
  }

  protected goTo(line: number, col?: number): void {
    this.reveal.set({ line, col, seq: ++this.revealSeq });
  }

  /** A draft of the reader's own with this text (the same one again if it was made before). */
  protected async openCopy(): Promise<void> {
    const s = this.shared();
    if (!s) return;
    this.copying.set(true);
    try {
      const existing = await this.drafts.findCopy(s.source, SHARED_COPY);
      if (existing) await this.drafts.open(existing.id);
      else await this.drafts.create(s.source, undefined, { label: SHARED_COPY });
      await this.router.navigateByUrl('/bench');
    } finally {
      this.copying.set(false);
    }
  }

  private async fetch(token: string): Promise<void> {
    this.load.set({ kind: 'loading' });
    try {
      const shared = await this.api.shared(token);
      this.document.update((d) => ({ key: d.key + 1, text: shared.source }));
      this.load.set({ kind: 'shown', shared });
      this.title.setTitle(`${shared.name} · Shared netlist · Nodewright`);
      this.client.forgetLastSolved();
      // The blocks the sharer's figures came from, whoever reads (signed in or not).
      this.client.useLibrary({ pinned: shared.library });
      this.client.solveNow(shared.source);
    } catch (err) {
      const e = apiErrorOf(err);
      this.load.set({ kind: 'problem', sentence: shareProblem(e.code, e.status), offline: e.status === 0 });
    }
  }
}
