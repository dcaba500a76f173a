/**
 * Noise by the adjoint network: every contributor of one output from ONE transposed solve per
 * frequency, from the factors of the small-signal matrix A = G + j·2πf·C.
 *
 * Row k of A·x = b is KCL at node k with b[k] the current injected into it, so the output
 * v(out) − v(ref) = eᵀ·x = (A⁻ᵀ·e)ᵀ·b with e = e_out − e_ref. The solution y = A⁻ᵀ·e of the
 * transposed system is therefore the transimpedance from a unit current injected at any row to
 * the output (the adjoint network of Director & Rohrer, IEEE Trans. Circuit Theory CT-16, 1969),
 * and a noise current of density S flowing between rows a and b adds |y[a] − y[b]|²·S to the
 * output power density. Independent sources are uncorrelated, so their powers add; a part's
 * contributor is the sum over its own sources.
 *
 * The same y gives the gain H from the `in` source to the output without a second solve: a 1 V
 * source stamps 1 into its branch row, so H = y[row]; a 1 A current source leaves `from` and
 * enters `to`, so H = y[to] − y[from].
 */
import type { AcSolver, LinearSystem } from './engine-api';
import { sourceDensity, type NoiseSource } from './noise-sources';

/** The output of a noise analysis: a node, optionally less a reference node. */
export interface NoiseOutput {
  node: string;
  ref?: string;
}

/** What a noise sweep gives, per frequency (all arrays as long as `freqHz`). */
export interface NoiseSpectrum {
  freqHz: readonly number[];
  /** Total output power density, V²/Hz. */
  outPower: Float64Array;
  /** By part index (parts with noise sources, in circuit order): the part's output power density, V²/Hz. */
  partPower: Map<number, Float64Array>;
  /** Gain from the input source to the output (V/V, or V/A for a current source). */
  gainRe: Float64Array;
  gainIm: Float64Array;
  /** Indices of the frequencies at which the matrix could not be factored or the solve overflowed (everything 0 there). */
  singular: number[];
}

/**
 * The noise spectrum of `output` over `freqHz`, with the gain from the independent source
 * `input`. One transposed solve per frequency; O(size + sources) work beyond it.
 */
export function noiseSpectrum(
  system: LinearSystem, solver: AcSolver, sources: readonly NoiseSource[], output: NoiseOutput, input: string, freqHz: readonly number[],
): NoiseSpectrum {
  const n = system.size;
  const nf = freqHz.length;
  const rhsRe = new Float64Array(n);
  const rhsIm = new Float64Array(n);
  const outRow = system.nodeIndex.get(output.node);
  const refRow = output.ref === undefined ? undefined : system.nodeIndex.get(output.ref);
  if (outRow !== undefined) rhsRe[outRow] += 1;
  if (refRow !== undefined) rhsRe[refRow] -= 1;

  // One accumulator per noisy part, and each source's slot in that list.
  const partPower = new Map<number, Float64Array>();
  for (const s of sources) if (!partPower.has(s.part)) partPower.set(s.part, new Float64Array(nf));
  const slots = [...partPower.values()];
  const slotOf = new Map([...partPower.keys()].map((part, k) => [part, k]));
  const sourceSlot = Int32Array.from(sources, (s) => slotOf.get(s.part)!);

  const outPower = new Float64Array(nf);
  const gainRe = new Float64Array(nf);
  const gainIm = new Float64Array(nf);
  const singular: number[] = [];
  const excitation = system.sources.get(input);
  const empty = n === 0 || outRow === undefined && refRow === undefined;

  for (let k = 0; k < nf; k++) {
    const f = freqHz[k];
    if (empty) continue;
    const y = solver.solveTransposed(f, rhsRe, rhsIm);
    if (y.singular) {
      singular.push(k);
      continue;
    }
    const yr = y.re;
    const yi = y.im;
    for (let j = 0; j < sources.length; j++) {
      const s = sources[j];
      const dr = (s.a >= 0 ? yr[s.a] : 0) - (s.b >= 0 ? yr[s.b] : 0);
      const di = (s.a >= 0 ? yi[s.a] : 0) - (s.b >= 0 ? yi[s.b] : 0);
      slots[sourceSlot[j]][k] += (dr * dr + di * di) * sourceDensity(s, f);
    }
    let total = 0;
    for (const p of slots) total += p[k];
    if (!Number.isFinite(total)) {
      // A nearly singular matrix overflowed: the point is as unusable as a singular one.
      for (const p of slots) p[k] = 0;
      singular.push(k);
      continue;
    }
    outPower[k] = total;
    if (excitation?.kind === 'vsrc') {
      gainRe[k] = yr[excitation.row];
      gainIm[k] = yi[excitation.row];
    } else if (excitation) {
      gainRe[k] = (excitation.to >= 0 ? yr[excitation.to] : 0) - (excitation.from >= 0 ? yr[excitation.from] : 0);
      gainIm[k] = (excitation.to >= 0 ? yi[excitation.to] : 0) - (excitation.from >= 0 ? yi[excitation.from] : 0);
    }
  }
  return { freqHz, outPower, partPower, gainRe, gainIm, singular };
}
