import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatDividerModule } from '@angular/material/divider';
import { MatMenuModule } from '@angular/material/menu';
import { MatSnackBar, MatSnackBarModule } from '@angular/material/snack-bar';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Session } from './core/session';
import { apiErrorOf } from './core/team-api';

/**
 * The shell: a top bar with the product name, the main places and who is signed in (with the
 * workspace switcher), then the routed page. The bench never waits for the team server: when it
 * cannot be reached the bar says so quietly and everything else stays usable.
 */
@Component({
  selector: 'nw-root',
  imports: [RouterOutlet, RouterLink, RouterLinkActive, MatToolbarModule, MatButtonModule, MatMenuModule, MatDividerModule, MatSnackBarModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <a class="skip-link" href="#main">Skip to content</a>
    <mat-toolbar class="top-bar" role="banner">
      <a class="brand" routerLink="/bench" aria-label="Nodewright, go to the bench">
        <svg class="mark" viewBox="0 0 32 32" aria-hidden="true">
          <path d="M6 22 L12 10 L16 18 L20 10 L26 22" fill="none" stroke="currentColor" stroke-width="3" stroke-linecap="round" stroke-linejoin="round" />
          <circle cx="16" cy="18" r="2.5" class="mark-dot" />
        </svg>
        <span class="name">Nodewright</span>
      </a>
      <nav class="places" aria-label="Main">
        <a mat-button routerLink="/bench" routerLinkActive="active" ariaCurrentWhenActive="page">Bench</a>
        @if (me()) {
          <a mat-button routerLink="/netlists" routerLinkActive="active" ariaCurrentWhenActive="page">Netlists</a>
        }
        <a mat-button routerLink="/library" routerLinkActive="active" ariaCurrentWhenActive="page">Library</a>
        @if (me() && session.isAdmin() && workspace(); as ws) {
          <a mat-button [routerLink]="['/w', ws.slug, 'admin']" routerLinkActive="active" ariaCurrentWhenActive="page">Members</a>
        }
      </nav>
      <span class="spacer"></span>
      @if (session.state() === 'offline') {
        <span class="offline" role="status">Team server offline — the bench keeps working</span>
      }
      @if (me(); as me) {
        @if (me.workspaces.length > 1 && workspace(); as ws) {
          <button mat-button type="button" class="workspace" [matMenuTriggerFor]="workspaceMenu"
            [attr.aria-label]="'Workspace: ' + ws.name + '. Switch workspace'">{{ ws.name }} ▾</button>
          <mat-menu #workspaceMenu="matMenu" xPosition="before">
            <div class="menu-head" aria-hidden="true">Switch workspace</div>
            @for (w of me.workspaces; track w.slug) {
              <button mat-menu-item type="button" role="menuitemradio" [attr.aria-checked]="w.slug === ws.slug" (click)="switchTo(w.slug)">
                <span class="ws-name" [class.current]="w.slug === ws.slug">{{ w.name }}</span>
                <span class="ws-role">{{ w.role }}</span>
              </button>
            }
          </mat-menu>
        } @else if (workspace(); as ws) {
          <span class="workspace-one" title="Your workspace">{{ ws.name }}</span>
        }
        <button mat-button type="button" class="user" [matMenuTriggerFor]="userMenu" [attr.aria-label]="'Signed in as ' + me.user.name + '. Account menu'">
          {{ me.user.name }} ▾
        </button>
        <mat-menu #userMenu="matMenu" xPosition="before">
          <div class="menu-info">
            <span class="email">{{ me.user.email }}</span>
            @if (workspace(); as ws) {
              <span class="role">{{ roleLabel(ws.role) }} in {{ ws.name }}</span>
            } @else {
              <span class="role">Not a member of any workspace yet</span>
            }
          </div>
          <mat-divider />
          <button mat-menu-item type="button" (click)="signOut()">Sign out</button>
        </mat-menu>
      } @else if (session.state() === 'signed-out') {
        <button mat-stroked-button type="button" (click)="signIn()">Sign in</button>
      }
    </mat-toolbar>
    <main id="main" tabindex="-1">
      <router-outlet />
    </main>
  `,
  styles: `
    :host { display: flex; flex-direction: column; min-height: 100vh; }
    .skip-link { position: absolute; left: -999px; top: 0; }
    .skip-link:focus { left: 8px; top: 8px; z-index: 10; background: var(--mat-sys-surface); padding: 4px 8px; }
    .top-bar { gap: 16px; border-bottom: 1px solid var(--mat-sys-outline-variant); background: var(--mat-sys-surface-container-low); }
    .brand { display: inline-flex; align-items: center; gap: 8px; color: var(--mat-sys-on-surface); text-decoration: none; }
    .mark { width: 28px; height: 28px; color: var(--mat-sys-primary); }
    .mark-dot { fill: var(--mat-sys-tertiary); }
    .name { font-weight: 700; font-size: 1.25rem; letter-spacing: 0.01em; }
    .places { display: flex; gap: 4px; }
    .places a.active { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); }
    .spacer { flex: 1; }
    .offline { font-size: 0.8125rem; line-height: 1.2; padding: 4px 10px; border-radius: 12px; white-space: nowrap;
      color: var(--mat-sys-on-surface-variant); background: var(--mat-sys-surface-container-high); border: 1px solid var(--mat-sys-outline-variant); }
    .workspace-one { font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); white-space: nowrap; }
    .workspace, .user { white-space: nowrap; }
    .user { font-weight: 600; }
    .menu-head { padding: 8px 16px 4px; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .ws-name { display: block; }
    .ws-name.current { font-weight: 700; }
    .ws-role { display: block; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .menu-info { display: flex; flex-direction: column; gap: 2px; padding: 8px 16px 10px; }
    .menu-info .email { font-weight: 600; }
    .menu-info .role { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    main { flex: 1; display: flex; flex-direction: column; outline: none; }
  `,
})
export class App {
  protected readonly session = inject(Session);
  private readonly router = inject(Router);
  private readonly snack = inject(MatSnackBar);

  protected readonly me = this.session.me;
  protected readonly workspace = computed(() => this.session.workspace());

  constructor() {
    void this.session.load();
  }

  protected roleLabel(role: string): string {
    return role.charAt(0).toUpperCase() + role.slice(1);
  }

  /** Works in another workspace; a page addressed by workspace (`/w/slug/…`) follows along. */
  protected switchTo(slug: string): void {
    this.session.chooseWorkspace(slug);
    const m = /^\/w\/[^/]+(\/[^?#]*)?/.exec(this.router.url);
    if (m) void this.router.navigateByUrl(`/w/${encodeURIComponent(slug)}${m[1] ?? '/netlists'}`);
  }

  protected signIn(): void {
    // Coming back to the sign-in page itself would only ask again: go where it was to lead.
    const here = this.router.url;
    const next = this.router.parseUrl(here).queryParamMap.get('next');
    this.session.signIn(here.startsWith('/sign-in') ? (next ?? '/bench') : here);
  }

  protected async signOut(): Promise<void> {
    try {
      await this.session.signOut();
    } catch (err) {
      this.snack.open(`Signed out in this browser. ${apiErrorOf(err).message}`, 'OK', { duration: 8000 });
    }
    await this.router.navigateByUrl('/bench');
  }
}
