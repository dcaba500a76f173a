/**
 * The bench's state, as signals: the netlist text, which draft it lives in (and the team netlist
 * that draft is linked to, if any), the newest solve and the result the panels show, the
 * diagnostics, and the line the editor should reveal.
 *
 * Solving goes through SolverClient (a Web Worker); storage through Drafts (IndexedDB). Every
 * edit is autosaved into the open draft shortly after typing stops, and at once when the page is
 * hidden or left; until that write is done the text also waits in Drafts' synchronous stash,
 * moved into its draft on the next visit. So nothing is lost to a reload, a closed tab or a
 * stopped server. Saving to the team server is TeamSync's business; this store only keeps the
 * link (`remote`) and writes it with the draft.
 */
import { DOCUMENT } from '@angular/common';
import { computed, DestroyRef, inject, Injectable, signal } from '@angular/core';
import { Drafts, draftTitle, UNTITLED, type Draft, type DraftRemote } from '../core/drafts';
import type { EditorDocument, RevealRequest } from './editor/netlist-editor';
import type { Example } from './examples';
import { SolverClient } from './solver-client';
import { SolveView } from './solve-view';

/** Quiet time after the last edit before the draft is written. */
export const AUTOSAVE_MS = 800;
/** Larger files are refused: a netlist is text of a few kB. */
export const MAX_FILE_BYTES = 1_000_000;

export type SaveState = 'saved' | 'unsaved' | 'saving';

/** What a shown netlist carries besides its text. */
export interface ShownMeta {
  label?: string;
  remote?: DraftRemote;
}

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

  /** A note after the title ("revision 3"), kept with the draft. */
  readonly label = signal<string | undefined>(undefined);
  /** The team netlist the open draft is linked to, with the version it is based on. */
  readonly remote = signal<DraftRemote | undefined>(undefined);
  /** True when the text differs from the team version it is based on. */
  readonly teamDirty = computed(() => {
    const remote = this.remote();
    return !!remote && this.source() !== remote.savedText;
  });

  /** The draft's title: the netlist's own, then its label. */
  readonly title = computed(() => draftTitle(this.source(), this.fileName() ?? UNTITLED, this.label()));
  /** The netlist's own title, without the label. */
  readonly ownTitle = computed(() => draftTitle(this.source(), this.fileName() ?? UNTITLED));

  private readonly view = new SolveView(this.client);
  /** The newest result, for the newest text. */
  readonly latest = this.view.latest;
  readonly diagnostics = this.view.diagnostics;
  readonly errorCount = this.view.errorCount;
  readonly names = this.view.names;
  readonly solveMs = this.view.solveMs;
  /** What the panels show (see SolveView). */
  readonly shown = this.view.shown;
  readonly shownWhole = this.view.shownWhole;
  readonly shownLines = this.view.shownLines;
  readonly stale = this.view.stale;
  readonly pending = this.view.pending;
  readonly staleReason = this.view.staleReason;

  private nextKey = 1;
  private revealSeq = 0;
  private saveTimer: ReturnType<typeof setTimeout> | undefined;
  private saving: Promise<void> = Promise.resolve();
  /** The text a page left unsaved last time, moved into its draft before anything else opens. */
  private readonly recovered = this.drafts.recoverStash();

  constructor() {
    // A hidden page may be discarded or closed without another event: write the draft now.
    const doc = inject(DOCUMENT);
    const view = doc.defaultView;
    const onHidden = () => {
      if (doc.visibilityState === 'hidden') void this.flushSave();
    };
    const onPageHide = () => void this.flushSave();
    doc.addEventListener('visibilitychange', onHidden);
    view?.addEventListener('pagehide', onPageHide);
    inject(DestroyRef).onDestroy(() => {
      doc.removeEventListener('visibilitychange', onHidden);
      view?.removeEventListener('pagehide', onPageHide);
      void this.flushSave();
    });
  }

  /** Reopens the last draft (with any text a reload left unsaved), or opens `fallback` as a new unsaved netlist. */
  async restore(fallback: Example): Promise<void> {
    const last = (await this.recovered) ?? (await this.drafts.lastOpened());
    void this.drafts.refresh();
    if (last) this.showDraft(last);
    else this.show(fallback.text, undefined, undefined);
  }

  /** An edit from the editor. */
  edit(text: string): void {
    this.source.set(text);
    this.client.edit(text);
    this.saveState.set('unsaved');
    this.drafts.stash({ draftId: this.draftId(), text, fileName: this.fileName(), label: this.label(), remote: this.remote() });
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
    return this.write();
  }

  /**
   * Links the open netlist to a team netlist (or moves it to a new base version), optionally with
   * new text (a conflict resolved, the team's copy taken), and writes both into the draft at once
   * — creating the draft if there is none yet — so a reload keeps text and link together.
   */
  async relink(remote: DraftRemote, text = this.source()): Promise<void> {
    this.remote.set(remote);
    this.label.set(undefined);
    if (text !== this.source()) {
      this.document.set({ key: this.nextKey++, text });
      this.source.set(text);
      this.client.solveNow(text);
    }
    await this.write();
  }

  /** Shows a stored draft, with its label and team link. */
  showDraft(draft: Draft): void {
    this.show(draft.text, draft.id, draft.fileName, { label: draft.label, remote: draft.remote });
  }

  /** Chains one write of the current text and link into the draft. */
  private write(): Promise<void> {
    if (this.saveTimer !== undefined) clearTimeout(this.saveTimer);
    this.saveTimer = undefined;
    const text = this.source();
    const meta = { label: this.label() ?? null, remote: this.remote() ?? null };
    this.saveState.set('saving');
    this.saving = this.saving.then(async () => {
      const id = this.draftId();
      const draft = id ? await this.drafts.save(id, text, meta) : await this.drafts.create(text, this.fileName(), meta);
      this.draftId.set(draft.id);
      if (this.source() === text) this.saveState.set('saved');
      else this.saveState.set('unsaved');
    });
    return this.saving;
  }

  /** Opens an example as a new, not yet saved netlist (the current one is saved first). */
  async openExample(example: Example): Promise<void> {
    await this.openText(example.text);
  }

  /** Opens a text as a new, not yet saved netlist (the current one is saved first). */
  async openText(text: string, meta: ShownMeta = {}): Promise<void> {
    await this.flushSave();
    this.show(text, undefined, undefined, meta);
  }

  /** A blank netlist. */
  async newNetlist(): Promise<void> {
    await this.flushSave();
    this.show('title  Untitled netlist\n\n', undefined, undefined);
  }

  async openDraft(id: string): Promise<Draft | undefined> {
    await this.flushSave();
    const draft = await this.drafts.open(id);
    if (draft) this.showDraft(draft);
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

  /** Shows a netlist: its text in a fresh editor document, solved at once. */
  show(text: string, draftId: string | undefined, fileName: string | undefined, meta: ShownMeta = {}): void {
    if (this.saveTimer !== undefined) clearTimeout(this.saveTimer);
    this.saveTimer = undefined;
    this.document.set({ key: this.nextKey++, text });
    this.source.set(text);
    this.draftId.set(draftId);
    this.fileName.set(fileName);
    this.label.set(meta.label);
    this.remote.set(meta.remote);
    // Nothing to save until it is edited: browsing the examples leaves no drafts behind.
    this.saveState.set('saved');
    this.client.forgetLastSolved();
    this.client.solveNow(text);
  }
}

/** A file name from a title: "Strainlab front end, step 1" → "strainlab-front-end-step-1". */
export function slug(title: string): string {
  const s = title.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60);
  return s || 'netlist';
}
