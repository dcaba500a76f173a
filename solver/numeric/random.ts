/**
 * Seeded random numbers for the mismatch runs. Run i of a seed draws from its own stream, made
 * from (seed, i) alone, so a result is the same whichever worker solved which runs and in what
 * order. The generator is SplitMix32-style mixing (the 32-bit variant of Steele, Lea & Flood's
 * SplitMix, "Fast splittable pseudorandom number generators", OOPSLA 2014) feeding Mulberry32
 * (a small public-domain 32-bit generator); normals come from the Box–Muller transform.
 */

/** Mixes a 32-bit value into a well-scrambled one (the SplitMix32 finaliser). */
function mix32(x: number): number {
  let z = (x + 0x9e3779b9) | 0;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return (z ^ (z >>> 16)) >>> 0;
}

/** A stream of uniform and normal draws. */
export interface RandomStream {
  /** Uniform in (0, 1), never 0 or 1. */
  uniform(): number;
  /** Standard normal (mean 0, sd 1). */
  normal(): number;
}

/** The stream of run `run` for `seed`: depends on those two numbers only. */
export function streamFor(seed: number, run: number): RandomStream {
  let state = mix32(mix32(seed | 0) ^ mix32((run | 0) + 0x632be5ab));
  let spare: number | undefined;
  const next32 = (): number => {
    state = (state + 0x6d2b79f5) | 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (t ^ (t >>> 14)) >>> 0;
  };
  const uniform = () => (next32() + 0.5) / 4294967296;
  return {
    uniform,
    normal() {
      if (spare !== undefined) {
        const s = spare;
        spare = undefined;
        return s;
      }
      const r = Math.sqrt(-2 * Math.log(uniform()));
      const a = 2 * Math.PI * uniform();
      spare = r * Math.sin(a);
      return r * Math.cos(a);
    },
  };
}
