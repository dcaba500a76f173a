/**
 * The worker's `use` resolver. `solveNetlist` resolves synchronously, so the blocks a netlist
 * names are fetched first (and kept), then the solve runs. Where a `use path@version` comes from,
 * in order:
 *  1. the sources pinned in the share link being read (a reader has no session);
 *  2. the signed-in workspace's library, through the API (drafts too, for their author and
 *     reviewers), with the version's state and the newest vetted version;
 *  3. this browser's IndexedDB copy of an earlier answer, when the server cannot be asked
 *     (offline, stopped, signed out meanwhile);
 *  4. the seed library shipped with the app (`library/`, cached by the service worker).
 * A version's source never changes once submitted, but its state does (vetted → retired) and so
 * does the newest vetted version: answers are re-asked after STATE_TTL_MS.
 */
import { parseNetlist, type OutlineUse, type UseLookup } from '../../../solver';
import type { BlockCache } from './block-cache';
import type { BlockOrigin, LibraryContext, UsedBlockState } from './solver-protocol';

interface ManifestEntry { path: string; version: number; file: string }

/** How long a block's state from the server is trusted before it is asked again, ms. */
export const STATE_TTL_MS = 30_000;
/** At most this many blocks are fetched for one text (uses of uses included). */
const MAX_BLOCKS = 64;

/** What the resolver knows of one `path@version`. */
export interface ResolvedBlock {
  source: string;
  origin: BlockOrigin;
  state?: UsedBlockState;
  newestVetted?: number | null;
  /** When the server (or the seed manifest) said so, ms since the epoch. */
  fetchedAt: number;
}

/** Why a block could not be resolved, for the solver's message. */
type Miss = { kind: 'no-block' } | { kind: 'no-version'; versions: number[] } | { kind: 'unreachable' };

export class LibraryResolver {
  private manifest: ManifestEntry[] | undefined;
  private readonly known = new Map<string, ResolvedBlock>();
  private readonly misses = new Map<string, Miss>();
  private context: LibraryContext = {};

  constructor(
    private readonly seedBase: URL,
    private readonly apiBase: URL,
    private readonly cache: BlockCache | undefined,
  ) {}

  /** What was resolved for `path@version` in the last preload, if anything. */
  lookup(path: string, version: number): ResolvedBlock | undefined {
    return this.known.get(`${path}@${version}`);
  }

  /**
   * Fetches what `text` uses (and what those files use) for `context`. Never throws: what could
   * not be found is reported by `resolve` when the solver asks.
   */
  async preload(text: string, context: LibraryContext): Promise<void> {
    if (!sameContext(context, this.context)) {
      // Another workspace (or another share): nothing known so far may be reused.
      this.known.clear();
      this.misses.clear();
      this.context = context;
    }
    const wanted = usesOf(text);
    const seen = new Set<string>();
    for (let i = 0; i < wanted.length && seen.size < MAX_BLOCKS; i++) {
      const { path, version } = wanted[i];
      const key = `${path}@${version}`;
      if (seen.has(key)) continue;
      seen.add(key);
      const had = this.known.get(key);
      const block = had && (had.origin === 'share' || Date.now() - had.fetchedAt < STATE_TTL_MS) ? had : await this.fetchBlock(path, version, had);
      if (block) {
        this.known.set(key, block);
        this.misses.delete(key);
        wanted.push(...usesOf(block.source));
      }
    }
  }

  /** The synchronous resolver handed to the solver. */
  readonly resolve = (path: string, version: number): UseLookup => {
    const key = `${path}@${version}`;
    const block = this.known.get(key);
    if (block) return { ok: true, text: block.source };
    const miss = this.misses.get(key);
    if (miss?.kind === 'no-version') {
      return { ok: false, message: `The library has no version ${version} of \`${path}\` you can use.`, hint: miss.versions.length ? `published: ${miss.versions.map((v) => `@${v}`).join(', ')}` : 'it has no vetted version yet' };
    }
    if (miss?.kind === 'no-block') {
      const seeds = this.manifest ? [...new Set(this.manifest.map((e) => e.path))] : [];
      return { ok: false, message: `The library has no block \`${path}\`.`, hint: seeds.length ? `the catalogue lists them; seed blocks: ${seeds.slice(0, 6).join(', ')}${seeds.length > 6 ? ', …' : ''}` : 'the catalogue lists the blocks' };
    }
    return { ok: false, message: `\`${key}\` cannot be fetched: the library could not be reached and this browser has no copy.`, hint: 'open the netlist once while the server is reachable' };
  };

  /** One block from the share pins, the workspace, the cache or the seeds, in that order. */
  private async fetchBlock(path: string, version: number, had: ResolvedBlock | undefined): Promise<ResolvedBlock | undefined> {
    const key = `${path}@${version}`;
    const pinned = this.context.pinned?.find((p) => p.path === path && p.version === version);
    if (pinned) return { source: pinned.source, origin: 'share', fetchedAt: Date.now() };

    const slug = this.context.workspace;
    let serverUnreachable = false;
    if (slug) {
      const answer = await this.fromWorkspace(slug, path, version);
      if (answer === 'unreachable') {
        serverUnreachable = true;
        // The server could not be asked: what this worker or this browser kept of the workspace's answer.
        const kept = had?.origin === 'workspace' || had?.origin === 'cache' ? had : await this.cachedCopy(slug, key);
        if (kept) return kept;
      } else if (answer !== 'absent') {
        void this.cache?.put({ workspace: slug, key, source: answer.source, state: answer.state, newestVetted: answer.newestVetted, fetchedAt: answer.fetchedAt });
        return answer;
      }
    }
    const seed = await this.fromSeeds(path, version);
    if (seed === 'unreachable') {
      if (had) return had;
      this.misses.set(key, { kind: 'unreachable' });
      return undefined;
    }
    // Not a seed block either: offline, "no such block" would be a guess.
    if (!seed && serverUnreachable) this.misses.set(key, { kind: 'unreachable' });
    return seed;
  }

  private async cachedCopy(slug: string, key: string): Promise<ResolvedBlock | undefined> {
    const kept = await this.cache?.get(slug, key);
    return kept && { source: kept.source, origin: 'cache', state: kept.state, newestVetted: kept.newestVetted, fetchedAt: Date.now() };
  }

  private async fromWorkspace(slug: string, path: string, version: number): Promise<ResolvedBlock | 'absent' | 'unreachable'> {
    const url = new URL(`workspaces/${encodeURIComponent(slug)}/library/${path.split('/').map(encodeURIComponent).join('/')}/${version}`, this.apiBase);
    try {
      const res = await fetch(url, { credentials: 'same-origin', cache: 'no-cache', headers: { accept: 'application/json' } });
      if (res.status === 404) return 'absent';
      if (!res.ok) return 'unreachable'; // signed out meanwhile, or the server is in trouble
      const body = (await res.json()) as { source: string; state: UsedBlockState; newestVetted: number | null };
      return { source: body.source, origin: 'workspace', state: body.state, newestVetted: body.newestVetted, fetchedAt: Date.now() };
    } catch {
      return 'unreachable';
    }
  }

  private async fromSeeds(path: string, version: number): Promise<ResolvedBlock | undefined | 'unreachable'> {
    try {
      this.manifest ??= ((await (await fetch(new URL('manifest.json', this.seedBase))).json()) as { blocks: ManifestEntry[] }).blocks;
    } catch {
      return 'unreachable';
    }
    const versions = this.manifest.filter((e) => e.path === path).map((e) => e.version);
    const entry = this.manifest.find((e) => e.path === path && e.version === version);
    if (!entry) {
      this.misses.set(`${path}@${version}`, versions.length ? { kind: 'no-version', versions } : { kind: 'no-block' });
      return undefined;
    }
    try {
      const res = await fetch(new URL(entry.file, this.seedBase));
      if (!res.ok) return 'unreachable';
      return { source: await res.text(), origin: 'seed', state: 'vetted', newestVetted: Math.max(...versions), fetchedAt: Date.now() };
    } catch {
      return 'unreachable';
    }
  }
}

/**
 * The `use` lines of a text (a netlist or a block file), in order, as the solver reads them. The
 * parse runs without a resolver: it is how the blocks to fetch are known before the solve.
 */
export function usesOf(text: string): OutlineUse[] {
  return parseNetlist(text).outline.uses;
}

function sameContext(a: LibraryContext, b: LibraryContext): boolean {
  return a.workspace === b.workspace && (a.pinned ?? []).length === (b.pinned ?? []).length
    && (a.pinned ?? []).every((p, i) => p.path === b.pinned![i].path && p.version === b.pinned![i].version);
}
