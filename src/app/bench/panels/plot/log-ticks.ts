/**
 * Ticks for a logarithmic frequency axis: decades (10 Hz, 100 Hz, 1 kHz …) as labelled major
 * ticks with 2…9 as minor ones; when zoomed to less than a couple of decades the 1-2-5 steps
 * get labels too, and below a fraction of a decade evenly spaced linear ticks take over.
 */

export interface AxisTicks {
  major: number[];
  minor: number[];
}

/** Ticks within [lo, hi] (Hz, lo > 0). `maxLabels` bounds how many major ticks get labels. */
export function logTicks(lo: number, hi: number, maxLabels = 10): AxisTicks {
  if (!(lo > 0 && hi > lo)) return { major: [], minor: [] };
  const decades = Math.log10(hi / lo);
  const inside = (v: number) => v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9);
  const first = Math.floor(Math.log10(lo));
  const last = Math.ceil(Math.log10(hi));
  if (decades < 0.5) return linearTicks(lo, hi, Math.max(3, Math.min(maxLabels, 6)));
  const labelled = decades < 2.5 ? [1, 2, 5] : [1];
  const major: number[] = [];
  const minor: number[] = [];
  for (let e = first; e <= last; e++) {
    const base = Math.pow(10, e);
    for (let m = 1; m <= 9; m++) {
      const v = Number((m * base).toPrecision(12));
      if (!inside(v)) continue;
      (labelled.includes(m) ? major : minor).push(v);
    }
  }
  // Many decades on a narrow plot: keep every second (or third …) decade labelled.
  if (major.length > maxLabels) {
    const step = Math.ceil(major.length / maxLabels);
    const keep = major.filter((v) => Math.round(Math.log10(v)) % step === 0);
    minor.push(...major.filter((v) => !keep.includes(v)));
    return { major: keep, minor: minor.sort((a, b) => a - b) };
  }
  return { major, minor };
}

/** Round-number ticks on a linear scale (used for narrow log spans and for the value axes). */
export function linearTicks(lo: number, hi: number, count = 6): AxisTicks {
  if (!(hi > lo)) return { major: [lo], minor: [] };
  const raw = (hi - lo) / count;
  const power = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
  return { major: stepsWithin(lo, hi, step), minor: stepsWithin(lo, hi, step / 2).filter((v) => !isMultiple(v, step)) };
}

/** Phase ticks on multiples of 15°, 30°, 45°, 90° or 180° — the angles a designer reads. */
export function phaseTicks(lo: number, hi: number, count = 5): AxisTicks {
  if (!(hi > lo)) return { major: [lo], minor: [] };
  const step = [15, 30, 45, 90, 180, 360, 720].find((s) => (hi - lo) / s <= count) ?? 1440;
  if ((hi - lo) / 15 < 2) return linearTicks(lo, hi, count);
  return { major: stepsWithin(lo, hi, step), minor: stepsWithin(lo, hi, step / 2).filter((v) => !isMultiple(v, step)) };
}

function stepsWithin(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi + step * 1e-9; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

function isMultiple(v: number, step: number): boolean {
  const r = v / step;
  return Math.abs(r - Math.round(r)) < 1e-9;
}
