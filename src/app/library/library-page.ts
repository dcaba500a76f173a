/**
 * The block library's catalogue: find blocks by text (searched on the server after a pause in
 * typing), narrow them by category, state and tag, and see at a glance which version is vetted
 * and whether a newer one is on its way. Designers propose blocks here; reviewers find their
 * queue. Signed out or offline it says so, and that the seed library keeps working in the bench.
 */
import { ChangeDetectionStrategy, Component, computed, DestroyRef, effect, inject, input, linkedSignal, signal, untracked } from '@angular/core';
import { Router, RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatChipsModule } from '@angular/material/chips';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { roleAtLeast, Session } from '../core/session';
import { apiErrorOf, type ApiError } from '../core/team-api';
import { AccessNotice } from '../netlists/access-notice';
import { pageWorkspace } from '../netlists/workspace-access';
import { STATE_FILTERS } from './block-words';
import { CatalogueTable } from './catalogue-table';
import { LibraryApi, type BlockState, type BlockSummary, type CatalogueQuery } from './library-api';
import { libraryBase, routeParam } from './library-links';

/** How long typing pauses before the search is sent. */
export const SEARCH_PAUSE_MS = 250;

@Component({
  selector: 'nw-library-page',
  imports: [RouterLink, AccessNotice, CatalogueTable, MatButtonModule, MatButtonToggleModule, MatChipsModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <header class="head">
        <div>
          <h1>Block library</h1>
          <p class="sub">@if (workspace(); as ws) {{{ ws.name }} · }Reviewed blocks your team reuses, each pinned by version with <code>use category/name&#64;version</code>.</p>
        </div>
        @if (workspace()) {
          <div class="make">
            @if (isReviewer()) {
              <a mat-stroked-button class="queue" [routerLink]="base() + '/queue'">Review queue@if (queueCount() !== undefined) { ({{ queueCount() }})}</a>
            }
            @if (canPropose()) { <button mat-flat-button type="button" (click)="propose()">Propose a block</button> }
          </div>
        }
      </header>

      @if (access().kind === 'member') {
        <div class="filters">
          <mat-form-field appearance="outline" subscriptSizing="dynamic" class="find">
            <mat-label>Search path, title, summary</mat-label>
            <input matInput type="search" [value]="search()" (input)="typed($any($event.target).value)" autocomplete="off" />
          </mat-form-field>
          <mat-button-toggle-group class="states" [value]="state() ?? ''" (change)="state.set($event.value || undefined)" aria-label="State" hideSingleSelectionIndicator>
            <mat-button-toggle value="">Any state</mat-button-toggle>
            @for (s of stateFilters; track s.state) { <mat-button-toggle [value]="s.state">{{ s.label }}</mat-button-toggle> }
          </mat-button-toggle-group>
          <mat-form-field appearance="outline" subscriptSizing="dynamic" class="tag">
            <mat-label>Tag</mat-label>
            <mat-select [value]="tag() ?? ''" (selectionChange)="tag.set($event.value || undefined)">
              <mat-option value="">Any tag</mat-option>
              @for (t of tags(); track t) { <mat-option [value]="t">{{ t }}</mat-option> }
            </mat-select>
          </mat-form-field>
          <span class="count" aria-live="polite">{{ countText() }}</span>
        </div>
        @if (categories().length) {
          <mat-chip-listbox class="cats" aria-label="Category" [value]="category() ?? ''" (change)="category.set($event.value || undefined)" hideSingleSelectionIndicator>
            <mat-chip-option value="">All categories</mat-chip-option>
            @for (c of categories(); track c) { <mat-chip-option [value]="c">{{ c }}</mat-chip-option> }
          </mat-chip-listbox>
        }
        <div class="bar-slot">@if (loading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }</div>
        @if (problem(); as p) {
          <div class="problem" role="alert">
            <span>{{ p.message }}</span>
            <button mat-button type="button" (click)="reload()">Try again</button>
          </div>
        }
        @if (rows().length > 0) {
          <nw-catalogue-table class="table" [class.dim]="loading()" [rows]="rows()" [base]="base()" [activeTag]="tag()" (tagChosen)="tag.set($event)" />
        } @else if (loaded() && !problem()) {
          <p class="empty">{{ emptyText() }}</p>
        }
      } @else if (access().kind !== 'loading') {
        <p class="seed" role="note">
          @if (access().kind === 'offline') { The team's library cannot be reached just now. }
          @else if (access().kind === 'signed-out') { The team's library needs you signed in. }
          The seed library that ships with Nodewright still works in the <a routerLink="/bench">bench</a>, offline too:
          <code>use mirrors/wilson_npn&#64;3</code> and the other seed blocks resolve there.
        </p>
        <nw-access-notice [access]="access()" />
      }
    </section>
  `,
  styles: `
    :host { display: block; }
    .page { box-sizing: border-box; width: 100%; max-width: 1360px; margin: 0 auto; padding: 24px 32px 48px; }
    .head { display: flex; align-items: flex-end; justify-content: space-between; gap: 16px; margin-bottom: 16px; }
    .head h1 { margin: 0; }
    .sub { margin: 4px 0 0; color: var(--mat-sys-on-surface-variant); }
    .make { display: flex; gap: 8px; flex: none; }
    .filters { display: flex; align-items: center; gap: 16px; flex-wrap: wrap; }
    .find { width: 300px; }
    .tag { width: 180px; }
    .states { --mat-standard-button-toggle-height: 40px; }
    .count { margin-left: auto; color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    .cats { display: block; margin-top: 10px; }
    .bar-slot { height: 4px; margin: 10px 0 4px; }
    .problem { display: flex; align-items: center; gap: 12px; margin: 8px 0; padding: 8px 12px; border-left: 3px solid #b3261e;
      background: #fbeae8; color: #5c1410; }
    .table { display: block; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; overflow: auto; max-height: calc(100vh - 300px);
      transition: opacity 120ms; }
    .table.dim { opacity: 0.7; }
    .empty { margin: 16px 0; padding: 24px; text-align: center; border: 1px dashed var(--mat-sys-outline-variant); border-radius: 8px;
      color: var(--mat-sys-on-surface-variant); background: var(--mat-sys-surface-container-lowest); }
    .seed { max-width: 75ch; margin: 0 0 12px; }
    code { font-size: 0.875em; }
  `,
})
export class LibraryPage {
  private readonly api = inject(LibraryApi);
  private readonly session = inject(Session);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);

  /** Bound from the route when its own parameters carry it; else read up the route tree. */
  readonly slug = input<string>();
  private readonly routeSlug = routeParam('slug');
  private readonly addressed = computed(() => this.slug() ?? this.routeSlug());
  private readonly place = pageWorkspace(() => this.addressed());
  protected readonly access = this.place.access;
  protected readonly workspace = this.place.workspace;
  protected readonly base = computed(() => libraryBase(this.addressed()));
  protected readonly canPropose = computed(() => roleAtLeast(this.workspace()?.role, 'designer'));
  protected readonly isReviewer = computed(() => roleAtLeast(this.workspace()?.role, 'reviewer'));
  protected readonly stateFilters = STATE_FILTERS;

  protected readonly search = signal('');
  private readonly q = signal('');
  protected readonly category = signal<string | undefined>(undefined);
  protected readonly state = signal<BlockState | undefined>(undefined);
  protected readonly tag = signal<string | undefined>(undefined);
  private readonly reloads = signal(0);

  protected readonly rows = signal<BlockSummary[]>([]);
  protected readonly loading = signal(false);
  protected readonly loaded = signal(false);
  protected readonly problem = signal<ApiError | undefined>(undefined);
  protected readonly queueCount = signal<number | undefined>(undefined);
  /** Categories and tags of every block seen in this workspace, so narrowing never hides a chip. */
  private readonly seen = linkedSignal<string | undefined, { categories: Set<string>; tags: Set<string> }>({
    source: () => this.workspace()?.slug,
    computation: () => ({ categories: new Set(), tags: new Set() }),
  });
  protected readonly categories = computed(() => [...this.seen().categories].sort());
  protected readonly tags = computed(() => [...this.seen().tags].sort((a, b) => a.localeCompare(b)));
  private searchTimer: ReturnType<typeof setTimeout> | undefined;
  private requestSeq = 0;

  constructor() {
    effect(() => {
      const ws = this.workspace();
      if (!ws) return;
      const query: CatalogueQuery = { q: this.q(), category: this.category(), state: this.state(), tag: this.tag() };
      this.reloads();
      untracked(() => void this.fetch(ws.slug, query));
    });
    effect(() => {
      const ws = this.workspace();
      if (ws && roleAtLeast(ws.role, 'reviewer')) untracked(() => void this.countQueue(ws.slug));
    });
    // A page addressed by workspace makes it the current one, so the shell's menus agree.
    effect(() => {
      const ws = this.workspace();
      if (ws && this.addressed() && untracked(this.session.workspace)?.slug !== ws.slug) this.session.chooseWorkspace(ws.slug);
    });
    inject(DestroyRef).onDestroy(() => clearTimeout(this.searchTimer));
  }

  protected typed(value: string): void {
    this.search.set(value);
    clearTimeout(this.searchTimer);
    this.searchTimer = setTimeout(() => this.q.set(value.trim()), SEARCH_PAUSE_MS);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected countText(): string {
    if (!this.loaded() || this.problem()) return '';
    const n = this.rows().length;
    return `${n} block${n === 1 ? '' : 's'}`;
  }

  protected emptyText(): string {
    const filtered = this.q() || this.category() || this.state() || this.tag();
    if (filtered) return 'No block matches these filters. Clear the search or choose “Any” to see more.';
    const ws = this.workspace()?.name ?? 'This workspace';
    return this.canPropose()
      ? `${ws} has no blocks yet. Propose one: a documented block with a small fixture and its checks.`
      : `${ws} has no blocks yet. They appear here once a designer proposes one.`;
  }

  protected async propose(): Promise<void> {
    const ws = this.workspace();
    if (!ws) return;
    // The dialog brings the editor and the solver worker: loaded when first asked for.
    const { openProposeBlockDialog } = await import('./propose-block-dialog');
    await openProposeBlockDialog(this.dialog, this.router, { slug: ws.slug }, this.base());
  }

  private async fetch(slug: string, query: CatalogueQuery): Promise<void> {
    const mine = ++this.requestSeq;
    this.loading.set(true);
    try {
      const res = await this.api.catalogue(slug, query);
      if (mine !== this.requestSeq) return;
      this.rows.set(res.items);
      this.seen.update(({ categories, tags }) => {
        for (const b of res.items) {
          categories.add(b.category);
          for (const t of b.tags) tags.add(t);
        }
        return { categories, tags };
      });
      this.problem.set(undefined);
    } catch (err) {
      if (mine !== this.requestSeq) return;
      this.problem.set(apiErrorOf(err));
      this.rows.set([]);
    } finally {
      if (mine === this.requestSeq) {
        this.loading.set(false);
        this.loaded.set(true);
      }
    }
  }

  private async countQueue(slug: string): Promise<void> {
    try {
      this.queueCount.set((await this.api.reviewQueue(slug)).items.length);
    } catch {
      this.queueCount.set(undefined);
    }
  }
}
