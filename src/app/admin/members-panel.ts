/**
 * A workspace's members: change a role (saved at once) or remove someone. The server refuses to
 * leave a workspace without an admin (409 `last_admin`); its sentence is shown as it comes.
 */
import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { Session } from '../core/session';
import { apiErrorOf, TeamApi, type Member, type Role } from '../core/team-api';
import { confirmWith } from '../netlists/confirm-dialog';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { ROLE_CHOICES } from './roles';

@Component({
  selector: 'nw-members-panel',
  imports: [MatTableModule, MatSelectModule, MatFormFieldModule, MatButtonModule, MatProgressBarModule, AgoPipe, ExactTimePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="bar-slot">@if (loading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading members" /> }</div>
    @if (problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
    <div class="frame">
      <table mat-table [dataSource]="members()" aria-label="Members">
      <ng-container matColumnDef="name">
        <th mat-header-cell *matHeaderCellDef>Name</th>
        <td mat-cell *matCellDef="let m"><span class="name">{{ m.name }}</span>@if (m.userId === meId()) { <span class="you">you</span> }</td>
      </ng-container>
      <ng-container matColumnDef="email">
        <th mat-header-cell *matHeaderCellDef>Email</th>
        <td mat-cell *matCellDef="let m">{{ m.email }}</td>
      </ng-container>
      <ng-container matColumnDef="role">
        <th mat-header-cell *matHeaderCellDef>Role</th>
        <td mat-cell *matCellDef="let m">
          <mat-form-field appearance="outline" subscriptSizing="dynamic" class="role">
            <mat-select [value]="m.role" (selectionChange)="changeRole(m, $event.value)" [disabled]="busy() === m.userId"
              [aria-label]="'Role of ' + m.name">
              @for (r of roles; track r.value) { <mat-option [value]="r.value">{{ r.label }}</mat-option> }
            </mat-select>
          </mat-form-field>
        </td>
      </ng-container>
      <ng-container matColumnDef="joined">
        <th mat-header-cell *matHeaderCellDef>Joined</th>
        <td mat-cell *matCellDef="let m"><span [title]="m.joinedAt | exactTime">{{ m.joinedAt | ago }}</span></td>
      </ng-container>
      <ng-container matColumnDef="actions">
        <th mat-header-cell *matHeaderCellDef class="actions"><span class="cdk-visually-hidden">Actions</span></th>
        <td mat-cell *matCellDef="let m" class="actions">
          <button mat-button type="button" class="remove" (click)="remove(m)" [disabled]="busy() === m.userId" [attr.aria-label]="'Remove ' + m.name + ' from the workspace'">Remove…</button>
        </td>
      </ng-container>
      <tr mat-header-row *matHeaderRowDef="columns"></tr>
      <tr mat-row *matRowDef="let m; columns: columns" [class.me]="m.userId === meId()"></tr>
    </table>
    </div>
    <p class="roles-help">Viewers read the workspace's netlists; designers also create, save, upload and share; reviewers also
      vet library blocks; admins also manage members and invitations and read the audit log.</p>
  `,
  styles: `
    :host { display: block; }
    .bar-slot { height: 4px; margin-bottom: 4px; }
    .problem { padding: 8px 12px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    .frame { border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; overflow: hidden; }
    table { width: 100%; background: var(--mat-sys-surface-container-lowest); }
    .name { font-weight: 600; }
    .you { margin-left: 8px; padding: 1px 6px; border-radius: 8px; font-size: 0.75rem; background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); }
    tr.me { background: var(--mat-sys-surface-container-low); }
    .role { width: 150px; --mat-form-field-container-height: 40px; --mat-form-field-container-vertical-padding: 8px; }
    .actions { text-align: right; width: 1%; white-space: nowrap; }
    .remove { color: #8c1d18; }
    .roles-help { margin: 12px 0 0; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); max-width: 80ch; }
  `,
})
export class MembersPanel {
  private readonly api = inject(TeamApi);
  private readonly session = inject(Session);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);

  readonly slug = input.required<string>();
  readonly meId = input<string | undefined>();

  protected readonly columns = ['name', 'email', 'role', 'joined', 'actions'];
  protected readonly roles = ROLE_CHOICES;
  protected readonly members = signal<Member[]>([]);
  protected readonly loading = signal(false);
  protected readonly problem = signal<string | undefined>(undefined);
  /** The member whose change is on its way, so it is not sent twice. */
  protected readonly busy = signal<string | undefined>(undefined);

  constructor() {
    effect(() => {
      const slug = this.slug();
      untracked(() => void this.load(slug));
    });
  }

  protected async changeRole(m: Member, role: Role): Promise<void> {
    this.busy.set(m.userId);
    try {
      const saved = await this.api.changeRole(this.slug(), m.userId, role);
      this.snack.open(`${saved.name} is now ${saved.role}.`, undefined, { duration: 3000 });
      if (m.userId === this.meId()) await this.session.load(true); // one's own role changes what the app offers
    } catch (err) {
      this.snack.open(apiErrorOf(err).message, 'OK', { duration: 10000 });
    } finally {
      this.busy.set(undefined);
      await this.load(this.slug()); // also puts a refused change back in its select
    }
  }

  protected async remove(m: Member): Promise<void> {
    const self = m.userId === this.meId();
    const yes = await confirmWith(this.dialog, {
      title: self ? 'Leave this workspace?' : `Remove ${m.name}?`,
      message: self
        ? 'You will no longer see its netlists; an admin would have to invite you again.'
        : `${m.name} (${m.email}) will no longer see the workspace's netlists. Their netlists stay in the workspace.`,
      action: self ? 'Leave' : 'Remove',
    });
    if (!yes) return;
    this.busy.set(m.userId);
    try {
      await this.api.removeMember(this.slug(), m.userId);
      this.snack.open(self ? 'You left the workspace.' : `${m.name} was removed.`, undefined, { duration: 3000 });
      if (self) await this.session.load(true);
      else await this.load(this.slug());
    } catch (err) {
      this.snack.open(apiErrorOf(err).message, 'OK', { duration: 10000 });
    } finally {
      this.busy.set(undefined);
    }
  }

  private async load(slug: string): Promise<void> {
    this.loading.set(true);
    try {
      const res = await this.api.members(slug);
      if (slug !== this.slug()) return;
      this.members.set(res.items);
      this.problem.set(undefined);
    } catch (err) {
      this.problem.set(apiErrorOf(err).message);
    } finally {
      this.loading.set(false);
    }
  }

}
