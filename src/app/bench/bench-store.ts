/**
 * The bench's state, as signals: the netlist text, which draft it lives in, the newest solve and
 * the result the panels show, the diagnostics, and the line the editor should reveal.
 *
 * Solving goes through SolverClient (a Web Worker); storage through Drafts (IndexedDB). Every
 * edit is autosaved into the open draft shortly after typing stops, so nothing is lost to a
 * reload, a closed tab or a stopped server.
 */
import { computed, DestroyRef, inject, Injectable, signal } from '@angular/core';
import type { Diagnostic, SolveResult } from '../../../solver';
import { Drafts, titleOf, UNTITLED, type Draft } from '../core/drafts';
import type { EditorDocument, RevealRequest } from './editor/netlist-editor';
import type { Example } from './examples';
import { SolverClient } from './solver-client';
import { NO_NAMES, type SolveReply } from './solver-protocol';

/** Quiet time after the last edit before the draft is written. */
export const AUTOSAVE_MS = 800;
/** Larger files are refused: a netlist is text of a few kB. */
export const MAX_FILE_BYTES = 1_000_000;

export type SaveState = 'saved' | 'unsaved' | 'saving';

@Injectable()
export class BenchStore {
  private readonly drafts = inject(Drafts);
  readonly client = inject(SolverClient);

  /** What the editor shows; a new key replaces its whole text and undo history. */
  readonly document = signal<EditorDocument>({ key: 0, text: '' });
  /** The text as edited. */
  readonly source = signal('');
  readonly draftId = signal<string | undefined>(undefined);
  readonly fileName = signal<string | undefined>(undefined);
  readonly saveState = signal<SaveState>('saved');
  /** Where the editor should put its cursor (checks, measures and problems ask for lines). */
  readonly reveal = signal<RevealRequest | undefined>(undefined);
  readonly cursorLine = signal(1);

  readonly title = computed(() => titleOf(this.source(), this.fileName() ?? UNTITLED));
  /** The newest result, for the newest text. */
  readonly latest = computed<SolveResult | undefined>(() => this.client.reply()?.result);
  readonly diagnostics = computed<Diagnostic[]>(() => {
    const r = this.latest();
    return r ? [...r.errors, ...r.warnings].sort((a, b) => a.line - b.line || a.col - b.col) : [];
  });
  readonly errorCount = computed(() => this.latest()?.errors.length ?? 0);
  readonly names = computed(() => this.client.reply()?.names ?? NO_NAMES);
  readonly solveMs = computed(() => this.client.reply()?.solveMs);

  private readonly shownReply = computed<SolveReply | undefined>(() => {
    const reply = this.client.reply();
    if (!reply || reply.result.errors.length === 0) return reply;
    return this.client.lastClean() ?? reply;
  });
  /**
   * What the panels show: the newest result when it solved cleanly; while the text has errors
   * (half-typed words included) the last clean one, flagged `stale`, so the panels do not blink.
   */
  readonly shown = computed<SolveResult | undefined>(() => this.shownReply()?.result);
  /** The text of the shown result (its measure and check lines). */
  readonly shownText = computed(() => this.shownReply()?.text ?? '');
  readonly stale = computed(() => {
    const reply = this.client.reply();
    return !!reply && reply.result.errors.length > 0 && this.shownReply() !== reply;
  });

  private nextKey = 1;
  private revealSeq = 0;
  private saveTimer: ReturnType<typeof setTimeout> | undefined;
  private saving: Promise<void> = Promise.resolve();

  constructor() {
    inject(DestroyRef).onDestroy(() => void this.flushSave());
  }

  /** Reopens the last draft, or opens `fallback` as a new unsaved netlist. */
  async restore(fallback: Example): Promise<void> {
    const last = await this.drafts.lastOpened();
    void this.drafts.refresh();
    if (last) this.show(last.text, last.id, last.fileName);
    else this.show(fallback.text, undefined, undefined);
  }

  /** An edit from the editor. */
  edit(text: string): void {
    this.source.set(text);
    this.client.edit(text);
    this.saveState.set('unsaved');
    if (this.saveTimer !== undefined) clearTimeout(this.saveTimer);
    this.saveTimer = setTimeout(() => void this.flushSave(), AUTOSAVE_MS);
  }

  solveNow(): void {
    this.client.solveNow(this.source());
  }

  /** Ctrl-S: saves now, creating a draft even for an untouched example. */
  async saveNow(): Promise<void> {
    if (!this.draftId()) this.saveState.set('unsaved');
    await this.flushSave();
  }

  /** Writes the text into its draft now (creating the draft on first save). */
  async flushSave(): Promise<void> {
    if (this.saveTimer !== undefined) clearTimeout(this.saveTimer);
    this.saveTimer = undefined;
    if (this.saveState() === 'saved') return this.saving;
    const text = this.source();
    this.saveState.set('saving');
    this.saving = this.saving.then(async () => {
      const id = this.draftId();
      const draft = id ? await this.drafts.save(id, text) : await this.drafts.create(text, this.fileName());
      this.draftId.set(draft.id);
      if (this.source() === text) this.saveState.set('saved');
      else this.saveState.set('unsaved');
    });
    return this.saving;
  }

  /** Opens an example as a new, not yet saved netlist (the current one is saved first). */
  async openExample(example: Example): Promise<void> {
    await this.flushSave();
    this.show(example.text, undefined, undefined);
  }

  /** A blank netlist. */
  async newNetlist(): Promise<void> {
    await this.flushSave();
    this.show('title  Untitled netlist\n\n', undefined, undefined);
  }

  async openDraft(id: string): Promise<Draft | undefined> {
    await this.flushSave();
    const draft = await this.drafts.open(id);
    if (draft) this.show(draft.text, draft.id, draft.fileName);
    return draft;
  }

  async deleteDraft(id: string): Promise<void> {
    await this.drafts.remove(id);
    if (this.draftId() === id) {
      this.draftId.set(undefined);
      this.saveState.set('unsaved');
    }
  }

  /**
   * Opens a file from disk as a new draft. Returns a sentence for the user when the file is
   * refused (too big, or not text).
   */
  async openFile(file: File): Promise<string | undefined> {
    if (file.size > MAX_FILE_BYTES) return `${file.name} is ${(file.size / 1e6).toFixed(1)} MB; a netlist is a text file of a few kB.`;
    if (!/\.(nwl|txt)$/i.test(file.name) && file.type && !file.type.startsWith('text/')) return `${file.name} is not a text file; open a .nwl netlist.`;
    const text = (await file.text()).replace(/\r\n?/g, '\n');
    if (text.includes('\u0000')) return `${file.name} is not a text file; open a .nwl netlist.`;
    await this.flushSave();
    const draft = await this.drafts.create(text, file.name);
    this.show(text, draft.id, file.name);
    return undefined;
  }

  /** The current netlist as a file to download. */
  download(): { name: string; blob: Blob } {
    const base = this.fileName() ?? `${slug(this.title())}.nwl`;
    return { name: /\.nwl$/i.test(base) ? base : `${base.replace(/\.[^.]*$/, '')}.nwl`, blob: new Blob([this.source()], { type: 'text/plain;charset=utf-8' }) };
  }

  /** Moves the editor cursor to a line (from a check, a measure or a problem). */
  selectLine(line: number, col?: number): void {
    this.reveal.set({ line, col, seq: ++this.revealSeq });
  }

  private show(text: string, draftId: string | undefined, fileName: string | undefined): void {
    if (this.saveTimer !== undefined) clearTimeout(this.saveTimer);
    this.saveTimer = undefined;
    this.document.set({ key: this.nextKey++, text });
    this.source.set(text);
    this.draftId.set(draftId);
    this.fileName.set(fileName);
    // Nothing to save until it is edited: browsing the examples leaves no drafts behind.
    this.saveState.set('saved');
    this.client.forgetClean();
    this.client.solveNow(text);
  }
}

/** A file name from a title: "Strainlab front end, step 1" → "strainlab-front-end-step-1". */
export function slug(title: string): string {
  const s = title.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60);
  return s || 'netlist';
}
