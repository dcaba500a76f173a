/**
 * A workspace's administration (`/w/:slug/admin`): its members and their roles, invitations, and
 * the audit log. Only the workspace's admins see it; the server refuses everyone else anyway.
 */
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatTabsModule } from '@angular/material/tabs';
import { roleAtLeast, Session } from '../core/session';
import { TeamApi } from '../core/team-api';
import { AccessNotice } from '../netlists/access-notice';
import { pageWorkspace } from '../netlists/workspace-access';
import { AuditPanel } from './audit-panel';
import { InvitationsPanel } from './invitations-panel';
import { MembersPanel } from './members-panel';

@Component({
  selector: 'nw-admin-page',
  imports: [RouterLink, MatTabsModule, AccessNotice, MembersPanel, InvitationsPanel, AuditPanel],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <header class="head">
        <h1>Members</h1>
        @if (workspace(); as ws) { <p class="sub">{{ ws.name }}</p> }
      </header>
      @if (workspace(); as ws) {
        @if (isAdmin()) {
          @if (devInboxUrl(); as url) {
            <p class="dev" role="note">Mail goes to the <a [href]="url" target="_blank" rel="noopener">development mail inbox</a> (opens in a new tab).</p>
          }
          <mat-tab-group mat-stretch-tabs="false" mat-align-tabs="start" animationDuration="0ms" class="tabs">
            <mat-tab label="Members">
              <ng-template matTabContent><div class="tab"><nw-members-panel [slug]="ws.slug" [meId]="session.me()?.user?.id" /></div></ng-template>
            </mat-tab>
            <mat-tab label="Invitations">
              <ng-template matTabContent><div class="tab"><nw-invitations-panel [slug]="ws.slug" /></div></ng-template>
            </mat-tab>
            <mat-tab label="Audit log">
              <ng-template matTabContent><div class="tab"><nw-audit-panel [slug]="ws.slug" /></div></ng-template>
            </mat-tab>
          </mat-tab-group>
        } @else {
          <p class="notice">Only the workspace's admins manage members. You are {{ ws.role }} in {{ ws.name }};
            its netlists are on the <a [routerLink]="['/w', ws.slug, 'netlists']">netlists page</a>.</p>
        }
      } @else if (access().kind !== 'loading') {
        <nw-access-notice [access]="access()" />
      }
    </section>
  `,
  styles: `
    :host { display: block; }
    .page { box-sizing: border-box; width: 100%; max-width: 1200px; margin: 0 auto; padding: 24px 32px 48px; }
    .head { display: flex; align-items: baseline; gap: 16px; margin-bottom: 8px; }
    .head h1 { margin: 0; }
    .sub { margin: 0; color: var(--mat-sys-on-surface-variant); }
    .dev { margin: 0 0 8px; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .tab { padding: 16px 2px 8px; }
    .notice { padding: 12px 16px; border-left: 3px solid var(--mat-sys-tertiary); background: var(--mat-sys-surface-container); }
  `,
})
export class AdminPage {
  protected readonly session = inject(Session);
  private readonly api = inject(TeamApi);

  /** From `/w/:slug/admin`. */
  readonly slug = input.required<string>();

  private readonly place = pageWorkspace(() => this.slug());
  protected readonly access = this.place.access;
  protected readonly workspace = this.place.workspace;
  protected readonly isAdmin = computed(() => roleAtLeast(this.workspace()?.role, 'admin'));
  protected readonly devInboxUrl = signal<string | null>(null);

  constructor() {
    effect(() => {
      if (!this.isAdmin()) return;
      untracked(() => void this.api.settings().then((s) => this.devInboxUrl.set(s.devInboxUrl), () => undefined));
    });
  }
}
