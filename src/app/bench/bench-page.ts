/**
 * The bench: the netlist editor on the left with its problems below, the results on the right —
 * a summary line, the panels (Bias, Response, Modes, Checks & measures) and the standing caution.
 * Sized for a 1280×800 laptop without scrolling the page: the editor and each panel scroll inside.
 *
 * `/bench?netlist=ID` opens a team netlist into its linked draft; `&version=N` opens revision N
 * as an unlinked copy. Saving a linked draft also saves it to the team, through the conflict
 * view when the team copy moved on (see TeamSync).
 */
import { afterNextRender, ChangeDetectionStrategy, Component, computed, effect, inject, Injector, input, untracked, viewChild } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar, MatSnackBarModule } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { Diagnostic } from '../../../solver';
import { Session } from '../core/session';
import type { Netlist, StaleCurrent } from '../core/team-api';
import { BenchColumns } from './bench-columns';
import { BenchStore } from './bench-store';
import { blockAtCursor, definedBlocks, drivenNodes, suggestedPath, wrapAsBlock } from './block-proposal';
import { BlockSources } from './block-sources';
import { LibraryIndex } from './library-index';
import { NetlistEditor, type EditorCommand } from './editor/netlist-editor';
import { ProblemsList } from './editor/problems-list';
import type { PinChange } from './library-notices';
import { ShortcutsHelp } from './editor/shortcuts-help';
import { EXAMPLES, exampleById, type Example } from './examples';
import { DraftsDialog, type DraftsDialogData, type DraftsDialogResult } from './files/drafts-dialog';
import { FileBar, type TeamBar } from './files/file-bar';
import { ResultsPanels } from './results-panels';
import { SolverClient } from './solver-client';
import { ConflictDialog, type ConflictData } from './team/conflict-dialog';
import { SaveToTeamDialog, type SaveToTeamData } from './team/save-to-team-dialog';
import { BlockPinsDialog, type BlockPinsData, type BlockPinsResult } from './team/block-pins-dialog';
import { ShareDialog, type ShareData, type ShareResult } from './team/share-dialog';
import { BEFORE_CONFLICT, TeamSync, type ConflictChoice, type PushOutcome } from './team/team-sync';

/** Mark set once the results of an edit are on screen (after `nw-edit`), for latency measurement. */
export const PAINTED_MARK = 'nw-painted';

@Component({
  selector: 'nw-bench-page',
  imports: [NetlistEditor, ProblemsList, FileBar, BenchColumns, ResultsPanels, MatSnackBarModule],
  providers: [SolverClient, BenchStore, TeamSync],
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(document:keydown)': 'onKey($event)' },
  template: `
    <nw-file-bar [title]="store.ownTitle()" [label]="store.label()" [status]="team.status()" [team]="teamBar()" [examples]="examples"
      (openExample)="openExample($event)" (drafts)="openDrafts()" (newNetlist)="store.newNetlist()" (openFile)="openFile($event)"
      (download)="download()" (save)="save()" (solve)="store.solveNow()" (help)="help()" (saveToTeam)="saveToTeam()" (share)="share()"
      (proposeBlock)="proposeBlock()" />
    <nw-bench-columns>
      <nw-netlist-editor netlist class="editor" [document]="store.document()" [diagnostics]="store.diagnostics()" [names]="store.names()"
        [reveal]="store.reveal()" label="Netlist editor" (textChange)="store.edit($event)" (command)="command($event)"
        (fileDropped)="openFile($event)" (cursorLine)="store.cursorLine.set($event)"
        [library]="libraryIndex.entries()" (libraryVersionsWanted)="libraryIndex.loadVersions($event)" />
      <nw-problems-list problems [diagnostics]="store.diagnostics()" [stale]="store.stale()" (selected)="goToProblem($event)" (pinChange)="movePin($event)" />
      <nw-results-panels class="results" [result]="store.shown()" [whole]="store.shownWhole()" [lines]="store.shownLines()" [stale]="store.stale()" [pending]="store.pending()" [errorCount]="store.errorCount()"
        [status]="client.status()" [slow]="client.slow()" [solveMs]="store.solveMs()" [failure]="client.failure()"
        [params]="store.names().params" (cancel)="client.cancel()" (lineSelected)="store.selectLine($event)" />
    </nw-bench-columns>
  `,
  styles: `
    :host { display: grid; grid-template-rows: auto minmax(0, 1fr); grid-template-columns: minmax(0, 1fr); height: calc(100vh - 65px); min-height: 480px; }
    .editor { min-height: 0; min-width: 0; height: 100%; }
    .results { flex: 1; }
  `,
})
export class BenchPage {
  protected readonly store = inject(BenchStore);
  protected readonly client = inject(SolverClient);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly injector = inject(Injector);
  protected readonly team = inject(TeamSync);
  private readonly session = inject(Session);
  private readonly blockSources = inject(BlockSources);
  private readonly router = inject(Router);
  /** The library's blocks and versions, for completing `use` lines. */
  protected readonly libraryIndex = inject(LibraryIndex);
  private readonly fileBar = viewChild.required(FileBar);
  private readonly editor = viewChild.required(NetlistEditor);
  protected readonly examples = EXAMPLES;

  /** `/bench?example=mirror-loaded` opens that demo. */
  readonly example = input<string | undefined>();
  /** `/bench?netlist=ID` opens that team netlist. */
  readonly netlist = input<string | undefined>();
  /** With `netlist`: `&version=N` opens revision N as a copy. */
  readonly version = input<string | undefined>();
  /** `/bench?block=category/name@N` opens that library version's source (block and fixture) as a new draft. */
  readonly block = input<string | undefined>();

  protected readonly teamBar = computed<TeamBar>(() => {
    const remote = this.store.remote();
    return {
      signedIn: !!this.session.me(),
      canCreate: this.team.canCreate(),
      linked: remote && { netlistId: remote.netlistId, canWrite: this.team.canWrite() },
    };
  });

  constructor() {
    this.client.warmUp();
    // `use` lines resolve from the workspace worked in; when it changes (sign-in, a switch), the
    // text is solved again against that workspace's library.
    let librarySlug: string | undefined | null = null;
    effect(() => {
      const slug = this.session.librarySlug();
      if (slug === librarySlug) return;
      const first = librarySlug === null;
      librarySlug = slug;
      untracked(() => {
        this.client.useLibrary({ workspace: slug });
        if (!first && this.store.source()) this.store.solveNow();
      });
    });
    afterNextRender(() => {
      const id = untracked(this.netlist);
      const asked = exampleById(untracked(this.example));
      const block = untracked(this.block);
      if (id) void this.openTeam(id, untracked(this.version));
      else if (block) void this.openBlock(block);
      else if (asked) void this.store.openExample(asked);
      else void this.store.restore(EXAMPLES[0]);
    });
    // The same page asked for another team netlist (only query parameters changed).
    let first = true;
    effect(() => {
      const id = this.netlist();
      const version = this.version();
      if (first) {
        first = false;
        return;
      }
      if (id) untracked(() => void this.openTeam(id, version));
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
    if (this.dialog.openDialogs.length > 0) {
      // A dialog has the keyboard (the conflict view's editor among them): the bench's shortcuts wait.
      if (mod && event.key.toLowerCase() === 's') event.preventDefault();
      return;
    }
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

  /** A library notice's "Use @N": the editor changes the line (one undoable edit) and the text is solved again. */
  protected movePin(change: PinChange): void {
    if (!this.editor().movePin(change)) this.tell(`Line ${change.line} no longer pins ${change.path}@${change.from}.`, 4000);
  }

  protected goToProblem(d: Diagnostic): void {
    this.store.selectLine(d.line, d.col);
  }

  protected openExample(example: Example): void {
    void this.store.openExample(example);
  }

  /**
   * "Propose block": the block at the cursor goes with its file (models and fixture); a netlist
   * without blocks is first wrapped as one, with the pins the designer ticks. The propose dialog
   * then takes over and, once sent, opens the new draft's block page.
   */
  protected async proposeBlock(): Promise<void> {
    const slug = this.session.workspace()?.slug;
    if (!slug) return;
    const text = this.store.source();
    const blocks = definedBlocks(text);
    let source = text;
    let path: string;
    const at = blockAtCursor(blocks, this.store.cursorLine());
    if (at) {
      path = suggestedPath(at.name);
    } else {
      const names = this.store.names();
      const nodes = names.nodes.filter((n) => n !== 'gnd' && n !== '0');
      const data: BlockPinsData = { nodes, pins: drivenNodes(names.parts, text, nodes), name: suggestedPath(this.store.ownTitle()).split('/')[1] };
      const chosen = await firstValueFrom(this.dialog.open<BlockPinsDialog, BlockPinsData, BlockPinsResult>(BlockPinsDialog, { data, maxWidth: '96vw' }).afterClosed());
      if (!chosen) return;
      source = wrapAsBlock(text, chosen.name, chosen.pins, new Map(names.parts.map((p) => [p.name, p.kind])));
      path = suggestedPath(chosen.name);
    }
    const { openProposeBlockDialog } = await import('../library/propose-block-dialog');
    await openProposeBlockDialog(this.dialog, this.router, { slug, source, path });
  }

  /** A library version's source as a new draft: the workspace's, else the seed library's. */
  private async openBlock(ref: string): Promise<void> {
    const source = await this.blockSources.read(ref);
    if (source.ok) return this.store.openText(source.text, { label: `from ${ref}` });
    this.tell(source.message, 8000);
    await this.store.restore(EXAMPLES[0]);
  }

  protected async openFile(file: File): Promise<void> {
    const refused = await this.store.openFile(file);
    this.tell(refused ?? `Opened ${file.name} as a new draft.`, refused ? 8000 : 3000);
  }

  /** Ctrl-S: the draft in this browser first, then — for a linked draft — the team copy. */
  protected async save(): Promise<void> {
    await this.store.saveNow();
    await this.after(await this.team.push());
  }

  /** "Save to team" for a draft not linked yet: the dialog creates the netlist; the draft links to it. */
  protected async saveToTeam(): Promise<void> {
    const workspace = this.session.workspace();
    if (!workspace) return;
    await this.store.saveNow(); // the text is safe here whatever the server says
    const source = this.store.source();
    const ref = this.dialog.open<SaveToTeamDialog, SaveToTeamData, Netlist>(SaveToTeamDialog, { data: { source, defaultName: this.store.title(), workspace }, width: '520px' });
    const netlist = await firstValueFrom(ref.afterClosed());
    if (!netlist) return;
    await this.team.linkCreated(netlist, source);
    this.tell(`Saved to team as “${netlist.name}”, v${netlist.version}.`);
  }

  protected async share(): Promise<void> {
    const remote = this.store.remote();
    if (!remote) return;
    const data: ShareData = {
      netlistId: remote.netlistId,
      name: remote.name,
      version: remote.baseVersion,
      savedText: remote.savedText,
      localDiffers: this.store.teamDirty(),
      canSave: this.team.canWrite(),
    };
    const ref = this.dialog.open<ShareDialog, ShareData, ShareResult>(ShareDialog, { data, width: '720px', maxWidth: '96vw', maxHeight: '92vh', autoFocus: 'dialog' });
    if ((await firstValueFrom(ref.afterClosed())) !== 'save-first') return;
    await this.save();
    if (this.store.remote()?.netlistId === remote.netlistId && !this.store.teamDirty()) await this.share();
  }

  private async openTeam(id: string, version: string | undefined): Promise<void> {
    const v = version !== undefined && /^\d+$/.test(version) ? Number(version) : undefined;
    const outcome = await this.team.open(id, v);
    if (!outcome.opened) await this.store.restore(EXAMPLES[0]);
    if (outcome.signIn && outcome.message) this.offerSignIn(outcome.message);
    else if (outcome.message) this.tell(outcome.message, 8000);
  }

  /** Tells the user what a save came to; a conflict opens the conflict view. */
  private async after(outcome: PushOutcome): Promise<void> {
    switch (outcome.kind) {
      case 'local': return this.tell('Draft saved in this browser.', 2000);
      case 'unchanged': return this.tell(`Saved in this browser; no changes against team v${outcome.version}.`, 2500);
      case 'saved': return this.tell(`Saved to team as v${outcome.version}.`, 2500);
      case 'read-only': return this.tell('Saved in this browser. Your role cannot save to this team netlist; edits stay in this browser.', 6000);
      case 'offline': return this.tell('Saved in this browser. The team server cannot be reached; the save will be sent when it is back.', 8000);
      case 'signed-out': return this.offerSignIn('Saved in this browser. You are signed out; sign in to save to the team.');
      case 'refused': return this.tell(`Saved in this browser. The team server refused the save: ${outcome.message}`, 10000);
      case 'conflict': return this.resolveConflict(outcome.current);
    }
  }

  /** The conflict view; a second conflict while resolving opens it again with the newer copy. */
  private async resolveConflict(current: StaleCurrent): Promise<void> {
    const remote = this.store.remote();
    if (!remote || this.dialog.openDialogs.some((d) => d.componentInstance instanceof ConflictDialog)) return;
    const ref = this.dialog.open<ConflictDialog, ConflictData, ConflictChoice>(ConflictDialog, {
      data: { current, mine: this.store.source(), baseVersion: remote.baseVersion },
      width: '96vw',
      maxWidth: '96vw',
      height: '92vh',
      ariaLabel: 'Save conflict',
      autoFocus: 'dialog',
    });
    const choice = await firstValueFrom(ref.afterClosed());
    if (!choice) return this.tell('Not saved to the team; your text is as it was. Save again to compare.', 6000);
    const outcome = await this.team.resolve(choice, current);
    if (choice.action === 'take-theirs') return this.tell(`Showing team v${current.version}. Your text is kept as a separate draft “… (${BEFORE_CONFLICT})”.`, 8000);
    return this.after(outcome);
  }

  /** A message with a Sign in action that comes back to this page. */
  private offerSignIn(message: string): void {
    this.snack.open(message, 'Sign in', { duration: 12000 }).onAction().subscribe(() => this.session.signIn());
  }

  private tell(message: string, duration = 3000): void {
    this.snack.open(message, 'OK', { duration });
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
