/**
 * Every saved revision of one team netlist, newest first: read any of them, compare two side by
 * side, download one, open it in the bench, or make an old one the current text again (as a new
 * revision, so nothing is ever lost).
 */
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { apiErrorOf, staleCurrentOf, TeamApi, type ApiError, type Netlist, type RevisionSummary } from '../core/team-api';
import { DiffView } from './diff-view';
import { nwlFileName } from './format';
import { AgoPipe, BytesPipe, ExactTimePipe } from './format-pipes';
import { comparePair, previousVersion, toggleCompare } from './revision-choice';
import { SourceView } from './source-view';

@Component({
  selector: 'nw-revisions-page',
  imports: [RouterLink, MatButtonModule, MatCheckboxModule, MatMenuModule, MatProgressBarModule, MatTableModule, DiffView, SourceView, AgoPipe, ExactTimePipe, BytesPipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <a class="back" [routerLink]="netlist() ? ['/w', netlist()!.workspace, 'netlists'] : '/netlists'">← Netlists</a>
      @if (netlist(); as n) {
        <header class="head">
          <div>
            <h1>{{ n.name }}</h1>
            <p class="sub">Revisions · current version {{ n.version }} · saved <span [title]="n.updatedAt | exactTime">{{ n.updatedAt | ago }}</span> by {{ n.updatedBy.name }}</p>
          </div>
          <a mat-stroked-button routerLink="/bench" [queryParams]="{ netlist: n.id }">Open in bench</a>
        </header>
      } @else if (!problem()) {
        <h1>Revisions</h1>
      }
      <div class="bar-slot">@if (loading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }</div>
      @if (problem(); as p) { <p class="problem" role="alert">{{ p.message }}</p> }

      @if (netlist(); as n) {
        <p class="hint">Choose a version to read it; tick two to compare them.</p>
        <div class="list">
          <table mat-table [dataSource]="revisions()" aria-label="Revisions, newest first">
            <ng-container matColumnDef="compare">
              <th mat-header-cell *matHeaderCellDef class="tick">Compare</th>
              <td mat-cell *matCellDef="let r" class="tick">
                <mat-checkbox [checked]="chosen().includes(r.version)" (change)="tick(r.version)" [aria-label]="'Compare version ' + r.version" />
              </td>
            </ng-container>
            <ng-container matColumnDef="version">
              <th mat-header-cell *matHeaderCellDef>Version</th>
              <td mat-cell *matCellDef="let r">
                <button type="button" class="pick" (click)="show(r.version)" [attr.aria-pressed]="shownAlone() === r.version">Version {{ r.version }}</button>
                @if (r.version === n.version) { <span class="current">current</span> }
              </td>
            </ng-container>
            <ng-container matColumnDef="author">
              <th mat-header-cell *matHeaderCellDef>Saved by</th>
              <td mat-cell *matCellDef="let r">{{ r.author.name }}</td>
            </ng-container>
            <ng-container matColumnDef="when">
              <th mat-header-cell *matHeaderCellDef>When</th>
              <td mat-cell *matCellDef="let r"><span [title]="r.createdAt | exactTime">{{ r.createdAt | ago }}</span></td>
            </ng-container>
            <ng-container matColumnDef="size">
              <th mat-header-cell *matHeaderCellDef class="num">Size</th>
              <td mat-cell *matCellDef="let r" class="num">{{ r.size | bytes }}</td>
            </ng-container>
            <ng-container matColumnDef="actions">
              <th mat-header-cell *matHeaderCellDef class="actions"><span class="cdk-visually-hidden">Actions</span></th>
              <td mat-cell *matCellDef="let r" class="actions">
                <button mat-button type="button" [matMenuTriggerFor]="rowMenu" [matMenuTriggerData]="{ r: r }" [attr.aria-label]="'Actions for version ' + r.version">Actions ▾</button>
              </td>
            </ng-container>
            <tr mat-header-row *matHeaderRowDef="columns; sticky: true"></tr>
            <tr mat-row *matRowDef="let r; columns: columns" [class.shown]="shownAlone() === r.version || chosen().includes(r.version)"></tr>
          </table>
        </div>
        <mat-menu #rowMenu="matMenu" xPosition="before">
          <ng-template matMenuContent let-r="r">
            @if (previous(r.version); as p) {
              <button mat-menu-item type="button" (click)="chosen.set([p, r.version])">Compare with version {{ p }}</button>
            }
            <a mat-menu-item [href]="fileUrl(r.version)" [attr.download]="fileName(r.version)">Download .nwl</a>
            <a mat-menu-item routerLink="/bench" [queryParams]="r.version === n.version ? { netlist: n.id } : { netlist: n.id, version: r.version }">Open in bench</a>
            @if (n.canWrite && r.version !== n.version) {
              <button mat-menu-item type="button" (click)="restore(r.version)">Restore as new revision</button>
            }
          </ng-template>
        </mat-menu>

        <section class="viewer" aria-live="polite">
          @if (pair(); as p) {
            <h2>Version {{ p.older }} → version {{ p.newer }}</h2>
            @if (textOf(p.older) !== undefined && textOf(p.newer) !== undefined) {
              <nw-diff-view [left]="textOf(p.older)!" [right]="textOf(p.newer)!" [leftLabel]="'Version ' + p.older" [rightLabel]="'Version ' + p.newer" />
            } @else {
              <p class="wait">Fetching both texts…</p>
            }
          } @else if (shownAlone(); as v) {
            <h2>Version {{ v }}@if (v === n.version) { (current) }</h2>
            @if (textOf(v); as text) {
              <nw-source-view [text]="text" [label]="'Version ' + v + ' of ' + n.name + ', read-only'" />
            } @else if (textOf(v) === '') {
              <p class="wait">This version is empty.</p>
            } @else {
              <p class="wait">Fetching the text…</p>
            }
          }
        </section>
      }
    </section>
  `,
  styles: `
    :host { display: block; }
    .page { box-sizing: border-box; width: 100%; max-width: 1200px; margin: 0 auto; padding: 16px 32px 48px; }
    .back { display: inline-block; margin-bottom: 8px; }
    .head { display: flex; align-items: flex-end; justify-content: space-between; gap: 16px; }
    .head h1 { margin: 0; }
    .sub { margin: 4px 0 0; color: var(--mat-sys-on-surface-variant); }
    .bar-slot { height: 4px; margin: 12px 0 4px; }
    .problem { padding: 8px 12px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    .hint { margin: 4px 0 8px; color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    .list { max-height: 232px; overflow: auto; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; }
    table { width: 100%; background: var(--mat-sys-surface-container-lowest); --mat-table-row-item-container-height: 40px; --mat-table-header-container-height: 44px; }
    tr.shown { background: var(--mat-sys-surface-container); }
    .tick { width: 1%; }
    .pick { border: 0; background: none; padding: 4px 0; font: inherit; font-weight: 600; color: var(--mat-sys-tertiary); cursor: pointer; text-decoration: underline; text-underline-offset: 3px; }
    .pick[aria-pressed='true'] { color: var(--mat-sys-on-surface); text-decoration: none; }
    .current { margin-left: 8px; padding: 1px 6px; border-radius: 8px; font-size: 0.75rem; background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); }
    .num { text-align: right; white-space: nowrap; }
    .actions { text-align: right; width: 1%; white-space: nowrap; }
    .viewer { margin-top: 20px; }
    .viewer h2 { font: var(--mat-sys-title-medium); margin: 0 0 8px; }
    .wait { color: var(--mat-sys-on-surface-variant); }
  `,
})
export class RevisionsPage {
  private readonly api = inject(TeamApi);
  private readonly snack = inject(MatSnackBar);

  /** From `/netlists/:id/revisions`. */
  readonly id = input.required<string>();

  protected readonly columns = ['compare', 'version', 'author', 'when', 'size', 'actions'];
  protected readonly netlist = signal<Netlist | undefined>(undefined);
  protected readonly revisions = signal<RevisionSummary[]>([]);
  protected readonly loading = signal(false);
  protected readonly problem = signal<ApiError | undefined>(undefined);
  /** The version read on its own (when not comparing). */
  protected readonly viewing = signal<number | undefined>(undefined);
  /** The versions ticked for comparing. */
  protected readonly chosen = signal<number[]>([]);
  protected readonly pair = computed(() => comparePair(this.chosen()));
  protected readonly shownAlone = computed(() => (this.pair() ? undefined : this.viewing()));
  /** Revision texts fetched so far; a revision never changes, so they are kept. */
  private readonly texts = signal<ReadonlyMap<number, string>>(new Map());
  private readonly fetching = new Set<number>();

  constructor() {
    effect(() => {
      const id = this.id();
      untracked(() => void this.load(id));
    });
    effect(() => {
      const p = this.pair();
      const wanted = p ? [p.older, p.newer] : [this.viewing()];
      for (const v of wanted) if (v !== undefined && !untracked(this.texts).has(v)) void this.fetchText(v);
    });
  }

  protected textOf(version: number): string | undefined {
    return this.texts().get(version);
  }

  protected show(version: number): void {
    this.viewing.set(version);
    this.chosen.set([]);
  }

  protected tick(version: number): void {
    this.chosen.update((c) => toggleCompare(c, version));
  }

  protected previous(version: number): number | undefined {
    return previousVersion(this.revisions().map((r) => r.version), version);
  }

  protected async restore(version: number): Promise<void> {
    const n = this.netlist();
    if (!n) return;
    try {
      const saved = await this.api.restoreRevision(n.id, version, n.version);
      this.snack.open(`Version ${version} is the current text again, saved as version ${saved.version}.`, undefined, { duration: 4000 });
      await this.load(n.id);
      this.show(saved.version);
    } catch (err) {
      const current = staleCurrentOf(err);
      if (current) {
        this.snack.open(`${current.author.name} saved version ${current.version} meanwhile, so nothing was restored. The list is up to date now; restore again if you still want version ${version}.`, 'OK', { duration: 12000 });
        await this.load(n.id);
      } else {
        this.snack.open(apiErrorOf(err).message, 'OK', { duration: 8000 });
      }
    }
  }

  private async load(id: string): Promise<void> {
    this.loading.set(true);
    try {
      const [n, list] = await Promise.all([this.api.getNetlist(id), this.api.revisions(id)]);
      if (id !== this.id()) return;
      if (this.netlist()?.id !== id) this.texts.set(new Map());
      this.netlist.set(n);
      this.revisions.set(list.items);
      this.texts.update((m) => new Map(m).set(n.version, n.source));
      const v = this.viewing();
      if (v === undefined || !list.items.some((r) => r.version === v)) this.viewing.set(n.version);
      this.problem.set(undefined);
    } catch (err) {
      this.problem.set(apiErrorOf(err));
    } finally {
      this.loading.set(false);
    }
  }

  private async fetchText(version: number): Promise<void> {
    const id = this.id();
    if (this.fetching.has(version)) return;
    this.fetching.add(version);
    try {
      const r = await this.api.revision(id, version);
      if (id === this.id()) this.texts.update((m) => new Map(m).set(version, r.source));
    } catch (err) {
      this.problem.set(apiErrorOf(err));
    } finally {
      this.fetching.delete(version);
    }
  }

  protected fileUrl(version: number): string {
    return this.api.revisionFileUrl(this.id(), version);
  }
  protected fileName(version: number): string {
    return nwlFileName(`${this.netlist()?.name ?? 'netlist'} v${version}`);
  }
}
