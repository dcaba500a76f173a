import { ChangeDetectionStrategy, Component } from '@angular/core';

/** The standing caution shown beside every result. */
@Component({
  selector: 'nw-cautions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="caution" role="note">
      First-order device models. These figures are for topology sanity checks; they do not replace
      sign-off simulation with your foundry's models, your team's review or local design rules.
    </p>
  `,
  styles: `
    .caution { margin: 16px 0 0; padding: 8px 12px; border-left: 3px solid var(--mat-sys-tertiary);
      background: var(--mat-sys-surface-container); color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
  `,
})
export class Cautions {}
