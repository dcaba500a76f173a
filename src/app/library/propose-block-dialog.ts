/**
 * "Propose a block": its path (category/name, checked as the server checks it), tags, and the
 * source — a documented template, or the text handed in (the bench's "propose as block"). Sends
 * it as version 1, a draft of the proposer's; a refusal is shown here and nothing typed is lost.
 */
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { apiErrorOf } from '../core/team-api';
import { BlockEditor } from './block-editor';
import { blockDocCheck, blockTemplate, checkBlockPath, parseTags } from './block-path';
import { LibraryApi, type BlockVersion } from './library-api';
import { blockLink } from './library-links';
import { blockName } from './use-snippet';

export interface ProposeBlockData {
  /** The workspace the block goes to. */
  slug: string;
  /** A source to start from (the bench's text); without it, the documented template. */
  source?: string;
  /** A path to start from. */
  path?: string;
}

@Component({
  selector: 'nw-propose-block-dialog',
  imports: [MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, BlockEditor],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Propose a block</h2>
    <form (submit)="$event.preventDefault(); send()">
      <mat-dialog-content class="content">
        <p class="lead">It starts as version 1, a draft of yours. Submit it for review from its page once its checks pass.</p>
        <div class="fields">
          <mat-form-field appearance="outline" class="path">
            <mat-label>Path (category/name)</mat-label>
            <input matInput name="path" [value]="path()" (input)="pathTyped($any($event.target).value)" (blur)="touched.set(true)"
              placeholder="mirrors/wilson_npn" autocomplete="off" spellcheck="false" required />
            <mat-hint>Lower case, digits and _; the name is the block's.</mat-hint>
          </mat-form-field>
          <mat-form-field appearance="outline" class="tags">
            <mat-label>Tags, separated by commas</mat-label>
            <input matInput name="tags" [value]="tagsText()" (input)="tagsText.set($any($event.target).value)" placeholder="npn, mirror" autocomplete="off" />
            <mat-hint>Empty: the source's <code>#: tags</code> line is used.</mat-hint>
          </mat-form-field>
        </div>
        @if (touched() && pathProblem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
        @if (tagsProblem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
        <nw-block-editor class="source" [initial]="initial()" [blockName]="name()" label="Source of the proposed block" (textChange)="source.set($event)" />
        @if (refusal(); as r) { <p class="problem" role="alert">{{ r }}</p> }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" (click)="cancel()">Cancel</button>
        <button mat-flat-button type="submit" [disabled]="sending()">{{ sending() ? 'Proposing…' : 'Propose' }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .content { width: min(920px, 86vw); --nw-block-editor-height: 40vh; }
    .lead { margin: 0 0 12px; color: var(--mat-sys-on-surface-variant); }
    .fields { display: grid; grid-template-columns: 1fr 1fr; gap: 12px; margin-bottom: 8px; }
    .problem { margin: 4px 0 8px; padding: 6px 10px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
    code { font-size: 0.8125rem; }
  `,
})
export class ProposeBlockDialog {
  protected readonly data = inject<ProposeBlockData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<ProposeBlockDialog, BlockVersion>>(MatDialogRef);
  private readonly api = inject(LibraryApi);

  protected readonly path = signal(this.data.path ?? '');
  protected readonly tagsText = signal('');
  protected readonly touched = signal(!!this.data.path);
  /** What the editor starts from: the handed-in source, else the template (renamed as the path is typed). */
  protected readonly initial = signal(this.data.source ?? blockTemplate(this.data.path ?? ''));
  protected readonly source = signal(this.initial());
  protected readonly sending = signal(false);
  protected readonly refusal = signal<string | undefined>(undefined);

  private readonly checked = computed(() => checkBlockPath(this.path()));
  protected readonly pathProblem = computed(() => {
    const c = this.checked();
    return 'problem' in c ? c.problem : undefined;
  });
  protected readonly name = computed(() => {
    const c = this.checked();
    return 'path' in c ? blockName(c.path) : undefined;
  });
  private readonly tags = computed(() => parseTags(this.tagsText()));
  protected readonly tagsProblem = computed(() => {
    const t = this.tags();
    return 'problem' in t ? t.problem : undefined;
  });

  protected pathTyped(value: string): void {
    // The untouched template follows the path, so its block is already the right one.
    const templateUntouched = !this.data.source && this.source() === blockTemplate(this.path().trim());
    this.path.set(value);
    this.refusal.set(undefined);
    if (templateUntouched) {
      const next = blockTemplate(value.trim());
      this.initial.set(next);
      this.source.set(next);
    }
  }

  protected cancel(): void {
    this.ref.close();
  }

  protected async send(): Promise<void> {
    this.touched.set(true);
    const path = this.checked();
    const tags = this.tags();
    if ('problem' in path || 'problem' in tags) return;
    const doc = blockDocCheck(this.source(), blockName(path.path));
    if (!doc.defined) {
      this.refusal.set(doc.problem);
      return;
    }
    this.sending.set(true);
    this.refusal.set(undefined);
    try {
      const created = await this.api.propose(this.data.slug, { path: path.path, source: this.source(), ...(tags.tags.length ? { tags: tags.tags } : {}) });
      this.ref.close(created);
    } catch (err) {
      this.refusal.set(apiErrorOf(err).message);
    } finally {
      this.sending.set(false);
    }
  }
}

/**
 * Opens "Propose a block" and, when a block was proposed, its page (under `base`, by default the
 * workspace's own `/w/SLUG/library`). Resolves with the new version, or undefined when cancelled.
 */
export async function openProposeBlockDialog(dialog: MatDialog, router: Router, data: ProposeBlockData, base = `/w/${encodeURIComponent(data.slug)}/library`): Promise<BlockVersion | undefined> {
  const ref = dialog.open<ProposeBlockDialog, ProposeBlockData, BlockVersion>(ProposeBlockDialog, { data, maxWidth: '96vw', autoFocus: 'first-tabbable' });
  const created = (await firstValueFrom(ref.afterClosed())) || undefined;
  if (created) await router.navigateByUrl(blockLink(base, created.path, created.version));
  return created;
}
