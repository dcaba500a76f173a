/**
 * Drafts: netlists kept in this browser (IndexedDB through Dexie), so work survives a reload, a
 * closed tab and a stopped server. Each draft is one netlist text with a title read from its
 * `title` line; the bench autosaves into the draft it has open and reopens the last one.
 *
 * The logic (titles, ordering, pruning, last-opened) sits over a small storage interface so it
 * can be tested without a browser; the Dexie backend is the real one.
 */
import { Injectable, InjectionToken, inject, signal } from '@angular/core';
import Dexie, { type Table } from 'dexie';

export interface Draft {
  id: string;
  /** From the netlist's `title` line, else the file name it came from, else "Untitled netlist". */
  title: string;
  text: string;
  /** The file it was opened from, when it was. */
  fileName?: string;
  createdAt: number;
  updatedAt: number;
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

/** Clock and id source, replaceable in tests. */
export const DRAFT_CLOCK = new InjectionToken<() => number>('draft clock', { providedIn: 'root', factory: () => () => Date.now() });

/** Drafts kept at most; the least recently changed go first. */
export const MAX_DRAFTS = 100;
const LAST_OPENED = 'last-opened-draft';
export const UNTITLED = 'Untitled netlist';

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

function newId(): string {
  return globalThis.crypto?.randomUUID?.() ?? `d${Date.now().toString(36)}${Math.random().toString(36).slice(2, 10)}`;
}

@Injectable({ providedIn: 'root' })
export class Drafts {
  private readonly backend = inject(DRAFT_BACKEND);
  private readonly now = inject(DRAFT_CLOCK);
  /** Every draft, most recently changed first. */
  readonly list = signal<Draft[]>([]);
  /** Set when storage failed (quota, private mode): the bench says so instead of losing work quietly. */
  readonly problem = signal<string | undefined>(undefined);

  async refresh(): Promise<Draft[]> {
    const all = await this.guard(() => this.backend.all(), []);
    this.list.set(all);
    return all;
  }

  /** A new draft with this text. */
  async create(text: string, fileName?: string): Promise<Draft> {
    const t = this.now();
    const draft: Draft = { id: newId(), title: titleOf(text, fileName ?? UNTITLED), text, ...(fileName ? { fileName } : {}), createdAt: t, updatedAt: t };
    await this.guard(() => this.backend.put(draft), undefined);
    await this.guard(() => this.backend.setMeta(LAST_OPENED, draft.id), undefined);
    await this.prune();
    await this.refresh();
    return draft;
  }

  /** Saves new text into a draft (creating it again if it was deleted meanwhile). */
  async save(id: string, text: string): Promise<Draft> {
    const old = await this.guard(() => this.backend.get(id), undefined);
    const t = this.now();
    const draft: Draft = old
      ? { ...old, text, title: titleOf(text, old.fileName ?? UNTITLED), updatedAt: Math.max(t, old.updatedAt) }
      : { id, text, title: titleOf(text), createdAt: t, updatedAt: t };
    if (old && old.text === text) return old;
    await this.guard(() => this.backend.put(draft), undefined);
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

  async remove(id: string): Promise<void> {
    await this.guard(() => this.backend.delete([id]), undefined);
    await this.refresh();
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
