/**
 * The blocks the editor offers on `use` lines: the signed-in workspace's catalogue (one request,
 * more only if the server ever pages it) merged with the seed library shipped with the app for
 * the paths the workspace lacks. Signed out, offline, or when the server fails: the seed library
 * alone (or nothing, if even the manifest cannot be read). It never throws.
 *
 * The catalogue gives each block's newest version and newest vetted one, which is enough to
 * complete a path; the full list of versions (older vetted ones, retired ones) costs a request
 * per block, so it is asked for only when completion wants the versions of that path
 * (`loadVersions`), once per block and workspace.
 */
import { HttpClient } from '@angular/common/http';
import { computed, effect, inject, Injectable, signal, untracked } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { Session } from '../core/session';
import { LibraryApi, type BlockSummary, type Catalogue } from '../library/library-api';
import type { LibraryEntry } from './solver-protocol';

/** The seed library's manifest, relative to the app's base href (the worker reads the same file). */
export const SEED_MANIFEST_URL = 'library/manifest.json';

/** Stop asking for further catalogue pages after this many (a server that ignores `page`). */
const MAX_PAGES = 20;
const PAGE_SIZE = 100;

type Versions = LibraryEntry['versions'];

/** The workspace's part of the index. */
interface WorkspaceCatalogue {
  slug: string;
  entries: LibraryEntry[];
  /** Paths whose versions are only those the catalogue row names (newest and newest vetted). */
  partial: ReadonlySet<string>;
}

@Injectable({ providedIn: 'root' })
export class LibraryIndex {
  private readonly http = inject(HttpClient);
  private readonly api = inject(LibraryApi);
  private readonly session = inject(Session);

  private readonly seed = signal<LibraryEntry[]>([]);
  private readonly workspace = signal<WorkspaceCatalogue | undefined>(undefined);
  /** Paths whose full version list was asked for in the current workspace. */
  private asked = new Set<string>();
  /** Increases with every workspace change, so a late answer for another workspace is dropped. */
  private generation = 0;

  /** The blocks a `use` line may name, workspace first, each with its versions newest first. */
  readonly entries = computed<LibraryEntry[]>(() => {
    const ws = this.workspace();
    const seed = this.seed();
    if (!ws) return seed;
    const have = new Set(ws.entries.map((e) => e.path));
    return [...ws.entries, ...seed.filter((e) => !have.has(e.path))];
  });

  /** The workspace whose catalogue to read: only while signed in (offline keeps `me` but cannot ask). */
  private readonly slug = computed(() => (this.session.state() === 'signed-in' ? this.session.workspace()?.slug : undefined));

  constructor() {
    void this.loadSeed();
    effect(() => {
      const slug = this.slug();
      untracked(() => void this.loadWorkspace(slug));
    });
  }

  /**
   * Fetches every version of a workspace block (with its state) when only the catalogue's
   * newest and newest vetted are known. Once per path and workspace; seed blocks need nothing.
   */
  loadVersions(path: string): void {
    const ws = this.workspace();
    if (!ws || !ws.partial.has(path) || this.asked.has(path)) return;
    this.asked.add(path);
    const generation = this.generation;
    this.api.block(ws.slug, path).then(
      (detail) => {
        if (generation !== this.generation || !Array.isArray(detail?.versionsList)) return;
        const versions = newestFirst(detail.versionsList.map((v) => ({ version: v.version, state: v.state })));
        this.workspace.update((current) => current && {
          ...current,
          entries: current.entries.map((e) => (e.path === path ? { ...e, versions } : e)),
          partial: new Set([...current.partial].filter((p) => p !== path)),
        });
      },
      () => undefined, // the catalogue's two versions stay; not asked again in this workspace
    );
  }

  private async loadSeed(): Promise<void> {
    try {
      const manifest = await firstValueFrom(this.http.get<{ blocks?: unknown }>(SEED_MANIFEST_URL));
      this.seed.set(seedEntries(manifest?.blocks));
    } catch {
      /* offline and not cached: no seed blocks to offer */
    }
  }

  private async loadWorkspace(slug: string | undefined): Promise<void> {
    const generation = ++this.generation;
    this.asked = new Set();
    this.workspace.set(undefined);
    if (!slug) return;
    try {
      const rows = await this.catalogue(slug);
      if (generation !== this.generation) return;
      const entries = rows.map(catalogueEntry);
      const partial = new Set(entries.filter((e, i) => rows[i].versions > e.versions.length).map((e) => e.path));
      this.workspace.set({ slug, entries: entries.sort((a, b) => a.path.localeCompare(b.path)), partial });
    } catch {
      /* the server could not be asked: the seed library alone */
    }
  }

  /** Every row of the catalogue. It comes in one answer today; further pages are asked only if `total` says there are more. */
  private async catalogue(slug: string): Promise<BlockSummary[]> {
    const first = await this.api.catalogue(slug);
    const rows = new Map((first?.items ?? []).map((r) => [r.path, r]));
    for (let page = 1; page < MAX_PAGES && rows.size < (first?.total ?? 0); page++) {
      const next = await firstValueFrom(this.http.get<Catalogue>(`/api/workspaces/${encodeURIComponent(slug)}/blocks`, { params: { page, pageSize: PAGE_SIZE } }));
      const before = rows.size;
      for (const r of next?.items ?? []) rows.set(r.path, r);
      if (rows.size === before) break; // the same rows again: the server does not page
    }
    return [...rows.values()].filter((r) => typeof r?.path === 'string' && r.latest);
  }
}

/** One catalogue row as an entry: its newest version and its newest vetted one. */
function catalogueEntry(row: BlockSummary): LibraryEntry {
  const versions: Versions = [{ version: row.latest.version, state: row.latest.state }];
  if (row.vetted !== null && row.vetted !== row.latest.version) versions.push({ version: row.vetted, state: 'vetted' });
  return { path: row.path, title: row.title ?? '', summary: row.summary ?? '', versions: newestFirst(versions), origin: 'workspace' };
}

/** The manifest's blocks grouped by path; every seed version is vetted. Malformed rows are skipped. */
export function seedEntries(blocks: unknown): LibraryEntry[] {
  if (!Array.isArray(blocks)) return [];
  const byPath = new Map<string, LibraryEntry>();
  for (const b of blocks as { path?: unknown; version?: unknown; title?: unknown; summary?: unknown }[]) {
    if (typeof b?.path !== 'string' || !Number.isInteger(b.version)) continue;
    const entry = byPath.get(b.path) ?? { path: b.path, title: '', summary: '', versions: [], origin: 'seed' as const };
    const newer = entry.versions.every((v) => v.version < (b.version as number));
    if (newer || !entry.title) {
      entry.title = typeof b.title === 'string' ? b.title : entry.title;
      entry.summary = typeof b.summary === 'string' ? b.summary : entry.summary;
    }
    entry.versions.push({ version: b.version as number, state: 'vetted' });
    byPath.set(b.path, entry);
  }
  return [...byPath.values()].map((e) => ({ ...e, versions: newestFirst(e.versions) })).sort((a, b) => a.path.localeCompare(b.path));
}

function newestFirst(versions: Versions): Versions {
  return [...versions].sort((a, b) => b.version - a.version);
}
