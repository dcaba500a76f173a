/**
 * The bench's bar above the editor: which netlist is open and whether it is saved, the examples,
 * the drafts, opening a file from disk, downloading, solving now and the help sheet.
 */
import { ChangeDetectionStrategy, Component, ElementRef, input, output, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatMenuModule } from '@angular/material/menu';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { SaveState } from '../bench-store';
import type { Example } from '../examples';

@Component({
  selector: 'nw-file-bar',
  imports: [MatButtonModule, MatMenuModule, MatTooltipModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="who">
      <h1 class="bench">Bench</h1>
      <span class="title" [title]="title()">{{ title() }}</span>
      <span class="save" [class]="saveState()" aria-live="polite">{{ saveText() }}</span>
    </div>
    <div class="actions" role="toolbar" aria-label="Netlist">
      <button mat-button type="button" [matMenuTriggerFor]="examplesMenu" aria-label="Examples: Strainlab demo netlists">Examples ▾</button>
      <mat-menu #examplesMenu="matMenu" class="nw-examples-menu">
        <div class="menu-head" aria-hidden="true">Strainlab bridge-sensor front end</div>
        @for (e of examples(); track e.id) {
          <button mat-menu-item type="button" (click)="openExample.emit(e)" [attr.data-example]="e.id">
            <span class="ex-label">{{ $index + 1 }}. {{ e.label }}</span>
            <span class="ex-blurb">{{ e.blurb }}</span>
          </button>
        }
      </mat-menu>
      <button mat-button type="button" (click)="drafts.emit()" aria-label="Drafts kept in this browser">Drafts</button>
      <button mat-button type="button" (click)="newNetlist.emit()" aria-label="New netlist">New</button>
      <button mat-button type="button" (click)="pickFile()" [matTooltip]="'Open a .nwl file (' + mod + '+O)'" aria-label="Open a netlist file from disk">Open…</button>
      <input #file type="file" accept=".nwl,.txt,text/plain" hidden (change)="picked($event)" aria-hidden="true" tabindex="-1" />
      <button mat-button type="button" (click)="download.emit()" matTooltip="Download this netlist as a .nwl file" aria-label="Download the netlist">Download</button>
      <button mat-button type="button" (click)="save.emit()" [matTooltip]="'Save the draft (' + mod + '+S)'" aria-label="Save the draft in this browser">Save</button>
      <button mat-flat-button type="button" (click)="solve.emit()" [matTooltip]="'Solve now (' + mod + '+Enter)'" aria-label="Solve now">Solve</button>
      <button mat-icon-button type="button" (click)="help.emit()" matTooltip="Keyboard shortcuts (F1)" aria-label="Keyboard shortcuts and help">?</button>
    </div>
  `,
  styles: `
    :host { display: flex; align-items: center; gap: 12px; padding: 4px 12px; min-height: 44px;
      border-bottom: 1px solid var(--mat-sys-outline-variant); background: var(--mat-sys-surface-container-low); }
    .who { display: flex; align-items: baseline; gap: 10px; min-width: 0; flex: 1; }
    .bench { font: var(--mat-sys-title-small); margin: 0; color: var(--mat-sys-on-surface-variant); text-transform: uppercase; letter-spacing: 0.06em; }
    .title { font-weight: 600; font-size: 1rem; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; min-width: 0; }
    .save { font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); white-space: nowrap; }
    .save.unsaved { color: #7a5200; }
    .actions { display: flex; align-items: center; gap: 2px; flex-wrap: nowrap; }
    .actions button { --mat-button-text-horizontal-padding: 10px; }
    .menu-head { padding: 8px 16px 4px; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .ex-label { display: block; font-weight: 600; }
    .ex-blurb { display: block; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); line-height: 1.3; }
  `,
})
export class FileBar {
  readonly title = input('');
  readonly saveState = input<SaveState>('saved');
  readonly hasDraft = input(false);
  readonly examples = input<readonly Example[]>([]);

  readonly openExample = output<Example>();
  readonly drafts = output<void>();
  readonly newNetlist = output<void>();
  readonly openFile = output<File>();
  readonly download = output<void>();
  readonly save = output<void>();
  readonly solve = output<void>();
  readonly help = output<void>();

  protected readonly mod = typeof navigator !== 'undefined' && /Mac|iPhone|iPad/.test(navigator.platform) ? '⌘' : 'Ctrl';
  private readonly file = viewChild.required<ElementRef<HTMLInputElement>>('file');

  /** Opens the system file picker (also bound to Ctrl-O). */
  pickFile(): void {
    this.file().nativeElement.click();
  }

  protected picked(event: Event): void {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    if (file) this.openFile.emit(file);
    input.value = '';
  }

  protected saveText(): string {
    switch (this.saveState()) {
      case 'saving': return 'Saving…';
      case 'unsaved': return 'Not saved yet';
      default: return this.hasDraft() ? 'Saved in this browser' : 'Edits will be kept as a draft';
    }
  }
}
