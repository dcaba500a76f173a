/**
 * The team's netlists as a table: sorted and paged by the server, so this component only shows
 * one page and reports what the user asks for (sort, page, row actions).
 */
import { ChangeDetectionStrategy, Component, inject, input, output } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { TeamApi, type NetlistSummary } from '../core/team-api';
import { nwlFileName, restorableText } from './format';
import { AgoPipe, BytesPipe, ExactTimePipe } from './format-pipes';

/** What a row's menu asks the page to do. */
export interface NetlistAction {
  kind: 'rename' | 'visibility' | 'delete' | 'restore';
  netlist: NetlistSummary;
}

export const PAGE_SIZES = [10, 25, 50, 100] as const;

@Component({
  selector: 'nw-netlists-table',
  imports: [RouterLink, MatTableModule, MatSortModule, MatPaginatorModule, MatMenuModule, MatButtonModule, AgoPipe, ExactTimePipe, BytesPipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <table mat-table [dataSource]="rows()" matSort matSortDisableClear [matSortActive]="sort()" [matSortDirection]="order()"
      (matSortChange)="sortChange.emit($event)" [attr.aria-label]="deleted() ? 'Recently deleted netlists' : 'Netlists'">
      <ng-container matColumnDef="name">
        <th mat-header-cell *matHeaderCellDef mat-sort-header sortActionDescription="Sort by name">Name</th>
        <td mat-cell *matCellDef="let n">
          @if (deleted()) {
            <span class="name">{{ n.name }}</span>
          } @else {
            <a class="name" routerLink="/bench" [queryParams]="{ netlist: n.id }" title="Open in the bench">{{ n.name }}</a>
          }
        </td>
      </ng-container>
      <ng-container matColumnDef="visibility">
        <th mat-header-cell *matHeaderCellDef>Seen by</th>
        <td mat-cell *matCellDef="let n">
          <span class="vis" [class.private]="n.visibility === 'private'">
            @if (n.visibility === 'private') {
              <svg viewBox="0 0 16 16" aria-hidden="true"><rect x="3" y="7" width="10" height="7" rx="1.5" /><path d="M5.5 7V5a2.5 2.5 0 0 1 5 0v2" fill="none" /></svg>
              Only the owner
            } @else {
              <svg viewBox="0 0 16 16" aria-hidden="true"><circle cx="5.5" cy="6" r="2" /><circle cx="11" cy="6" r="2" /><path d="M1.5 13c.5-2.5 2-3.5 4-3.5s3.5 1 4 3.5M9 9.6c.6-.1 1.3-.1 2-.1 2 0 3.5 1 4 3.5" fill="none" /></svg>
              Workspace
            }
          </span>
        </td>
      </ng-container>
      <ng-container matColumnDef="owner">
        <th mat-header-cell *matHeaderCellDef mat-sort-header sortActionDescription="Sort by owner">Owner</th>
        <td mat-cell *matCellDef="let n">{{ n.owner.name }}@if (n.owner.id === meId()) { <span class="you">(you)</span> }</td>
      </ng-container>
      <ng-container matColumnDef="updatedAt">
        <th mat-header-cell *matHeaderCellDef mat-sort-header start="desc" sortActionDescription="Sort by last update">Updated</th>
        <td mat-cell *matCellDef="let n">
          <span [title]="n.updatedAt | exactTime">{{ n.updatedAt | ago }}</span>
          <span class="by">by {{ n.updatedBy.name }}</span>
        </td>
      </ng-container>
      <ng-container matColumnDef="deletedAt">
        <th mat-header-cell *matHeaderCellDef>Deleted</th>
        <td mat-cell *matCellDef="let n">
          <span [title]="n.deletedAt | exactTime">{{ n.deletedAt | ago }}</span>
          <span class="by">{{ restorable(n.deletedAt) }}</span>
        </td>
      </ng-container>
      <ng-container matColumnDef="version">
        <th mat-header-cell *matHeaderCellDef class="num">Version</th>
        <td mat-cell *matCellDef="let n" class="num">{{ n.version }}</td>
      </ng-container>
      <ng-container matColumnDef="size">
        <th mat-header-cell *matHeaderCellDef mat-sort-header arrowPosition="before" start="desc" class="num" sortActionDescription="Sort by size">Size</th>
        <td mat-cell *matCellDef="let n" class="num">{{ n.size | bytes }}</td>
      </ng-container>
      <ng-container matColumnDef="actions">
        <th mat-header-cell *matHeaderCellDef class="actions"><span class="cdk-visually-hidden">Actions</span></th>
        <td mat-cell *matCellDef="let n" class="actions">
          @if (deleted()) {
            @if (n.canDelete) {
              <button mat-stroked-button type="button" (click)="act.emit({ kind: 'restore', netlist: n })" [attr.aria-label]="'Restore ' + n.name">Restore</button>
            }
          } @else {
            <button mat-button type="button" class="more" [matMenuTriggerFor]="rowMenu" [matMenuTriggerData]="{ n: n }"
              [attr.aria-label]="'Actions for ' + n.name">Actions ▾</button>
          }
        </td>
      </ng-container>
      <tr mat-header-row *matHeaderRowDef="columns()"></tr>
      <tr mat-row *matRowDef="let n; columns: columns()"></tr>
    </table>
    <mat-menu #rowMenu="matMenu" xPosition="before">
      <ng-template matMenuContent let-n="n">
        <a mat-menu-item routerLink="/bench" [queryParams]="{ netlist: n.id }">Open in bench</a>
        <a mat-menu-item [routerLink]="['/netlists', n.id, 'revisions']">Revisions</a>
        <a mat-menu-item [href]="fileUrl(n)" [attr.download]="fileName(n)">Download .nwl</a>
        @if (n.canWrite) {
          <button mat-menu-item type="button" (click)="act.emit({ kind: 'rename', netlist: n })">Rename…</button>
          @if (n.owner.id === meId()) {
            <button mat-menu-item type="button" (click)="act.emit({ kind: 'visibility', netlist: n })">
              {{ n.visibility === 'private' ? 'Share with the workspace' : 'Make private' }}
            </button>
          }
        }
        @if (n.canDelete) {
          <button mat-menu-item type="button" class="danger" (click)="act.emit({ kind: 'delete', netlist: n })">Delete…</button>
        }
      </ng-template>
    </mat-menu>
    <mat-paginator [length]="total()" [pageIndex]="page()" [pageSize]="pageSize()" [pageSizeOptions]="pageSizes" showFirstLastButtons
      (page)="pageChange.emit($event)" [attr.aria-label]="deleted() ? 'Pages of deleted netlists' : 'Pages of netlists'" />
  `,
  styles: `
    :host { display: block; }
    table { width: 100%; background: var(--mat-sys-surface-container-lowest); }
    .name { font-weight: 600; }
    a.name { color: var(--mat-sys-tertiary); text-decoration: none; }
    a.name:hover, a.name:focus-visible { text-decoration: underline; }
    .vis { display: inline-flex; align-items: center; gap: 6px; color: var(--mat-sys-on-surface-variant); white-space: nowrap; }
    .vis svg { width: 16px; height: 16px; fill: none; stroke: currentColor; stroke-width: 1.4; }
    .vis.private { color: var(--mat-sys-primary); }
    .you { margin-left: 4px; color: var(--mat-sys-on-surface-variant); }
    .by { display: block; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .num { text-align: right; white-space: nowrap; }
    th.num ::ng-deep .mat-sort-header-container { justify-content: flex-end; }
    .actions { text-align: right; width: 1%; white-space: nowrap; }
    .danger { color: #8c1d18; }
    mat-paginator { background: transparent; }
  `,
})
export class NetlistsTable {
  private readonly api = inject(TeamApi);

  readonly rows = input<readonly NetlistSummary[]>([]);
  readonly total = input(0);
  readonly page = input(0);
  readonly pageSize = input(25);
  readonly sort = input<string>('updatedAt');
  readonly order = input<'asc' | 'desc'>('desc');
  /** Shows the recently deleted ones (with Restore) instead of the live ones. */
  readonly deleted = input(false);
  /** The signed-in user's id, to mark their netlists and offer what only an owner may do. */
  readonly meId = input<string | undefined>();

  readonly sortChange = output<Sort>();
  readonly pageChange = output<PageEvent>();
  readonly act = output<NetlistAction>();

  protected readonly pageSizes = [...PAGE_SIZES];

  protected columns(): string[] {
    return this.deleted()
      ? ['name', 'owner', 'deletedAt', 'size', 'actions']
      : ['name', 'visibility', 'owner', 'updatedAt', 'version', 'size', 'actions'];
  }

  protected restorable(deletedAt: string): string {
    return restorableText(deletedAt);
  }
  protected fileUrl(n: NetlistSummary): string {
    return this.api.revisionFileUrl(n.id, n.version);
  }
  protected fileName(n: NetlistSummary): string {
    return nwlFileName(n.name);
  }
}

