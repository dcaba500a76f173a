import { ChangeDetectionStrategy, Component } from '@angular/core';
import { Cautions } from '../core/cautions';

/** The bench: netlist editor and live results (the editor and panels arrive with the bench issue). */
@Component({
  selector: 'nw-bench-page',
  imports: [Cautions],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Bench</h1>
      <p>Write a netlist, see its operating point, gains and CMRR as you type. The solver runs in your browser.</p>
      <nw-cautions />
    </section>
  `,
  styles: `.page { padding: 24px; max-width: 960px; }`,
})
export class BenchPage {}
