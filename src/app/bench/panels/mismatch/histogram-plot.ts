import { afterRenderEffect, ChangeDetectionStrategy, Component, ElementRef, inject, input, viewChild } from '@angular/core';
import { exportSize, serializeSvg } from '../plot/plot-export';
import { PlotSize } from '../plot/plot-fit';
import { drawHistogram } from './histogram-draw';
import type { HistogramData } from './mismatch-figures';

/**
 * One mismatch histogram: runs per bin with the check limits drawn on it, as SVG (exported
 * through `svgText()`, like every plot). Its width follows its host; its height is fixed.
 */
@Component({
  selector: 'nw-histogram-plot',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<svg #svg class="plot" role="img" [attr.aria-label]="ariaLabel()"></svg>`,
  styles: `
    :host { display: block; min-width: 0; }
    .plot { display: block; width: 100%; }
  `,
})
export class HistogramPlot {
  readonly data = input.required<HistogramData>();
  /** Title of the x axis, e.g. `vos (V)`. */
  readonly xTitle = input.required<string>();
  readonly unit = input('');
  readonly ariaLabel = input('Histogram');
  readonly height = input(230);

  /** Limit labels left off for lack of room (their text stays in the line's tooltip). */
  droppedLabels: readonly string[] = [];

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly box = new PlotSize(this.host.nativeElement, { fixed: () => this.height(), least: () => 160, initial: () => 230, max: 600 });

  constructor() {
    afterRenderEffect(() => {
      this.droppedLabels = drawHistogram(this.svgRef().nativeElement, this.box.width(), this.box.height(), this.data(), { x: this.xTitle(), unit: this.unit() });
    });
  }

  /** The histogram as a standalone SVG document. */
  svgText(): string {
    return serializeSvg(this.svgRef().nativeElement);
  }

  /** Size of the exported file in CSS pixels. */
  size(): { width: number; height: number } {
    return exportSize(this.svgRef().nativeElement);
  }
}
