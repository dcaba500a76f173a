/**
 * What a team page says instead of its content when it has no workspace to show: the server is
 * out of reach, the user is signed out, belongs to no workspace, or not to the one addressed.
 */
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { Session } from '../core/session';
import type { WorkspaceAccess } from './workspace-access';

@Component({
  selector: 'nw-access-notice',
  imports: [RouterLink, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @switch (access().kind) {
      @case ('offline') {
        <p>The team server cannot be reached just now, so this page has nothing to show. The
          <a routerLink="/bench">bench</a> keeps working and keeps your drafts in this browser.</p>
        <button mat-stroked-button type="button" (click)="retry()">Try again</button>
      }
      @case ('signed-out') {
        <p>Sign in with your team's account to see this page.</p>
        <button mat-flat-button type="button" (click)="session.signIn()">Sign in</button>
      }
      @case ('no-workspace') {
        <p>You are not a member of any workspace yet. A workspace admin can invite you; the invitation
          arrives by mail. Meanwhile the <a routerLink="/bench">bench</a> works without one.</p>
      }
      @case ('not-member') {
        <p>You are not a member of the workspace “{{ slug() }}”. Ask one of its admins for an invitation,
          or go to <a routerLink="/netlists">your own workspace's netlists</a>.</p>
      }
    }
  `,
  styles: `
    :host { display: block; padding: 12px 16px; border-left: 3px solid var(--mat-sys-tertiary); background: var(--mat-sys-surface-container); border-radius: 2px; }
    p { margin: 0 0 8px; max-width: 70ch; }
    p:last-child { margin-bottom: 0; }
  `,
})
export class AccessNotice {
  protected readonly session = inject(Session);
  readonly access = input.required<WorkspaceAccess>();

  protected slug(): string {
    const a = this.access();
    return a.kind === 'not-member' ? a.slug : '';
  }

  protected retry(): void {
    void this.session.load(true);
  }
}
