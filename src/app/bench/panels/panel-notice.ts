import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { SolveResult } from '../../../../solver';

/** Why a panel has nothing to show, and what to do about it. */
export interface Notice {
  title: string;
  text: string;
  /** A netlist line to copy, when one would help. */
  code?: string;
}

/**
 * The notice a panel shows instead of its content: no result yet, a circuit that did not solve,
 * or (from `specific`) the panel's own missing ingredient; undefined when there is content to
 * show. Errors confined to requests (a misspelt measure) leave the circuit solved: the panel
 * shows what it has, and the editor marks the request's line.
 */
export function panelNotice(result: SolveResult | undefined, specific: (r: SolveResult) => Notice | undefined): Notice | undefined {
  if (!result) return { title: 'Nothing solved yet', text: 'Write or open a netlist; results appear here as soon as it solves.' };
  const errors = result.errors?.length ?? 0;
  if (errors > 0 && !result.op) {
    const first = result.errors[0];
    return {
      title: errors === 1 ? 'The netlist has an error' : `The netlist has ${errors} errors`,
      text: `Line ${first.line}: ${first.message}${errors > 1 ? ' The editor marks the others.' : ''}`,
    };
  }
  return specific(result);
}

/**
 * A tag on a figure from an earlier version of the netlist: neither the green of a pass nor the
 * red of a fail, dashed so it reads as provisional even without colour.
 */
export const STALE_TAG_STYLES = `
  .tag.stale { color: var(--mat-sys-on-surface-variant); background: transparent; border: 1px dashed var(--mat-sys-outline); }
  .earlier { font-weight: 400; font-style: italic; }
`;

/** A quiet box that says why a panel is empty. */
@Component({
  selector: 'nw-panel-notice',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="notice" role="status">
      <p class="title">{{ notice().title }}</p>
      <p>{{ notice().text }}</p>
      @if (notice().code) { <code>{{ notice().code }}</code> }
    </div>
  `,
  styles: `
    .notice { padding: 16px; border: 1px dashed var(--mat-sys-outline-variant); border-radius: 8px;
      background: var(--mat-sys-surface-container-low); color: var(--mat-sys-on-surface-variant); }
    .notice p { margin: 0 0 6px; }
    .title { font-weight: 700; color: var(--mat-sys-on-surface); }
    code { display: inline-block; padding: 2px 6px; border-radius: 4px; background: var(--mat-sys-surface-container-high);
      color: var(--mat-sys-on-surface); font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.8125rem; }
  `,
})
export class PanelNotice {
  readonly notice = input.required<Notice>();
}
