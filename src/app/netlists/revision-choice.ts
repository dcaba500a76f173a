/**
 * Which revisions the user has ticked for comparing: at most two, and the pair always shown older
 * on the left whatever order they were ticked in.
 */

/** Ticks or unticks `version`; ticking a third drops the one ticked first. */
export function toggleCompare(chosen: readonly number[], version: number): number[] {
  if (chosen.includes(version)) return chosen.filter((v) => v !== version);
  return [...chosen, version].slice(-2);
}

/** The two ticked versions as older and newer, or undefined until two are ticked. */
export function comparePair(chosen: readonly number[]): { older: number; newer: number } | undefined {
  if (chosen.length !== 2) return undefined;
  const [a, b] = chosen;
  return { older: Math.min(a, b), newer: Math.max(a, b) };
}

/** The version just before `version` in a newest-first list, for "compare with the previous". */
export function previousVersion(newestFirst: readonly number[], version: number): number | undefined {
  const i = newestFirst.indexOf(version);
  return i >= 0 && i + 1 < newestFirst.length ? newestFirst[i + 1] : undefined;
}
