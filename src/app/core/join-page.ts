import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { signInUrl } from './session';
import { apiErrorOf, TeamApi, type InvitationPreview } from './team-api';

/**
 * Where an invitation mail leads (`/join/:token`): who invites whom to which workspace with which
 * role, and the way in, which is signing in with the invited address.
 */
@Component({
  selector: 'nw-join-page',
  imports: [RouterLink, MatButtonModule, MatProgressBarModule, AgoPipe, ExactTimePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Join a team</h1>
      @if (invitation(); as inv) {
        <p class="lead">{{ inv.invitedBy.name }} invites you to join <em>{{ inv.workspace.name }}</em> as {{ article(inv.role) }} {{ inv.role }}.</p>
        <dl>
          <dt>Invited address</dt>
          <dd>{{ inv.email }}</dd>
          <dt>Valid until</dt>
          <dd>{{ inv.expiresAt | exactTime }} ({{ inv.expiresAt | ago }})</dd>
        </dl>
        <p>Sign in with <strong>{{ inv.email }}</strong> at your team's identity provider to accept. The invitation can be used once.</p>
        <p><button mat-flat-button type="button" (click)="join()">Sign in to join</button></p>
      } @else if (problem(); as p) {
        @if (p.status === 404) {
          <p role="alert">This invitation cannot be used: it has expired, was used already or was revoked, or the link is
            incomplete. Ask the workspace admin to send a new one.</p>
        } @else {
          <p role="alert">{{ p.message }}</p>
          <p><button mat-stroked-button type="button" (click)="load()">Try again</button></p>
        }
      } @else {
        <mat-progress-bar mode="indeterminate" aria-label="Loading the invitation" />
      }
      <p class="note">Meanwhile the <a routerLink="/bench">bench</a> works without an account.</p>
    </section>
  `,
  styles: `
    .page { box-sizing: border-box; padding: 32px; max-width: 680px; margin: 0 auto; }
    .lead { font-size: 1.125rem; line-height: 1.5; }
    dl { display: grid; grid-template-columns: max-content 1fr; gap: 4px 16px; margin: 16px 0; }
    dt { color: var(--mat-sys-on-surface-variant); }
    dd { margin: 0; font-weight: 600; }
    .note { margin-top: 24px; color: var(--mat-sys-on-surface-variant); }
  `,
})
export class JoinPage {
  private readonly api = inject(TeamApi);

  /** From `/join/:token`. */
  readonly token = input.required<string>();

  protected readonly invitation = signal<InvitationPreview | undefined>(undefined);
  protected readonly problem = signal<{ status: number; message: string } | undefined>(undefined);

  constructor() {
    effect(() => {
      this.token();
      untracked(() => void this.load());
    });
  }

  protected async load(): Promise<void> {
    this.problem.set(undefined);
    this.invitation.set(undefined);
    try {
      this.invitation.set(await this.api.invitation(this.token()));
    } catch (err) {
      this.problem.set(apiErrorOf(err));
    }
  }

  protected join(): void {
    window.location.assign(signInUrl('/netlists', this.token()));
  }

  protected article(role: string): string {
    return /^[aeiou]/i.test(role) ? 'an' : 'a';
  }
}
