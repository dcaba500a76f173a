/**
 * Writing a review: a comment, and comments tied to lines (typed with a line number, or started
 * by clicking a line number in the source). Reviewers who did not write the version approve it or
 * send it back — sending back needs a reason; anyone from designer up can just comment. The box
 * only gathers the words: the page sends them, and keeps them if the server refuses.
 */
import { ChangeDetectionStrategy, Component, effect, ElementRef, input, output, signal, untracked, viewChildren } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { ReviewBody, ReviewDecision } from './library-api';

/** A comment on one line, as typed. */
export interface LineDraft {
  line: number | null;
  text: string;
}

/**
 * The request for `decision` from what was typed, or a sentence saying what is missing. Line
 * comments need a line within the source and some text; empty rows are dropped.
 */
export function reviewBody(decision: ReviewDecision, comment: string, lines: readonly LineDraft[], lineCount: number): { body: ReviewBody } | { problem: string } {
  const comments: { line: number; text: string }[] = [];
  for (const l of lines) {
    const text = l.text.trim();
    if (l.line === null && !text) continue;
    if (l.line === null || !Number.isInteger(l.line) || l.line < 1 || l.line > lineCount) return { problem: `A line comment needs a line between 1 and ${lineCount}.` };
    if (!text) return { problem: `Say something about line ${l.line}, or remove that row.` };
    comments.push({ line: l.line, text });
  }
  const said = comment.trim();
  if (decision === 'send_back' && !said && comments.length === 0) return { problem: 'Say why it goes back: a comment, or a comment on a line.' };
  if (decision === 'comment' && !said && comments.length === 0) return { problem: 'Write a comment first.' };
  return { body: { decision, ...(said ? { comment: said } : {}), ...(comments.length ? { comments } : {}) } };
}

@Component({
  selector: 'nw-review-box',
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-form-field appearance="outline" class="wide" subscriptSizing="dynamic">
      <mat-label>{{ canDecide() ? 'Comment (a reason is needed to send it back)' : 'Comment' }}</mat-label>
      <textarea matInput rows="3" [value]="comment()" (input)="comment.set($any($event.target).value)"></textarea>
    </mat-form-field>
    @for (l of lines(); track $index; let i = $index) {
      <div class="line-row">
        <mat-form-field appearance="outline" class="num" subscriptSizing="dynamic">
          <mat-label>Line</mat-label>
          <input matInput type="number" min="1" [max]="lineCount()" [value]="l.line ?? ''" (input)="setLine(i, $any($event.target).value)" />
        </mat-form-field>
        <mat-form-field appearance="outline" class="wide" subscriptSizing="dynamic">
          <mat-label>Comment on line {{ l.line ?? '…' }}</mat-label>
          <input #lineText matInput [value]="l.text" (input)="setText(i, $any($event.target).value)" />
        </mat-form-field>
        <button mat-button type="button" (click)="remove(i)" [attr.aria-label]="'Remove the comment on line ' + (l.line ?? '')">Remove</button>
      </div>
    }
    <button mat-button type="button" class="add" (click)="addLine(null)">+ Comment on a line</button>
    <span class="tip">or click a line number in the source</span>
    @if (problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
    <div class="actions">
      @if (canDecide()) {
        <button mat-flat-button type="button" class="approve" [disabled]="busy()" (click)="send('approve')">Approve: vetted</button>
        <button mat-stroked-button type="button" class="send-back" [disabled]="busy()" (click)="send('send_back')">Send back to draft</button>
      }
      <button mat-button type="button" [disabled]="busy()" (click)="send('comment')">Comment only</button>
    </div>
  `,
  styles: `
    :host { display: flex; flex-direction: column; gap: 8px; }
    .wide { flex: 1; width: 100%; }
    .line-row { display: flex; gap: 8px; align-items: center; }
    .num { width: 92px; flex: none; }
    .add { align-self: flex-start; }
    .tip { margin-top: -8px; padding-left: 12px; font-size: 0.8125rem; color: var(--mat-sys-on-surface-variant); }
    .problem { margin: 0; padding: 6px 10px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    .actions { display: flex; gap: 8px; flex-wrap: wrap; }
    .approve { --mat-button-filled-container-color: var(--mat-sys-tertiary); --mat-button-filled-label-text-color: var(--mat-sys-on-tertiary); }
  `,
})
export class ReviewBox {
  /** The version is in review and the caller may approve or send it back. */
  readonly canDecide = input(false);
  /** Lines in the source, to check line numbers against. */
  readonly lineCount = input.required<number>();
  /** A line chosen in the source view; `seq` lets the same line be chosen twice. */
  readonly chosenLine = input<{ line: number; seq: number } | undefined>(undefined);
  readonly busy = input(false);
  /** A complete review to send. */
  readonly review = output<ReviewBody>();

  protected readonly comment = signal('');
  protected readonly lines = signal<LineDraft[]>([]);
  protected readonly problem = signal<string | undefined>(undefined);
  private readonly lineTexts = viewChildren<ElementRef<HTMLInputElement>>('lineText');

  constructor() {
    effect(() => {
      const c = this.chosenLine();
      if (c) untracked(() => this.addLine(c.line));
    });
  }

  /** Empties the box once the page has sent its review. */
  clear(): void {
    this.comment.set('');
    this.lines.set([]);
    this.problem.set(undefined);
  }

  protected addLine(line: number | null): void {
    // A line already being commented on keeps its row; an empty row takes the chosen line.
    const rows = this.lines();
    if (line !== null && rows.some((l) => l.line === line)) return;
    const empty = rows.findIndex((l) => l.line === null && !l.text.trim());
    const at = empty >= 0 ? empty : rows.length;
    if (empty >= 0) this.lines.set(rows.map((l, i) => (i === empty ? { ...l, line } : l)));
    else this.lines.set([...rows, { line, text: '' }]);
    // Once the row is drawn, the cursor goes where the words go.
    setTimeout(() => this.lineTexts()[at]?.nativeElement.focus());
  }

  protected setLine(i: number, raw: string): void {
    const n = Number.parseInt(raw, 10);
    this.lines.update((all) => all.map((l, j) => (j === i ? { ...l, line: Number.isFinite(n) ? n : null } : l)));
  }

  protected setText(i: number, text: string): void {
    this.lines.update((all) => all.map((l, j) => (j === i ? { ...l, text } : l)));
  }

  protected remove(i: number): void {
    this.lines.update((all) => all.filter((_, j) => j !== i));
  }

  protected send(decision: ReviewDecision): void {
    const r = reviewBody(decision, this.comment(), this.lines(), this.lineCount());
    if ('problem' in r) {
      this.problem.set(r.problem);
      return;
    }
    this.problem.set(undefined);
    this.review.emit(r.body);
  }
}
