/**
 * A version's pins and params with what their doc lines say (and their defaults); one the
 * author left undocumented says so, since a reviewer should ask for it.
 */
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { DocumentedName } from './library-api';

@Component({
  selector: 'nw-block-pins',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h3>Pins</h3>
    @if (pins().length) {
      <dl>
        @for (p of pins(); track p.name) {
          <dt><code>{{ p.name }}</code></dt>
          <dd [class.missing]="!p.doc">{{ p.doc || 'not documented' }}</dd>
        }
      </dl>
    } @else { <p class="none">No pins.</p> }
    <h3>Params</h3>
    @if (params().length) {
      <dl>
        @for (p of params(); track p.name) {
          <dt><code>{{ p.name }}</code>@if (p.default) { <span class="default"> = {{ p.default }}</span> }</dt>
          <dd [class.missing]="!p.doc">{{ p.doc || 'not documented' }}</dd>
        }
      </dl>
    } @else { <p class="none">No params: the block has none to set.</p> }
  `,
  styles: `
    :host { display: block; font-size: 0.875rem; }
    h3 { font: var(--mat-sys-title-small); margin: 0 0 4px; }
    h3:not(:first-child) { margin-top: 12px; }
    dl { display: grid; grid-template-columns: max-content 1fr; gap: 4px 12px; margin: 0; }
    dt { font-weight: 600; white-space: nowrap; }
    dd { margin: 0; }
    code { font-size: 0.8125rem; }
    .default { font-weight: 400; color: var(--mat-sys-on-surface-variant); font-family: ui-monospace, "DejaVu Sans Mono", Menlo, monospace; font-size: 0.8125rem; }
    .missing, .none { color: var(--mat-sys-on-surface-variant); font-style: italic; }
    .none { margin: 0; }
  `,
})
export class BlockPins {
  readonly pins = input.required<readonly DocumentedName[]>();
  readonly params = input.required<readonly DocumentedName[]>();
}
