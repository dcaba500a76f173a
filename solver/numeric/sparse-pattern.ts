/**
 * A fixed sparsity pattern in compressed sparse column (CSC) form: the positions where a
 * circuit's matrices may be nonzero. A circuit's pattern never changes (the union of its
 * conductance and capacitance stamps, its devices' Jacobian positions and the full diagonal), so
 * it is built once and every matrix of that circuit — each Newton iterate, each frequency — is a
 * plain Float64Array of values, one per slot, in this order.
 *
 * Row indices are sorted within each column, so a position's slot is found by binary search
 * (done once per stamp position when a circuit is set up, never in a hot loop).
 */

/** A square sparsity pattern, CSC, rows sorted and unique within each column. */
export class SparsePattern {
  /** Number of stored positions. */
  readonly nnz: number;
  private hashValue: number | undefined;

  /**
   * @param n       order of the matrix
   * @param colPtr  n + 1 offsets: column j's slots are colPtr[j] … colPtr[j+1] − 1
   * @param rowIdx  row of each slot, increasing within a column
   */
  constructor(readonly n: number, readonly colPtr: Int32Array, readonly rowIdx: Int32Array) {
    this.nnz = colPtr[n];
  }

  /** Builds a pattern from coordinate pairs (duplicates merged); `diagonal` adds every (i, i). */
  static fromCoordinates(n: number, rows: ArrayLike<number>, cols: ArrayLike<number>, count: number, diagonal = true): SparsePattern {
    // Counting sort by column, then sort and de-duplicate the rows of each column.
    const total = count + (diagonal ? n : 0);
    const start = new Int32Array(n + 1);
    for (let k = 0; k < count; k++) start[cols[k] + 1]++;
    if (diagonal) for (let j = 0; j < n; j++) start[j + 1]++;
    for (let j = 0; j < n; j++) start[j + 1] += start[j];
    const fill = start.slice(0, n);
    const rowsByCol = new Int32Array(total);
    for (let k = 0; k < count; k++) rowsByCol[fill[cols[k]]++] = rows[k];
    if (diagonal) for (let j = 0; j < n; j++) rowsByCol[fill[j]++] = j;
    const colPtr = new Int32Array(n + 1);
    const out = new Int32Array(total);
    let nnz = 0;
    for (let j = 0; j < n; j++) {
      colPtr[j] = nnz;
      const column = rowsByCol.subarray(start[j], start[j + 1]).sort();
      for (let k = 0; k < column.length; k++) if (k === 0 || column[k] !== column[k - 1]) out[nnz++] = column[k];
    }
    colPtr[n] = nnz;
    return new SparsePattern(n, colPtr, out.slice(0, nnz));
  }

  /** The pattern of the nonzeros of one or more dense row-major n×n matrices, plus the diagonal. */
  static fromDense(n: number, ...matrices: ArrayLike<number>[]): SparsePattern {
    const rows: number[] = [];
    const cols: number[] = [];
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        if (matrices.some((m) => m[i * n + j] !== 0)) {
          rows.push(i);
          cols.push(j);
        }
      }
    }
    return SparsePattern.fromCoordinates(n, rows, cols, rows.length);
  }

  /** Slot of position (r, c), or −1 when it is not in the pattern. */
  slot(r: number, c: number): number {
    if (r < 0 || c < 0 || r >= this.n || c >= this.n) return -1;
    let lo = this.colPtr[c];
    let hi = this.colPtr[c + 1] - 1;
    const rows = this.rowIdx;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const v = rows[mid];
      if (v === r) return mid;
      if (v < r) lo = mid + 1;
      else hi = mid - 1;
    }
    return -1;
  }

  /** A 32-bit FNV-1a hash of the structure, for caches keyed by pattern. */
  get hash(): number {
    if (this.hashValue === undefined) {
      let h = 0x811c9dc5 ^ this.n;
      const mix = (v: number) => {
        h ^= v;
        h = Math.imul(h, 0x01000193);
      };
      for (let j = 0; j <= this.n; j++) mix(this.colPtr[j]);
      for (let k = 0; k < this.nnz; k++) mix(this.rowIdx[k]);
      this.hashValue = h >>> 0;
    }
    return this.hashValue;
  }

  /** True when both patterns have the same positions. */
  equals(other: SparsePattern): boolean {
    if (other === this) return true;
    if (other.n !== this.n || other.nnz !== this.nnz) return false;
    for (let j = 0; j <= this.n; j++) if (other.colPtr[j] !== this.colPtr[j]) return false;
    for (let k = 0; k < this.nnz; k++) if (other.rowIdx[k] !== this.rowIdx[k]) return false;
    return true;
  }

  /** Values on this pattern written into a dense row-major n×n array (zeroed first). */
  toDense(values: ArrayLike<number>, out = new Float64Array(this.n * this.n)): Float64Array {
    out.fill(0);
    const n = this.n;
    for (let j = 0; j < n; j++) for (let p = this.colPtr[j]; p < this.colPtr[j + 1]; p++) out[this.rowIdx[p] * n + j] = values[p];
    return out;
  }

  /** Values of a dense row-major n×n array at this pattern's slots (positions outside it are dropped). */
  gather(dense: ArrayLike<number>, out = new Float64Array(this.nnz)): Float64Array {
    const n = this.n;
    for (let j = 0; j < n; j++) for (let p = this.colPtr[j]; p < this.colPtr[j + 1]; p++) out[p] = dense[this.rowIdx[p] * n + j];
    return out;
  }

  /**
   * The adjacency of the symmetric pattern A + Aᵀ without the diagonal, as offsets and
   * neighbour lists: the graph a fill-reducing ordering works on.
   */
  symmetricAdjacency(): { ptr: Int32Array; idx: Int32Array } {
    const n = this.n;
    const degree = new Int32Array(n + 1);
    for (let j = 0; j < n; j++) {
      for (let p = this.colPtr[j]; p < this.colPtr[j + 1]; p++) {
        const i = this.rowIdx[p];
        if (i === j) continue;
        degree[i + 1]++;
        degree[j + 1]++;
      }
    }
    for (let i = 0; i < n; i++) degree[i + 1] += degree[i];
    const fill = degree.slice(0, n);
    const raw = new Int32Array(degree[n]);
    for (let j = 0; j < n; j++) {
      for (let p = this.colPtr[j]; p < this.colPtr[j + 1]; p++) {
        const i = this.rowIdx[p];
        if (i === j) continue;
        raw[fill[i]++] = j;
        raw[fill[j]++] = i;
      }
    }
    // (i, j) and (j, i) both present gives duplicates: keep each neighbour once.
    const ptr = new Int32Array(n + 1);
    const idx = new Int32Array(raw.length);
    const seen = new Int32Array(n).fill(-1);
    let m = 0;
    for (let i = 0; i < n; i++) {
      ptr[i] = m;
      for (let p = degree[i]; p < degree[i + 1]; p++) {
        const j = raw[p];
        if (seen[j] === i) continue;
        seen[j] = i;
        idx[m++] = j;
      }
    }
    ptr[n] = m;
    return { ptr, idx: idx.slice(0, m) };
  }
}

/** Collects stamp positions, then builds their {@link SparsePattern}. Ground (negative) indices are skipped. */
export class PatternBuilder {
  private rows = new Int32Array(64);
  private cols = new Int32Array(64);
  private count = 0;

  constructor(readonly n: number) {}

  add(r: number, c: number): void {
    if (r < 0 || c < 0) return;
    if (this.count === this.rows.length) {
      const rows = new Int32Array(2 * this.count);
      const cols = new Int32Array(2 * this.count);
      rows.set(this.rows);
      cols.set(this.cols);
      this.rows = rows;
      this.cols = cols;
    }
    this.rows[this.count] = r;
    this.cols[this.count++] = c;
  }

  /** The pattern of every position added, plus the full diagonal. */
  build(): SparsePattern {
    return SparsePattern.fromCoordinates(this.n, this.rows, this.cols, this.count, true);
  }
}
