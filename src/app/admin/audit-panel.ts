/**
 * The workspace's audit log, newest first, paged by the server.
 */
import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { apiErrorOf, TeamApi, type AuditEntry } from '../core/team-api';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { actionLabel, detailsText, targetText } from './audit-text';

@Component({
  selector: 'nw-audit-panel',
  imports: [MatTableModule, MatPaginatorModule, MatProgressBarModule, AgoPipe, ExactTimePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="bar-slot">@if (loading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading the audit log" /> }</div>
    @if (problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
    @if (total() > 0 || loading()) {
      <div class="frame">
        <table mat-table [dataSource]="entries()" aria-label="Audit log, newest first">
          <ng-container matColumnDef="at">
            <th mat-header-cell *matHeaderCellDef>When</th>
            <td mat-cell *matCellDef="let e" class="nowrap"><span [title]="e.at | exactTime">{{ e.at | ago }}</span></td>
          </ng-container>
          <ng-container matColumnDef="actor">
            <th mat-header-cell *matHeaderCellDef>Who</th>
            <td mat-cell *matCellDef="let e">{{ e.actor?.name ?? 'The server' }}</td>
          </ng-container>
          <ng-container matColumnDef="action">
            <th mat-header-cell *matHeaderCellDef>Action</th>
            <td mat-cell *matCellDef="let e"><span [title]="e.action">{{ label(e.action) }}</span></td>
          </ng-container>
          <ng-container matColumnDef="target">
            <th mat-header-cell *matHeaderCellDef>Target</th>
            <td mat-cell *matCellDef="let e">{{ target(e) }}</td>
          </ng-container>
          <ng-container matColumnDef="details">
            <th mat-header-cell *matHeaderCellDef>Details</th>
            <td mat-cell *matCellDef="let e" class="details">{{ details(e) }}</td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let e; columns: columns"></tr>
        </table>
        <mat-paginator [length]="total()" [pageIndex]="page()" [pageSize]="pageSize()" [pageSizeOptions]="[25, 50, 100]"
          (page)="paged($event)" aria-label="Pages of the audit log" />
      </div>
    } @else if (!problem()) {
      <p class="empty">Nothing recorded yet. Changes to members, invitations and netlists appear here.</p>
    }
  `,
  styles: `
    :host { display: block; }
    .bar-slot { height: 4px; margin-bottom: 4px; }
    .problem { padding: 8px 12px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    .frame { border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; overflow: hidden; background: var(--mat-sys-surface-container-lowest); }
    table { width: 100%; background: transparent; }
    .nowrap { white-space: nowrap; }
    .details { color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    mat-paginator { background: transparent; }
    .empty { color: var(--mat-sys-on-surface-variant); }
  `,
})
export class AuditPanel {
  private readonly api = inject(TeamApi);

  readonly slug = input.required<string>();

  protected readonly columns = ['at', 'actor', 'action', 'target', 'details'];
  protected readonly entries = signal<AuditEntry[]>([]);
  protected readonly total = signal(0);
  protected readonly page = signal(0);
  protected readonly pageSize = signal(25);
  protected readonly loading = signal(false);
  protected readonly problem = signal<string | undefined>(undefined);
  private seq = 0;

  constructor() {
    effect(() => {
      const [slug, page, size] = [this.slug(), this.page(), this.pageSize()];
      untracked(() => void this.load(slug, page, size));
    });
  }

  protected paged(e: PageEvent): void {
    this.pageSize.set(e.pageSize);
    this.page.set(e.pageIndex);
  }

  private async load(slug: string, page: number, size: number): Promise<void> {
    const mine = ++this.seq;
    this.loading.set(true);
    try {
      const res = await this.api.audit(slug, page, size);
      if (mine !== this.seq) return;
      this.entries.set(res.items);
      this.total.set(res.total);
      this.problem.set(undefined);
    } catch (err) {
      if (mine === this.seq) this.problem.set(apiErrorOf(err).message);
    } finally {
      if (mine === this.seq) this.loading.set(false);
    }
  }

  protected label(action: string): string {
    return actionLabel(action);
  }
  protected target(e: AuditEntry): string {
    return targetText(e);
  }
  protected details(e: AuditEntry): string {
    return detailsText(e.details);
  }
}
