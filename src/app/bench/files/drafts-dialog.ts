/**
 * The drafts kept in this browser: open one, or delete it.
 */
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { Drafts, type Draft } from '../../core/drafts';
import { timeAgo } from '../time-ago';

export { timeAgo };

export interface DraftsDialogData {
  currentId?: string;
}

/** What the dialog closes with: a draft to open. Deletions happen in place. */
export interface DraftsDialogResult {
  open?: string;
  deleted: string[];
}

@Component({
  selector: 'nw-drafts-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Drafts in this browser</h2>
    <mat-dialog-content>
      @if (drafts.list().length === 0) {
        <p class="empty">No drafts yet. Every netlist you edit is kept here automatically.</p>
      } @else {
        <label class="filter">Find <input type="search" [value]="filter()" (input)="filter.set($any($event.target).value)" aria-label="Find a draft by title" /></label>
        <ul class="list">
          @for (d of shown(); track d.id) {
            <li [class.current]="d.id === data.currentId">
              <button type="button" class="open" (click)="open(d.id)" [attr.aria-label]="'Open ' + d.title + ', changed ' + ago(d.updatedAt) + (d.remote ? ', linked to a team netlist' : '')">
                <span class="t">{{ d.title }}</span>
                <span class="meta">{{ meta(d) }}</span>
              </button>
              <button mat-button type="button" class="delete" (click)="remove(d.id)" [attr.aria-label]="'Delete the draft ' + d.title">Delete</button>
            </li>
          } @empty {
            <li class="empty">No draft title contains “{{ filter() }}”.</li>
          }
        </ul>
      }
      @if (drafts.problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" (click)="close()">Close</button>
    </mat-dialog-actions>
  `,
  styles: `
    .filter { display: flex; gap: 8px; align-items: center; margin-bottom: 8px; }
    .filter input { flex: 1; font: inherit; padding: 4px 8px; border: 1px solid var(--mat-sys-outline); border-radius: 4px; background: var(--mat-sys-surface-container-lowest); color: var(--mat-sys-on-surface); }
    .list { list-style: none; margin: 0; padding: 0; min-width: 440px; }
    li { display: flex; align-items: center; gap: 8px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    li.current { background: var(--mat-sys-surface-container-low); }
    .open { flex: 1; display: flex; flex-direction: column; align-items: flex-start; gap: 2px; padding: 8px 6px; border: 0;
      background: transparent; font: inherit; color: var(--mat-sys-on-surface); text-align: left; cursor: pointer; }
    .open:hover { background: var(--mat-sys-surface-container); }
    .t { font-weight: 600; }
    .meta { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .empty { color: var(--mat-sys-on-surface-variant); }
    .problem { color: #8c1d18; }
  `,
})
export class DraftsDialog {
  protected readonly drafts = inject(Drafts);
  protected readonly data = inject<DraftsDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<DraftsDialog, DraftsDialogResult>>(MatDialogRef);
  protected readonly filter = signal('');
  private readonly deleted: string[] = [];
  protected readonly shown = computed(() => {
    const f = this.filter().trim().toLowerCase();
    return this.drafts.list().filter((d) => !f || d.title.toLowerCase().includes(f));
  });

  constructor() {
    void this.drafts.refresh();
  }

  protected ago(t: number): string {
    return timeAgo(t);
  }

  /** "3 min ago · bridge.nwl · team “Core” v3, changes not saved to the team · open now". */
  protected meta(d: Draft): string {
    const parts = [this.ago(d.updatedAt)];
    if (d.fileName) parts.push(d.fileName);
    if (d.remote) parts.push(`team “${d.remote.name}” v${d.remote.baseVersion}${d.text !== d.remote.savedText ? ', changes not saved to the team' : ''}`);
    if (d.id === this.data.currentId) parts.push('open now');
    return parts.join(' · ');
  }

  protected open(id: string): void {
    this.ref.close({ open: id, deleted: this.deleted });
  }

  protected async remove(id: string): Promise<void> {
    this.deleted.push(id);
    await this.drafts.remove(id);
  }

  protected close(): void {
    this.ref.close({ deleted: this.deleted });
  }
}
