/**
 * The review queue: versions waiting for review that someone else wrote, oldest first, with who
 * submitted them, when, and how their checks fared in the author's browser. Each opens the block
 * page at that version, where its checks are solved again before anyone vets it.
 */
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { roleAtLeast } from '../core/session';
import { apiErrorOf, type ApiError } from '../core/team-api';
import { AccessNotice } from '../netlists/access-notice';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { pageWorkspace } from '../netlists/workspace-access';
import { checksSummary } from './block-words';
import { LibraryApi, type QueueItem } from './library-api';
import { blockLink, libraryBase, routeParam } from './library-links';

@Component({
  selector: 'nw-review-queue-page',
  imports: [RouterLink, AccessNotice, MatButtonModule, MatProgressBarModule, MatTableModule, AgoPipe, ExactTimePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <a class="back" [routerLink]="base()">← Block library</a>
      <h1>Review queue</h1>
      @if (access().kind === 'member') {
        @if (!isReviewer()) {
          <p class="note">Reviewers and admins vet blocks; you are {{ workspace()?.role }} in {{ workspace()?.name }}. You can still read every version and comment on it from its page.</p>
        } @else {
          <p class="sub">Versions waiting for a reviewer, oldest first; your own are not listed — someone else vets them.</p>
          <div class="bar-slot">@if (loading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading" /> }</div>
          @if (problem(); as p) {
            <div class="problem" role="alert"><span>{{ p.message }}</span><button mat-button type="button" (click)="load()">Try again</button></div>
          }
          @if (items().length) {
            <table mat-table [dataSource]="items()" aria-label="Versions waiting for review, oldest first">
              <ng-container matColumnDef="block">
                <th mat-header-cell *matHeaderCellDef>Version</th>
                <td mat-cell *matCellDef="let i">
                  <a class="path" [routerLink]="link(i)">{{ i.path }}&#64;{{ i.version }}</a>
                  <div class="title">{{ i.title }}</div>
                </td>
              </ng-container>
              <ng-container matColumnDef="author">
                <th mat-header-cell *matHeaderCellDef>Author</th>
                <td mat-cell *matCellDef="let i">{{ i.author.name }}</td>
              </ng-container>
              <ng-container matColumnDef="when">
                <th mat-header-cell *matHeaderCellDef>Submitted</th>
                <td mat-cell *matCellDef="let i"><span [title]="i.submittedAt | exactTime">{{ i.submittedAt | ago }}</span></td>
              </ng-container>
              <ng-container matColumnDef="checks">
                <th mat-header-cell *matHeaderCellDef>Author's checks</th>
                <td mat-cell *matCellDef="let i"><span class="checks" [class.failing]="i.checks.failing > 0">{{ summary(i) }}</span></td>
              </ng-container>
              <ng-container matColumnDef="open">
                <th mat-header-cell *matHeaderCellDef><span class="cdk-visually-hidden">Open</span></th>
                <td mat-cell *matCellDef="let i" class="open"><a mat-stroked-button [routerLink]="link(i)" [attr.aria-label]="'Review ' + i.path + ' version ' + i.version">Review</a></td>
              </ng-container>
              <tr mat-header-row *matHeaderRowDef="columns"></tr>
              <tr mat-row *matRowDef="let i; columns: columns"></tr>
            </table>
          } @else if (loaded() && !problem()) {
            <p class="empty">Nothing is waiting for you. New submissions are mailed to reviewers as they arrive.</p>
          }
        }
      } @else if (access().kind !== 'loading') {
        <nw-access-notice [access]="access()" />
      }
    </section>
  `,
  styles: `
    :host { display: block; }
    .page { box-sizing: border-box; width: 100%; max-width: 1200px; margin: 0 auto; padding: 16px 32px 48px; }
    .back { display: inline-block; margin-bottom: 8px; }
    h1 { margin: 0; }
    .sub, .note { margin: 4px 0 0; color: var(--mat-sys-on-surface-variant); max-width: 80ch; }
    .bar-slot { height: 4px; margin: 12px 0 4px; }
    .problem { display: flex; align-items: center; gap: 12px; padding: 8px 12px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    table { width: 100%; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; overflow: hidden; background: var(--mat-sys-surface-container-lowest); }
    .path { font-family: ui-monospace, "DejaVu Sans Mono", Menlo, monospace; font-weight: 600; color: var(--mat-sys-tertiary); }
    .title { color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    .checks.failing { color: #8c1d18; font-weight: 600; }
    .open { text-align: right; width: 1%; }
    .empty { margin: 16px 0; padding: 24px; text-align: center; border: 1px dashed var(--mat-sys-outline-variant); border-radius: 8px;
      color: var(--mat-sys-on-surface-variant); }
  `,
})
export class ReviewQueuePage {
  private readonly api = inject(LibraryApi);

  readonly slug = input<string>();
  private readonly routeSlug = routeParam('slug');
  private readonly addressed = computed(() => this.slug() ?? this.routeSlug());
  private readonly place = pageWorkspace(() => this.addressed());
  protected readonly access = this.place.access;
  protected readonly workspace = this.place.workspace;
  protected readonly base = computed(() => libraryBase(this.addressed()));
  protected readonly isReviewer = computed(() => roleAtLeast(this.workspace()?.role, 'reviewer'));

  protected readonly columns = ['block', 'author', 'when', 'checks', 'open'];
  protected readonly items = signal<QueueItem[]>([]);
  protected readonly loading = signal(false);
  protected readonly loaded = signal(false);
  protected readonly problem = signal<ApiError | undefined>(undefined);

  constructor() {
    effect(() => {
      if (this.workspace() && this.isReviewer()) untracked(() => void this.load());
    });
  }

  protected link(i: QueueItem): string {
    return blockLink(this.base(), i.path, i.version);
  }

  protected summary(i: QueueItem): string {
    return checksSummary(i.checks.total, i.checks.failing);
  }

  protected async load(): Promise<void> {
    const ws = this.workspace();
    if (!ws) return;
    this.loading.set(true);
    try {
      this.items.set((await this.api.reviewQueue(ws.slug)).items);
      this.problem.set(undefined);
    } catch (err) {
      this.problem.set(apiErrorOf(err));
    } finally {
      this.loading.set(false);
      this.loaded.set(true);
    }
  }
}
