/**
 * The bench's bar above the editor: which netlist is open and where it is saved, the examples,
 * the drafts, opening a file from disk, downloading, saving, the team (netlists, revisions, save
 * to team, share — only what the user's role allows), solving now and the help sheet.
 */
import { ChangeDetectionStrategy, Component, computed, ElementRef, input, output, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatMenuModule } from '@angular/material/menu';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import type { Example } from '../examples';
import type { SaveStatus } from '../team/save-status';

/** What the bar offers for the team server. */
export interface TeamBar {
  /** Signed in: the team netlists are a link away. */
  signedIn: boolean;
  /** May create a netlist in the current workspace ("Save to team"). */
  canCreate: boolean;
  /** The team netlist the draft is linked to. */
  linked?: { netlistId: string; canWrite: boolean };
}

const NO_TEAM: TeamBar = { signedIn: false, canCreate: false };

@Component({
  selector: 'nw-file-bar',
  imports: [MatButtonModule, MatMenuModule, MatTooltipModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="who">
      <h1 class="bench">Bench</h1>
      <span class="title" [title]="title() + (label() ? ' (' + label() + ')' : '')">{{ title() }}</span>
      @if (label()) { <span class="label">({{ label() }})</span> }
      <span class="save" [class]="status().tone" [title]="status().text" aria-live="polite">{{ status().text }}</span>
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
      <button mat-button type="button" (click)="save.emit()" [matTooltip]="saveHint() + ' (' + mod + '+S)'" [attr.aria-label]="saveHint()">Save</button>
      @if (team().signedIn) {
        <span class="sep" aria-hidden="true"></span>
        <a mat-button routerLink="/netlists">Team netlists</a>
        @if (team().linked; as l) {
          <a mat-button [routerLink]="['/netlists', l.netlistId, 'revisions']" matTooltip="The saved versions of this team netlist">Revisions</a>
          @if (l.canWrite) { <button mat-stroked-button type="button" (click)="share.emit()" matTooltip="A read-only link for people without an account">Share</button> }
        } @else if (team().canCreate) {
          <button mat-stroked-button type="button" (click)="saveToTeam.emit()" matTooltip="Keep this netlist on the team server, with every save as a version">Save to team</button>
        }
        @if (team().canCreate) {
          <button mat-button type="button" (click)="proposeBlock.emit()" matTooltip="Offer the block at the cursor (or this netlist as a block) to the team library for review">Propose block</button>
        }
        <span class="sep" aria-hidden="true"></span>
      }
      <button mat-flat-button type="button" (click)="solve.emit()" [matTooltip]="'Solve now (' + mod + '+Enter)'" aria-label="Solve now">Solve</button>
      <button mat-icon-button type="button" (click)="help.emit()" matTooltip="Keyboard shortcuts (F1)" aria-label="Keyboard shortcuts and help">?</button>
    </div>
  `,
  styles: `
    :host { display: flex; align-items: center; flex-wrap: wrap; gap: 4px 12px; padding: 4px 12px; min-height: 44px; min-width: 0;
      border-bottom: 1px solid var(--mat-sys-outline-variant); background: var(--mat-sys-surface-container-low); }
    .who { display: flex; align-items: center; gap: 10px; min-width: 0; flex: 1 1 0; }
    .bench { font: var(--mat-sys-title-small); margin: 0; color: var(--mat-sys-on-surface-variant); text-transform: uppercase; letter-spacing: 0.06em; }
    .title { font-weight: 600; font-size: 1rem; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; min-width: 4em; flex: 0 1 auto; }
    /* Long states (offline, conflict) wrap onto a second line rather than push the actions off screen. */
    .label { font-weight: 600; white-space: nowrap; color: var(--mat-sys-tertiary); flex: none; }
    .save { font-size: 0.8125rem; line-height: 1.2; color: var(--mat-sys-on-surface-variant); flex: none; max-width: 20em;
      display: -webkit-box; -webkit-box-orient: vertical; -webkit-line-clamp: 2; overflow: hidden; }
    .save.warn { color: #7a5200; }
    .sep { width: 1px; height: 24px; margin: 0 4px; background: var(--mat-sys-outline-variant); }
    .actions { display: flex; align-items: center; gap: 2px; flex-wrap: nowrap; }
    .actions button { --mat-button-text-horizontal-padding: 10px; }
    .menu-head { padding: 8px 16px 4px; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .ex-label { display: block; font-weight: 600; }
    .ex-blurb { display: block; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); line-height: 1.3; }
  `,
})
export class FileBar {
  /** The netlist's own title. */
  readonly title = input('');
  /** A note kept with the draft ("revision 3"), shown after the title even when the title is cut short. */
  readonly label = input<string | undefined>();
  /** Where the text is saved, in words (see saveStatus). */
  readonly status = input<SaveStatus>({ text: '', tone: 'ok' });
  readonly team = input<TeamBar>(NO_TEAM);
  readonly examples = input<readonly Example[]>([]);

  readonly openExample = output<Example>();
  readonly drafts = output<void>();
  readonly newNetlist = output<void>();
  readonly openFile = output<File>();
  readonly download = output<void>();
  readonly save = output<void>();
  readonly solve = output<void>();
  readonly help = output<void>();
  readonly saveToTeam = output<void>();
  readonly share = output<void>();
  readonly proposeBlock = output<void>();

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

  protected readonly saveHint = computed(() =>
    this.team().linked?.canWrite ? 'Save the draft in this browser and to the team' : 'Save the draft in this browser');
}
