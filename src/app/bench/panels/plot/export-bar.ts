import { ChangeDetectionStrategy, Component, DestroyRef, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { downloadBlob, svgToPng } from './plot-export';

/** What a plot offers to the export buttons. */
export interface ExportablePlot {
  /** The plot as a standalone SVG document. */
  svgText(): string;
  /** The exported file's size in CSS pixels. */
  size(): { width: number; height: number };
}

/**
 * The export buttons every plot has: SVG, PNG (twice the size, for slides) and CSV — of the
 * curves on the plot, and, when the plot shows a choice of them, of every curve the result has.
 * Says what it saved, for five seconds.
 */
@Component({
  selector: 'nw-export-bar',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <span class="status" aria-live="polite">{{ status() }}</span>
    <span class="buttons" role="group" aria-label="Export the plot">
      <button mat-button type="button" (click)="exportSvg()" [disabled]="!plot()" aria-label="Export the plot as SVG">SVG</button>
      <button mat-button type="button" (click)="exportPng()" [disabled]="!plot()" aria-label="Export the plot as PNG">PNG</button>
      @if (csvShown(); as shown) {
        <button mat-button type="button" (click)="save(shown(), 'csv')" aria-label="Export the plotted curves as CSV">CSV</button>
      }
      @if (csvAll(); as all) {
        <button mat-button type="button" (click)="save(all(), 'csv', csvShown() ? '-all' : '')" [attr.aria-label]="allLabel()" [attr.title]="allLabel()">
          {{ csvShown() ? 'CSV, all ' + allCount() : 'CSV' }}
        </button>
      }
    </span>
  `,
  styles: `
    :host { display: inline-flex; align-items: center; gap: 6px; margin-left: auto; min-width: 0;
      --mat-button-text-container-height: 32px; }
    .buttons { display: inline-flex; gap: 2px; }
    .status { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
  `,
})
export class ExportBar {
  /** The plot to export (absent while there is none). */
  readonly plot = input<ExportablePlot | undefined>();
  /** File name without extension, e.g. `resistor-tail-pair-response`. */
  readonly stem = input.required<string>();
  /** CSV of the curves shown on the plot. */
  readonly csvShown = input<(() => string) | undefined>();
  /** CSV of every curve of the result, shown or not. */
  readonly csvAll = input<(() => string) | undefined>();
  /** How many curves the full CSV holds (for its button). */
  readonly allCount = input(0);

  readonly status = signal('');
  private timer: ReturnType<typeof setTimeout> | undefined;

  constructor() {
    inject(DestroyRef).onDestroy(() => clearTimeout(this.timer));
  }

  protected allLabel(): string {
    // The accessible name starts with the visible text (WCAG 2.5.3, label in name).
    return this.csvShown() ? `CSV, all ${this.allCount()}: export every curve as CSV, shown or not` : 'CSV: export the curves';
  }

  exportSvg(): void {
    const plot = this.plot();
    if (plot) this.save(plot.svgText(), 'svg');
  }

  async exportPng(): Promise<void> {
    const plot = this.plot();
    if (!plot) return;
    const { width, height } = plot.size();
    try {
      this.saveBlob(await svgToPng(plot.svgText(), width, height, 2), 'png');
    } catch (err) {
      this.say(err instanceof Error ? err.message : 'The PNG could not be made.');
    }
  }

  /** Saves text as `<stem><suffix>.<ext>`. */
  save(text: string, ext: 'svg' | 'csv', suffix = ''): void {
    this.saveBlob(new Blob([text], { type: ext === 'svg' ? 'image/svg+xml' : 'text/csv' }), ext, suffix);
  }

  private saveBlob(blob: Blob, ext: string, suffix = ''): void {
    const name = `${this.stem()}${suffix}.${ext}`;
    downloadBlob(blob, name);
    this.say(`Saved ${name}.`);
  }

  private say(text: string): void {
    this.status.set(text);
    clearTimeout(this.timer);
    this.timer = setTimeout(() => this.status.set(''), 5000);
  }
}
