/**
 * The one error type the measure functions throw. The evaluator catches it (and anything else
 * mathjs throws) and turns it into a diagnostic on the measure's line: no exception leaves the
 * measure layer.
 */
export class MeasureError extends Error {
  readonly hint?: string;

  constructor(message: string, hint?: string) {
    // No stack: these are the user's mistakes, caught a few frames up and never shown with one,
    // and a measure that fails in every run of a mismatch analysis made the stack capture (and
    // an own `name`) a tenth of the run.
    const engine = Error as { stackTraceLimit?: number };
    const limit = engine.stackTraceLimit;
    if (limit !== undefined) engine.stackTraceLimit = 0;
    super(message);
    if (limit !== undefined) engine.stackTraceLimit = limit;
    this.hint = hint;
  }
}
Object.defineProperty(MeasureError.prototype, 'name', { value: 'MeasureError', configurable: true, writable: true });

/**
 * A measure that cannot be evaluated because something it needs (an `analyze ac` or `ports`
 * line, an earlier measure) already failed with an error of its own. The evaluator drops the
 * measure or check without a further message: one mistake, one error.
 */
export class FollowOnError extends MeasureError {
  constructor(what: string) {
    super(`${what} failed earlier.`);
  }
}
Object.defineProperty(FollowOnError.prototype, 'name', { value: 'FollowOnError', configurable: true, writable: true });

/** The closest of `candidates` to `name` by edit distance, when close enough to be a likely typo. */
export function closestName(name: string, candidates: Iterable<string>): string | undefined {
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const d = editDistance(name.toLowerCase(), candidate.toLowerCase());
    if (d < bestDistance) {
      bestDistance = d;
      best = candidate;
    }
  }
  // A suggestion three edits away from a four-letter name is noise, not help.
  return best !== undefined && bestDistance <= Math.max(1, Math.floor(name.length / 3)) ? best : undefined;
}

/** "did you mean `x`?" for the closest candidate, or undefined. */
export function didYouMean(name: string, candidates: Iterable<string>): string | undefined {
  const best = closestName(name, candidates);
  return best === undefined ? undefined : `did you mean \`${best}\`?`;
}

/** Levenshtein distance (insert, delete, substitute each cost 1). */
function editDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const substitution = previous[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1);
      current.push(Math.min(previous[j] + 1, current[j - 1] + 1, substitution));
    }
    previous = current;
  }
  return previous[b.length];
}
