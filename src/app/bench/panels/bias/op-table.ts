import { ChangeDetectionStrategy, Component, computed, effect, input, linkedSignal, signal } from '@angular/core';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { STATUS_STYLES } from '../panel-styles';

/** A highlight on a cell: a word and a symbol, never colour alone. */
export interface CellFlag {
  text: string;
  /** What the flag means, for the tooltip and screen readers. */
  detail: string;
}

/** A column of an operating-point table. */
export interface OpColumn<Row> {
  id: string;
  header: string;
  /** The header spelled out, e.g. "collector current". */
  title: string;
  text: (row: Row) => string;
  /** The value sorted on: numbers numerically, text naturally (q2 before q10). */
  sortValue: (row: Row) => number | string;
  /** A problem to flag in this cell. */
  flag?: (row: Row) => CellFlag | undefined;
  /** Draw the value as a tag (regions). */
  tag?: boolean;
  numeric?: boolean;
}

/** Rows first rendered in one frame: a long table grows by this many a frame, so no frame is long. */
export const ROWS_PER_FRAME = 16;

const nextFrame: (run: () => void) => () => void = typeof requestAnimationFrame === 'function'
  ? (run) => { const id = requestAnimationFrame(run); return () => cancelAnimationFrame(id); }
  : (run) => { const id = setTimeout(run, 16); return () => clearTimeout(id); };

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/** Rows sorted by `sort` (stable; unsorted when no direction). */
export function sortRows<Row>(rows: readonly Row[], columns: readonly OpColumn<Row>[], sort: Sort | undefined): Row[] {
  const column = sort?.direction ? columns.find((c) => c.id === sort.active) : undefined;
  if (!column) return [...rows];
  const sign = sort!.direction === 'asc' ? 1 : -1;
  return rows
    .map((row, index) => ({ row, index, key: column.sortValue(row) }))
    .sort((a, b) => {
      const order = typeof a.key === 'number' && typeof b.key === 'number' ? a.key - b.key : collator.compare(String(a.key), String(b.key));
      return order !== 0 ? sign * order : a.index - b.index;
    })
    .map((x) => x.row);
}

/**
 * One sortable table of the operating point (devices, nodes, sources or parts), compact enough
 * for a 700 px panel; the page-wide filter is applied by the caller. Rows are tracked by name, so
 * a new result for the same circuit (every keystroke) updates cells in place instead of
 * rebuilding every row; a table of new rows (another netlist, a filter) is built ROWS_PER_FRAME
 * rows a frame.
 */
@Component({
  selector: 'nw-op-table',
  imports: [MatTableModule, MatSortModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="scroll">
      <table mat-table [dataSource]="built()" [trackBy]="byName" matSort (matSortChange)="sort.set($event)" [attr.aria-label]="label()">
        @for (col of columns(); track col.id) {
          <ng-container [matColumnDef]="col.id">
            <th mat-header-cell *matHeaderCellDef mat-sort-header [class.numeric]="col.numeric" [attr.title]="col.title"
                [sortActionDescription]="'Sort by ' + col.title">{{ col.header }}</th>
            <td mat-cell *matCellDef="let row" [class.numeric]="col.numeric">
              @if (col.flag?.(row); as flag) {
                <span class="tag warn" [attr.title]="flag.detail">⚠ {{ col.tag ? flag.text : col.text(row) }}</span>
                @if (!col.tag) { <span class="visually-hidden">: </span><span class="flag-word">{{ flag.text }}</span> }
              } @else if (col.tag) {
                <span class="tag ok">{{ col.text(row) }}</span>
              } @else {
                <span class="num">{{ col.text(row) }}</span>
              }
            </td>
          </ng-container>
        }
        <tr mat-header-row *matHeaderRowDef="columnIds()"></tr>
        <tr mat-row *matRowDef="let row; columns: columnIds()" [class.flagged]="isFlagged(row)"></tr>
      </table>
    </div>
  `,
  styles: [STATUS_STYLES, `
    :host { display: block; --mat-table-row-item-container-height: 30px; --mat-table-header-container-height: 34px;
      --mat-table-background-color: var(--mat-sys-surface-container-lowest); }
    .scroll { overflow-x: auto; border: 1px solid var(--mat-sys-outline-variant); border-radius: 6px; }
    table { width: 100%; }
    th.mat-mdc-header-cell { font-weight: 700; color: var(--mat-sys-on-surface-variant); font-size: 0.8125rem; white-space: nowrap; }
    .mat-mdc-cell, .mat-mdc-header-cell { padding: 0 6px; font-size: 0.8125rem; }
    .mat-mdc-cell:first-child, .mat-mdc-header-cell:first-child { padding-left: 10px; font-weight: 600; }
    .numeric { text-align: right; }
    th.numeric ::ng-deep .mat-sort-header-container { justify-content: flex-end; }
    tr.flagged { background: #FDF6E9; }
    .flag-word { display: block; font-size: 0.6875rem; color: #7A4A00; text-align: right; line-height: 1.1; }
  `],
})
export class OpTable<Row extends { name: string }> {
  readonly label = input.required<string>();
  readonly columns = input.required<readonly OpColumn<Row>[]>();
  readonly rows = input.required<readonly Row[]>();

  readonly sort = signal<Sort | undefined>(undefined);
  protected readonly byName = (_index: number, row: Row): string => row.name;
  readonly columnIds = computed(() => this.columns().map((c) => c.id));
  readonly sorted = computed(() => sortRows(this.rows(), this.columns(), this.sort()));
  /** How many rows are built so far; starts again at one frame's worth when the row count changes. */
  private readonly limit = linkedSignal({ source: () => this.rows().length, computation: () => ROWS_PER_FRAME });
  /** The rows in the table now (all of them, once it has grown). */
  readonly built = computed(() => {
    const rows = this.sorted();
    return rows.length > this.limit() ? rows.slice(0, this.limit()) : rows;
  });

  constructor() {
    effect((onCleanup) => {
      const limit = this.limit();
      if (limit < this.sorted().length) onCleanup(nextFrame(() => this.limit.set(limit + ROWS_PER_FRAME)));
    });
  }

  isFlagged(row: Row): boolean {
    return this.columns().some((c) => c.flag?.(row) !== undefined);
  }
}
