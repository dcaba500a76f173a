/**
 * Asks for a netlist's name, and for a new one who may see it. Used for "New netlist" and
 * "Rename"; closes with the answer or with nothing when cancelled.
 */
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { type AbstractControl, FormControl, FormGroup, ReactiveFormsModule, type ValidationErrors } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import type { Visibility } from '../core/team-api';

export interface NameDialogData {
  title: string;
  action: string;
  name?: string;
  /** Set to ask for visibility too (new netlists); the workspace's name for the sentence. */
  askVisibility?: { workspaceName: string };
}

export interface NameDialogResult {
  name: string;
  visibility: Visibility;
}

/** The server accepts names of 1–120 characters (docs/api.md). */
export const NAME_MAX = 120;

/** The name as it will be stored (one line, trimmed), or a sentence saying why it cannot be. */
export function checkNetlistName(raw: string): { name: string } | { problem: string } {
  const name = raw.replace(/\s+/g, ' ').trim();
  if (!name) return { problem: 'Give the netlist a name.' };
  if (name.length > NAME_MAX) return { problem: `A name has at most ${NAME_MAX} characters; this one has ${name.length}.` };
  return { name };
}

@Component({
  selector: 'nw-name-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatRadioModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()">
      <mat-dialog-content>
        <mat-form-field class="name" appearance="outline">
          <mat-label>Name</mat-label>
          <input matInput formControlName="name" cdkFocusInitial required autocomplete="off" />
          @if (form.controls.name.errors?.['name']; as p) { <mat-error>{{ p }}</mat-error> }
          <mat-hint align="end">{{ form.controls.name.value.trim().length }} / {{ nameMax }}</mat-hint>
        </mat-form-field>
        @if (data.askVisibility; as v) {
          <mat-radio-group class="vis" formControlName="visibility" aria-label="Who can see it">
            <mat-radio-button value="workspace">Everyone in {{ v.workspaceName }}</mat-radio-button>
            <mat-radio-button value="private">Only me (private)</mat-radio-button>
          </mat-radio-group>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit">{{ data.action }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .name { width: 100%; min-width: 380px; margin-top: 4px; }
    .vis { display: flex; flex-direction: column; gap: 2px; }
  `,
})
export class NameDialog {
  protected readonly data = inject<NameDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<NameDialog, NameDialogResult>>(MatDialogRef);
  protected readonly nameMax = NAME_MAX;
  protected readonly form = new FormGroup({
    name: new FormControl(this.data.name ?? '', { nonNullable: true, validators: nameValidator }),
    visibility: new FormControl<Visibility>('workspace', { nonNullable: true }),
  });

  protected submit(): void {
    const c = checkNetlistName(this.form.controls.name.value);
    if ('problem' in c) {
      this.form.markAllAsTouched();
      return;
    }
    this.ref.close({ name: c.name, visibility: this.form.controls.visibility.value });
  }
}

function nameValidator(control: AbstractControl<string>): ValidationErrors | null {
  const c = checkNetlistName(control.value);
  return 'problem' in c ? { name: c.problem } : null;
}
