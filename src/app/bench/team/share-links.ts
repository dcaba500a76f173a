/**
 * The share links of one netlist (the user's own; an admin sees everyone's): which version each
 * shows, when it expires, whether it is still active, how often it was opened — and revoking
 * one, after a confirmation in the same row.
 */
import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { Session } from '../../core/session';
import { apiErrorOf, TeamApi, type ShareLink } from '../../core/team-api';
import { expiresText, openedText, shortDate } from './share-options';

const STATE_WORDS: Record<ShareLink['state'], string> = { active: 'active', expired: 'expired', revoked: 'revoked' };

@Component({
  selector: 'nw-share-links',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h3 class="h" id="nw-share-links-title">Links to this netlist</h3>
    @if (problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
    @if (items() === undefined) {
      <p class="quiet">Loading the links…</p>
    } @else if (items()!.length === 0) {
      <p class="quiet">No links yet.</p>
    } @else {
      <ul class="links" aria-labelledby="nw-share-links-title">
        @for (l of items(); track l.id) {
          <li [class.inactive]="l.state !== 'active'">
            <div class="what">
              <span><strong>v{{ l.version }}</strong> · made {{ date(l.createdAt) }}@if (l.createdBy.id !== myId()) { by {{ l.createdBy.name }} }</span>
              <span class="meta">{{ expires(l) }} · {{ opened(l) }}</span>
            </div>
            <span class="state" [class]="l.state">{{ stateWord(l) }}</span>
            @if (l.state === 'active') {
              @if (confirming() === l.id) {
                <span class="confirm" role="group" [attr.aria-label]="'Revoke the link to v' + l.version + ' made ' + date(l.createdAt)">
                  <span>Whoever opens it will be told it was revoked.</span>
                  <button mat-flat-button type="button" (click)="revoke(l)" [disabled]="busy()">Yes, revoke</button>
                  <button mat-button type="button" (click)="confirming.set(undefined)">Keep it</button>
                </span>
              } @else {
                <button mat-stroked-button type="button" (click)="confirming.set(l.id)">Revoke</button>
              }
            }
          </li>
        }
      </ul>
    }
  `,
  styles: `
    .h { font: var(--mat-sys-title-small); margin: 16px 0 6px; }
    .quiet { color: var(--mat-sys-on-surface-variant); margin: 4px 0; }
    .problem { color: #8c1d18; }
    .links { list-style: none; margin: 0; padding: 0; }
    li { display: flex; align-items: center; gap: 10px; padding: 6px 4px; border-bottom: 1px solid var(--mat-sys-outline-variant); flex-wrap: wrap; }
    li.inactive .what { color: var(--mat-sys-on-surface-variant); }
    .what { flex: 1; display: flex; flex-direction: column; min-width: 240px; }
    .meta { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .state { font-size: 0.75rem; font-weight: 700; padding: 1px 8px; border-radius: 8px; background: var(--mat-sys-surface-container-high); }
    .state.active { background: #d7eedf; color: #0c4a2f; }
    .state.revoked { background: #f7d9d6; color: #7a1812; }
    .confirm { display: flex; align-items: center; gap: 6px; font-size: 0.875rem; flex-wrap: wrap; }
  `,
})
export class ShareLinks {
  private readonly api = inject(TeamApi);
  private readonly session = inject(Session);

  readonly netlistId = input.required<string>();
  /** Changes when a link was just made, to list it. */
  readonly refreshKey = input(0);

  protected readonly items = signal<ShareLink[] | undefined>(undefined);
  protected readonly problem = signal<string | undefined>(undefined);
  protected readonly confirming = signal<string | undefined>(undefined);
  protected readonly busy = signal(false);
  protected readonly myId = () => this.session.me()?.user.id;

  constructor() {
    effect(() => {
      const id = this.netlistId();
      this.refreshKey();
      untracked(() => void this.load(id));
    });
  }

  protected date(iso: string): string {
    return shortDate(iso);
  }
  protected expires(l: ShareLink): string {
    return expiresText(l);
  }
  protected opened(l: ShareLink): string {
    return openedText(l);
  }
  protected stateWord(l: ShareLink): string {
    return STATE_WORDS[l.state];
  }

  protected async revoke(link: ShareLink): Promise<void> {
    this.busy.set(true);
    try {
      await this.api.revokeShare(link.id);
      this.confirming.set(undefined);
      await this.load(this.netlistId());
    } catch (err) {
      this.problem.set(`The link was not revoked: ${apiErrorOf(err).message}`);
    } finally {
      this.busy.set(false);
    }
  }

  private async load(id: string): Promise<void> {
    try {
      const { items } = await this.api.shares(id);
      this.items.set(items);
      this.problem.set(undefined);
    } catch (err) {
      this.items.set(this.items() ?? []);
      this.problem.set(`The links could not be listed: ${apiErrorOf(err).message}`);
    }
  }
}
