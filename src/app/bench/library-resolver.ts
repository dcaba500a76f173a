/**
 * The worker's `use` resolver. The solver resolves `use` lines synchronously, so the worker solves
 * with what it has and notes what the solve asked for; only when that includes a block not fetched
 * yet (or one whose state is due to be asked again) are those fetched and the text solved again —
 * nested uses surface in the next round. A keystroke in a netlist whose blocks are known costs one
 * solve and no fetch. Where a `use path@version` comes from, in order:
 *  1. the sources pinned in the share link being read (a reader has no session);
 *  2. the signed-in workspace's library, through the API (drafts too, for their author and
 *     reviewers), with the version's state and the newest vetted version;
 *  3. this browser's IndexedDB copy of an earlier answer, when the server cannot be asked
 *     (offline, stopped, signed out meanwhile);
 *  4. the seed library shipped with the app (`library/`, cached by the service worker).
 * A version's source never changes once submitted, but its state does (vetted → retired) and so
 * does the newest vetted version: answers are re-asked after STATE_TTL_MS.
 */
import { parseNetlist, type UseLookup } from '../../../solver';
import type { BlockCache } from './block-cache';
import type { BlockOrigin, LibraryContext, UsedBlockState } from './solver-protocol';

interface ManifestEntry { path: string; version: number; file: string }

/** How long a block's state from the server is trusted before it is asked again, ms. */
export const STATE_TTL_MS = 30_000;
/** How soon a block the library could not be reached for is asked again, ms. */
const UNREACHABLE_RETRY_MS = 5_000;
/** At most this many blocks are fetched for one text (uses of uses included). */
const MAX_BLOCKS = 64;
/** At most this many fetch-and-solve-again rounds for one text (the depth of nested uses). */
const MAX_ROUNDS = 8;

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

/** The `(path, version) → lookup` callback the solver calls for each `use` line it meets. */
export type ResolveUse = (path: string, version: number) => UseLookup;

export class LibraryResolver {
  private manifest: ManifestEntry[] | undefined;
  private readonly known = new Map<string, ResolvedBlock>();
  private readonly misses = new Map<string, Miss>();
  /** When a block was last looked for in vain (not asked again before STATE_TTL_MS). */
  private readonly missedAt = new Map<string, number>();
  private context: LibraryContext = {};

  constructor(
    private readonly seedBase: URL,
    private readonly apiBase: URL,
    private readonly cache: BlockCache | undefined,
  ) {}

  /** What was resolved for `path@version`, if anything. */
  lookup(path: string, version: number): ResolvedBlock | undefined {
    return this.known.get(`${path}@${version}`);
  }

  /**
   * Runs `solve` (a solve or a parse of one text) with the blocks of `context`, fetching what it
   * asked for and running it again until nothing it asks for is missing or due (see the header).
   * Undefined when `superseded` says, after a fetch, that the result is no longer wanted. Never
   * throws for a block: what could not be found is reported by `resolve` when the solver asks.
   */
  async solveWith<T>(context: LibraryContext, solve: (resolve: ResolveUse) => T, superseded?: () => boolean): Promise<T | undefined> {
    if (!sameContext(context, this.context)) {
      // Another workspace (or another share): nothing known so far may be reused.
      this.known.clear();
      this.misses.clear();
      this.missedAt.clear();
      this.context = context;
    }
    for (let round = 0; ; round++) {
      const asked = new Map<string, { path: string; version: number }>();
      const out = solve((path, version) => {
        asked.set(`${path}@${version}`, { path, version });
        return this.resolve(path, version);
      });
      const due = [...asked.entries()].filter(([key]) => this.isDue(key)).slice(0, MAX_BLOCKS);
      if (due.length === 0 || round >= MAX_ROUNDS) return out;
      let changed = false;
      for (const [key, { path, version }] of due) {
        const had = this.known.get(key);
        const missedBefore = JSON.stringify(this.misses.get(key));
        const block = await this.fetchBlock(path, version, had);
        if (block) {
          // Marked as asked now, whatever answered (a kept copy too): not asked again before STATE_TTL_MS.
          this.known.set(key, { ...block, fetchedAt: Date.now() });
          this.misses.delete(key);
          changed ||= !had || had.source !== block.source || had.state !== block.state || had.newestVetted !== block.newestVetted || had.origin !== block.origin;
        } else {
          this.missedAt.set(key, Date.now());
          // A new reason (no such block, no such version, unreachable) changes the solver's message.
          changed ||= !!had || missedBefore !== JSON.stringify(this.misses.get(key));
          this.known.delete(key);
        }
      }
      if (superseded?.()) return undefined;
      // A refresh that changed nothing (the usual case every STATE_TTL_MS) needs no second solve.
      if (!changed) return out;
    }
  }

  /** Fetches what `text` uses (nested uses included) for `context`, by parsing it. */
  async preload(text: string, context: LibraryContext): Promise<void> {
    await this.solveWith(context, (resolve) => parseNetlist(text, { resolveUse: resolve }));
  }

  /** A block to fetch: never fetched, or its answer (or its absence) older than STATE_TTL_MS; a share's pins never are. */
  private isDue(key: string): boolean {
    const block = this.known.get(key);
    if (block) return block.origin !== 'share' && Date.now() - block.fetchedAt >= STATE_TTL_MS;
    const missed = this.missedAt.get(key);
    // A server that could not be reached is asked again soon: it may be back.
    const wait = this.misses.get(key)?.kind === 'unreachable' ? UNREACHABLE_RETRY_MS : STATE_TTL_MS;
    return missed === undefined || Date.now() - missed >= wait;
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

function sameContext(a: LibraryContext, b: LibraryContext): boolean {
  return a.workspace === b.workspace && (a.pinned ?? []).length === (b.pinned ?? []).length
    && (a.pinned ?? []).every((p, i) => p.path === b.pinned![i].path && p.version === b.pinned![i].version);
}
