import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterLink } from '@angular/router';

/** Sign-in through the team's identity provider. */
@Component({
  selector: 'nw-sign-in-page',
  imports: [RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Sign in</h1>
      <p>Sign in to keep netlists on the team server, use the block library and open share links.
        The bench itself works without an account, even offline.</p>
      <p class="note" role="note">Team sign-in is not switched on in this version yet: your netlists are kept
        as drafts in this browser. Open the <a routerLink="/bench">bench</a> to work.</p>
    </section>
  `,
  styles: `.page { padding: 24px; max-width: 640px; } .note { padding: 8px 12px; border-left: 3px solid var(--mat-sys-tertiary); background: var(--mat-sys-surface-container); }`,
})
export class SignInPage {}
