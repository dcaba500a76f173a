import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { SolveResult } from '../../../../solver';
import { SolverClient } from '../solver-client';
import {
  BJT_COLUMNS, branchColumns, branchGroups, DIODE_COLUMNS, deviceProblems, deviceRows, headroomFlag, MOS_COLUMNS, NODE_COLUMNS,
  regionFlag, regionWord, type BranchRow, type NodeRow,
} from './bias/bias-rows';
import { OpTable, type OpColumn } from './bias/op-table';
import { PanelNotice, panelNotice, STALE_TAG_STYLES } from './panel-notice';
import { STATUS_STYLES } from './panel-styles';
import { formatSi } from './si-format';

const SOURCE_COLUMNS = branchColumns('p→n');
const PART_COLUMNS = branchColumns('a→b');
const withoutKind = <R,>(columns: readonly OpColumn<R>[]) => columns.filter((c) => c.id !== 'kind');

/**
 * *Bias*: the DC operating point. Devices first (region, currents, voltages and the hybrid-pi
 * small-signal values), with every device outside its intended region or short of headroom
 * flagged by word, symbol and colour; then node voltages, sources and part currents, nodes and
 * parts in netlist order. One filter box narrows every table; each table sorts on any column.
 */
@Component({
  selector: 'nw-bias-panel',
  imports: [OpTable, PanelNotice, MatFormFieldModule, MatInputModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice(); as n) {
      <nw-panel-notice [notice]="n" />
    } @else {
      @if (problems().length > 0) {
        <div class="problems" role="status">
          <p class="lead"><span class="tag warn">⚠ {{ problems().length }} {{ problems().length === 1 ? 'device needs' : 'devices need' }} attention</span></p>
          <ul>
            @for (p of problems(); track p.name) {
              <li><button type="button" class="link" (click)="filter.set(p.name)" [attr.aria-label]="'Show only ' + p.name">{{ p.name }}</button>: {{ p.text }}</li>
            }
          </ul>
        </div>
      } @else if (deviceCount() > 0) {
        <p class="all-good" role="status"><span class="tag" [class.pass]="!stale()" [class.stale]="stale()">✓ All {{ deviceCount() }} devices in their intended regions, with headroom
          @if (stale()) { <span class="earlier">in an earlier version</span> }</span></p>
      }
      <div class="filter-row">
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="filter">
          <mat-label>Filter by name, kind or region</mat-label>
          <input matInput type="search" [value]="filter()" (input)="filter.set($any($event.target).value)" aria-label="Filter the operating-point tables by name, kind or region" />
        </mat-form-field>
        @if (filter()) { <button mat-button type="button" (click)="filter.set('')">Clear filter</button> }
        <span class="count">{{ shownCount() }}</span>
      </div>

      @if (bjt().length > 0) {
        <h2>Bipolar transistors</h2>
        <nw-op-table label="Bipolar transistors" [columns]="bjtColumns" [rows]="bjt()" />
      }
      @if (mos().length > 0) {
        <h2>MOS transistors</h2>
        <nw-op-table label="MOS transistors" [columns]="mosColumns" [rows]="mos()" />
      }
      @if (diodes().length > 0) {
        <h2>Diodes</h2>
        <nw-op-table label="Diodes" [columns]="diodeColumns" [rows]="diodes()" />
      }
      <div class="pair">
        @if (nodes().length > 0) {
          <section>
            <h2>Node voltages</h2>
            <nw-op-table label="Node voltages" [columns]="nodeColumns" [rows]="nodes()" />
          </section>
        }
        @if (sources().length > 0) {
          <section>
            <h2>Sources</h2>
            <nw-op-table label="Sources" [columns]="sourceColumns()" [rows]="sources()" />
            <p class="note">{{ supplyText() }}</p>
          </section>
        }
      </div>
      @if (parts().length > 0) {
        <h2>Parts</h2>
        <nw-op-table label="Parts" [columns]="partColumns()" [rows]="parts()" />
      }
      @if (shownCount() === '0 rows match') {
        <p class="note">Nothing matches “{{ filter() }}”.</p>
      }
    }
  `,
  styles: [STATUS_STYLES, STALE_TAG_STYLES, `
    :host { display: block; }
    h2 { font-size: 0.9375rem; font-weight: 700; margin: 14px 0 6px; }
    .problems { padding: 8px 12px; border-radius: 8px; background: #FDF6E9; border: 1px solid #E6CB97; margin-bottom: 10px; }
    .problems .lead { margin: 0 0 4px; }
    .problems ul { margin: 0; padding-left: 20px; font-size: 0.875rem; }
    .problems li { margin: 2px 0; }
    .link { font: inherit; font-weight: 700; color: var(--mat-sys-tertiary); background: none; border: 0; padding: 0; cursor: pointer; text-decoration: underline; }
    .all-good { margin: 0 0 10px; }
    .filter-row { display: flex; align-items: center; gap: 8px; flex-wrap: wrap; }
    .filter { width: 300px; max-width: 100%; --mat-form-field-container-height: 40px; --mat-form-field-container-vertical-padding: 8px; }
    .count { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .pair { display: block; }
    .pair section:first-child nw-op-table { max-width: 360px; }
    .note { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); margin: 4px 0 0; }
  `],
})
export class BiasPanel {
  readonly result = input<SolveResult | undefined>();
  /** The result is from an earlier version of the netlist: nothing is shown as fine in green. */
  readonly stale = input(false);
  readonly filter = signal('');

  readonly bjtColumns = BJT_COLUMNS;
  readonly mosColumns = MOS_COLUMNS;
  readonly diodeColumns = DIODE_COLUMNS;
  readonly nodeColumns = NODE_COLUMNS;
  /** The Kind column only when the kinds are known (from the solver reply that gave this result). */
  readonly sourceColumns = computed(() => (this.kinds().size > 0 ? SOURCE_COLUMNS : withoutKind(SOURCE_COLUMNS)));
  readonly partColumns = computed(() => (this.kinds().size > 0 ? PART_COLUMNS : withoutKind(PART_COLUMNS)));
  private readonly client = inject(SolverClient, { optional: true });

  readonly notice = computed(() => panelNotice(this.result(), (r) => {
    if (!r.op) return { title: 'No operating point', text: 'The DC operating point did not solve; the editor lists why.' };
    const { nodes, sources, parts, devices } = r.op;
    if ([nodes, sources, parts, devices].every((o) => Object.keys(o).length === 0)) {
      return {
        title: 'Nothing to bias yet',
        text: 'Add a supply and the parts it feeds: node voltages, currents and every transistor\'s region and hybrid-pi values appear here. For example:',
        code: 'vcc: vsrc(vcc, gnd) 5 V',
      };
    }
    return undefined;
  }));

  private readonly op = computed(() => this.result()?.op);
  private readonly devices = computed(() => { const op = this.op(); return op ? deviceRows(op) : { bjt: [], mos: [], diode: [] }; });
  readonly problems = computed(() => { const op = this.op(); return op ? deviceProblems(op) : []; });
  readonly deviceCount = computed(() => Object.keys(this.op()?.devices ?? {}).length);

  /** Whether a row matches the filter: by name, kind, region or the words of its flags. */
  private readonly matcher = computed(() => {
    const words = this.filter().trim().toLowerCase().split(/\s+/).filter(Boolean);
    return (haystack: string[]) => words.every((w) => haystack.some((h) => h.toLowerCase().includes(w)));
  });

  readonly bjt = computed(() => this.devices().bjt.filter((d) => this.matcher()([d.name, d.kind, regionWord(d.region), regionFlag(d)?.text ?? '', headroomFlag(d) ? 'headroom' : ''])));
  readonly mos = computed(() => this.devices().mos.filter((d) => this.matcher()([d.name, d.kind, regionWord(d.region), regionFlag(d)?.text ?? '', headroomFlag(d) ? 'headroom' : ''])));
  readonly diodes = computed(() => this.devices().diode.filter((d) => this.matcher()([d.name, d.kind, d.region])));
  // Nodes come in the solver's order, which is the order they first appear in the netlist.
  readonly nodes = computed<NodeRow[]>(() => Object.entries(this.op()?.nodes ?? {}).map(([name, v]) => ({ name, v })).filter((n) => this.matcher()([n.name, 'node'])));

  /**
   * Part kinds by name, in netlist order, from the solver reply this result came in (the latest,
   * or the last clean one while the text has errors); empty where there is no solver client.
   */
  private readonly kinds = computed<ReadonlyMap<string, string>>(() => {
    const reply = [this.client?.reply(), this.client?.lastSolved()].find((r) => r && r.result === this.result());
    return new Map((reply?.names.parts ?? []).map((p) => [p.name, p.kind]));
  });
  private readonly branches = computed(() => { const op = this.op(); return op ? branchGroups(op, this.kinds()) : { sources: [], parts: [] }; });
  readonly sources = computed<BranchRow[]>(() => this.branches().sources.filter((s) => this.matcher()([s.name, s.kind ?? '', 'source'])));
  readonly parts = computed<BranchRow[]>(() => this.branches().parts.filter((p) => this.matcher()([p.name, p.kind ?? '', 'part'])));

  readonly shownCount = computed(() => {
    if (!this.filter().trim()) return '';
    const n = this.bjt().length + this.mos().length + this.diodes().length + this.nodes().length + this.sources().length + this.parts().length;
    return `${n} ${n === 1 ? 'row matches' : 'rows match'}`;
  });

  /** What the sources deliver in all: the circuit's dissipation. */
  readonly supplyText = computed(() => {
    const delivered = -this.branches().sources.reduce((sum, s) => sum + s.p, 0);
    return `The sources deliver ${formatSi(delivered, 'W')} in all; a source delivers power when its current leaves its more positive terminal.`;
  });
}
