import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { EXAMPLES } from '../bench/examples';
import { Cautions } from '../core/cautions';
import { Session } from '../core/session';

/**
 * `/`: the front page. What the product is for in two sentences, the Strainlab examples one click
 * from a solved bench, the standing cautions, and the way on for someone who already knows it.
 */
@Component({
  selector: 'nw-home-page',
  imports: [RouterLink, MatButtonModule, Cautions],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="page">
      <section class="intro" aria-labelledby="nw-home-title">
        <h1 id="nw-home-title">A bench for analog circuits, in the browser</h1>
        <p class="lead">Nodewright solves a text netlist while you type it: the bias point with each transistor's region and
          hybrid-pi values, the frequency response, differential and common-mode gains with CMRR, and the checks you state.
          It tells you in seconds whether a topology is sane, and your team keeps its netlists, revisions and vetted blocks
          together on its own server.</p>
        <p class="actions">
          <a mat-flat-button routerLink="/bench">Continue to the bench</a>
          <a mat-stroked-button routerLink="/reference">Language reference</a>
          @if (session.me()) {
            <a mat-button routerLink="/netlists">Team netlists</a>
          }
        </p>
      </section>

      <section aria-labelledby="nw-home-examples">
        <h2 id="nw-home-examples">Open an example</h2>
        <p class="quiet">Strainlab, a bridge-sensor front end, in four steps: each opens in the bench as a new draft, solved.</p>
        <ul class="examples">
          @for (e of examples; track e.id) {
            <li>
              <a class="example" routerLink="/bench" [queryParams]="{ example: e.id }" [attr.data-example]="e.id">
                <span class="step" aria-hidden="true">{{ $index + 1 }}</span>
                <span class="what">
                  <span class="label">{{ e.label }}</span>
                  <span class="blurb">{{ e.blurb }}</span>
                </span>
              </a>
            </li>
          }
        </ul>
      </section>

      <section aria-labelledby="nw-home-cautions">
        <h2 id="nw-home-cautions">Before you rely on the numbers</h2>
        <nw-cautions />
        <p class="quiet small">Your netlists stay in this browser as drafts until you sign in and save them to your team;
          once opened, the bench also opens and solves offline.</p>
      </section>
    </div>
  `,
  styles: `
    :host { display: block; }
    .page { box-sizing: border-box; max-width: 980px; margin: 0 auto; padding: 28px 32px 48px; }
    .intro h1 { font: var(--mat-sys-headline-large); margin: 0 0 14px; }
    .lead { font-size: 1.1875rem; line-height: 1.55; max-width: 68ch; margin: 0 0 20px; }
    .actions { display: flex; flex-wrap: wrap; gap: 10px; margin: 0 0 24px; }
    h2 { font: var(--mat-sys-title-large); font-weight: 700; margin: 22px 0 6px; }
    .quiet { color: var(--mat-sys-on-surface-variant); margin: 0 0 12px; line-height: 1.5; }
    .small { font-size: 0.875rem; margin-top: 10px; }
    .examples { list-style: none; margin: 0; padding: 0; display: grid; grid-template-columns: repeat(auto-fill, minmax(360px, 1fr)); gap: 10px; }
    .example { display: flex; gap: 12px; align-items: flex-start; height: 100%; box-sizing: border-box; padding: 12px 14px;
      border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; background: var(--mat-sys-surface-container-lowest);
      color: var(--mat-sys-on-surface); text-decoration: none; }
    .example:hover { border-color: var(--mat-sys-primary); background: var(--mat-sys-surface-container-low); }
    .example:hover .label { text-decoration: underline; }
    .step { flex: none; width: 28px; height: 28px; border-radius: 50%; display: grid; place-items: center; font-weight: 700;
      background: var(--mat-sys-primary); color: var(--mat-sys-on-primary); }
    .what { display: flex; flex-direction: column; gap: 2px; }
    .label { font-weight: 700; font-size: 1.0625rem; color: var(--mat-sys-primary); }
    .blurb { color: var(--mat-sys-on-surface-variant); line-height: 1.4; }
  `,
})
export class HomePage {
  protected readonly session = inject(Session);
  protected readonly examples = EXAMPLES;
}
