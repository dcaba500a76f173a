/**
 * The densities of `analyze noise`, read out of a solve result for the Noise panel: the output
 * and input-referred curves, their rms over the band, and the parts ranked by their share of the
 * band's noise power. Free of the DOM, so it is tested on real solves without a browser.
 *
 * Band figures follow the solver's own rule (solver/report/noise-band.ts, `bandPower`): between
 * grid points the power density is a power law, integrated exactly — so the rms here is the very
 * number `noise_out_rms()` and `noise_in_rms()` give.
 */
import { bandPower, type NoiseResult, type SolveResult } from '../../../../../solver';
import { suggestedInput, suggestedOutput } from '../suggested-names';

/** One noisy part over the band. */
export interface NoiseContributor {
  part: string;
  /** Its share of the output density at each frequency, V/√Hz. */
  density: readonly number[];
  /** ∫ density² df over the band, V². */
  power: number;
  /** Its share of the band's noise power, 0…1 (see `noiseData`). */
  share: number;
}

export interface NoiseData {
  freqHz: readonly number[];
  /** The output as the netlist reads it: `v(outa)`, or `v(outa) − v(outb)` with a reference node. */
  output: string;
  /** The input source. */
  input: string;
  /** The input-referred figures are volts for a voltage source, amperes for a current source. */
  inUnit: 'V' | 'A';
  /** Output density, V/√Hz. */
  out: readonly number[];
  /** Input-referred density (V/√Hz or A/√Hz); NaN where it is undefined (the input does not reach the output). */
  inReferred: readonly number[];
  /** Frequencies at which the input-referred density is undefined. */
  undefinedHz: readonly number[];
  /** rms output noise over the band, V. */
  outRms: number;
  /** rms input-referred noise over the band (V or A); undefined when the density is undefined anywhere in it. */
  inRms: number | undefined;
  /** Every noisy part, largest share first (ties by name). */
  contributors: NoiseContributor[];
  /**
   * Σ of the parts' band powers over the output's own. Σ part² = total² at every point, but the
   * power-law rule between points is not additive when the parts' shapes differ (a 1/f part
   * beside a white one), so this is 1 to within the grid's resolution: 1 − 1.8·10⁻⁶ for a MOS
   * stage with a 100 kHz flicker corner at 10 points a decade (noise-data.spec.ts), exactly 1
   * when every part has the same shape. Shares are taken of the parts' sum, so they add to 100 %.
   */
  closure: number;
  /** Index of the spot frequency to read the contributors at first (see `defaultSpot`). */
  spot: number;
}

/** The noise data of `result`, or undefined without a noise sweep. */
export function noiseData(result: SolveResult | undefined): NoiseData | undefined {
  const noise = result?.noise;
  if (!noise || noise.freq_hz.length === 0) return undefined;
  const f = noise.freq_hz;
  const undefinedAt = (k: number) => noise.in_density[k] === 0 && noise.out_density[k] > 0;
  const inReferred = noise.in_density.map((d, k) => (undefinedAt(k) ? NaN : d));
  const undefinedHz = f.filter((_, k) => undefinedAt(k));
  const outPower = bandPower(f, squared(noise.out_density));
  const parts = Object.entries(noise.contributors).map(([part, density]) => ({ part, density, power: bandPower(f, squared(density)) }));
  // Shares of the parts' own sum, so they add to 100 % exactly whatever `closure` is.
  const sum = parts.reduce((s, p) => s + p.power, 0);
  const contributors = parts
    .map((p) => ({ ...p, share: sum > 0 ? p.power / sum : 0 }))
    .sort((a, b) => b.power - a.power || a.part.localeCompare(b.part));
  return {
    freqHz: f,
    output: outputName(noise),
    input: noise.in,
    inUnit: result?.op && !(noise.in in result.op.sources) ? 'A' : 'V',
    out: noise.out_density,
    inReferred,
    undefinedHz,
    outRms: Math.sqrt(outPower),
    inRms: undefinedHz.length > 0 ? undefined : Math.sqrt(bandPower(f, squared(noise.in_density))),
    contributors,
    closure: outPower > 0 ? sum / outPower : 1,
    spot: defaultSpot(f),
  };
}

/** `v(outa)`, or `v(outa) − v(outb)` for an output taken between two nodes. */
export function outputName(noise: Pick<NoiseResult, 'out' | 'out_ref'>): string {
  return noise.out_ref ? `v(${noise.out}) − v(${noise.out_ref})` : `v(${noise.out})`;
}

/**
 * The spot frequency to read the contributors at first: the swept point nearest 1 kHz — the
 * audio designer's habit, and a frequency above most flicker corners — when 1 kHz is inside the
 * band, else the point nearest the band's middle on the log scale (where the report reads them).
 */
export function defaultSpot(freqHz: readonly number[]): number {
  const n = freqHz.length;
  if (n === 0) return 0;
  const inside = freqHz[0] <= 1e3 && 1e3 <= freqHz[n - 1];
  return nearestOnLog(freqHz, inside ? 1e3 : Math.sqrt(freqHz[0] * freqHz[n - 1]));
}

/** Index of the point of `freqHz` nearest `f` on the log scale. */
export function nearestOnLog(freqHz: readonly number[], f: number): number {
  let best = 0;
  for (let k = 1; k < freqHz.length; k++) if (Math.abs(Math.log(freqHz[k] / f)) < Math.abs(Math.log(freqHz[best] / f))) best = k;
  return best;
}

/** One row of the contributors table at a spot frequency. */
export interface ContributorRow {
  rank: number;
  part: string;
  /** Share of the band's noise power, 0…1. */
  share: number;
  /** rms of its part of the output noise over the band, V. */
  rms: number;
  /** Its density at the spot frequency, V/√Hz. */
  spotDensity: number;
  /** Its share of the output noise power at the spot frequency, 0…1. */
  spotShare: number;
}

/** The contributors as table rows, read at swept point `spot`. */
export function contributorRows(data: NoiseData, spot: number): ContributorRow[] {
  const total = data.out[spot] ** 2;
  return data.contributors.map((c, k) => ({
    rank: k + 1,
    part: c.part,
    share: c.share,
    rms: Math.sqrt(c.power),
    spotDensity: c.density[spot],
    spotShare: total > 0 ? c.density[spot] ** 2 / total : 0,
  }));
}

/** The part contributing most at swept point `k` and its share of the output power there. */
export function largestAt(data: NoiseData, k: number): { part: string; share: number } | undefined {
  const total = data.out[k] ** 2;
  let best: NoiseContributor | undefined;
  for (const c of data.contributors) if (!best || c.density[k] > best.density[k]) best = c;
  return best && total > 0 ? { part: best.part, share: best.density[k] ** 2 / total } : undefined;
}

/**
 * The noise line to copy into a netlist without one: the ports' output (both nodes of a
 * differential one) and first input when there are ports, else names guessed from the solve.
 */
export function suggestedNoise(result: SolveResult): string {
  const out = suggestedOutput(result);
  return `analyze noise out ${out.node}${out.ref ? ` ${out.ref}` : ''} in ${suggestedInput(result)} from 10 Hz to 10 MHz per decade 10`;
}

function squared(density: readonly number[]): number[] {
  return density.map((d) => d * d);
}
