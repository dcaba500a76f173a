/**
 * The symbolic analysis of a sparsity pattern — its fill-reducing order — cached by pattern, so
 * every solve of a circuit of the same shape reuses it: each Newton iteration and frequency point
 * (one factorisation object), but also each sweep value, temperature and Monte Carlo run, which
 * elaborate a new circuit of the same shape and so build an equal pattern.
 *
 * Beside the order the cache keeps the pivot order and L/U patterns of the last successful full
 * factorisation, real and complex: the next factorisation object of that shape starts by
 * refactoring on them and chooses pivots afresh only if one has degraded.
 */
import { approximateMinimumDegree } from './amd';
import type { LuStructure } from './lu-structure';
import type { SparsePattern } from './sparse-pattern';

/** Patterns whose analysis is kept; the least recently used goes first. */
export const SYMBOLIC_CACHE_SIZE = 16;

/** What is known about a pattern independent of its values. */
export interface SparseSymbolic {
  readonly pattern: SparsePattern;
  /** Fill-reducing elimination order (approximate minimum degree on A + Aᵀ). */
  readonly order: Int32Array;
  /** Pivot order and patterns of the last real / complex full factorisation on this pattern. */
  realSeed: LuStructure | null;
  complexSeed: LuStructure | null;
}

const cache = new Map<number, SparseSymbolic[]>();
let cached = 0;

/** The symbolic analysis of `pattern`, from the cache when an equal pattern was analysed before. */
export function symbolicFor(pattern: SparsePattern): SparseSymbolic {
  const key = pattern.hash;
  const bucket = cache.get(key);
  const hit = bucket?.find((s) => s.pattern.equals(pattern));
  if (hit) {
    // Re-insert: Map iteration order is insertion order, so the first key is the least recent.
    cache.delete(key);
    cache.set(key, bucket!);
    return hit;
  }
  const symbolic: SparseSymbolic = { pattern, order: approximateMinimumDegree(pattern), realSeed: null, complexSeed: null };
  if (bucket) {
    bucket.push(symbolic);
    cache.delete(key);
    cache.set(key, bucket);
  } else cache.set(key, [symbolic]);
  if (++cached > SYMBOLIC_CACHE_SIZE) {
    const oldest = cache.keys().next().value as number;
    cached -= cache.get(oldest)!.length;
    cache.delete(oldest);
  }
  return symbolic;
}

/** Empties the cache (tests that count orderings). */
export function clearSymbolicCache(): void {
  cache.clear();
  cached = 0;
}
