/**
 * The approximate minimum degree ordering: a permutation, less fill than the natural order on
 * grids and ladders, and about as little as the AMD of mathjs (CSparse's cs_amd, T. A. Davis,
 * Direct Methods for Sparse Linear Systems, SIAM 2006, §7.1, reached through `slu(A, 1, …)`,
 * which orders A + Aᵀ). Fill is counted by ./amd.ts choleskyFillCount, itself checked here
 * against a plain elimination on small random graphs.
 */
import fc from 'fast-check';
import { slu, sparse } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { approximateMinimumDegree, choleskyFillCount } from './amd';
import { SparsePattern } from './sparse-pattern';

/** Pattern of a graph given as edges, diagonal included. */
function graphPattern(n: number, edges: [number, number][]): SparsePattern {
  const rows = edges.flatMap(([a, b]) => [a, b]);
  const cols = edges.flatMap(([a, b]) => [b, a]);
  return SparsePattern.fromCoordinates(n, rows, cols, rows.length);
}

/** The 5-point k×k grid (a resistive mesh), nodes numbered row by row. */
function grid(k: number): SparsePattern {
  const edges: [number, number][] = [];
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) {
      if (j + 1 < k) edges.push([i * k + j, i * k + j + 1]);
      if (i + 1 < k) edges.push([i * k + j, (i + 1) * k + j]);
    }
  }
  return graphPattern(k * k, edges);
}

/** A resistor ladder of `rungs` sections: two rails joined by a rung at every section, numbered rail by rail. */
function ladder(rungs: number): SparsePattern {
  const edges: [number, number][] = [];
  for (let s = 0; s < rungs; s++) {
    edges.push([s, rungs + s]);
    if (s + 1 < rungs) {
      edges.push([s, s + 1]);
      edges.push([rungs + s, rungs + s + 1]);
    }
  }
  return graphPattern(2 * rungs, edges);
}

const natural = (n: number) => Int32Array.from({ length: n }, (_, i) => i);

function isPermutation(order: Int32Array, n: number): boolean {
  if (order.length !== n) return false;
  const seen = new Uint8Array(n);
  for (const v of order) {
    if (v < 0 || v >= n || seen[v]) return false;
    seen[v] = 1;
  }
  return true;
}

/** Fill by explicit elimination of the graph (O(n³), for checking the counter). */
function bruteFill(p: SparsePattern, order: Int32Array): number {
  const n = p.n;
  const { ptr, idx } = p.symmetricAdjacency();
  const adj = Array.from({ length: n }, (_, i) => new Set(Array.from(idx.subarray(ptr[i], ptr[i + 1]))));
  const done = new Uint8Array(n);
  let count = 0;
  for (const v of order) {
    const later = [...adj[v]].filter((u) => !done[u]);
    count += later.length;
    for (const a of later) for (const b of later) if (a !== b) adj[a].add(b);
    done[v] = 1;
  }
  return count;
}

/** mathjs's AMD order of A + Aᵀ (the column order `q` of its sparse LU). */
function mathjsAmd(p: SparsePattern): Int32Array {
  const dense = Array.from({ length: p.n }, () => new Array<number>(p.n).fill(0));
  for (let j = 0; j < p.n; j++) for (let k = p.colPtr[j]; k < p.colPtr[j + 1]; k++) dense[p.rowIdx[k]][j] = p.rowIdx[k] === j ? 4 : -1;
  return Int32Array.from(slu(sparse(dense), 1, 1).q as number[]);
}

const randomGraph = fc.integer({ min: 1, max: 40 }).chain((n) =>
  fc.tuple(fc.constant(n), fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 3 * n })),
);

describe('approximate minimum degree', () => {
  it('returns a permutation of the unknowns for any pattern', () => {
    fc.assert(
      fc.property(randomGraph, ([n, edges]) => {
        const p = graphPattern(n, edges.filter(([a, b]) => a !== b) as [number, number][]);
        expect(isPermutation(approximateMinimumDegree(p), n)).toBe(true);
      }),
      { numRuns: 200, seed: 31 },
    );
  });

  it('counts fill exactly (against a plain elimination of the graph)', () => {
    fc.assert(
      fc.property(randomGraph, ([n, edges]) => {
        const p = graphPattern(n, edges.filter(([a, b]) => a !== b) as [number, number][]);
        const order = approximateMinimumDegree(p);
        expect(choleskyFillCount(p, order)).toBe(bruteFill(p, order));
        expect(choleskyFillCount(p, natural(n))).toBe(bruteFill(p, natural(n)));
      }),
      { numRuns: 100, seed: 32 },
    );
  });

  it('on 2-D grids: far less fill than the natural order, within 20 % of mathjs cs_amd', () => {
    for (const k of [10, 20, 30]) {
      const p = grid(k);
      const ours = choleskyFillCount(p, approximateMinimumDegree(p));
      const nat = choleskyFillCount(p, natural(p.n));
      // The natural (row-by-row) order fills the whole band: about k per node, k³ in all.
      expect(nat).toBeGreaterThan(0.9 * k * k * k);
      expect(ours).toBeLessThan(nat / (k >= 20 ? 2 : 1.2));
      expect(ours).toBeLessThan(1.2 * choleskyFillCount(p, mathjsAmd(p)));
    }
  });

  it('on ladders numbered rail by rail: no fill at all, where the natural order fills a band', () => {
    for (const rungs of [5, 50, 200]) {
      const p = ladder(rungs);
      const edges = 3 * rungs - 2;
      // A ladder eliminated from one end creates at most one fill edge per section.
      expect(choleskyFillCount(p, approximateMinimumDegree(p))).toBeLessThanOrEqual(edges + rungs);
      expect(choleskyFillCount(p, natural(p.n))).toBeGreaterThan(rungs * (rungs - 1) / 2);
    }
  });

  it('orders a dense row (a supply rail touching every stage) last', () => {
    const n = 400;
    const edges: [number, number][] = [];
    for (let i = 1; i < n; i++) edges.push([0, i]);
    for (let i = 1; i + 1 < n; i++) edges.push([i, i + 1]);
    const order = approximateMinimumDegree(graphPattern(n, edges));
    expect(order[n - 1]).toBe(0);
  });
});
