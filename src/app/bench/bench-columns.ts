/**
 * The bench's two columns: the netlist (editor above, problems below) on the left, the results
 * on the right. The bench and the shared view both lay out through it, so they look the same.
 * Content: an element marked `netlist`, one marked `problems`, and the results.
 */
import { ChangeDetectionStrategy, Component } from '@angular/core';

@Component({
  selector: 'nw-bench-columns',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="left" aria-label="Netlist">
      <ng-content select="[netlist]" />
      <div class="problems"><ng-content select="[problems]" /></div>
    </section>
    <section class="right" aria-label="Results"><ng-content /></section>
  `,
  styles: `
    :host { display: grid; grid-template-columns: minmax(0, 43fr) minmax(0, 57fr); gap: 12px; padding: 8px 12px 10px; min-height: 0; }
    .left { display: grid; grid-template-rows: minmax(0, 1fr) auto; grid-template-columns: minmax(0, 1fr); gap: 6px; min-height: 0; min-width: 0; }
    .problems { display: flex; flex-direction: column; max-height: 24vh; min-height: 0; }
    .right { display: flex; flex-direction: column; min-height: 0; min-width: 0; }
  `,
})
export class BenchColumns {}
