/**
 * The team's netlists in one workspace: find, sort and page them (all on the server), open one in
 * the bench, see its revisions, rename, share with the workspace or keep private, download,
 * delete and restore; create a new one or upload .nwl files. What is offered follows the role;
 * the server checks every call anyway.
 */
import { ChangeDetectionStrategy, Component, computed, DestroyRef, effect, ElementRef, inject, input, linkedSignal, signal, untracked, viewChild } from '@angular/core';
import { Router } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { Sort } from '@angular/material/sort';
import { firstValueFrom } from 'rxjs';
import { roleAtLeast, Session } from '../core/session';
import { apiErrorOf, TeamApi, type ApiError, type NetlistQuery, type NetlistSummary } from '../core/team-api';
import { AccessNotice } from './access-notice';
import { confirmWith } from './confirm-dialog';
import { NameDialog, type NameDialogData, type NameDialogResult } from './name-dialog';
import { NetlistsTable, type NetlistAction } from './netlists-table';
import { fileProblemsOf, UploadProblemsDialog, type UploadProblemsData } from './upload-problems-dialog';
import { RESTORABLE_DAYS } from './format';
import { pageWorkspace } from './workspace-access';

type SortKey = NonNullable<NetlistQuery['sort']>;
const SORT_KEYS: readonly SortKey[] = ['name', 'owner', 'updatedAt', 'size'];

/** The text a new team netlist starts with: its title line, ready for the first part. */
export function starterSource(name: string): string {
  return `title  ${name}\n\n`;
}

@Component({
  selector: 'nw-netlists-page',
  imports: [AccessNotice, NetlistsTable, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, MatSlideToggleModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <header class="head">
        <div>
          <h1>Netlists</h1>
          @if (workspace(); as ws) {
            <p class="sub">{{ ws.name }} · you are {{ ws.role }}</p>
          }
        </div>
        @if (workspace() && canWrite()) {
          <div class="make">
            <button mat-stroked-button type="button" (click)="pickFiles()" [disabled]="uploading()">Upload .nwl…</button>
            <input #files type="file" accept=".nwl" multiple hidden (change)="upload($event)" aria-hidden="true" tabindex="-1" />
            <button mat-flat-button type="button" (click)="create()">New netlist</button>
          </div>
        }
      </header>

      @if (access().kind === 'member') {
        <div class="filters">
          <mat-form-field appearance="outline" subscriptSizing="dynamic" class="find">
            <mat-label>Find by name</mat-label>
            <input matInput type="search" [value]="search()" (input)="typed($any($event.target).value)" autocomplete="off" />
          </mat-form-field>
          <mat-slide-toggle [checked]="deleted()" (change)="deleted.set($event.checked)">Recently deleted</mat-slide-toggle>
          <span class="count" aria-live="polite">{{ countText() }}</span>
        </div>
        @if (deleted()) {
          <p class="hint">Deleted netlists can be restored for {{ restorableDays }} days{{ isAdmin() ? '' : ' by their owner or an admin' }}.</p>
        }
        <div class="bar-slot">
          @if (loading() || uploading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }
        </div>
        @if (problem(); as p) {
          <div class="problem" role="alert">
            <span>{{ p.message }}</span>
            @if (p.code === 'signed_out') {
              <button mat-button type="button" (click)="session.signIn()">Sign in again</button>
            } @else {
              <button mat-button type="button" (click)="reload()">Try again</button>
            }
          </div>
        }
        @if (rows().length > 0 || !loaded()) {
          <nw-netlists-table [rows]="rows()" [total]="total()" [page]="page()" [pageSize]="pageSize()" [sort]="sort()" [order]="order()"
            [deleted]="deleted()" [meId]="session.me()?.user?.id" [class.dim]="loading()"
            (sortChange)="sorted($event)" (pageChange)="paged($event)" (act)="act($event)" />
        } @else if (!problem()) {
          <p class="empty">{{ emptyText() }}</p>
        }
      } @else if (access().kind !== 'loading') {
        <nw-access-notice [access]="access()" />
      }
    </section>
  `,
  styles: `
    :host { display: block; }
    .page { box-sizing: border-box; width: 100%; max-width: 1200px; margin: 0 auto; padding: 24px 32px 48px; }
    .head { display: flex; align-items: flex-end; justify-content: space-between; gap: 16px; margin-bottom: 16px; }
    .head h1 { margin: 0; }
    .sub { margin: 4px 0 0; color: var(--mat-sys-on-surface-variant); }
    .make { display: flex; gap: 8px; }
    .filters { display: flex; align-items: center; gap: 24px; flex-wrap: wrap; }
    .find { width: 320px; }
    .count { margin-left: auto; color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    .hint { margin: 8px 0 0; color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    .bar-slot { height: 4px; margin: 12px 0 0; }
    .problem { display: flex; align-items: center; gap: 12px; margin: 8px 0; padding: 8px 12px; border-left: 3px solid #b3261e;
      background: #fbeae8; color: #5c1410; }
    .empty { margin: 16px 0; padding: 24px; text-align: center; border: 1px dashed var(--mat-sys-outline-variant); border-radius: 8px;
      color: var(--mat-sys-on-surface-variant); background: var(--mat-sys-surface-container-lowest); }
    nw-netlists-table { border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; overflow: hidden; transition: opacity 120ms; }
    nw-netlists-table.dim { opacity: 0.7; }
  `,
})
export class NetlistsPage {
  private readonly api = inject(TeamApi);
  protected readonly session = inject(Session);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly filesInput = viewChild<ElementRef<HTMLInputElement>>('files');

  /** From `/w/:slug/netlists`; without it the session's current workspace. */
  readonly slug = input<string>();

  protected readonly restorableDays = RESTORABLE_DAYS;
  private readonly place = pageWorkspace(() => this.slug());
  protected readonly access = this.place.access;
  protected readonly workspace = this.place.workspace;
  protected readonly canWrite = computed(() => roleAtLeast(this.workspace()?.role, 'designer'));
  protected readonly isAdmin = computed(() => roleAtLeast(this.workspace()?.role, 'admin'));

  /** What is typed in the search field; `q` follows it after a pause. */
  protected readonly search = signal('');
  private readonly q = signal('');
  protected readonly sort = signal<SortKey>('updatedAt');
  protected readonly order = signal<'asc' | 'desc'>('desc');
  protected readonly deleted = signal(false);
  protected readonly pageSize = signal(25);
  /** Back to the first page whenever the workspace, the search, the sort or the list changes. */
  protected readonly page = linkedSignal({
    source: () => [this.workspace()?.slug, this.q(), this.sort(), this.order(), this.deleted()].join('\u0000'),
    computation: () => 0,
  });
  private readonly reloads = signal(0);

  protected readonly rows = signal<NetlistSummary[]>([]);
  protected readonly total = signal(0);
  protected readonly loading = signal(false);
  protected readonly loaded = signal(false);
  protected readonly uploading = signal(false);
  protected readonly problem = signal<ApiError | undefined>(undefined);
  private searchTimer: ReturnType<typeof setTimeout> | undefined;
  private requestSeq = 0;

  constructor() {
    effect(() => {
      const ws = this.workspace();
      if (!ws) return;
      const query: NetlistQuery = { q: this.q(), sort: this.sort(), order: this.order(), page: this.page(), pageSize: this.pageSize(), deleted: this.deleted() || undefined };
      this.reloads();
      untracked(() => void this.fetch(ws.slug, query));
    });
    // A page addressed by workspace makes it the current one, so the shell's menus agree.
    effect(() => {
      const ws = this.workspace();
      if (ws && this.slug() && untracked(this.session.workspace)?.slug !== ws.slug) this.session.chooseWorkspace(ws.slug);
    });
    inject(DestroyRef).onDestroy(() => clearTimeout(this.searchTimer));
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected typed(value: string): void {
    this.search.set(value);
    clearTimeout(this.searchTimer);
    this.searchTimer = setTimeout(() => this.q.set(value.trim()), 250);
  }

  protected sorted(s: Sort): void {
    const key = SORT_KEYS.find((k) => k === s.active) ?? 'updatedAt';
    this.sort.set(key);
    this.order.set(s.direction === 'asc' ? 'asc' : 'desc');
  }

  protected paged(e: PageEvent): void {
    this.pageSize.set(e.pageSize);
    this.page.set(e.pageIndex);
  }

  protected countText(): string {
    if (!this.loaded()) return '';
    const n = this.total();
    const what = this.deleted() ? 'deleted netlist' : 'netlist';
    return `${n} ${what}${n === 1 ? '' : 's'}${this.q() ? ` matching “${this.q()}”` : ''}`;
  }

  protected emptyText(): string {
    const ws = this.workspace()?.name ?? 'this workspace';
    if (this.q()) return `No netlist name contains “${this.q()}”. Try fewer letters, or clear the search.`;
    if (this.deleted()) return `Nothing was deleted in ${ws} in the last ${RESTORABLE_DAYS} days.`;
    if (this.canWrite()) return `${ws} has no netlists yet. Start one with “New netlist”, upload .nwl files, or save a draft from the bench to the team.`;
    return `${ws} has no netlists you can see yet. They appear here once a designer saves one for the workspace.`;
  }

  private async fetch(slug: string, query: NetlistQuery): Promise<void> {
    const mine = ++this.requestSeq;
    this.loading.set(true);
    try {
      const res = await this.api.listNetlists(slug, query);
      if (mine !== this.requestSeq) return;
      const page = query.page ?? 0;
      if (res.items.length === 0 && res.total > 0 && page > 0) {
        // The last page emptied (a delete elsewhere): show the new last page instead.
        this.page.set(Math.max(0, Math.ceil(res.total / this.pageSize()) - 1));
        return;
      }
      this.rows.set(res.items);
      this.total.set(res.total);
      this.problem.set(undefined);
      this.loaded.set(true);
    } catch (err) {
      if (mine !== this.requestSeq) return;
      this.problem.set(apiErrorOf(err));
      this.rows.set([]);
      this.loaded.set(true);
    } finally {
      if (mine === this.requestSeq) this.loading.set(false);
    }
  }

  protected pickFiles(): void {
    this.filesInput()?.nativeElement.click();
  }

  protected async create(): Promise<void> {
    const ws = this.workspace();
    if (!ws) return;
    const ref = this.dialog.open<NameDialog, NameDialogData, NameDialogResult>(NameDialog, {
      data: { title: 'New netlist', action: 'Create and open', askVisibility: { workspaceName: ws.name } },
    });
    const answer = await firstValueFrom(ref.afterClosed());
    if (!answer) return;
    try {
      const created = await this.api.createNetlist(ws.slug, { name: answer.name, source: starterSource(answer.name), visibility: answer.visibility });
      await this.router.navigate(['/bench'], { queryParams: { netlist: created.id } });
    } catch (err) {
      this.tell(apiErrorOf(err).message, true);
    }
  }

  protected async upload(event: Event): Promise<void> {
    const input = event.target as HTMLInputElement;
    const files = [...(input.files ?? [])];
    input.value = '';
    const ws = this.workspace();
    if (!ws || files.length === 0) return;
    this.uploading.set(true);
    try {
      const res = await this.api.uploadNetlists(ws.slug, files);
      const n = res.items.length;
      this.tell(`Uploaded ${n} netlist${n === 1 ? '' : 's'}.`);
      if (this.deleted()) this.deleted.set(false);
      else this.reload();
    } catch (err) {
      const e = apiErrorOf(err);
      const problems = fileProblemsOf(e);
      if (problems.length) this.dialog.open<UploadProblemsDialog, UploadProblemsData>(UploadProblemsDialog, { data: { message: e.message, problems } });
      else this.tell(e.message, true);
    } finally {
      this.uploading.set(false);
    }
  }

  protected async act({ kind, netlist }: NetlistAction): Promise<void> {
    try {
      switch (kind) {
        case 'rename': return await this.rename(netlist);
        case 'visibility': return await this.toggleVisibility(netlist);
        case 'delete': return await this.remove(netlist);
        case 'restore': return await this.restore(netlist);
      }
    } catch (err) {
      this.tell(apiErrorOf(err).message, true);
      this.reload();
    }
  }

  private async rename(n: NetlistSummary): Promise<void> {
    const ref = this.dialog.open<NameDialog, NameDialogData, NameDialogResult>(NameDialog, { data: { title: 'Rename netlist', action: 'Rename', name: n.name } });
    const answer = await firstValueFrom(ref.afterClosed());
    if (!answer || answer.name === n.name) return;
    await this.api.updateNetlist(n.id, { name: answer.name });
    this.tell(`Renamed to “${answer.name}”.`);
    this.reload();
  }

  private async toggleVisibility(n: NetlistSummary): Promise<void> {
    const visibility = n.visibility === 'private' ? 'workspace' : 'private';
    await this.api.updateNetlist(n.id, { visibility });
    this.tell(visibility === 'private' ? `“${n.name}” is now private: only you see it.` : `Everyone in ${this.workspace()?.name ?? 'the workspace'} now sees “${n.name}”.`);
    this.reload();
  }

  private async remove(n: NetlistSummary): Promise<void> {
    const yes = await confirmWith(this.dialog, {
      title: `Delete “${n.name}”?`,
      message: `It moves to Recently deleted, where its owner or an admin can restore it, with all its revisions, for ${RESTORABLE_DAYS} days.`,
      action: 'Delete',
    });
    if (!yes) return;
    await this.api.deleteNetlist(n.id);
    this.reload();
    const ref = this.snack.open(`Deleted “${n.name}”.`, 'Undo', { duration: 8000 });
    ref.onAction().subscribe(() => void this.act({ kind: 'restore', netlist: n }));
  }

  private async restore(n: NetlistSummary): Promise<void> {
    await this.api.restoreNetlist(n.id);
    this.tell(`Restored “${n.name}”.`);
    this.reload();
  }

  private tell(message: string, problem = false): void {
    this.snack.open(message, problem ? 'OK' : undefined, { duration: problem ? 8000 : 3000 });
  }
}
