/**
 * Stands where a result panel goes until that panel is built.
 */
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { SolveResult } from '../../../solver';

@Component({
  selector: 'nw-panel-placeholder',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<p class="ph">The {{ name() }} panel is on its way.@if (result()?.op) { The netlist solved; its numbers are in the other panels. }</p>`,
  styles: `.ph { color: var(--mat-sys-on-surface-variant); padding: 16px; }`,
})
export class PanelPlaceholder {
  readonly name = input('');
  readonly result = input<SolveResult | undefined>();
}
