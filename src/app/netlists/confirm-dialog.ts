/**
 * A yes/no question before something that cannot be taken back lightly (deleting a netlist,
 * removing a member, revoking an invitation). Closes with true when confirmed.
 */
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule } from '@angular/material/dialog';
import { firstValueFrom } from 'rxjs';

export interface ConfirmDialogData {
  title: string;
  message: string;
  /** The confirming button's words, e.g. "Delete". */
  action: string;
}

@Component({
  selector: 'nw-confirm-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content><p class="message">{{ data.message }}</p></mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false" cdkFocusInitial>Cancel</button>
      <button mat-flat-button type="button" class="confirm" [mat-dialog-close]="true">{{ data.action }}</button>
    </mat-dialog-actions>
  `,
  styles: `
    .message { margin: 0; max-width: 460px; }
    .confirm { --mat-button-filled-container-color: #8c1d18; --mat-button-filled-label-text-color: #fff; }
  `,
})
export class ConfirmDialog {
  protected readonly data = inject<ConfirmDialogData>(MAT_DIALOG_DATA);
}

/** Opens the question and resolves true only when the user confirms. */
export async function confirmWith(dialog: MatDialog, data: ConfirmDialogData): Promise<boolean> {
  const ref = dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, autoFocus: 'first-tabbable', role: 'alertdialog' });
  return (await firstValueFrom(ref.afterClosed())) === true;
}
