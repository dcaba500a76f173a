/**
 * Approximate minimum degree ordering (P. R. Amestoy, T. A. Davis, I. S. Duff, "An approximate
 * minimum degree ordering algorithm", SIAM J. Matrix Anal. Appl. 17(4), 1996), written for this
 * engine: a fill-reducing symmetric permutation of the pattern A + Aᵀ, computed once per circuit
 * shape and reused by every factorisation of that shape.
 *
 * The elimination is simulated on the quotient graph: an eliminated variable becomes an
 * "element" standing for the clique its elimination creates, so the graph never grows beyond
 * the original pattern. Each variable keeps its variable neighbours A(i) and element neighbours
 * E(i); each element e its variables L(e). Eliminating the variable p of least degree:
 *   1. L(p) = A(p) ∪ (∪ L(e) for e in E(p)) minus p; the elements of E(p) are absorbed into p;
 *   2. for each i in L(p): A(i) loses everything now covered by p, E(i) gains p, and its degree
 *      becomes the paper's approximate external degree
 *        d(i) = min( remaining − 1,  d_old(i) + |L(p) \ i|,  |A(i)| + |L(p) \ i| + Σ |L(e) \ L(p)| ),
 *      the sum over the other elements of i, with |L(e) \ L(p)| counted for all of them in one
 *      pass; an element found inside L(p) (|L(e) \ L(p)| = 0) is absorbed too ("aggressive absorption").
 * Rows denser than DENSE_ROW_FACTOR·√n (a supply rail touching every stage) are ordered last
 * without taking part, as the paper recommends: they would be eliminated last anyway and would
 * make every degree update long. Supervariable detection and mass elimination (speed-ups of the
 * paper's code that do not change what the ordering is for) are left out: every variable is its
 * own supervariable, which keeps the code short; circuit patterns are small enough.
 */
import type { SparsePattern } from './sparse-pattern';

/** A row with more than this many times √n neighbours (and at least DENSE_ROW_MIN) is ordered last. */
export const DENSE_ROW_FACTOR = 10;
/** Below this degree no row counts as dense (small patterns keep every row in the ordering). */
export const DENSE_ROW_MIN = 16;

const VARIABLE = 0;
const ELEMENT = 1;
const ABSORBED = 2;
const DENSE = 3;

/**
 * An approximate-minimum-degree order of the symmetric pattern of `pattern` (A + Aᵀ; the diagonal
 * is ignored): `order[k]` is the index eliminated k-th. Deterministic.
 */
export function approximateMinimumDegree(pattern: SparsePattern): Int32Array {
  const { ptr, idx } = pattern.symmetricAdjacency();
  return amdOnGraph(pattern.n, ptr, idx);
}

/** {@link approximateMinimumDegree} on an adjacency given as offsets and neighbour lists (no self loops, no duplicates). */
export function amdOnGraph(n: number, ptr: Int32Array, idx: Int32Array): Int32Array {
  const order = new Int32Array(n);
  const status = new Uint8Array(n);
  const varAdj: (number[] | null)[] = new Array(n);
  const elemAdj: (number[] | null)[] = new Array(n);
  const members: (number[] | null)[] = new Array(n);
  const degree = new Int32Array(n);
  // Degree buckets: doubly linked lists, last in first out (deterministic ties).
  const head = new Int32Array(n + 1).fill(-1);
  const next = new Int32Array(n).fill(-1);
  const prev = new Int32Array(n).fill(-1);
  // Marks for forming L(p) and the |L(e) \ L(p)| pass: stamped, never cleared.
  const inLp = new Int32Array(n).fill(-1);
  const wStamp = new Int32Array(n).fill(-1);
  const w = new Int32Array(n);

  const denseLimit = Math.max(DENSE_ROW_MIN, Math.floor(DENSE_ROW_FACTOR * Math.sqrt(n)));
  const dense: number[] = [];
  for (let i = 0; i < n; i++) if (ptr[i + 1] - ptr[i] > denseLimit) status[i] = DENSE;
  for (let i = 0; i < n; i++) {
    if (status[i] === DENSE) {
      dense.push(i);
      continue;
    }
    const list: number[] = [];
    for (let p = ptr[i]; p < ptr[i + 1]; p++) if (status[idx[p]] !== DENSE) list.push(idx[p]);
    varAdj[i] = list;
    elemAdj[i] = [];
    degree[i] = list.length;
  }

  const insert = (i: number, d: number) => {
    degree[i] = d;
    const h = head[d];
    next[i] = h;
    prev[i] = -1;
    if (h >= 0) prev[h] = i;
    head[d] = i;
  };
  const remove = (i: number) => {
    const d = degree[i];
    if (prev[i] >= 0) next[prev[i]] = next[i];
    else head[d] = next[i];
    if (next[i] >= 0) prev[next[i]] = prev[i];
  };
  for (let i = n - 1; i >= 0; i--) if (status[i] === VARIABLE) insert(i, degree[i]);

  const sparseCount = n - dense.length;
  let minDeg = 0;
  for (let k = 0; k < sparseCount; k++) {
    // 1. The variable of least (approximate) degree.
    while (head[minDeg] < 0) minDeg++;
    const p = head[minDeg];
    remove(p);
    order[k] = p;

    // 2. Its element: L(p) = A(p) ∪ the variables of every element of p, p excluded.
    const lp: number[] = [];
    inLp[p] = k;
    for (const v of varAdj[p]!) {
      if (status[v] === VARIABLE && inLp[v] !== k) {
        inLp[v] = k;
        lp.push(v);
      }
    }
    for (const e of elemAdj[p]!) {
      if (status[e] !== ELEMENT) continue;
      for (const v of members[e]!) {
        if (status[v] === VARIABLE && inLp[v] !== k) {
          inLp[v] = k;
          lp.push(v);
        }
      }
      status[e] = ABSORBED;
      members[e] = null;
    }
    status[p] = ELEMENT;
    members[p] = lp;
    varAdj[p] = null;
    elemAdj[p] = null;

    // 3. |L(e) \ L(p)| for every other element touching L(p): start at |L(e)|, minus one per
    //    member found in L(p). Members of a live element are all live variables (eliminating a
    //    member absorbs the element), so |L(e)| is its list length.
    for (const i of lp) {
      for (const e of elemAdj[i]!) {
        if (status[e] !== ELEMENT) continue;
        if (wStamp[e] !== k) {
          wStamp[e] = k;
          w[e] = members[e]!.length;
        }
        w[e]--;
      }
    }

    // 4. Prune each neighbour's lists, attach p, and update its approximate degree.
    const remaining = sparseCount - k - 1;
    const lpOthers = lp.length - 1;
    for (const i of lp) {
      remove(i);
      const vars = varAdj[i]!;
      let nv = 0;
      for (const v of vars) if (status[v] === VARIABLE && inLp[v] !== k) vars[nv++] = v;
      vars.length = nv;
      const elems = elemAdj[i]!;
      let ne = 0;
      let external = 0;
      for (const e of elems) {
        if (status[e] !== ELEMENT || e === p) continue;
        if (w[e] === 0) {
          // Aggressive absorption: every member of e is in L(p), so p covers e.
          status[e] = ABSORBED;
          members[e] = null;
          continue;
        }
        elems[ne++] = e;
        external += w[e];
      }
      elems.length = ne;
      elems.push(p);
      const bound = nv + lpOthers + external;
      const d = Math.max(0, Math.min(remaining, degree[i] + lpOthers, bound));
      insert(i, d);
      if (d < minDeg) minDeg = d;
    }
  }
  for (let k = 0; k < dense.length; k++) order[sparseCount + k] = dense[k];
  return order;
}

/**
 * Off-diagonal nonzeros of the Cholesky factor L of the symmetric pattern A + Aᵀ eliminated in
 * `order`: the fill an ordering leads to (exactly, for a factorisation that keeps the diagonal
 * pivots). Elimination tree (J. W. H. Liu, 1986) and row subtrees, O(nnz(L)) time.
 */
export function choleskyFillCount(pattern: SparsePattern, order: Int32Array): number {
  const n = pattern.n;
  const { ptr, idx } = pattern.symmetricAdjacency();
  const pos = new Int32Array(n);
  for (let k = 0; k < n; k++) pos[order[k]] = k;
  const parent = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const v = order[k];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      let i = pos[idx[p]];
      while (i !== -1 && i < k) {
        const up = ancestor[i];
        ancestor[i] = k;
        if (up === -1) parent[i] = k;
        i = up;
      }
    }
  }
  const flag = new Int32Array(n).fill(-1);
  let count = 0;
  for (let k = 0; k < n; k++) {
    flag[k] = k;
    const v = order[k];
    for (let p = ptr[v]; p < ptr[v + 1]; p++) {
      // Row k of L: the union of the etree paths from each earlier neighbour up towards k.
      for (let j = pos[idx[p]]; j !== -1 && j < k && flag[j] !== k; j = parent[j]) {
        flag[j] = k;
        count++;
      }
    }
  }
  return count;
}
