/**
 * The results side of a bench: the summary line, the panels (Bias, Response, Modes, then Transfer,
 * Sweeps, Mismatch, Noise and Poles when the text asks for them, Checks & measures, and the analyses not asked
 * for yet under "Other analyses" with how to ask) and the standing caution. The bench and the shared view both render it, from the
 * same solver, so a reviewer sees the very numbers the author saw.
 */
import { ChangeDetectionStrategy, Component, computed, input, linkedSignal, output, signal } from '@angular/core';
import { MatTabsModule } from '@angular/material/tabs';
import type { SolveResult } from '../../../solver';
import { Cautions } from '../core/cautions';
import { BiasPanel } from './panels/bias-panel';
import { ChecksPanel } from './panels/checks-panel';
import { MeasuresPanel } from './panels/measures-panel';
import { MismatchPanel } from './panels/mismatch-panel';
import { NoisePanel } from './panels/noise-panel';
import { PolesPanel } from './panels/poles-panel';
import { ModesPanel } from './panels/modes-panel';
import { ResponsePanel } from './panels/response-panel';
import { SensitivityTable } from './panels/sensitivity-table';
import { SweepsPanel } from './panels/sweeps-panel';
import { TransferPanel } from './panels/transfer-panel';
import { ResultsSummary } from './results-summary';
import type { SolveStatus } from './solver-client';
import { NO_LINES, type RequestLines } from './solver-protocol';

let noteIds = 0;

/** The tabs of analyses a netlist may or may not ask for, in tab order. */
const OPTIONAL_TABS = ['transfer', 'sweeps', 'mismatch', 'noise', 'poles'] as const;
type OptionalTab = (typeof OPTIONAL_TABS)[number];
/** Each optional tab's label. */
const TAB_LABELS: Record<OptionalTab, string> = { transfer: 'Transfer', sweeps: 'Sweeps', mismatch: 'Mismatch', noise: 'Noise', poles: 'Poles' };

@Component({
  selector: 'nw-results-panels',
  imports: [ResultsSummary, Cautions, MatTabsModule, BiasPanel, ResponsePanel, ModesPanel, ChecksPanel, MeasuresPanel, TransferPanel, SweepsPanel, MismatchPanel, NoisePanel, PolesPanel, SensitivityTable],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <nw-results-summary [result]="whole() ?? result()" [stale]="stale()" [pending]="pending() && asked().has('sweeps')" [errorCount]="errorCount()"
      [status]="status()" [slow]="slow()" [solveMs]="solveMs()" [failure]="failure()"
      (cancel)="cancel.emit()" />
    @if (stale()) { <p class="stale-note" [id]="noteId" role="note">These figures are from an earlier version of the netlist.</p> }
    <mat-tab-group class="panels" [class.stale]="stale() || slow()" [attr.aria-describedby]="stale() ? noteId : null" animationDuration="0ms" mat-stretch-tabs="false" mat-align-tabs="start"
      (selectedTabChange)="tabChosen($event.tab.textLabel)">
      <mat-tab label="Bias">
        <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Bias results"><nw-bias-panel [result]="result()" [stale]="stale()" /></div></ng-template>
      </mat-tab>
      <mat-tab label="Response">
        <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Response results"><nw-response-panel [result]="result()" /></div></ng-template>
      </mat-tab>
      <mat-tab label="Modes">
        <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Modes results"><nw-modes-panel [result]="result()" /></div></ng-template>
      </mat-tab>
      <!-- The analyses the text asks for get a tab each; the others wait under "Other analyses". -->
      @if (shown().has('transfer')) {
        <mat-tab [label]="labels.transfer">
          <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Transfer results"><nw-transfer-panel [result]="result()" /></div></ng-template>
        </mat-tab>
      }
      @if (shown().has('sweeps')) {
        <mat-tab [label]="labels.sweeps">
          <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Sweeps results"><nw-sweeps-panel [result]="sweepsResult()" [measureLines]="lines().measures" [params]="params()" [stale]="stale() || pending()" [updating]="pending()" /></div></ng-template>
        </mat-tab>
      }
      @if (shown().has('mismatch')) {
        <mat-tab [label]="labels.mismatch">
          <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Mismatch results"><nw-mismatch-panel [result]="result()" [lines]="lines()" /></div></ng-template>
        </mat-tab>
      }
      @if (shown().has('noise')) {
        <mat-tab [label]="labels.noise">
          <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Noise results"><nw-noise-panel [result]="result()" /></div></ng-template>
        </mat-tab>
      }
      @if (shown().has('poles')) {
        <mat-tab [label]="labels.poles">
          <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Poles results"><nw-poles-panel [result]="result()" /></div></ng-template>
        </mat-tab>
      }
      <mat-tab>
        <ng-template mat-tab-label>
          Checks &amp; measures
          @if (failedChecks() > 0) { <span class="badge" [class.fail]="!stale()" [class.old]="stale()" [attr.aria-label]="failedChecks() + (stale() ? ' failing in an earlier version' : ' failing')">{{ failedChecks() }} fail</span> }
        </ng-template>
        <ng-template matTabContent><div class="panel" tabindex="0" role="region" aria-label="Checks and measures">
          <nw-checks-panel [result]="result()" [measureLines]="lines().measures" [stale]="stale()" (lineSelected)="lineSelected.emit($event)" />
          <h2 class="sub">Measures</h2>
          <nw-measures-panel [result]="result()" [measureLines]="lines().measures" (lineSelected)="lineSelected.emit($event)" />
          @if (sweepsResult()?.sensitivity) {
            <h2 class="sub">Sensitivity</h2>
            @if (pending()) { <p class="updating" role="status">Updating for the newest text — these figures are from the one before.</p> }
            <nw-sensitivity-table [result]="sweepsResult()" />
          } @else if (pending() && asksSensitivity()) {
            <h2 class="sub">Sensitivity</h2>
            <p class="updating" role="status">Solving the sensitivities…</p>
          }
        </div></ng-template>
      </mat-tab>
      @if (notAsked().length > 0) {
        <mat-tab label="Other analyses">
          <ng-template matTabContent><div class="panel others" tabindex="0" role="region" aria-label="Other analyses, not in this netlist yet">
            <p class="others-intro">Not in this netlist yet. Each one below says how to ask for it.</p>
            @for (kind of notAsked(); track kind) {
              <section [attr.aria-labelledby]="'nw-other-' + kind">
                @switch (kind) {
                  @case ('transfer') { <h2 class="sub" id="nw-other-transfer">Transfer curve</h2><nw-transfer-panel [result]="result()" /> }
                  @case ('sweeps') { <h2 class="sub" id="nw-other-sweeps">Sweeps: a param or the temperature</h2><nw-sweeps-panel [result]="result()" [measureLines]="lines().measures" [params]="params()" [stale]="stale()" /> }
                  @case ('mismatch') { <h2 class="sub" id="nw-other-mismatch">Mismatch</h2><nw-mismatch-panel [result]="result()" [lines]="lines()" /> }
                  @case ('noise') { <h2 class="sub" id="nw-other-noise">Noise</h2><nw-noise-panel [result]="result()" /> }
                  @case ('poles') { <h2 class="sub" id="nw-other-poles">Poles and zeros</h2><nw-poles-panel [result]="result()" /> }
                }
              </section>
            }
          </div></ng-template>
        </mat-tab>
      }
    </mat-tab-group>
    <nw-cautions class="caution" />
  `,
  styles: `
    :host { display: flex; flex-direction: column; min-height: 0; min-width: 0; }
    .panels { flex: 1; min-height: 0; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px;
      background: var(--mat-sys-surface-container-lowest); }
    /* Stale figures are marked by the note and a hatched edge, not by fading (faded text fails contrast). */
    .panels.stale { border-color: #c9a24a; background-image: repeating-linear-gradient(135deg, transparent 0 10px, rgba(201, 162, 74, 0.07) 10px 20px); }
    .panels.stale ::ng-deep .tag.pass { color: var(--mat-sys-on-surface-variant); background: transparent; border: 1px dashed var(--mat-sys-outline); }
    .stale-note { margin: 0 0 4px; padding: 2px 8px; font-size: 0.8125rem; color: #6b4600; background: #fbecc8; border-radius: 4px; }
    /* Focusable, so a keyboard can scroll a long panel (the tab body is the scroller). */
    .panel { padding: 10px 12px; }
    .panel:focus-visible { outline: 2px solid var(--mat-sys-tertiary); outline-offset: -2px; }
    /* Tighter tabs: seven fit the results column of a 1280 px screen without paging arrows. */
    :host ::ng-deep .panels .mat-mdc-tab { padding: 0 12px; min-width: 0; }
    :host ::ng-deep .panels .mat-mdc-tab-body-wrapper { flex: 1 1 auto; min-height: 0; }
    /* Contained: a result's new numbers re-lay out the open panel only, not the page. */
    :host ::ng-deep .panels .mat-mdc-tab-body-content { overflow: auto; contain: strict; }
    .badge { margin-left: 6px; padding: 0 6px; border-radius: 8px; font-size: 0.75rem; font-weight: 700; }
    .badge.fail { background: #f7d9d6; color: #7a1812; }
    .badge.old { border: 1px dashed var(--mat-sys-outline); color: var(--mat-sys-on-surface-variant); }
    .sub { font: var(--mat-sys-title-small); margin: 18px 0 6px; color: var(--mat-sys-on-surface-variant); }
    .caution { display: block; flex: none; }
    .updating { margin: 0 0 6px; padding: 2px 8px; font-size: 0.8125rem; color: #6b4600; background: #fbecc8; border-radius: 4px; }
    .others-intro { margin: 0 0 4px; color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    .others section + section { margin-top: 8px; border-top: 1px solid var(--mat-sys-outline-variant); }
    .caution ::ng-deep .caution { margin-top: 8px; padding: 6px 10px; font-size: 0.8125rem; }
  `,
})
export class ResultsPanels {
  /** The result the panels show (the last clean one while the text has errors). */
  readonly result = input<SolveResult | undefined>();
  /** The measure and check lines of that result's text. */
  readonly lines = input<RequestLines>(NO_LINES);
  /** The netlist's params (the outline's names), for the Sweeps tab's suggestion. */
  readonly params = input<readonly string[]>([]);
  /** The result is not the current text's (see SolveView): every figure is marked, no pass is green. */
  readonly stale = input(false);
  /** The result's sweeps and sensitivity are still being solved (the reply is `pending`). */
  readonly pending = input(false);
  /**
   * The whole result once the second stage completed (sweeps, sensitivity); the other panels
   * read `result`, which does not change then.
   */
  readonly whole = input<SolveResult | undefined>();
  readonly errorCount = input(0);
  readonly status = input<SolveStatus>('idle');
  readonly slow = input(false);
  readonly solveMs = input<number | undefined>();
  readonly failure = input<string | undefined>();

  /** Cancel the solve in progress. */
  readonly cancel = output<void>();
  /** A check or measure was chosen: its line in the netlist. */
  readonly lineSelected = output<number>();

  protected readonly labels = TAB_LABELS;
  protected readonly noteId = `nw-stale-note-${++noteIds}`;
  /** The optional tabs the text asks for (by its analyze lines, or the result's members). */
  protected readonly asked = computed(() => {
    const kinds = new Set(this.lines().analyses.map((a) => a.kind));
    const r = this.result();
    const asked = new Set<OptionalTab>();
    if (kinds.has('transfer') || r?.transfer) asked.add('transfer');
    if (kinds.has('vary') || kinds.has('temp') || r?.vary || r?.temp) asked.add('sweeps');
    if (kinds.has('mismatch') || r?.mismatch) asked.add('mismatch');
    if (kinds.has('noise') || r?.noise) asked.add('noise');
    if (kinds.has('poles') || r?.poles) asked.add('poles');
    return asked;
  });
  /**
   * What the Sweeps tab and the sensitivity table read: the result, and while its second stage
   * runs, the sweeps and sensitivity of the result before (marked as updating), so the tab does
   * not blank on every keystroke.
   */
  private readonly held = linkedSignal<{ result: SolveResult | undefined; pending: boolean }, Pick<SolveResult, 'vary' | 'temp' | 'sensitivity'>>({
    source: () => ({ result: this.whole() ?? this.result(), pending: this.pending() }),
    computation: ({ result, pending }, previous) => (pending ? previous?.value ?? {} : { vary: result?.vary, temp: result?.temp, sensitivity: result?.sensitivity }),
  });
  protected readonly sweepsResult = computed(() => {
    const r = this.whole() ?? this.result();
    const held = this.held(); // read every time, so it has seen the result before a pending one
    return r && this.pending() ? { ...r, ...held } : r;
  });
  protected readonly asksSensitivity = computed(() => this.lines().analyses.some((a) => a.kind === 'sensitivity'));
  /**
   * The optional tab the user is on. It stays while the text stops asking for it (a select-all
   * and delete before a paste, an analyze line being retyped), showing how to ask, so the view
   * is not pulled from under the user; it goes when they choose another tab.
   */
  private readonly kept = signal<OptionalTab | undefined>(undefined);
  /** The optional tabs on screen: those asked for, and the one the user is on. */
  protected readonly shown = computed(() => {
    const kept = this.kept();
    return kept && !this.asked().has(kept) ? new Set([...this.asked(), kept]) : this.asked();
  });
  protected readonly notAsked = computed(() => OPTIONAL_TABS.filter((t) => !this.shown().has(t)));

  protected tabChosen(label: string): void {
    this.kept.set(OPTIONAL_TABS.find((t) => TAB_LABELS[t] === label));
  }
  protected readonly failedChecks = computed(() => this.result()?.checks.filter((c) => !c.pass).length ?? 0);
}
