/**
 * Sharing a team netlist: a read-only link to the saved version, for people without an account
 * (a reviewer, a customer). Optional expiry and people to tell by e-mail; the link is shown once,
 * as the server keeps only a hash of its token. Below, the netlist's links and how often each
 * was opened.
 */
import { ChangeDetectionStrategy, Component, ElementRef, inject, signal, viewChild } from '@angular/core';
import { Clipboard } from '@angular/cdk/clipboard';
import { COMMA, ENTER, SEMICOLON, SPACE } from '@angular/cdk/keycodes';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule, type MatChipInputEvent } from '@angular/material/chips';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { TeamApi, type CreatedShare } from '../../core/team-api';
import { refusalText } from './save-to-team-dialog';
import { EXPIRY_CHOICES, expiryOf, parseEmails, shortDate, type ExpiryChoice } from './share-options';
import { ShareLinks } from './share-links';

export interface ShareData {
  netlistId: string;
  name: string;
  /** The saved team version a new link will show. */
  version: number;
  /** The text of that version (its `use` lines are recorded with the link). */
  savedText: string;
  /** The bench's text differs from the saved version. */
  localDiffers: boolean;
  /** The user may save to the team (offer "Save first"). */
  canSave: boolean;
}

/** What the dialog closes with: `save-first` asks the bench to save, then to open it again. */
export type ShareResult = 'save-first' | undefined;

/** Today as a date input wants it (local time). */
function todayInput(now = new Date()): string {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${p(now.getMonth() + 1)}-${p(now.getDate())}`;
}

@Component({
  selector: 'nw-share-dialog',
  imports: [MatDialogModule, MatButtonModule, MatChipsModule, MatFormFieldModule, MatInputModule, MatSelectModule, ShareLinks],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Share “{{ data.name }}”</h2>
    <mat-dialog-content>
      @if (data.localDiffers) {
        <div class="notice" role="note">
          <span>Your text has changes not saved to the team. A link shows the saved team version, v{{ data.version }}.</span>
          @if (data.canSave) { <button mat-stroked-button type="button" (click)="saveFirst()">Save first</button> }
        </div>
      }
      <p class="lead">Anyone with the link can read team version v{{ data.version }} and see its results solved in their browser,
        without signing in. Later saves do not change what the link shows.</p>

      @if (created(); as c) {
        <section class="created" aria-label="The new link">
          <p class="made" role="status">Link to v{{ c.version }} created@if (c.expiresAt) {, working until {{ date(c.expiresAt) }}}.
            Copy it now: it is shown only this once.</p>
          <div class="url-row">
            <code class="url" data-testid="share-url">{{ url() }}</code>
            <button mat-flat-button type="button" (click)="copy()">Copy link</button>
          </div>
          @if (copied() === true) { <p class="quiet" role="status">Copied to the clipboard.</p> }
          @if (copied() === false) { <p class="quiet" role="status">The browser did not allow copying; select the link and copy it by hand.</p> }
          @if (c.notified.length) { <p class="quiet">A note with the link went to {{ c.notified.join(', ') }}.</p> }
          <button mat-button type="button" (click)="another()">Make another link</button>
        </section>
      } @else {
        <section class="new" aria-label="New link">
          <div class="row">
            <mat-form-field class="expiry">
              <mat-label>Link stops working</mat-label>
              <mat-select [value]="expiry()" (selectionChange)="expiry.set($event.value)">
                @for (c of choices; track c.value) { <mat-option [value]="c.value">{{ c.label }}</mat-option> }
              </mat-select>
            </mat-form-field>
            @if (expiry() === 'date') {
              <mat-form-field class="date">
                <mat-label>Last day</mat-label>
                <input matInput type="date" [min]="today" [value]="lastDay()" (input)="lastDay.set($any($event.target).value)" />
              </mat-form-field>
            }
          </div>
          <mat-form-field class="emails">
            <mat-label>Tell people by e-mail (optional)</mat-label>
            <mat-chip-grid #grid aria-label="Addresses to tell">
              @for (a of emails(); track a) {
                <mat-chip-row (removed)="removeEmail(a)">{{ a }}
                  <button matChipRemove type="button" [attr.aria-label]="'Remove ' + a">×</button>
                </mat-chip-row>
              }
              <input #emailInput placeholder="name@example.com" [matChipInputFor]="grid" [matChipInputSeparatorKeyCodes]="separators"
                [matChipInputAddOnBlur]="true" (matChipInputTokenEnd)="addEmails($event)" (paste)="pasted($event)" />
            </mat-chip-grid>
            <mat-hint>Separate addresses with commas or spaces.</mat-hint>
          </mat-form-field>
          @if (problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
          <button mat-flat-button type="button" (click)="create()" [disabled]="busy()">{{ busy() ? 'Creating…' : 'Create link' }}</button>
        </section>
      }

      <nw-share-links [netlistId]="data.netlistId" [refreshKey]="made()" />
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Close</button>
    </mat-dialog-actions>
  `,
  styles: `
    :host { display: block; }
    .notice { display: flex; align-items: center; gap: 12px; padding: 8px 12px; margin-bottom: 10px; border-radius: 6px; background: #fbecc8; color: #4d3300; }
    .lead { margin: 0 0 12px; max-width: 64ch; }
    .row { display: flex; gap: 12px; flex-wrap: wrap; }
    .expiry { width: 220px; }
    .date { width: 200px; }
    .emails { width: 100%; }
    .problem { color: #8c1d18; margin: 0 0 8px; }
    .quiet { color: var(--mat-sys-on-surface-variant); margin: 4px 0; }
    .created { padding: 10px 12px; border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; background: var(--mat-sys-surface-container-lowest); }
    .made { margin: 0 0 8px; }
    .url-row { display: flex; align-items: center; gap: 10px; }
    .url { flex: 1; padding: 6px 8px; border-radius: 4px; background: var(--mat-sys-surface-container); overflow-wrap: anywhere; user-select: all; }
  `,
})
export class ShareDialog {
  protected readonly data = inject<ShareData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<ShareDialog, ShareResult>>(MatDialogRef);
  private readonly api = inject(TeamApi);
  private readonly clipboard = inject(Clipboard);
  private readonly emailInput = viewChild<ElementRef<HTMLInputElement>>('emailInput');

  protected readonly choices = EXPIRY_CHOICES;
  protected readonly separators = [ENTER, COMMA, SEMICOLON, SPACE];
  protected readonly today = todayInput();
  protected readonly expiry = signal<ExpiryChoice>('never');
  protected readonly lastDay = signal('');
  protected readonly emails = signal<string[]>([]);
  protected readonly problem = signal<string | undefined>(undefined);
  protected readonly busy = signal(false);
  protected readonly created = signal<CreatedShare | undefined>(undefined);
  protected readonly url = signal('');
  protected readonly copied = signal<boolean | undefined>(undefined);
  /** Counts links made here, so the list below reloads. */
  protected readonly made = signal(0);
  /** What the last typing or paste had that is not an address. */
  private invalid: string[] = [];

  protected date(iso: string): string {
    return shortDate(iso);
  }

  protected saveFirst(): void {
    this.ref.close('save-first');
  }

  protected addEmails(event: MatChipInputEvent): void {
    this.take(event.value);
    event.chipInput.clear();
    this.putBackInvalid();
  }

  /** A pasted list becomes chips at once; what is not an address stays in the field. */
  protected pasted(event: ClipboardEvent): void {
    const text = event.clipboardData?.getData('text') ?? '';
    if (!/[\s,;]/.test(text.trim())) return;
    event.preventDefault();
    this.take(text);
    this.putBackInvalid();
  }

  protected removeEmail(address: string): void {
    this.emails.update((all) => all.filter((a) => a !== address));
  }

  protected async create(): Promise<void> {
    if (this.busy()) return;
    // Addresses typed but not yet turned into chips count too.
    const input = this.emailInput()?.nativeElement;
    if (input?.value.trim()) {
      this.take(input.value);
      input.value = '';
      this.putBackInvalid();
      if (this.problem()) return;
    }
    const expiry = expiryOf(this.expiry(), this.lastDay(), new Date());
    if (expiry.error) return this.problem.set(expiry.error);
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      const created = await this.api.createShare(this.data.netlistId, {
        ...(expiry.expiresAt ? { expiresAt: expiry.expiresAt } : {}),
        ...(this.emails().length ? { notify: this.emails() } : {}),
      });
      this.url.set(new URL(created.url, location.origin).href);
      this.created.set(created);
      this.copied.set(undefined);
      this.emails.set([]);
      this.made.update((n) => n + 1);
    } catch (err) {
      this.problem.set(refusalText(err));
    } finally {
      this.busy.set(false);
    }
  }

  protected copy(): void {
    this.copied.set(this.clipboard.copy(this.url()));
  }

  protected another(): void {
    this.created.set(undefined);
    this.url.set('');
  }

  private take(text: string): void {
    const { valid, invalid } = parseEmails(text);
    this.emails.update((all) => [...all, ...valid.filter((v) => !all.some((a) => a.toLowerCase() === v.toLowerCase()))]);
    this.invalid = invalid;
    this.problem.set(invalid.length ? `${invalid.map((a) => `“${a}”`).join(', ')} ${invalid.length === 1 ? 'is not an e-mail address' : 'are not e-mail addresses'}; correct or remove ${invalid.length === 1 ? 'it' : 'them'}.` : undefined);
  }

  /** Leaves what was not an address in the field, to be corrected rather than lost. */
  private putBackInvalid(): void {
    const input = this.emailInput()?.nativeElement;
    if (input && this.invalid.length) input.value = this.invalid.join(', ');
  }
}
