/**
 * This browser's copy of the library blocks the bench resolved from the team server, so a
 * netlist that uses them still solves offline. IndexedDB through Dexie; it works in the solver
 * worker as in a page. Keyed by workspace and `path@version`: a version's source never changes
 * once submitted, and the state kept is the last the server gave.
 */
import Dexie, { type Table } from 'dexie';
import type { UsedBlockState } from './solver-protocol';

export interface CachedBlock {
  workspace: string;
  /** `path@version`. */
  key: string;
  source: string;
  state?: UsedBlockState;
  newestVetted?: number | null;
  /** When the server gave it, ms since the epoch. */
  fetchedAt: number;
}

class BlockDatabase extends Dexie {
  blocks!: Table<CachedBlock, [string, string]>;
  constructor() {
    super('nodewright-blocks');
    this.version(1).stores({ blocks: '[workspace+key]' });
  }
}

export class BlockCache {
  private readonly db = new BlockDatabase();

  /** The kept copy, if any; never throws (storage refused: nothing kept). */
  async get(workspace: string, key: string): Promise<CachedBlock | undefined> {
    try {
      return await this.db.blocks.get([workspace, key]);
    } catch {
      return undefined;
    }
  }

  /** Keeps a copy; failures (quota, private window) only mean no offline copy. */
  async put(block: CachedBlock): Promise<void> {
    try {
      await this.db.blocks.put(block);
    } catch {
      /* nothing kept */
    }
  }

  /** The blocks kept for a workspace (for tests and a future "offline copies" view). */
  async list(workspace: string): Promise<CachedBlock[]> {
    try {
      return await this.db.blocks.where('[workspace+key]').between([workspace, Dexie.minKey], [workspace, Dexie.maxKey]).toArray();
    } catch {
      return [];
    }
  }
}

/** The cache when IndexedDB exists in this scope, else none. */
export function openBlockCache(): BlockCache | undefined {
  return typeof indexedDB === 'undefined' ? undefined : new BlockCache();
}
