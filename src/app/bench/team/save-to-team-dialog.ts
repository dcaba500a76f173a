/**
 * "Save to team" for a draft not linked yet: a name and who may see it, then the netlist is
 * created in the current workspace. The dialog makes the call itself so a refusal is shown where
 * the name was typed; the draft is untouched until the server has answered.
 */
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { apiErrorOf, TeamApi, type Netlist, type Visibility, type WorkspaceRef } from '../../core/team-api';

/** A netlist name is 1–120 characters (docs/api.md). */
export const MAX_NAME = 120;

export interface SaveToTeamData {
  source: string;
  /** From the netlist's title line. */
  defaultName: string;
  workspace: WorkspaceRef;
}

/** The server's refusal as one sentence (validation details first). */
export function refusalText(err: unknown): string {
  const e = apiErrorOf(err);
  if (e.status === 0) return 'The team server cannot be reached. Your draft stays in this browser; try again when you are back online.';
  const details = Array.isArray(e.details) ? (e.details as { message?: string }[]).map((d) => d.message).filter(Boolean) : [];
  return details.length ? `${e.message} ${details.join(' ')}` : e.message;
}

@Component({
  selector: 'nw-save-to-team-dialog',
  imports: [MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatRadioModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Save to team</h2>
    <form (submit)="$event.preventDefault(); create()">
      <mat-dialog-content>
        <p class="lead">A team netlist in <strong>{{ data.workspace.name }}</strong>, version 1. This draft stays linked to it:
          later saves add versions.</p>
        <mat-form-field class="name">
          <mat-label>Name</mat-label>
          <input matInput [value]="name()" (input)="name.set($any($event.target).value)" [attr.maxlength]="max" required cdkFocusInitial />
          <mat-hint align="end">{{ name().trim().length }} / {{ max }}</mat-hint>
          @if (nameProblem(); as p) { <mat-hint class="bad">{{ p }}</mat-hint> }
        </mat-form-field>
        <mat-radio-group class="who" aria-label="Who can see it" [value]="visibility()" (change)="visibility.set($event.value)">
          <mat-radio-button value="workspace">Everyone in {{ data.workspace.name }}</mat-radio-button>
          <mat-radio-button value="private">Only me</mat-radio-button>
        </mat-radio-group>
        @if (problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy() || !!nameProblem()">{{ busy() ? 'Saving…' : 'Save to team' }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .lead { margin: 0 0 12px; max-width: 52ch; }
    .name { width: 100%; }
    .who { display: flex; flex-direction: column; gap: 2px; margin-top: 4px; }
    .bad { color: #8c1d18; }
    .problem { color: #8c1d18; margin: 8px 0 0; max-width: 52ch; }
  `,
})
export class SaveToTeamDialog {
  protected readonly data = inject<SaveToTeamData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<SaveToTeamDialog, Netlist>>(MatDialogRef);
  private readonly api = inject(TeamApi);
  protected readonly max = MAX_NAME;

  protected readonly name = signal(this.data.defaultName.slice(0, MAX_NAME));
  protected readonly visibility = signal<Visibility>('workspace');
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | undefined>(undefined);
  protected readonly nameProblem = computed(() => {
    const n = this.name().trim();
    if (!n) return 'Give the netlist a name.';
    if (n.length > MAX_NAME) return `At most ${MAX_NAME} characters.`;
    return undefined;
  });

  protected async create(): Promise<void> {
    if (this.busy() || this.nameProblem()) return;
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      const netlist = await this.api.createNetlist(this.data.workspace.slug, { name: this.name().trim(), source: this.data.source, visibility: this.visibility() });
      this.ref.close(netlist);
    } catch (err) {
      this.problem.set(refusalText(err));
    } finally {
      this.busy.set(false);
    }
  }
}
