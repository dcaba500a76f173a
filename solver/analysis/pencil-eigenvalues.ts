/**
 * The finite generalised eigenvalues of a matrix pencil: the complex s at which A + s·E is
 * singular. With A = G and E = C of the small-signal circuit these are its poles; with the
 * bordered pencil of a transfer (zeros.ts) its zeros.
 *
 * E = C is singular in almost every circuit (a node without capacitance, the branch rows of
 * voltage sources), so the pencil has infinite eigenvalues besides the finite ones, and a plain
 * eigenvalue routine cannot be given it. The reduction used here:
 *
 * 1. Shift and equilibrate. B = A + σ·E for a real shift σ (0 for the poles); the rows and then
 *    the columns of the pencil are scaled by powers of two so that B's largest entry in each is
 *    about 1. Scaling rows and columns of a pencil does not move its eigenvalues, and it puts
 *    siemens, branch incidences and min_g on one footing for the tests below.
 * 2. Reduce to the dynamic unknowns. Let d be the unknowns whose column of E is not zero. For an
 *    eigenvector x: (B + (s − σ)·E)·x = 0 ⟺ x = −(s − σ)·B⁻¹·E[:, d]·x_d, and taking the rows d:
 *    M·x_d = μ·x_d with M = −(B⁻¹·E)[d, d] and μ = 1/(s − σ); x_d ≠ 0, else x = 0. Conversely each
 *    non-zero eigenvalue μ of M gives the finite eigenvalue s = σ + 1/μ. This eliminates the
 *    algebraic unknowns exactly, like a Schur complement, but needs only B invertible — not the
 *    algebraic block alone, which is singular whenever a voltage source holds a node that has
 *    a capacitor. Inductors put −L on their branch diagonal of E, so their currents are dynamic.
 * 3. Deflate the structural infinities. Zero eigenvalues of M are infinite eigenvalues of the
 *    pencil. Those the circuit's structure makes (a node held by a source: a zero row; a vcvs
 *    output: a zero column) come out of B⁻¹ as rows or columns that vanish up to rounding; each
 *    such row or column is deleted, which removes an eigenvalue exactly 0 (expand the determinant
 *    along it) and keeps rounding from splitting the zero into spurious small eigenvalues.
 * 4. Balance what is left (Parlett–Reinsch: a diagonal similarity by powers of two that evens
 *    row and column norms) and take its eigenvalues with ml-matrix's EigenvalueDecomposition
 *    (Hessenberg reduction and shifted QR).
 * 5. An eigenvalue with |μ| ≤ INFINITE_RELATIVE·‖M‖ is an infinite one blurred by rounding (it
 *    stands for |s − σ| more than 10¹² times the slowest time scale of M) and is dropped.
 *
 * Bounded work: dense O(n³); the caller caps n (MAX_POLES_UNKNOWNS).
 */
import { EigenvalueDecomposition, LuDecomposition, Matrix } from 'ml-matrix';
import type { Phasor } from '../numeric/complex';

/** |μ| below this fraction of ‖M‖ (∞-norm after balancing) counts as zero: an infinite eigenvalue. */
export const INFINITE_RELATIVE = 1e-12;
/** A row or column of M whose entries all lie below this fraction of M's largest entry is deleted as structurally zero. */
export const DEFLATE_RELATIVE = 1e-14;
/** A pivot of the equilibrated shifted matrix below this makes it singular (no trustworthy inverse). */
export const PIVOT_RELATIVE = 1e-13;
/** |Im μ| below this fraction of |μ| is rounding of a double real eigenvalue: reported as real. */
export const REAL_RELATIVE = 1e-7;

/** What the reduction found. */
export type PencilOutcome =
  | { singular: false; values: Phasor[]; /** Eigenvalues found infinite (structural or dropped). */ infinite: number }
  | { singular: true };

/** Nearest power of two to 1/x (1 for 0 or a non-finite x). */
function inversePowerOfTwo(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return 1;
  return 2 ** -Math.round(Math.log2(x));
}

/**
 * Finite eigenvalues s of the n×n pencil A + s·E (row-major), computed with the real shift
 * `shift`; `singular` when A + shift·E cannot be inverted reliably (the shift is itself an
 * eigenvalue, or the pencil is singular for every s). Inputs are read, not modified.
 */
export function pencilEigenvalues(A: Float64Array, E: Float64Array, n: number, shift: number): PencilOutcome {
  if (n === 0) return { singular: false, values: [], infinite: 0 };
  const dynamic: number[] = [];
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      if (E[i * n + j] !== 0) {
        dynamic.push(j);
        break;
      }
    }
  }

  // 1. The shifted matrix and the equilibration of the pencil.
  const B = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) B[k] = A[k] + shift * E[k];
  if (!B.every(Number.isFinite)) return { singular: true };
  const rowScale = new Float64Array(n);
  const colScale = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let m = 0;
    for (let j = 0; j < n; j++) m = Math.max(m, Math.abs(B[i * n + j]));
    if (m === 0) return { singular: true };
    rowScale[i] = inversePowerOfTwo(m);
  }
  for (let j = 0; j < n; j++) {
    let m = 0;
    for (let i = 0; i < n; i++) m = Math.max(m, Math.abs(B[i * n + j]) * rowScale[i]);
    if (m === 0) return { singular: true };
    colScale[j] = inversePowerOfTwo(m);
  }
  const scaledB = Matrix.zeros(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) scaledB.set(i, j, B[i * n + j] * rowScale[i] * colScale[j]);
  if (dynamic.length === 0) {
    return invertible(new LuDecomposition(scaledB), n) ? { singular: false, values: [], infinite: n } : { singular: true };
  }

  // 2. M = −(B⁻¹·E)[d, d] on the scaled pencil (a diagonal similarity of the unscaled M).
  const lu = new LuDecomposition(scaledB);
  if (!invertible(lu, n)) return { singular: true };
  const m = dynamic.length;
  const Ed = Matrix.zeros(n, m);
  for (let i = 0; i < n; i++) for (let c = 0; c < m; c++) Ed.set(i, c, E[i * n + dynamic[c]] * rowScale[i] * colScale[dynamic[c]]);
  const Y = lu.solve(Ed);
  const M = new Float64Array(m * m);
  for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) M[r * m + c] = -Y.get(dynamic[r], c);
  if (!M.every(Number.isFinite)) return { singular: true };

  // 3. Structural infinities, 4. balance and eigenvalues, 5. blurred infinities.
  const kept = deflateZeroLines(M, m);
  if (kept.length === 0) return { singular: false, values: [], infinite: n };
  const K = Matrix.zeros(kept.length, kept.length);
  for (let r = 0; r < kept.length; r++) for (let c = 0; c < kept.length; c++) K.set(r, c, M[kept[r] * m + kept[c]]);
  balance(K);
  const norm = infinityNorm(K);
  if (norm === 0) return { singular: false, values: [], infinite: n };
  const evd = new EigenvalueDecomposition(K);
  const re = evd.realEigenvalues;
  const im = evd.imaginaryEigenvalues;
  const values: Phasor[] = [];
  for (let k = 0; k < re.length; k++) {
    const size = Math.hypot(re[k], im[k]);
    if (!(size > INFINITE_RELATIVE * norm)) continue;
    // s − σ = 1/μ = conj(μ)/|μ|².
    const imag = Math.abs(im[k]) <= REAL_RELATIVE * size ? 0 : -im[k] / (size * size);
    values.push({ re: shift + re[k] / (size * size), im: imag });
  }
  return { singular: false, values, infinite: n - values.length };
}

/** The LU has no pivot below PIVOT_RELATIVE (the matrix was equilibrated to unit rows and columns). */
function invertible(lu: LuDecomposition, n: number): boolean {
  if (lu.isSingular()) return false;
  const U = lu.upperTriangularMatrix;
  for (let j = 0; j < n; j++) if (!(Math.abs(U.get(j, j)) >= PIVOT_RELATIVE)) return false;
  return true;
}

/**
 * Indices of M (m×m, row-major) left after deleting, one at a time, every row or column whose
 * entries (over the indices still kept) all lie below DEFLATE_RELATIVE × M's largest entry.
 */
function deflateZeroLines(M: Float64Array, m: number): number[] {
  let largest = 0;
  for (let k = 0; k < m * m; k++) largest = Math.max(largest, Math.abs(M[k]));
  const floor = DEFLATE_RELATIVE * largest;
  const alive = new Uint8Array(m).fill(1);
  let changed = largest > 0;
  if (!changed) return [];
  while (changed) {
    changed = false;
    for (let k = 0; k < m; k++) {
      if (!alive[k]) continue;
      let rowMax = 0;
      let colMax = 0;
      for (let j = 0; j < m; j++) {
        if (!alive[j]) continue;
        rowMax = Math.max(rowMax, Math.abs(M[k * m + j]));
        colMax = Math.max(colMax, Math.abs(M[j * m + k]));
      }
      if (rowMax <= floor || colMax <= floor) {
        alive[k] = 0;
        changed = true;
      }
    }
  }
  const kept: number[] = [];
  for (let k = 0; k < m; k++) if (alive[k]) kept.push(k);
  return kept;
}

/**
 * Parlett–Reinsch balancing in place: repeated diagonal similarity by powers of two (exact in
 * floating point) until each row and column have comparable 1-norms (off the diagonal). The
 * eigenvalues are unchanged; their rounding errors, which scale with the matrix norm, shrink.
 */
export function balance(K: Matrix): void {
  const n = K.rows;
  const RADIX = 2;
  let converged = false;
  // Each pass moves a scale by at least a factor of two; 100 passes bound the work.
  for (let pass = 0; pass < 100 && !converged; pass++) {
    converged = true;
    for (let i = 0; i < n; i++) {
      let c = 0;
      let r = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        c += Math.abs(K.get(j, i));
        r += Math.abs(K.get(i, j));
      }
      if (c === 0 || r === 0) continue;
      let f = 1;
      let g = r / RADIX;
      const s = c + r;
      // Bounded: a factor beyond 2^±400 would only come from denormal entries.
      for (let k = 0; c < g && k < 400; k++) {
        f *= RADIX;
        c *= RADIX * RADIX;
      }
      g = r * RADIX;
      for (let k = 0; c > g && k < 400; k++) {
        f /= RADIX;
        c /= RADIX * RADIX;
      }
      if ((c + r) / f < 0.95 * s) {
        converged = false;
        for (let j = 0; j < n; j++) K.set(i, j, K.get(i, j) / f);
        for (let j = 0; j < n; j++) K.set(j, i, K.get(j, i) * f);
      }
    }
  }
}

function infinityNorm(K: Matrix): number {
  let best = 0;
  for (let i = 0; i < K.rows; i++) {
    let s = 0;
    for (let j = 0; j < K.columns; j++) s += Math.abs(K.get(i, j));
    best = Math.max(best, s);
  }
  return best;
}
