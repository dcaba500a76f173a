import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';

/** Sign-in through the team's identity provider. */
@Component({
  selector: 'nw-sign-in-page',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Sign in</h1>
      <p>Sign in to keep netlists on the team server, use the block library and open share links.
        The bench itself works without an account, even offline.</p>
      <a mat-flat-button href="/api/auth/sign-in">Sign in with your team account</a>
    </section>
  `,
  styles: `.page { padding: 24px; max-width: 640px; }`,
})
export class SignInPage {}
