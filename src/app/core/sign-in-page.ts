import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { Session, signInUrl } from './session';

/** What the server's `/sign-in?problem=CODE` redirects mean, in the user's words. */
const PROBLEMS: Record<string, string> = {
  denied: 'The identity provider did not sign you in: it refused, or the sign-in was cancelled.',
  state_mismatch: 'The sign-in took too long or was started in another tab, so it was not finished. Please try again.',
  invitation_email_mismatch:
    'This invitation was sent to another email address. Sign in with that address, or ask the workspace admin for a new invitation.',
  invitation_unavailable: 'This invitation can no longer be used: it has expired, was used already or was revoked. Ask the workspace admin for a new one.',
  provider_unreachable: 'The identity provider could not be reached just now. Please try again in a moment.',
};

/** The sentence for a sign-in problem code; unknown codes get a general one. */
export function signInProblem(code: string): string {
  return Object.hasOwn(PROBLEMS, code) ? PROBLEMS[code] : 'Signing in did not work this time. Please try again; if it keeps failing, tell your workspace admin.';
}

/** Sign-in through the team's identity provider, and what went wrong when it did not work. */
@Component({
  selector: 'nw-sign-in-page',
  imports: [RouterLink, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Sign in</h1>
      @if (problem(); as p) {
        <p class="problem" role="alert">{{ sentence(p) }}</p>
      }
      @if (session.me(); as me) {
        <p>You are signed in as <strong>{{ me.user.name }}</strong> ({{ me.user.email }}).</p>
        <p class="links">
          <a mat-flat-button routerLink="/netlists">Team netlists</a>
          <a mat-stroked-button routerLink="/bench">Bench</a>
        </p>
      } @else {
        <p>Nodewright signs you in with your team's identity provider: you go to its sign-in page and come
          straight back here. Signed in, you keep netlists on the team server with every revision, share
          links, and see what your role in each workspace allows.</p>
        <p><a mat-flat-button [href]="target()">Sign in</a></p>
        @if (session.state() === 'offline') {
          <p class="note" role="note">The team server cannot be reached just now, so signing in will not work until it is back.</p>
        }
      }
      <p class="note">The <a routerLink="/bench">bench</a> works without an account, even offline: your netlists are kept as
        drafts in this browser until you save them to the team.</p>
    </section>
  `,
  styles: `
    .page { box-sizing: border-box; padding: 32px; max-width: 680px; margin: 0 auto; }
    p { line-height: 1.5; }
    .links { display: flex; gap: 8px; }
    .problem { padding: 8px 12px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    .note { padding: 8px 12px; border-left: 3px solid var(--mat-sys-tertiary); background: var(--mat-sys-surface-container); }
  `,
})
export class SignInPage {
  protected readonly session = inject(Session);

  /** Where to come back to after signing in (`?next=`). */
  readonly next = input<string>();
  /** Why the last sign-in failed (`?problem=`), set by the server's redirect. */
  readonly problem = input<string>();

  /** Only paths of this app come back: signInUrl turns anything else into "/". */
  protected readonly target = computed(() => signInUrl(this.next() || '/bench'));

  protected sentence(code: string): string {
    return signInProblem(code);
  }
}
