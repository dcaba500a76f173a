/**
 * One block at one version (the newest when the address names none): its source with the review
 * notes on their lines, its pins and params, its checks as the author solved them beside the same
 * checks solved again in this browser, the review thread, every version with a diff between any
 * two, and what the caller may do now (the version's `can`, decided by the server).
 */
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked, viewChild } from '@angular/core';
import { toObservable } from '@angular/core/rxjs-interop';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { filter, firstValueFrom, map } from 'rxjs';
import type { SolveResult } from '../../../solver';
import { SolverClient } from '../bench/solver-client';
import type { SolveReply } from '../bench/solver-protocol';
import { Cautions } from '../core/cautions';
import { roleAtLeast } from '../core/session';
import { apiErrorOf, type ApiError } from '../core/team-api';
import { AccessNotice } from '../netlists/access-notice';
import { confirmWith } from '../netlists/confirm-dialog';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { pageWorkspace } from '../netlists/workspace-access';
import { BlockActions, type BlockAction } from './block-actions';
import { BlockChecks } from './block-checks';
import { BlockEditor } from './block-editor';
import { BlockPins } from './block-pins';
import { BlockSource, type LineNote, type LineReveal } from './block-source';
import { BlockVersions } from './block-versions';
import { outcomesOf } from './check-compare';
import { LibraryApi, type BlockDetail, type BlockVersion, type ReviewBody } from './library-api';
import { blockLink, libraryBase, routeParam } from './library-links';
import { ReviewBox } from './review-box';
import { ReviewThread } from './review-thread';
import { StateChip } from './state-chip';
import { useSnippet } from './use-snippet';

type Mode = 'view' | 'edit' | 'propose';

/** The review notes of a thread, grouped by line. */
export function lineNotes(reviews: BlockVersion['reviews']): LineNote[] {
  const by = new Map<number, string[]>();
  for (const r of reviews) if (r.line) by.set(r.line, [...(by.get(r.line) ?? []), `${r.author.name}: ${r.comment || r.kind}`]);
  return [...by].map(([line, texts]) => ({ line, texts }));
}

@Component({
  selector: 'nw-block-page',
  imports: [RouterLink, MatButtonModule, MatFormFieldModule, MatInputModule, MatMenuModule, MatProgressBarModule, AccessNotice, Cautions, AgoPipe, ExactTimePipe,
    BlockActions, BlockChecks, BlockEditor, BlockPins, BlockSource, BlockVersions, ReviewBox, ReviewThread, StateChip],
  providers: [SolverClient],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <a class="back" [routerLink]="base()">← Block library</a>
      @if (access().kind !== 'member') {
        @if (access().kind !== 'loading') {
          <h1 class="path">{{ path() }}</h1>
          <p class="seed" role="note">The team's library is out of reach here. The seed library that ships with Nodewright still works in the
            <a routerLink="/bench">bench</a>, offline too: its blocks resolve from <code>use</code> lines there.</p>
          <nw-access-notice [access]="access()" />
        }
      } @else {
        <div class="bar-slot">@if (loading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }</div>
        @if (problem(); as p) {
          <h1 class="path">{{ path() }}</h1>
          <div class="problem" role="alert">
            <span>{{ p.message }}</span>
            @if (p.status !== 404) { <button mat-button type="button" (click)="reload()">Try again</button> }
          </div>
        } @else if (shown(); as v) {
          <header class="head">
            <div class="what">
              <h1><span class="path">{{ v.path }}</span> <nw-state-chip [state]="v.state" [version]="v.version" /></h1>
              <p class="title">{{ v.title }}</p>
              <p class="meta">
                v{{ v.version }} by {{ v.author.name }}, written <span [title]="v.createdAt | exactTime">{{ v.createdAt | ago }}</span>
                @if (v.submittedAt) { · submitted <span [title]="v.submittedAt | exactTime">{{ v.submittedAt | ago }}</span> }
                @if (v.decidedAt && v.decidedBy) { · decided by {{ v.decidedBy.name }} <span [title]="v.decidedAt | exactTime">{{ v.decidedAt | ago }}</span> }
              </p>
            </div>
            @if (block(); as b) {
              <button mat-stroked-button type="button" [matMenuTriggerFor]="versionsMenu">Versions ({{ b.versions }}) ▾</button>
              <mat-menu #versionsMenu="matMenu" xPosition="before">
                @for (x of b.versionsList; track x.version) {
                  <a mat-menu-item [routerLink]="link(x.version)" [attr.aria-current]="x.version === v.version ? 'page' : null">
                    <nw-state-chip [state]="x.state" [version]="x.version" /> <span class="by">{{ x.author.name }}</span>
                  </a>
                }
              </mat-menu>
            }
          </header>
          @if (vettedElsewhere(); as vv) {
            <p class="note">This is not the vetted version: netlists should pin <a [routerLink]="link(vv)">v{{ vv }}</a>, the newest vetted one.</p>
          } @else if (v.state !== 'vetted' && !block()?.vetted) {
            <p class="note">No version of this block is vetted yet: it is not ready for others' designs.</p>
          }
          <nw-block-actions class="actions" [version]="v" [canWrite]="canWrite()" [busy]="busy()" (act)="act($event)" />

          <div class="columns">
            <section class="left" aria-labelledby="nw-block-source-head">
              @switch (mode()) {
                @case ('view') {
                  <h2 id="nw-block-source-head">Source</h2>
                  <nw-block-source [text]="v.source" [label]="v.path + ' version ' + v.version + ', read-only'" [notes]="notes()"
                    [commentable]="canWrite()" [reveal]="reveal()" (lineChosen)="lineChosen($event)" />
                  @if (canWrite()) { <p class="tip">Click a line number to comment on that line.</p> }
                }
                @case ('edit') {
                  <h2 id="nw-block-source-head">Editing draft v{{ v.version }}</h2>
                  <nw-block-editor [initial]="v.source" [blockName]="name()" [label]="'Draft ' + v.path + ' version ' + v.version" (textChange)="draftText.set($event)" />
                  <div class="edit-actions">
                    <button mat-flat-button type="button" [disabled]="busy()" (click)="saveDraft()">Save draft</button>
                    <button mat-button type="button" (click)="cancelEditing()">Cancel</button>
                  </div>
                }
                @case ('propose') {
                  <h2 id="nw-block-source-head">New version of {{ v.path }}, starting from v{{ v.version }}</h2>
                  <nw-block-editor [initial]="v.source" [blockName]="name()" [label]="'New version of ' + v.path" (textChange)="draftText.set($event)" />
                  <div class="edit-actions">
                    <button mat-flat-button type="button" [disabled]="busy()" (click)="proposeVersion()">Propose as v{{ (block()?.latest?.version ?? v.version) + 1 }}</button>
                    <button mat-button type="button" (click)="cancelEditing()">Cancel</button>
                  </div>
                }
              }
              <nw-block-pins class="pins" [pins]="v.pins" [params]="v.params" />
            </section>
            <section class="right" aria-labelledby="nw-block-checks-head">
              <h2 id="nw-block-checks-head">Checks: the author's and this browser's</h2>
              <nw-block-checks [author]="v.checks" [result]="here()?.result" [measureLines]="here()?.lines?.measures ?? []" [status]="client.status()" [failure]="client.failure()" (lineSelected)="goToLine($event)" />
              <nw-cautions />
              @if (v.can.submit) {
                <div class="submit">
                  <h3>Submit for review</h3>
                  <p class="hint">Its checks are solved in this browser and sent with it; the reviewers are mailed a link.
                    @if (v.submittedAt) { It was sent back, so it goes in again unchanged, with the checks of its first submission. }</p>
                  <mat-form-field appearance="outline" subscriptSizing="dynamic" class="wide">
                    <mat-label>Note to the reviewers (optional)</mat-label>
                    <textarea matInput rows="2" [value]="submitNote()" (input)="submitNote.set($any($event.target).value)"></textarea>
                  </mat-form-field>
                  @if (submitProblem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
                  <button mat-flat-button type="button" [disabled]="busy()" (click)="submit()">Submit v{{ v.version }} for review</button>
                </div>
              }
              <h2>Review</h2>
              <nw-review-thread [entries]="v.reviews" (lineSelected)="goToLine($event)" />
              @if (canWrite()) {
                <nw-review-box class="box" [canDecide]="v.can.review" [lineCount]="lineCount()" [chosenLine]="chosenLine()" [busy]="busy()" (review)="sendReview($event)" />
              }
            </section>
          </div>

          @if (block(); as b) {
            <section class="versions" aria-labelledby="nw-block-versions-head">
              <h2 id="nw-block-versions-head">Versions</h2>
              <nw-block-versions [slug]="workspace()!.slug" [path]="v.path" [base]="base()" [versions]="b.versionsList" [shown]="v.version" [shownSource]="v.source" />
            </section>
          }
        }
      }
    </section>
  `,
  styles: `
    :host { display: block; }
    .page { box-sizing: border-box; width: 100%; max-width: 1560px; margin: 0 auto; padding: 12px 24px 48px; }
    .back { display: inline-block; margin-bottom: 4px; }
    .bar-slot { height: 4px; margin-bottom: 4px; }
    .head { display: flex; align-items: flex-start; justify-content: space-between; gap: 16px; }
    .what { min-width: 0; }
    h1 { margin: 0; display: flex; flex-wrap: wrap; align-items: center; gap: 10px; font-size: 1.5rem; }
    .path { font-family: ui-monospace, "DejaVu Sans Mono", Menlo, monospace; overflow-wrap: anywhere; }
    .title { margin: 2px 0 0; font-size: 1.0625rem; }
    .meta { margin: 2px 0 0; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .by { margin-left: 6px; color: var(--mat-sys-on-surface-variant); }
    .note { margin: 8px 0 0; padding: 6px 10px; border-left: 3px solid var(--mat-sys-primary); background: var(--mat-sys-surface-container); max-width: 90ch; }
    .seed { max-width: 75ch; }
    .actions { margin: 10px 0 4px; }
    .problem { display: flex; align-items: center; gap: 12px; padding: 8px 12px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    .columns { display: grid; grid-template-columns: minmax(0, 1fr) minmax(0, 1fr); gap: 24px; margin-top: 8px; }
    h2 { font: var(--mat-sys-title-medium); margin: 12px 0 6px; }
    h3 { font: var(--mat-sys-title-small); margin: 0 0 4px; }
    .left { --nw-source-height: 58vh; --nw-block-editor-height: 50vh; min-width: 0; }
    .right { min-width: 0; }
    .tip, .hint { margin: 4px 0 0; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .pins { margin-top: 16px; }
    .edit-actions { display: flex; gap: 8px; margin-top: 8px; }
    .submit { margin-top: 16px; padding: 10px 12px; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; display: flex; flex-direction: column; gap: 8px; align-items: flex-start; }
    .submit .problem { display: block; }
    .wide { width: 100%; }
    .box { margin-top: 12px; }
    .versions { margin-top: 16px; }
    @media (max-width: 1100px) { .columns { grid-template-columns: minmax(0, 1fr); } }
  `,
})
export class BlockPage {
  private readonly api = inject(LibraryApi);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly title = inject(Title);
  protected readonly client = inject(SolverClient);

  /** From the route: `:category/:name[/:version]`, and `:slug` when the route passes it down. */
  readonly category = input.required<string>();
  readonly name = input.required<string>();
  readonly version = input<string>();
  readonly slug = input<string>();

  private readonly routeSlug = routeParam('slug');
  private readonly addressed = computed(() => this.slug() ?? this.routeSlug());
  private readonly place = pageWorkspace(() => this.addressed());
  protected readonly access = this.place.access;
  protected readonly workspace = this.place.workspace;
  protected readonly base = computed(() => libraryBase(this.addressed()));
  protected readonly path = computed(() => `${this.category()}/${this.name()}`);
  protected readonly canWrite = computed(() => roleAtLeast(this.workspace()?.role, 'designer'));

  protected readonly block = signal<BlockDetail | undefined>(undefined);
  protected readonly shown = signal<BlockVersion | undefined>(undefined);
  protected readonly loading = signal(false);
  protected readonly problem = signal<(ApiError & { status: number }) | undefined>(undefined);
  protected readonly busy = signal(false);
  protected readonly mode = signal<Mode>('view');
  /** The editor's text while editing or proposing. */
  protected readonly draftText = signal('');
  protected readonly submitNote = signal('');
  protected readonly submitProblem = signal<string | undefined>(undefined);
  protected readonly reveal = signal<LineReveal | undefined>(undefined);
  protected readonly chosenLine = signal<{ line: number; seq: number } | undefined>(undefined);
  private readonly reloads = signal(0);
  private seq = 0;
  private readonly reviewBox = viewChild(ReviewBox);
  private readonly editor = viewChild(BlockEditor);

  /** This browser's solve of the shown source (not of an older one still arriving). */
  protected readonly here = computed<SolveReply | undefined>(() => {
    const reply = this.client.reply();
    return reply && reply.text === this.shown()?.source ? reply : undefined;
  });
  private readonly replies = toObservable(computed(() => ({ reply: this.client.reply(), failed: this.client.status() === 'failed' })));
  protected readonly notes = computed(() => lineNotes(this.shown()?.reviews ?? []));
  protected readonly lineCount = computed(() => (this.shown()?.source ?? '').split('\n').length);
  protected readonly vettedElsewhere = computed(() => {
    const b = this.block();
    const v = this.shown();
    return b?.vetted && v && b.vetted !== v.version ? b.vetted : undefined;
  });

  constructor() {
    this.client.warmUp();
    effect(() => {
      const ws = this.workspace();
      const path = this.path();
      const raw = this.version();
      this.reloads();
      if (ws) untracked(() => void this.load(ws.slug, path, raw));
    });
    effect(() => {
      const v = this.shown();
      if (!v) return;
      untracked(() => {
        this.title.setTitle(`${v.path} v${v.version} · Block library · Nodewright`);
        this.client.forgetLastSolved();
        this.client.solveNow(v.source);
      });
    });
  }

  protected link(version?: number): string {
    return blockLink(this.base(), this.path(), version);
  }

  protected goToLine(line: number): void {
    this.reveal.set({ line, seq: ++this.seq });
  }
  protected lineChosen(line: number): void {
    this.chosenLine.set({ line, seq: ++this.seq });
  }

  protected act(action: BlockAction): void {
    switch (action) {
      case 'use': return void this.copyUse();
      case 'edit':
      case 'propose':
        this.draftText.set(this.shown()?.source ?? '');
        this.mode.set(action);
        return;
      case 'retire': return void this.retire();
    }
  }

  /** Copies `use path@version` and an instance line with every pin, for pasting into a netlist. */
  protected async copyUse(): Promise<void> {
    const v = this.shown();
    if (!v) return;
    const text = useSnippet(v.path, v.version, v.pins, v.params);
    try {
      await navigator.clipboard.writeText(text);
      this.snack.open(`Copied “use ${v.path}@${v.version}” and an instance line: paste them into your netlist and name the nodes.`, undefined, { duration: 5000 });
    } catch {
      this.snack.open(`The clipboard is not available here. Type these two lines into your netlist: ${text.trim().replace('\n', '  ·  ')}`, 'OK', { duration: 20000 });
    }
  }

  /** Solves the source here, refuses while it has errors, then submits it with those checks. */
  protected async submit(): Promise<void> {
    const v = this.shown();
    const ws = this.workspace();
    if (!v || !ws) return;
    this.busy.set(true);
    this.submitProblem.set(undefined);
    try {
      const result = await this.solved(v.source);
      if (!result) return this.submitProblem.set(`The solver did not run in this browser (${this.client.failure()}); nothing was submitted. Reload the page and try again.`);
      if (result.errors.length) {
        const e = result.errors[0];
        return this.submitProblem.set(`The source has ${result.errors.length} error${result.errors.length === 1 ? '' : 's'} (line ${e.line}: ${e.message}); a version is submitted only when it solves. ${v.can.edit ? 'Edit the draft' : 'Propose a new version'} to fix ${result.errors.length === 1 ? 'it' : 'them'}.`);
      }
      const note = this.submitNote().trim();
      const answer = await this.api.submit(ws.slug, v.path, v.version, { checks: outcomesOf(result.checks), ...(note ? { note } : {}) });
      this.submitNote.set('');
      const mailed = answer.mailed?.length ?? 0;
      this.snack.open(`Submitted v${v.version} for review${mailed ? `; ${mailed} reviewer${mailed === 1 ? ' was' : 's were'} mailed` : ''}.`, undefined, { duration: 5000 });
      this.afterChange(answer);
    } catch (err) {
      this.submitProblem.set(apiErrorOf(err).message);
    } finally {
      this.busy.set(false);
    }
  }

  protected async sendReview(body: ReviewBody): Promise<void> {
    const v = this.shown();
    const ws = this.workspace();
    if (!v || !ws) return;
    this.busy.set(true);
    try {
      const answer = await this.api.review(ws.slug, v.path, v.version, body);
      this.reviewBox()?.clear();
      const said = { approve: `Approved: v${v.version} is vetted.`, send_back: `Sent v${v.version} back to its author as a draft.`, comment: 'Comment added.' }[body.decision];
      this.snack.open(said, undefined, { duration: 4000 });
      this.afterChange(answer);
    } catch (err) {
      // The box keeps what was typed; the reason is shown, nothing is lost.
      this.snack.open(apiErrorOf(err).message, 'OK', { duration: 10000 });
    } finally {
      this.busy.set(false);
    }
  }

  protected async saveDraft(): Promise<void> {
    const v = this.shown();
    const ws = this.workspace();
    if (!v || !ws) return;
    await this.write(async () => {
      const answer = await this.api.editDraft(ws.slug, v.path, v.version, this.draftText());
      this.snack.open(`Saved the draft v${v.version}.`, undefined, { duration: 3000 });
      this.mode.set('view');
      this.afterChange(answer);
    });
  }

  protected async proposeVersion(): Promise<void> {
    const v = this.shown();
    const ws = this.workspace();
    if (!v || !ws) return;
    await this.write(async () => {
      const answer = await this.api.proposeVersion(ws.slug, v.path, this.draftText());
      this.snack.open(`Proposed v${answer.version}, a draft of yours. Submit it for review once its checks pass.`, undefined, { duration: 5000 });
      this.mode.set('view');
      await this.router.navigateByUrl(this.link(answer.version));
    });
  }

  protected async cancelEditing(): Promise<void> {
    const changed = this.draftText() !== (this.shown()?.source ?? '');
    if (changed && !(await confirmWith(this.dialog, { title: 'Discard your changes?', message: 'The text you changed here is not saved anywhere else.', action: 'Discard' }))) return;
    this.mode.set('view');
  }

  protected editorErrors(): number {
    return this.editor()?.errorCount() ?? 0;
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

  private async retire(): Promise<void> {
    const v = this.shown();
    const ws = this.workspace();
    if (!v || !ws) return;
    const yes = await confirmWith(this.dialog, {
      title: `Retire ${v.path}@${v.version}?`,
      message: 'It stays readable, and netlists that pin it still solve (with a warning), but it is no longer offered for new designs. Retiring cannot be undone.',
      action: 'Retire',
    });
    if (!yes) return;
    await this.write(async () => {
      const answer = await this.api.retire(ws.slug, v.path, v.version);
      this.snack.open(`Retired v${v.version}.`, undefined, { duration: 3000 });
      this.afterChange(answer);
    });
  }

  /** Runs a write; a refusal is said in a snackbar and whatever was typed stays. */
  private async write(run: () => Promise<void>): Promise<void> {
    this.busy.set(true);
    try {
      await run();
    } catch (err) {
      this.snack.open(apiErrorOf(err).message, 'OK', { duration: 10000 });
    } finally {
      this.busy.set(false);
    }
  }

  /** The version as the server now has it, and the block's list (its states changed). */
  private afterChange(answer: BlockVersion): void {
    this.shown.set(answer);
    const ws = this.workspace();
    if (ws) void this.api.block(ws.slug, answer.path).then((b) => this.block.set(b), () => undefined);
  }

  /** This browser's solve of `text`: waits for it, or undefined when the worker failed. */
  private solved(text: string): Promise<SolveResult | undefined> {
    const reply = this.client.reply();
    if (reply?.text === text) return Promise.resolve(reply.result);
    if (this.client.status() !== 'solving' && this.client.status() !== 'waiting') this.client.solveNow(text);
    return firstValueFrom(this.replies.pipe(
      filter(({ reply: r, failed }) => r?.text === text || failed),
      map(({ reply: r }) => (r?.text === text ? r.result : undefined)),
    ));
  }

  private async load(slug: string, path: string, raw: string | undefined): Promise<void> {
    const wanted = raw === undefined ? undefined : Number(raw);
    if (wanted !== undefined && !(Number.isInteger(wanted) && wanted >= 1)) {
      this.problem.set({ code: 'bad_version', message: `“${raw}” is not a version number: versions are 1, 2, 3…`, status: 404 });
      return;
    }
    this.loading.set(true);
    this.mode.set('view');
    try {
      const [block, direct] = await Promise.all([this.api.block(slug, path), wanted ? this.api.version(slug, path, wanted) : Promise.resolve(undefined)]);
      const version = direct ?? (await this.api.version(slug, path, block.latest.version));
      if (path !== this.path()) return;
      this.block.set(block);
      this.shown.set(version);
      this.problem.set(undefined);
    } catch (err) {
      this.problem.set(apiErrorOf(err));
    } finally {
      this.loading.set(false);
    }
  }
}
