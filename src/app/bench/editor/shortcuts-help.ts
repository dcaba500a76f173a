/**
 * The help sheet: the bench's keyboard shortcuts, a reminder of the statements and the way to
 * the full language reference.
 */
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';

const MOD = typeof navigator !== 'undefined' && /Mac|iPhone|iPad/.test(navigator.platform) ? '⌘' : 'Ctrl';

export const SHORTCUTS: { keys: string[]; what: string }[] = [
  { keys: [MOD, 'Enter'], what: 'Solve now (the bench also solves as you type)' },
  { keys: [MOD, 'S'], what: 'Save the draft in this browser (it also saves itself)' },
  { keys: [MOD, 'O'], what: 'Open a .nwl file from disk (or drop one on the editor)' },
  { keys: ['F1'], what: 'This help (or ? outside the editor)' },
  { keys: [MOD, 'Space'], what: 'Complete: part kinds, pins, nodes, models, params' },
  { keys: ['F2'], what: 'Show the pins and params of the block at the cursor (as on hover)' },
  { keys: [MOD, 'Z'], what: 'Undo' },
  { keys: [MOD, 'Shift', 'Z'], what: 'Redo' },
  { keys: [MOD, '/'], what: 'Comment or uncomment the line' },
  { keys: ['F8'], what: 'Next problem' },
  { keys: [MOD, 'Shift', 'M'], what: 'List the problems in the editor' },
  { keys: ['Tab'], what: 'Leave the editor (Tab is not captured)' },
  { keys: ['Esc'], what: 'Close a completion list or this sheet' },
];

@Component({
  selector: 'nw-shortcuts-help',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Keyboard shortcuts</h2>
    <mat-dialog-content>
      <table class="keys">
        <caption class="visually-hidden">Shortcuts of the bench</caption>
        <tbody>
          @for (s of shortcuts; track s.what) {
            <tr>
              <th scope="row">
                @for (k of s.keys; track $index) {
                  @if ($index > 0) { <span class="plus" aria-hidden="true">+</span> }<kbd>{{ k }}</kbd>
                }
              </th>
              <td>{{ s.what }}</td>
            </tr>
          }
        </tbody>
      </table>
      <p class="note">A line reads <code>name: kind(connections) value</code>; statements start with
        <code>title param option model block use analyze ports measure check</code>; <code>#</code> starts a comment.</p>
      <p class="reference">Every statement, with worked examples, is in the
        <a href="/reference" target="_blank" rel="noopener">language reference<span class="visually-hidden"> (opens in a new tab)</span></a>,
        which also opens from the <strong>Syntax</strong> link beside each problem.</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-flat-button mat-dialog-close cdkFocusInitial>Close</button>
    </mat-dialog-actions>
  `,
  styles: `
    .keys { border-collapse: collapse; width: 100%; }
    th { text-align: left; font-weight: 400; white-space: nowrap; padding: 4px 16px 4px 0; vertical-align: top; }
    td { padding: 4px 0; }
    kbd { display: inline-block; min-width: 1.4em; text-align: center; padding: 1px 6px; border-radius: 4px;
      border: 1px solid var(--mat-sys-outline); border-bottom-width: 2px; background: var(--mat-sys-surface-container-lowest);
      font: 0.8125rem ui-monospace, "DejaVu Sans Mono", monospace; }
    .plus { margin: 0 3px; color: var(--mat-sys-on-surface-variant); }
    .note { margin-top: 12px; color: var(--mat-sys-on-surface-variant); }
    .reference { margin: 8px 0 0; }
    code { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.8125rem; }
    .visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); }
  `,
})
export class ShortcutsHelp {
  protected readonly shortcuts = SHORTCUTS;
}
