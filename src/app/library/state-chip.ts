/**
 * A version's state as a small chip: word and symbol (never colour alone), cool for vetted, warm
 * for in review, plain for a draft, greyed for retired.
 */
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { STATE_CHIP } from './block-words';
import type { BlockState } from './library-api';

@Component({
  selector: 'nw-state-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[class]': '"chip " + state()', '[attr.title]': 'chip().meaning' },
  template: `<span aria-hidden="true">{{ chip().symbol }}</span> @if (version(); as v) { v{{ v }} · }{{ chip().label }}`,
  styles: `
    :host { display: inline-flex; align-items: center; gap: 4px; padding: 1px 8px; border-radius: 10px; font-size: 0.8125rem;
      font-weight: 600; white-space: nowrap; border: 1px solid transparent; line-height: 1.4; }
    :host(.vetted) { background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); }
    :host(.in_review) { background: var(--mat-sys-primary-container); color: var(--mat-sys-on-primary-container); }
    :host(.draft) { border-color: var(--mat-sys-outline); color: var(--mat-sys-on-surface); }
    :host(.retired) { background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface-variant); }
  `,
})
export class StateChip {
  readonly state = input.required<BlockState>();
  /** Shown as "v3 · Vetted" when given. */
  readonly version = input<number>();
  protected readonly chip = computed(() => STATE_CHIP[this.state()] ?? { label: this.state(), symbol: '', meaning: '' });
}
