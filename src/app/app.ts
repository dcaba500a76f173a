import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatToolbarModule } from '@angular/material/toolbar';

/** The shell: a top bar with the product name and the main places, then the routed page. */
@Component({
  selector: 'nw-root',
  imports: [RouterOutlet, RouterLink, RouterLinkActive, MatToolbarModule, MatButtonModule],
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
        <a mat-button routerLink="/library" routerLinkActive="active" ariaCurrentWhenActive="page">Library</a>
      </nav>
      <span class="spacer"></span>
      <a mat-stroked-button routerLink="/sign-in" routerLinkActive="active">Sign in</a>
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
    main { flex: 1; display: flex; flex-direction: column; outline: none; }
  `,
})
export class App {}
