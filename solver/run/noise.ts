/**
 * `analyze noise out NODE [REF] in SOURCE from F1 to F2 per decade N`: the noise densities of the
 * §5 `noise` member over the ac grid — the output density, the input-referred density and each
 * noisy part's share — from one adjoint solve per frequency (analysis/noise.ts), and the data the
 * noise measures read.
 */
import { diagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { NoiseResult } from '../circuit/result';
import { logSweep } from '../analysis/frequency';
import { noiseSpectrum } from '../analysis/noise';
import { noiseSources } from '../analysis/noise-sources';
import { formatSi } from '../report/si-format';
import type { AnalysisRunner } from './analysis-run';

/**
 * At most this many frequency points × unknowns in one noise sweep: each point factors the
 * small-signal matrix once, so the work grows with both.
 */
export const MAX_NOISE_WORK = 2_000_000;

/**
 * A gain below this fraction of the largest gain over the sweep counts as zero: the input source
 * does not reach the output there (a cancellation that leaves rounding, not a transfer), and the
 * input-referred density is undefined.
 */
export const NOISE_GAIN_FLOOR = 1e-15;

/** Frequencies named in a message: the first few and how many more. */
function listed(freqs: readonly number[]): string {
  const shown = freqs.slice(0, 4).map((f) => formatSi(f, 'Hz')).join(', ');
  return freqs.length > 4 ? `${shown} and ${freqs.length - 4} more` : shown;
}

/** Runs the noise sweep of a resolved request (its nodes, source and point count were checked where it was read). */
export const runNoise: AnalysisRunner<'noise', NoiseResult> = (circuit, bias, request) => {
  const diagnostics: Diagnostic[] = [];
  const sweep = logSweep(request.fromHz, request.toHz, request.perDecade);
  const size = bias.system.size;
  if (sweep.length * size > MAX_NOISE_WORK) {
    diagnostics.push(diagnostic('error', 'sweep-too-large', request.loc,
      `analyze noise would solve ${sweep.length} frequencies × ${size} unknowns, more than ${MAX_NOISE_WORK.toLocaleString('en-US')}.`,
      'use fewer points per decade or a narrower band'));
    return { diagnostics };
  }
  const sources = noiseSources(circuit, bias.op, bias.system);
  const spectrum = noiseSpectrum(bias.system, bias.solver, sources, { node: request.out, ref: request.outRef }, request.input, sweep);

  const singular = new Set(spectrum.singular);
  const gain = sweep.map((_, k) => Math.hypot(spectrum.gainRe[k], spectrum.gainIm[k]));
  const peak = gain.reduce((m, g) => Math.max(m, g), 0);
  const outDensity = Array.from(spectrum.outPower, Math.sqrt);
  const inDefined = gain.map((g, k) => !singular.has(k) && g > 0 && g > NOISE_GAIN_FLOOR * peak && Number.isFinite(outDensity[k] / g));
  const inDensity = outDensity.map((d, k) => (inDefined[k] ? d / gain[k] : 0));

  const contributors: Record<string, number[]> = {};
  for (const [part, power] of spectrum.partPower) contributors[circuit.parts[part].name] = Array.from(power, Math.sqrt);

  if (singular.size > 0) {
    diagnostics.push(diagnostic('warning', 'noise-singular', request.loc,
      `analyze noise: the small-signal circuit is singular at ${singular.size} of ${sweep.length} frequencies (${listed(spectrum.singular.map((k) => sweep[k]))}); every density there is reported as 0.`,
      'look for a node with no path to ground at those frequencies'));
  }
  const noGain = sweep.filter((_, k) => !inDefined[k] && !singular.has(k));
  if (noGain.length > 0) {
    const where = noGain.length === sweep.length - singular.size ? 'at any frequency of the sweep' : `at ${noGain.length} of ${sweep.length} frequencies (${listed(noGain)})`;
    diagnostics.push(diagnostic('warning', 'noise-no-gain', request.loc,
      `analyze noise: the source \`${request.input}\` does not reach the output ${where}, so the input-referred density is undefined there and reported as 0.`,
      'name as `in` the source that drives the output'));
  }

  const inputKind = circuit.parts.find((p) => p.name === request.input)?.kind;
  const member: NoiseResult = {
    out: request.out,
    ...(request.outRef ? { out_ref: request.outRef } : {}),
    in: request.input,
    freq_hz: sweep,
    out_density: outDensity,
    in_density: inDensity,
    contributors,
  };
  return {
    member,
    diagnostics,
    measures: {
      noise: {
        freqHz: sweep,
        outPower: Array.from(spectrum.outPower),
        inPower: inDensity.map((d) => d * d),
        inDefined,
        inUnit: inputKind === 'isrc' ? 'A' : 'V',
      },
    },
  };
};
