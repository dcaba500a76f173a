/**
 * Drafts: netlists kept in this browser (IndexedDB through Dexie), so work survives a reload, a
 * closed tab and a stopped server. Each draft is one netlist text with a title read from its
 * `title` line; the bench autosaves into the draft it has open and reopens the last one. A draft
 * opened from the team server stays linked to its netlist (`remote`), with the version it is
 * based on, so it can be saved back — or kept safely here while the server cannot be reached.
 *
 * The logic (titles, ordering, pruning, last-opened) sits over a small storage interface so it
 * can be tested without a browser; the Dexie backend is the real one.
 *
 * IndexedDB writes are asynchronous and may not finish when the page unloads, so the bench also
 * keeps the newest text not yet written in a synchronous stash (localStorage); the next visit
 * moves it into its draft before anything else opens (`recoverStash`).
 */
import { Injectable, InjectionToken, inject, signal } from '@angular/core';
import Dexie, { type Table } from 'dexie';

/**
 * The team netlist a draft is linked to. `savedText` is the text of `baseVersion` on the server,
 * so the bench can tell whether the draft has changes not yet saved to the team without asking.
 */
export interface DraftRemote {
  netlistId: string;
  /** Slug of the netlist's workspace (the role there decides whether it may be saved). */
  workspace: string;
  /** The netlist's name on the server. */
  name: string;
  /** The server version this draft's text was last in step with. */
  baseVersion: number;
  /** The text of `baseVersion`. */
  savedText: string;
}

export interface Draft {
  id: string;
  /** From the netlist's `title` line, else the file name it came from, else "Untitled netlist"; then ` (label)`. */
  title: string;
  text: string;
  /** The file it was opened from, when it was. */
  fileName?: string;
  /** A note kept after the title, e.g. "revision 3" or "my version before conflict". */
  label?: string;
  /** The team netlist this draft saves to, when linked. */
  remote?: DraftRemote;
  createdAt: number;
  updatedAt: number;
}

/**
 * What may change besides the text. A key left out keeps what the draft has; `null` removes it.
 */
export interface DraftMeta {
  label?: string | null;
  remote?: DraftRemote | null;
}

/** Where drafts are stored. */
export interface DraftBackend {
  all(): Promise<Draft[]>;
  get(id: string): Promise<Draft | undefined>;
  put(draft: Draft): Promise<void>;
  delete(ids: string[]): Promise<void>;
  getMeta(key: string): Promise<string | undefined>;
  setMeta(key: string, value: string): Promise<void>;
}

class DraftDatabase extends Dexie {
  drafts!: Table<Draft, string>;
  meta!: Table<{ key: string; value: string }, string>;
  constructor() {
    super('nodewright-drafts');
    // `label` and `remote` are not indexed, so they need no new schema version.
    this.version(1).stores({ drafts: 'id, updatedAt', meta: 'key' });
  }
}

/** IndexedDB, through Dexie. */
export class DexieDraftBackend implements DraftBackend {
  private readonly db = new DraftDatabase();
  all(): Promise<Draft[]> {
    return this.db.drafts.orderBy('updatedAt').reverse().toArray();
  }
  get(id: string): Promise<Draft | undefined> {
    return this.db.drafts.get(id);
  }
  async put(draft: Draft): Promise<void> {
    await this.db.drafts.put(draft);
  }
  async delete(ids: string[]): Promise<void> {
    await this.db.drafts.bulkDelete(ids);
  }
  async getMeta(key: string): Promise<string | undefined> {
    return (await this.db.meta.get(key))?.value;
  }
  async setMeta(key: string, value: string): Promise<void> {
    await this.db.meta.put({ key, value });
  }
}

/** Plain memory; for tests, and the fallback when IndexedDB is unavailable (private windows). */
export class MemoryDraftBackend implements DraftBackend {
  private readonly drafts = new Map<string, Draft>();
  private readonly meta = new Map<string, string>();
  async all(): Promise<Draft[]> {
    return [...this.drafts.values()].map((d) => ({ ...d })).sort((a, b) => b.updatedAt - a.updatedAt);
  }
  async get(id: string): Promise<Draft | undefined> {
    const d = this.drafts.get(id);
    return d ? { ...d } : undefined;
  }
  async put(draft: Draft): Promise<void> {
    this.drafts.set(draft.id, { ...draft });
  }
  async delete(ids: string[]): Promise<void> {
    for (const id of ids) this.drafts.delete(id);
  }
  async getMeta(key: string): Promise<string | undefined> {
    return this.meta.get(key);
  }
  async setMeta(key: string, value: string): Promise<void> {
    this.meta.set(key, value);
  }
}

export const DRAFT_BACKEND = new InjectionToken<DraftBackend>('draft storage', {
  providedIn: 'root',
  factory: () => (typeof indexedDB === 'undefined' ? new MemoryDraftBackend() : new DexieDraftBackend()),
});

/** The synchronous part of Web Storage the stash uses. */
export type StashStorage = Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;

/** Where the unsaved text waits synchronously: localStorage, when the browser allows it. */
export const DRAFT_STASH = new InjectionToken<StashStorage | undefined>('draft stash', {
  providedIn: 'root',
  factory: () => {
    try {
      return globalThis.localStorage ?? undefined;
    } catch {
      return undefined; // storage disabled: the IndexedDB draft is all there is
    }
  },
});

/** Web Storage in plain memory, for tests: what a page's localStorage keeps across a reload. */
export class MemoryStash implements StashStorage {
  readonly items = new Map<string, string>();
  getItem(key: string): string | null {
    return this.items.get(key) ?? null;
  }
  setItem(key: string, value: string): void {
    this.items.set(key, value);
  }
  removeItem(key: string): void {
    this.items.delete(key);
  }
}

/** The newest text of the open netlist that may not be in its draft yet. */
export interface Stash {
  /** The draft it belongs to; none for a netlist never saved (an edited example). */
  draftId?: string;
  text: string;
  fileName?: string;
  label?: string;
  remote?: DraftRemote;
}

/** The Web Storage key of the stash. */
export const STASH_KEY = 'nodewright-unsaved-edit';

/** Clock and id source, replaceable in tests. */
export const DRAFT_CLOCK = new InjectionToken<() => number>('draft clock', { providedIn: 'root', factory: () => () => Date.now() });

/** Drafts kept at most; the least recently changed go first. */
export const MAX_DRAFTS = 100;
const LAST_OPENED = 'last-opened-draft';
export const UNTITLED = 'Untitled netlist';

/** The title shown for a draft: the netlist's own title, then its label in parentheses. */
export function draftTitle(text: string, fallback = UNTITLED, label?: string): string {
  const title = titleOf(text, fallback);
  return label ? `${title} (${label})` : title;
}

/** The title a netlist gives itself: its first `title` line, trimmed of a trailing comment. */
export function titleOf(text: string, fallback = UNTITLED): string {
  for (const line of text.split('\n')) {
    const m = /^\s*title\s+(.*)$/.exec(line);
    if (m) {
      const title = m[1].replace(/\s+#.*$/, '').trim();
      if (title) return title.length > 120 ? `${title.slice(0, 117)}…` : title;
    }
  }
  return fallback;
}

/** Applies `meta` to a draft and recomputes its title. */
function withMeta(draft: Draft, meta: DraftMeta): Draft {
  const next: Draft = { ...draft };
  if (meta.label === null) delete next.label;
  else if (meta.label !== undefined) next.label = meta.label;
  if (meta.remote === null) delete next.remote;
  else if (meta.remote !== undefined) next.remote = { ...meta.remote };
  next.title = draftTitle(next.text, next.fileName ?? UNTITLED, next.label);
  return next;
}

function sameRemote(a: DraftRemote | undefined, b: DraftRemote | undefined): boolean {
  if (!a || !b) return a === b;
  return a.netlistId === b.netlistId && a.workspace === b.workspace && a.name === b.name && a.baseVersion === b.baseVersion && a.savedText === b.savedText;
}

function newId(): string {
  return globalThis.crypto?.randomUUID?.() ?? `d${Date.now().toString(36)}${Math.random().toString(36).slice(2, 10)}`;
}

@Injectable({ providedIn: 'root' })
export class Drafts {
  private readonly backend = inject(DRAFT_BACKEND);
  private readonly now = inject(DRAFT_CLOCK);
  private readonly stashStorage = inject(DRAFT_STASH);
  /** Every draft, most recently changed first. */
  readonly list = signal<Draft[]>([]);
  /** Set when storage failed (quota, private mode): the bench says so instead of losing work quietly. */
  readonly problem = signal<string | undefined>(undefined);

  async refresh(): Promise<Draft[]> {
    const all = await this.guard(() => this.backend.all(), []);
    this.list.set(all);
    return all;
  }

  /** A new draft with this text (linked to a team netlist or labelled when `meta` says so). */
  async create(text: string, fileName?: string, meta: DraftMeta = {}): Promise<Draft> {
    const t = this.now();
    const draft = withMeta({ id: newId(), title: '', text, ...(fileName ? { fileName } : {}), createdAt: t, updatedAt: t }, meta);
    await this.put(draft);
    await this.guard(() => this.backend.setMeta(LAST_OPENED, draft.id), undefined);
    await this.prune();
    await this.refresh();
    return draft;
  }

  /**
   * Saves new text (and, when given, a new team link or label) into a draft — creating it again
   * if it was deleted meanwhile, link included, so neither the text nor its base version is lost.
   */
  async save(id: string, text: string, meta: DraftMeta = {}): Promise<Draft> {
    const old = await this.guard(() => this.backend.get(id), undefined);
    const t = this.now();
    const draft = withMeta(old ? { ...old, text, updatedAt: Math.max(t, old.updatedAt) } : { id, text, title: '', createdAt: t, updatedAt: t }, meta);
    if (old && old.text === text && old.title === draft.title && sameRemote(old.remote, draft.remote)) {
      this.clearStash(text);
      return old;
    }
    await this.put(draft);
    await this.refresh();
    return draft;
  }

  /** Opens a draft: returns it and remembers it as the one to reopen next time. */
  async open(id: string): Promise<Draft | undefined> {
    const draft = await this.guard(() => this.backend.get(id), undefined);
    if (draft) await this.guard(() => this.backend.setMeta(LAST_OPENED, id), undefined);
    return draft;
  }

  /** The draft open when the bench was last left, if it still exists. */
  async lastOpened(): Promise<Draft | undefined> {
    const id = await this.guard(() => this.backend.getMeta(LAST_OPENED), undefined);
    return id ? this.guard(() => this.backend.get(id), undefined) : undefined;
  }

  /** The draft linked to team netlist `netlistId`, if there is one (the most recently changed). */
  async linkedTo(netlistId: string): Promise<Draft | undefined> {
    const all = await this.guard(() => this.backend.all(), []);
    return all.filter((d) => d.remote?.netlistId === netlistId).sort((a, b) => b.updatedAt - a.updatedAt)[0];
  }

  /** An unlinked draft with exactly this text and label (so opening the same revision twice reuses it). */
  async findCopy(text: string, label: string): Promise<Draft | undefined> {
    const all = await this.guard(() => this.backend.all(), []);
    return all.find((d) => !d.remote && d.label === label && d.text === text);
  }

  async remove(id: string): Promise<void> {
    await this.guard(() => this.backend.delete([id]), undefined);
    await this.refresh();
  }

  /** Keeps `stash` synchronously until `clearStash`; quietly does nothing where storage is refused. */
  stash(stash: Stash): void {
    try {
      this.stashStorage?.setItem(STASH_KEY, JSON.stringify(stash));
    } catch {
      // Quota or a storage-less window: the draft's own autosave still runs.
    }
  }

  /** Forgets the stash once `text` is safely in a draft (a newer stash is kept); saves do this themselves. */
  clearStash(text: string): void {
    try {
      if (this.readStash()?.text === text) this.stashStorage!.removeItem(STASH_KEY);
    } catch {
      // As in stash().
    }
  }

  /**
   * Moves a stash left by a page that unloaded before its draft was written into that draft (or a
   * new one, reusing a draft that already holds the very text), makes it the last opened, and
   * returns it. The stash goes only once the draft is written; otherwise it waits for the next visit.
   */
  async recoverStash(): Promise<Draft | undefined> {
    const stash = this.readStash();
    if (!stash) return undefined;
    const meta: DraftMeta = { label: stash.label ?? null, remote: stash.remote ?? null };
    let draft: Draft;
    if (stash.draftId) draft = await this.save(stash.draftId, stash.text, meta);
    else {
      const same = (await this.guard(() => this.backend.all(), [])).find((d) => d.text === stash.text);
      if (same) this.clearStash(same.text);
      draft = same ?? (await this.create(stash.text, stash.fileName, meta));
    }
    if (this.readStash()?.text === stash.text) return undefined; // not written
    await this.open(draft.id);
    return draft;
  }

  private readStash(): Stash | undefined {
    try {
      return parseStash(this.stashStorage?.getItem(STASH_KEY));
    } catch {
      return undefined;
    }
  }

  /** Writes a draft; once it is stored, a stash of the same text has done its work. */
  private async put(draft: Draft): Promise<void> {
    const stored = await this.guard(() => this.backend.put(draft).then(() => true), false);
    if (stored) this.clearStash(draft.text);
  }

  /** Keeps at most MAX_DRAFTS, dropping the least recently changed. */
  private async prune(): Promise<void> {
    const all = await this.guard(() => this.backend.all(), []);
    if (all.length <= MAX_DRAFTS) return;
    const drop = [...all].sort((a, b) => b.updatedAt - a.updatedAt).slice(MAX_DRAFTS).map((d) => d.id);
    await this.guard(() => this.backend.delete(drop), undefined);
  }

  private async guard<T>(op: () => Promise<T>, fallback: T): Promise<T> {
    try {
      const value = await op();
      this.problem.set(undefined);
      return value;
    } catch (err) {
      this.problem.set(`Drafts could not be stored in this browser (${err instanceof Error ? err.message : String(err)}).`);
      return fallback;
    }
  }
}

/** A stash read back, or undefined when there is none or it is not one of ours. */
function parseStash(raw: string | null | undefined): Stash | undefined {
  if (!raw) return undefined;
  try {
    const value = JSON.parse(raw) as Partial<Stash> | null;
    return value && typeof value.text === 'string' && (value.draftId === undefined || typeof value.draftId === 'string') ? (value as Stash) : undefined;
  } catch {
    return undefined;
  }
}
