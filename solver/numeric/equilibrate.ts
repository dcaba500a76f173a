/**
 * Row and column equilibration of a sparse matrix: R·A·C with every row, then every column, of
 * largest magnitude near 1 (the max-norm scaling of LAPACK's xGEEQU, common practice). Scale
 * factors are powers of two, so scaling itself rounds nothing: a well-scaled matrix factors to
 * the same bits as before, and a badly scaled one (a 1 TΩ resistor beside a 1 mΩ one, a junction
 * at 1e18 S next to 1e-12 S of min_g) is pivoted on its real relative sizes.
 *
 * After scaling, each column's largest entry lies in [1, 2), so pivot thresholds and the
 * singularity floor read as relative to the column's scale.
 */

/** Exponent range of the scale factors: enough for any finite entry, and the inverse never overflows. */
const MAX_EXPONENT = 1000;

// The binary exponent is read from the number's bits (Math.log2 and ** cost ~100 ns each, and a
// factorisation needs 2n of them). The high word of a little-endian double holds sign, exponent
// and the top of the mantissa; big-endian platforms take the arithmetic path.
const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);
const HIGH = new Uint8Array(Float64Array.of(1).buffer)[7] === 0x3f ? 1 : -1;

/**
 * 2^−e where 2^e ≤ m < 2^(e+1), e held within ±MAX_EXPONENT: scaling by it brings m into
 * [1, 2). 1 for zero, negative, subnormal or non-finite m.
 */
export function inversePowerOfTwo(m: number): number {
  if (!(m >= 2.2250738585072014e-308) || m === Infinity) return 1;
  let e: number;
  if (HIGH === 1) {
    bits[0] = m;
    e = ((words[1] >>> 20) & 0x7ff) - 1023;
  } else {
    e = Math.floor(Math.log2(m));
  }
  if (e > MAX_EXPONENT) e = MAX_EXPONENT;
  else if (e < -MAX_EXPONENT) e = -MAX_EXPONENT;
  if (HIGH === 1) {
    words[0] = 0;
    words[1] = (1023 - e) << 20;
    return bits[0];
  }
  return 2 ** -e;
}

/**
 * Fills `rowScale` and `colScale` (length n) for the matrix with values `re` (and `im`, for a
 * complex matrix: magnitudes as |re| + |im|) on the CSC pattern (colPtr, rowIdx).
 */
export function equilibrate(
  n: number,
  colPtr: Int32Array,
  rowIdx: Int32Array,
  re: Float64Array,
  im: Float64Array | null,
  rowScale: Float64Array,
  colScale: Float64Array,
): void {
  rowScale.fill(0, 0, n);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const a = im ? Math.abs(re[p]) + Math.abs(im[p]) : Math.abs(re[p]);
      const i = rowIdx[p];
      if (a > rowScale[i]) rowScale[i] = a;
    }
  }
  for (let i = 0; i < n; i++) rowScale[i] = inversePowerOfTwo(rowScale[i]);
  for (let j = 0; j < n; j++) {
    let m = 0;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const a = (im ? Math.abs(re[p]) + Math.abs(im[p]) : Math.abs(re[p])) * rowScale[rowIdx[p]];
      if (a > m) m = a;
    }
    colScale[j] = inversePowerOfTwo(m);
  }
}
