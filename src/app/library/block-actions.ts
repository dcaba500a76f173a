/**
 * What can be done with the version on the page, offered as the server's `can` and the caller's
 * role allow: open it in the bench, copy its `use` line, edit the draft, propose a new version,
 * retire it. (Submitting and reviewing have panels of their own: they take words.)
 */
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import type { BlockVersion } from './library-api';
import { benchQuery } from './library-links';

export type BlockAction = 'use' | 'edit' | 'propose' | 'retire';

@Component({
  selector: 'nw-block-actions',
  imports: [RouterLink, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <a mat-stroked-button routerLink="/bench" [queryParams]="bench()" [attr.aria-label]="'Open ' + version().path + ' version ' + version().version + ' in the bench as a new draft'">Open in bench</a>
    <button mat-stroked-button type="button" (click)="act.emit('use')">Use in my netlist</button>
    @if (version().can.edit) { <button mat-stroked-button type="button" [disabled]="busy()" (click)="act.emit('edit')">Edit draft</button> }
    @if (canWrite()) { <button mat-stroked-button type="button" [disabled]="busy()" (click)="act.emit('propose')">Propose a new version</button> }
    @if (version().can.retire) { <button mat-button type="button" class="retire" [disabled]="busy()" (click)="act.emit('retire')">Retire…</button> }
  `,
  styles: `
    :host { display: flex; flex-wrap: wrap; gap: 8px; align-items: center; }
    .retire { color: #8c1d18; }
  `,
})
export class BlockActions {
  readonly version = input.required<BlockVersion>();
  /** Designer or more: may propose versions. */
  readonly canWrite = input(false);
  readonly busy = input(false);
  readonly act = output<BlockAction>();

  protected bench(): { block: string } {
    return benchQuery(this.version().path, this.version().version);
  }
}
