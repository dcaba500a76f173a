/**
 * Inviting someone to the workspace by mail, and the invitations still waiting to be accepted
 * (which can be revoked). The link travels by mail only; the page never shows it.
 */
import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import { FormControl, FormGroup, FormGroupDirective, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { apiErrorOf, TeamApi, type Invitation, type Role } from '../core/team-api';
import { confirmWith } from '../netlists/confirm-dialog';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { ROLE_CHOICES } from './roles';

@Component({
  selector: 'nw-invitations-panel',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatButtonModule, MatTableModule, MatProgressBarModule, AgoPipe, ExactTimePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2>Invite someone</h2>
    <form class="invite" [formGroup]="form" (ngSubmit)="invite(formDir)" #formDir="ngForm">
      <mat-form-field appearance="outline" class="email">
        <mat-label>Email address</mat-label>
        <input matInput type="email" formControlName="email" autocomplete="off" required />
        @if (form.controls.email.hasError('required')) { <mat-error>Enter the address to send the invitation to.</mat-error> }
        @else if (form.controls.email.hasError('email')) { <mat-error>This is not an email address.</mat-error> }
      </mat-form-field>
      <mat-form-field appearance="outline" class="role">
        <mat-label>Role</mat-label>
        <mat-select formControlName="role">
          @for (r of roles; track r.value) { <mat-option [value]="r.value">{{ r.label }}</mat-option> }
        </mat-select>
      </mat-form-field>
      <button mat-flat-button type="submit" [disabled]="sending()">Send invitation</button>
    </form>
    @if (outcome(); as o) { <p class="outcome" [class.warn]="o.warn" role="status">{{ o.text }}</p> }

    <h2>Waiting to be accepted</h2>
    <div class="bar-slot">@if (loading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading invitations" /> }</div>
    @if (problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
    @if (pending().length > 0) {
      <div class="frame">
      <table mat-table [dataSource]="pending()" aria-label="Pending invitations">
        <ng-container matColumnDef="email">
          <th mat-header-cell *matHeaderCellDef>Email</th>
          <td mat-cell *matCellDef="let i">{{ i.email }}</td>
        </ng-container>
        <ng-container matColumnDef="role">
          <th mat-header-cell *matHeaderCellDef>Role</th>
          <td mat-cell *matCellDef="let i">{{ i.role }}</td>
        </ng-container>
        <ng-container matColumnDef="invitedBy">
          <th mat-header-cell *matHeaderCellDef>Invited by</th>
          <td mat-cell *matCellDef="let i">{{ i.invitedBy.name }} <span class="muted" [title]="i.createdAt | exactTime">{{ i.createdAt | ago }}</span></td>
        </ng-container>
        <ng-container matColumnDef="expires">
          <th mat-header-cell *matHeaderCellDef>Expires</th>
          <td mat-cell *matCellDef="let i"><span [title]="i.expiresAt | exactTime">{{ i.expiresAt | ago }}</span></td>
        </ng-container>
        <ng-container matColumnDef="actions">
          <th mat-header-cell *matHeaderCellDef class="actions"><span class="cdk-visually-hidden">Actions</span></th>
          <td mat-cell *matCellDef="let i" class="actions">
            <button mat-button type="button" class="revoke" (click)="revoke(i)" [attr.aria-label]="'Revoke the invitation to ' + i.email">Revoke…</button>
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let i; columns: columns"></tr>
      </table>
    </div>
    } @else if (!loading() && !problem()) {
      <p class="empty">No invitation is waiting. Invitations expire after 7 days and can be used once.</p>
    }
  `,
  styles: `
    :host { display: block; }
    h2 { font: var(--mat-sys-title-medium); margin: 8px 0 12px; }
    h2 + .bar-slot { margin-top: -8px; }
    .invite { display: flex; align-items: flex-start; gap: 12px; flex-wrap: wrap; }
    .email { width: 340px; }
    .role { width: 160px; }
    .invite button { margin-top: 10px; }
    .outcome { margin: 0 0 16px; padding: 8px 12px; border-left: 3px solid var(--mat-sys-tertiary); background: var(--mat-sys-surface-container); }
    .outcome.warn { border-left-color: #9a6700; background: #fbf1dc; color: #4d3500; }
    .bar-slot { height: 4px; margin-bottom: 4px; }
    .problem { padding: 8px 12px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    .frame { border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; overflow: hidden; }
    table { width: 100%; background: var(--mat-sys-surface-container-lowest); }
    .muted { display: block; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .actions { text-align: right; width: 1%; white-space: nowrap; }
    .revoke { color: #8c1d18; }
    .empty { color: var(--mat-sys-on-surface-variant); }
  `,
})
export class InvitationsPanel {
  private readonly api = inject(TeamApi);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);

  readonly slug = input.required<string>();

  protected readonly roles = ROLE_CHOICES;
  protected readonly columns = ['email', 'role', 'invitedBy', 'expires', 'actions'];
  protected readonly form = new FormGroup({
    email: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.email] }),
    role: new FormControl<Role>('designer', { nonNullable: true }),
  });
  protected readonly sending = signal(false);
  protected readonly outcome = signal<{ text: string; warn: boolean } | undefined>(undefined);
  protected readonly pending = signal<Invitation[]>([]);
  protected readonly loading = signal(false);
  protected readonly problem = signal<string | undefined>(undefined);

  constructor() {
    effect(() => {
      const slug = this.slug();
      untracked(() => void this.load(slug));
    });
  }

  protected async invite(formDir: FormGroupDirective): Promise<void> {
    if (this.form.invalid) return;
    const { email, role } = this.form.getRawValue();
    this.sending.set(true);
    this.outcome.set(undefined);
    try {
      const inv = await this.api.invite(this.slug(), { email: email.trim(), role });
      this.outcome.set(
        inv.mailed === false
          ? { text: `The invitation for ${inv.email} was created, but the mail could not be sent. Revoke it and invite again later.`, warn: true }
          : { text: `Invitation mailed to ${inv.email}.`, warn: false },
      );
      formDir.resetForm({ email: '', role: 'designer' });
      await this.load(this.slug());
    } catch (err) {
      this.outcome.set({ text: apiErrorOf(err).message, warn: true });
    } finally {
      this.sending.set(false);
    }
  }

  protected async revoke(i: Invitation): Promise<void> {
    const yes = await confirmWith(this.dialog, {
      title: 'Revoke the invitation?',
      message: `The link mailed to ${i.email} will stop working. You can invite the same address again later.`,
      action: 'Revoke',
    });
    if (!yes) return;
    try {
      await this.api.revokeInvitation(i.id);
      this.snack.open(`The invitation to ${i.email} was revoked.`, undefined, { duration: 3000 });
    } catch (err) {
      this.snack.open(apiErrorOf(err).message, 'OK', { duration: 8000 });
    }
    await this.load(this.slug());
  }

  private async load(slug: string): Promise<void> {
    this.loading.set(true);
    try {
      const res = await this.api.invitations(slug);
      if (slug !== this.slug()) return;
      this.pending.set(res.items);
      this.problem.set(undefined);
    } catch (err) {
      this.problem.set(apiErrorOf(err).message);
    } finally {
      this.loading.set(false);
    }
  }

}
