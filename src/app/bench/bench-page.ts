/**
 * The bench: the netlist editor on the left with its problems below, the results on the right —
 * a summary line, the panels (Bias, Response, Modes, Checks & measures) and the standing caution.
 * Sized for a 1280×800 laptop without scrolling the page: the editor and each panel scroll inside.
 */
import { afterNextRender, ChangeDetectionStrategy, Component, computed, effect, inject, Injector, input, untracked, viewChild } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar, MatSnackBarModule } from '@angular/material/snack-bar';
import { MatTabsModule } from '@angular/material/tabs';
import type { Diagnostic } from '../../../solver';
import { Cautions } from '../core/cautions';
import { BenchStore } from './bench-store';
import { NetlistEditor, type EditorCommand } from './editor/netlist-editor';
import { ProblemsList } from './editor/problems-list';
import { ShortcutsHelp } from './editor/shortcuts-help';
import { EXAMPLES, exampleById, type Example } from './examples';
import { DraftsDialog, type DraftsDialogData, type DraftsDialogResult } from './files/drafts-dialog';
import { FileBar } from './files/file-bar';
import { BiasPanel } from './panels/bias-panel';
import { ChecksPanel } from './panels/checks-panel';
import { MeasuresPanel } from './panels/measures-panel';
import { ModesPanel } from './panels/modes-panel';
import { ResponsePanel } from './panels/response-panel';
import { ResultsSummary } from './results-summary';
import { SolverClient } from './solver-client';

/** Mark set once the results of an edit are on screen (after `nw-edit`), for latency measurement. */
export const PAINTED_MARK = 'nw-painted';

@Component({
  selector: 'nw-bench-page',
  imports: [NetlistEditor, ProblemsList, FileBar, ResultsSummary, Cautions, MatTabsModule, MatSnackBarModule, BiasPanel, ResponsePanel, ModesPanel, ChecksPanel, MeasuresPanel],
  providers: [SolverClient, BenchStore],
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(document:keydown)': 'onKey($event)' },
  template: `
    <nw-file-bar [title]="store.title()" [saveState]="store.saveState()" [hasDraft]="!!store.draftId()" [examples]="examples"
      (openExample)="openExample($event)" (drafts)="openDrafts()" (newNetlist)="store.newNetlist()" (openFile)="openFile($event)"
      (download)="download()" (save)="save()" (solve)="store.solveNow()" (help)="help()" />
    <div class="work">
      <section class="left" aria-label="Netlist">
        <nw-netlist-editor class="editor" [document]="store.document()" [diagnostics]="store.diagnostics()" [names]="store.names()"
          [reveal]="store.reveal()" label="Netlist editor" (textChange)="store.edit($event)" (command)="command($event)"
          (fileDropped)="openFile($event)" (cursorLine)="store.cursorLine.set($event)" />
        <nw-problems-list class="problems" [diagnostics]="store.diagnostics()" (selected)="goToProblem($event)" />
      </section>
      <section class="right" aria-label="Results">
        <nw-results-summary [result]="store.shown()" [stale]="store.stale()" [errorCount]="store.errorCount()"
          [status]="client.status()" [slow]="client.slow()" [solveMs]="store.solveMs()" [failure]="client.failure()"
          (cancel)="client.cancel()" />
        <mat-tab-group class="panels" [class.stale]="store.stale() || client.slow()" animationDuration="0ms" mat-stretch-tabs="false" mat-align-tabs="start">
          <mat-tab label="Bias">
            <ng-template matTabContent><div class="panel"><nw-bias-panel [result]="store.shown()" /></div></ng-template>
          </mat-tab>
          <mat-tab label="Response">
            <ng-template matTabContent><div class="panel"><nw-response-panel [result]="store.shown()" /></div></ng-template>
          </mat-tab>
          <mat-tab label="Modes">
            <ng-template matTabContent><div class="panel"><nw-modes-panel [result]="store.shown()" /></div></ng-template>
          </mat-tab>
          <mat-tab>
            <ng-template mat-tab-label>
              Checks &amp; measures
              @if (failedChecks() > 0) { <span class="badge fail" [attr.aria-label]="failedChecks() + ' failing'">{{ failedChecks() }} fail</span> }
            </ng-template>
            <ng-template matTabContent><div class="panel">
              <nw-checks-panel [result]="store.shown()" [netlist]="store.shownText()" (lineSelected)="store.selectLine($event)" />
              <h2 class="sub">Measures</h2>
              <nw-measures-panel [result]="store.shown()" [netlist]="store.shownText()" (lineSelected)="store.selectLine($event)" />
            </div></ng-template>
          </mat-tab>
        </mat-tab-group>
        <nw-cautions class="caution" />
      </section>
    </div>
  `,
  styles: `
    :host { display: grid; grid-template-rows: auto minmax(0, 1fr); height: calc(100vh - 65px); min-height: 480px; }
    .work { display: grid; grid-template-columns: minmax(0, 43fr) minmax(0, 57fr); gap: 12px; padding: 8px 12px 10px; min-height: 0; }
    .left { display: grid; grid-template-rows: minmax(0, 1fr) auto; grid-template-columns: minmax(0, 1fr); gap: 6px; min-height: 0; min-width: 0; }
    .editor { min-height: 0; min-width: 0; height: 100%; }
    .problems { max-height: 24vh; }
    .right { display: flex; flex-direction: column; min-height: 0; min-width: 0; }
    .panels { flex: 1; min-height: 0; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px;
      background: var(--mat-sys-surface-container-lowest); }
    .panels.stale .panel { opacity: 0.62; }
    .panel { padding: 10px 12px; }
    :host ::ng-deep .panels .mat-mdc-tab-body-wrapper { flex: 1 1 auto; min-height: 0; }
    :host ::ng-deep .panels .mat-mdc-tab-body-content { overflow: auto; }
    .badge { margin-left: 6px; padding: 0 6px; border-radius: 8px; font-size: 0.75rem; font-weight: 700; }
    .badge.fail { background: #f7d9d6; color: #7a1812; }
    .sub { font: var(--mat-sys-title-small); margin: 18px 0 6px; color: var(--mat-sys-on-surface-variant); }
    .caution { display: block; flex: none; }
    .caution ::ng-deep .caution { margin-top: 8px; padding: 6px 10px; font-size: 0.8125rem; }
  `,
})
export class BenchPage {
  protected readonly store = inject(BenchStore);
  protected readonly client = inject(SolverClient);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly injector = inject(Injector);
  private readonly fileBar = viewChild.required(FileBar);
  protected readonly examples = EXAMPLES;

  /** `/bench?example=mirror-loaded` opens that demo. */
  readonly example = input<string | undefined>();

  protected readonly failedChecks = computed(() => this.store.shown()?.checks.filter((c) => !c.pass).length ?? 0);

  constructor() {
    this.client.warmUp();
    afterNextRender(() => {
      const asked = exampleById(untracked(this.example));
      if (asked) void this.store.openExample(asked);
      else void this.store.restore(EXAMPLES[0]);
    });
    // Each reply, once rendered and painted, is marked for the latency measurement.
    effect(() => {
      if (!this.client.reply()) return;
      afterNextRender({ read: () => requestAnimationFrame(() => performance.mark(PAINTED_MARK)) }, { injector: this.injector });
    });
  }

  protected command(cmd: EditorCommand): void {
    switch (cmd) {
      case 'solve': return this.store.solveNow();
      case 'save': return void this.save();
      case 'open': return this.fileBar().pickFile();
      case 'help': return this.help();
    }
  }

  /** Shortcuts outside the editor (the editor handles its own and marks them handled). */
  protected onKey(event: KeyboardEvent): void {
    if (event.defaultPrevented) return;
    const mod = event.ctrlKey || event.metaKey;
    const target = event.target as HTMLElement | null;
    const typing = !!target && (target.isContentEditable || /^(INPUT|TEXTAREA|SELECT)$/.test(target.tagName));
    if (mod && event.key.toLowerCase() === 's') {
      event.preventDefault();
      void this.save();
    } else if (mod && event.key.toLowerCase() === 'o') {
      event.preventDefault();
      this.fileBar().pickFile();
    } else if (mod && event.key === 'Enter') {
      event.preventDefault();
      this.store.solveNow();
    } else if (event.key === 'F1' || (event.key === '?' && !typing && !mod)) {
      event.preventDefault();
      this.help();
    }
  }

  protected goToProblem(d: Diagnostic): void {
    this.store.selectLine(d.line, d.col);
  }

  protected openExample(example: Example): void {
    void this.store.openExample(example);
  }

  protected async openFile(file: File): Promise<void> {
    const refused = await this.store.openFile(file);
    this.snack.open(refused ?? `Opened ${file.name} as a new draft.`, 'OK', { duration: refused ? 8000 : 3000 });
  }

  protected async save(): Promise<void> {
    await this.store.saveNow();
    this.snack.open('Draft saved in this browser.', undefined, { duration: 2000 });
  }

  protected download(): void {
    const { name, blob } = this.store.download();
    const url = URL.createObjectURL(blob);
    const a = document.createElement('a');
    a.href = url;
    a.download = name;
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  }

  protected help(): void {
    if (this.dialog.openDialogs.some((d) => d.componentInstance instanceof ShortcutsHelp)) return;
    this.dialog.open(ShortcutsHelp, { width: '560px', autoFocus: 'dialog', ariaLabel: 'Keyboard shortcuts' });
  }

  protected openDrafts(): void {
    const ref = this.dialog.open<DraftsDialog, DraftsDialogData, DraftsDialogResult>(DraftsDialog, { data: { currentId: this.store.draftId() }, width: '600px' });
    ref.afterClosed().subscribe((res) => {
      if (!res) return;
      for (const id of res.deleted) if (id === this.store.draftId()) void this.store.deleteDraft(id);
      if (res.open) void this.store.openDraft(res.open);
    });
  }
}
