/**
 * The catalogue's rows: path and title, summary, tags, the vetted badge ("vetted v3") with the
 * newest version's state when it is newer, and when the block last changed.
 */
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatTableModule } from '@angular/material/table';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { latestNote, vettedBadge } from './block-words';
import type { BlockSummary } from './library-api';
import { blockLink } from './library-links';
import { StateChip } from './state-chip';

@Component({
  selector: 'nw-catalogue-table',
  imports: [RouterLink, MatTableModule, AgoPipe, ExactTimePipe, StateChip],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <table mat-table [dataSource]="rows()" aria-label="Blocks">
      <ng-container matColumnDef="block">
        <th mat-header-cell *matHeaderCellDef>Block</th>
        <td mat-cell *matCellDef="let b">
          <a class="path" [routerLink]="link(b)">{{ b.path }}</a>
          <div class="title">{{ b.title }}</div>
        </td>
      </ng-container>
      <ng-container matColumnDef="summary">
        <th mat-header-cell *matHeaderCellDef>Summary</th>
        <td mat-cell *matCellDef="let b"><p class="summary" [title]="b.summary">{{ b.summary }}</p></td>
      </ng-container>
      <ng-container matColumnDef="tags">
        <th mat-header-cell *matHeaderCellDef>Tags</th>
        <td mat-cell *matCellDef="let b">
          <span class="tags">
            @for (t of b.tags; track t) {
              <button type="button" class="tag" [class.on]="t === activeTag()" (click)="tagChosen.emit(t)" [attr.aria-label]="'Show blocks tagged ' + t">{{ t }}</button>
            }
          </span>
        </td>
      </ng-container>
      <ng-container matColumnDef="status">
        <th mat-header-cell *matHeaderCellDef>Status</th>
        <td mat-cell *matCellDef="let b">
          <span class="status">
            @if (badge(b); as v) {
              <a class="vetted" [routerLink]="link(b, b.vetted)" [attr.aria-label]="'Vetted version ' + b.vetted">✓ {{ v }}</a>
            } @else {
              <span class="unvetted">not vetted yet</span>
            }
            @if (note(b)) {
              <a class="newer" [routerLink]="link(b, b.latest.version)"><nw-state-chip [state]="b.latest.state" [version]="b.latest.version" /></a>
            }
          </span>
        </td>
      </ng-container>
      <ng-container matColumnDef="updated">
        <th mat-header-cell *matHeaderCellDef class="when">Updated</th>
        <td mat-cell *matCellDef="let b" class="when"><span [title]="b.updatedAt | exactTime">{{ b.updatedAt | ago }}</span></td>
      </ng-container>
      <tr mat-header-row *matHeaderRowDef="columns; sticky: true"></tr>
      <tr mat-row *matRowDef="let b; columns: columns"></tr>
    </table>
  `,
  styles: `
    :host { display: block; }
    table { width: 100%; background: var(--mat-sys-surface-container-lowest); --mat-table-row-item-container-height: 60px; }
    td { vertical-align: top; padding-top: 8px !important; padding-bottom: 8px !important; }
    .mat-column-block { width: 26%; }
    .mat-column-tags { width: 17%; }
    .mat-column-status { width: 16%; }
    .path { font-family: ui-monospace, "DejaVu Sans Mono", Menlo, monospace; font-size: 0.875rem; font-weight: 600; color: var(--mat-sys-tertiary);
      overflow-wrap: anywhere; }
    .title { margin-top: 2px; color: var(--mat-sys-on-surface); }
    .summary { margin: 0; display: -webkit-box; -webkit-line-clamp: 2; -webkit-box-orient: vertical; overflow: hidden;
      color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    .tags { display: flex; flex-wrap: wrap; gap: 4px; }
    .tag { font: inherit; font-size: 0.75rem; padding: 0 6px; border-radius: 8px; border: 1px solid var(--mat-sys-outline-variant);
      background: var(--mat-sys-surface-container); color: var(--mat-sys-on-surface-variant); cursor: pointer; }
    .tag.on { border-color: var(--mat-sys-tertiary); color: var(--mat-sys-tertiary); font-weight: 600; }
    .status { display: flex; flex-direction: column; align-items: flex-start; gap: 4px; }
    .vetted { padding: 1px 8px; border-radius: 10px; font-size: 0.8125rem; font-weight: 700; text-decoration: none;
      background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); white-space: nowrap; }
    .unvetted { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .newer { text-decoration: none; }
    .when { text-align: right; white-space: nowrap; width: 1%; }
  `,
})
export class CatalogueTable {
  readonly rows = input.required<BlockSummary[]>();
  /** Where the block pages are (`/library` or `/w/SLUG/library`). */
  readonly base = input.required<string>();
  readonly activeTag = input<string>();
  /** A tag was clicked: filter by it. */
  readonly tagChosen = output<string>();

  protected readonly columns = ['block', 'summary', 'tags', 'status', 'updated'];

  protected link(b: BlockSummary, version?: number | null): string {
    return blockLink(this.base(), b.path, version ?? undefined);
  }
  protected badge(b: BlockSummary): string | undefined {
    return vettedBadge(b);
  }
  protected note(b: BlockSummary): string | undefined {
    return latestNote(b);
  }
}
