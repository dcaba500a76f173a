/**
 * The readable report's noise section: the densities at about one frequency per decade, the rms
 * noise over the band (power-law integration, noise-band.ts) and the largest contributors at a
 * spot frequency in the middle of the band (on the log scale), each with its share of the power.
 */
import type { NoiseResult, SolveResult } from '../circuit/result';
import { bandPower, squared } from './noise-band';
import { formatSi } from './si-format';

/** Most rows of the density table. */
const MAX_ROWS = 9;
/** How many contributors the spot table lists. */
const TOP_CONTRIBUTORS = 5;

/** Grid indices to print: the points nearest each power of ten, the ends, at most MAX_ROWS. */
export function reportedPoints(freqHz: readonly number[]): number[] {
  const n = freqHz.length;
  if (n === 0) return [];
  const picked = new Set<number>([0, n - 1]);
  const first = Math.ceil(Math.log10(freqHz[0]) - 1e-9);
  const last = Math.floor(Math.log10(freqHz[n - 1]) + 1e-9);
  for (let e = first; e <= last; e++) {
    let best = 0;
    for (let k = 1; k < n; k++) if (Math.abs(Math.log10(freqHz[k]) - e) < Math.abs(Math.log10(freqHz[best]) - e)) best = k;
    picked.add(best);
  }
  let rows = [...picked].sort((a, b) => a - b);
  if (rows.length > MAX_ROWS) {
    const step = (rows.length - 1) / (MAX_ROWS - 1);
    rows = Array.from({ length: MAX_ROWS }, (_, k) => rows[Math.round(k * step)]);
  }
  return rows;
}

/** The input-referred density is undefined where it is 0 but the output density is not (H = 0 there). */
function undefinedAt(noise: NoiseResult, k: number): boolean {
  return noise.in_density[k] === 0 && noise.out_density[k] > 0;
}

/** The noise section of a report: tables as rows (header first), ready for the report's table layout. */
export interface NoiseSection {
  title: string;
  /** Frequency, output density, input-referred density. */
  densities: string[][];
  /** The rms figures over the band, one line. */
  rms: string;
  /** The spot frequency the contributors are read at, in words. */
  spot: string;
  /** Part, density, share of the output power (empty rows list when nothing is noisy). */
  contributors: string[][];
}

/** The noise section of `result`, or undefined without a noise member. */
export function noiseSection(result: SolveResult): NoiseSection | undefined {
  const noise = result.noise;
  if (!noise || noise.freq_hz.length === 0) return undefined;
  const f = noise.freq_hz;
  // The input-referred figures are volts for a voltage source and amperes for a current source.
  const inUnit = result.op && !(noise.in in result.op.sources) ? 'A' : 'V';
  const output = noise.out_ref ? `v(${noise.out}, ${noise.out_ref})` : noise.out;
  const title = `Noise at ${output}, input ${noise.in} (${formatSi(f[0], 'Hz')} to ${formatSi(f[f.length - 1], 'Hz')}, ${f.length} points)`;

  const densities: string[][] = [['frequency', 'output', 'input-referred']];
  for (const k of reportedPoints(f)) {
    densities.push([formatSi(f[k], 'Hz'), formatSi(noise.out_density[k], 'V/√Hz'), undefinedAt(noise, k) ? '—' : formatSi(noise.in_density[k], `${inUnit}/√Hz`)]);
  }

  const outRms = Math.sqrt(bandPower(f, squared(noise.out_density)));
  const inUndefined = f.some((_, k) => undefinedAt(noise, k));
  const inRms = inUndefined ? '— (undefined where the input does not reach the output)' : formatSi(Math.sqrt(bandPower(f, squared(noise.in_density))), inUnit);
  const rms = `rms over the band: output ${formatSi(outRms, 'V')}, input-referred ${inRms}`;

  // The spot frequency: the grid point nearest the band's middle on the log scale.
  const middle = Math.sqrt(f[0] * f[f.length - 1]);
  let spot = 0;
  for (let k = 1; k < f.length; k++) if (Math.abs(Math.log(f[k] / middle)) < Math.abs(Math.log(f[spot] / middle))) spot = k;
  const total = noise.out_density[spot] ** 2;
  const ranked = Object.entries(noise.contributors)
    .map(([part, d]) => ({ part, density: d[spot] }))
    .filter((c) => c.density > 0 && total > 0)
    .sort((a, b) => b.density - a.density)
    .slice(0, TOP_CONTRIBUTORS);
  const contributors = [['part', 'density', 'share'], ...ranked.map((c) => [c.part, formatSi(c.density, 'V/√Hz'), `${((100 * c.density ** 2) / total).toFixed(1)} %`])];
  return { title, densities, rms, spot: `largest contributors at ${formatSi(f[spot], 'Hz')} (share of the output noise power)`, contributors };
}
