import { afterRenderEffect, ChangeDetectionStrategy, Component, computed, ElementRef, inject, input, viewChild } from '@angular/core';
import { exportSize, serializeSvg } from '../plot/plot-export';
import { PlotSize } from '../plot/plot-fit';
import type { PzPoint } from './pole-zero-data';
import { drawPz } from './pz-draw';
import { layoutPz, type PzGeometry, type PzScale } from './pz-geometry';

/**
 * The pole–zero map: the s-plane in hertz with poles as × and zeros as ○, on a linear or an
 * arcsinh scale (pz-geometry.ts). An image to screen readers, named by `ariaLabel`; the table
 * beside it is the accessible form of its content. Exported through `svgText()` like every plot.
 */
@Component({
  selector: 'nw-pz-map',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<svg #svg class="plot" role="img" [attr.aria-label]="ariaLabel()"></svg>`,
  styles: `
    :host { display: block; min-width: 0; }
    .plot { display: block; width: 100%; }
  `,
})
export class PzMap {
  readonly points = input.required<readonly PzPoint[]>();
  readonly scale = input<PzScale>('linear');
  readonly ariaLabel = input('Pole–zero map');
  /** Caption of the exported file, e.g. the netlist's title. */
  readonly caption = input<string>();
  readonly height = input(340);

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly box = new PlotSize(this.host.nativeElement, { fixed: () => this.height(), least: () => 220, initial: () => 340, max: 700 });

  readonly geometry = computed<PzGeometry>(() => layoutPz({ width: this.box.width(), height: this.box.height(), points: this.points(), scale: this.scale() }));

  constructor() {
    afterRenderEffect(() => drawPz(this.svgRef().nativeElement, this.geometry(), this.points(), this.caption()));
  }

  /** The map as a standalone SVG document. */
  svgText(): string {
    return serializeSvg(this.svgRef().nativeElement);
  }

  /** Size of the exported file in CSS pixels (the map and its caption). */
  size(): { width: number; height: number } {
    return exportSize(this.svgRef().nativeElement);
  }
}
