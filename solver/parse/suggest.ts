/**
 * "Did you mean …?" suggestions: the known name with the smallest Levenshtein distance, when it
 * is close enough to be a plausible typo.
 */

/** Levenshtein distance, giving up (returning `limit + 1`) once it must exceed `limit`. */
export function levenshtein(a: string, b: string, limit = Infinity): number {
  if (Math.abs(a.length - b.length) > limit) return limit + 1;
  let prev = new Array<number>(b.length + 1);
  let cur = new Array<number>(b.length + 1);
  for (let j = 0; j <= b.length; j++) prev[j] = j;
  for (let i = 1; i <= a.length; i++) {
    cur[0] = i;
    let rowMin = cur[0];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      cur[j] = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (cur[j] < rowMin) rowMin = cur[j];
    }
    if (rowMin > limit) return limit + 1;
    [prev, cur] = [cur, prev];
  }
  return prev[b.length];
}

/** At most this many candidates are compared, so huge netlists stay fast. */
const MAX_CANDIDATES = 5000;

/** The closest candidate to `name`, or undefined when none is plausibly meant. */
export function closest(name: string, candidates: Iterable<string>): string | undefined {
  const limit = Math.max(1, Math.min(3, Math.floor(name.length / 3) + 1));
  let best: string | undefined;
  let bestDistance = limit + 1;
  let seen = 0;
  const lower = name.toLowerCase();
  for (const candidate of candidates) {
    if (++seen > MAX_CANDIDATES) break;
    if (candidate === name) continue;
    const d = candidate.toLowerCase() === lower ? 0.5 : levenshtein(name, candidate, limit);
    if (d < bestDistance) {
      bestDistance = d;
      best = candidate;
    }
  }
  return best;
}

/** `did you mean \`x\`?` or undefined. */
export function didYouMean(name: string, candidates: Iterable<string>): string | undefined {
  const best = closest(name, candidates);
  return best === undefined ? undefined : `did you mean \`${best}\`?`;
}
