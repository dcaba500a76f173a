/**
 * The results side of a bench: the summary line, the panels (Bias, Response, Modes, Checks &
 * measures) and the standing caution. The bench and the shared view both render it, from the
 * same solver, so a reviewer sees the very numbers the author saw.
 */
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatTabsModule } from '@angular/material/tabs';
import type { SolveResult } from '../../../solver';
import { Cautions } from '../core/cautions';
import { BiasPanel } from './panels/bias-panel';
import { ChecksPanel } from './panels/checks-panel';
import { MeasuresPanel } from './panels/measures-panel';
import { ModesPanel } from './panels/modes-panel';
import { ResponsePanel } from './panels/response-panel';
import { ResultsSummary } from './results-summary';
import type { SolveStatus } from './solver-client';

@Component({
  selector: 'nw-results-panels',
  imports: [ResultsSummary, Cautions, MatTabsModule, BiasPanel, ResponsePanel, ModesPanel, ChecksPanel, MeasuresPanel],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <nw-results-summary [result]="result()" [stale]="stale()" [errorCount]="errorCount()"
      [status]="status()" [slow]="slow()" [solveMs]="solveMs()" [failure]="failure()"
      (cancel)="cancel.emit()" />
    <mat-tab-group class="panels" [class.stale]="stale() || slow()" animationDuration="0ms" mat-stretch-tabs="false" mat-align-tabs="start">
      <mat-tab label="Bias">
        <ng-template matTabContent><div class="panel"><nw-bias-panel [result]="result()" /></div></ng-template>
      </mat-tab>
      <mat-tab label="Response">
        <ng-template matTabContent><div class="panel"><nw-response-panel [result]="result()" /></div></ng-template>
      </mat-tab>
      <mat-tab label="Modes">
        <ng-template matTabContent><div class="panel"><nw-modes-panel [result]="result()" /></div></ng-template>
      </mat-tab>
      <mat-tab>
        <ng-template mat-tab-label>
          Checks &amp; measures
          @if (failedChecks() > 0) { <span class="badge fail" [attr.aria-label]="failedChecks() + ' failing'">{{ failedChecks() }} fail</span> }
        </ng-template>
        <ng-template matTabContent><div class="panel">
          <nw-checks-panel [result]="result()" [netlist]="text()" (lineSelected)="lineSelected.emit($event)" />
          <h2 class="sub">Measures</h2>
          <nw-measures-panel [result]="result()" [netlist]="text()" (lineSelected)="lineSelected.emit($event)" />
        </div></ng-template>
      </mat-tab>
    </mat-tab-group>
    <nw-cautions class="caution" />
  `,
  styles: `
    :host { display: flex; flex-direction: column; min-height: 0; min-width: 0; }
    .panels { flex: 1; min-height: 0; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px;
      background: var(--mat-sys-surface-container-lowest); }
    .panels.stale .panel { opacity: 0.62; }
    .panel { padding: 10px 12px; }
    :host ::ng-deep .panels .mat-mdc-tab-body-wrapper { flex: 1 1 auto; min-height: 0; }
    :host ::ng-deep .panels .mat-mdc-tab-body-content { overflow: auto; }
    .badge { margin-left: 6px; padding: 0 6px; border-radius: 8px; font-size: 0.75rem; font-weight: 700; }
    .badge.fail { background: #f7d9d6; color: #7a1812; }
    .sub { font: var(--mat-sys-title-small); margin: 18px 0 6px; color: var(--mat-sys-on-surface-variant); }
    .caution { display: block; flex: none; }
    .caution ::ng-deep .caution { margin-top: 8px; padding: 6px 10px; font-size: 0.8125rem; }
  `,
})
export class ResultsPanels {
  /** The result the panels show (the last clean one while the text has errors). */
  readonly result = input<SolveResult | undefined>();
  /** The text of that result (its check and measure lines). */
  readonly text = input('');
  /** The result is older than the text (the text has errors). */
  readonly stale = input(false);
  readonly errorCount = input(0);
  readonly status = input<SolveStatus>('idle');
  readonly slow = input(false);
  readonly solveMs = input<number | undefined>();
  readonly failure = input<string | undefined>();

  /** Cancel the solve in progress. */
  readonly cancel = output<void>();
  /** A check or measure was chosen: its line in the netlist. */
  readonly lineSelected = output<number>();

  protected readonly failedChecks = computed(() => this.result()?.checks.filter((c) => !c.pass).length ?? 0);
}
