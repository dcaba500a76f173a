/**
 * Long analyses written as generators that yield between their units of work (a sweep value, a
 * sensitivity knob), so a caller with an event loop — the bench's worker — can stop between two
 * of them when newer text is waiting, where a plain call could only be killed. `drain` runs one
 * to the end for callers that want the result at once (the CLI, the tests).
 */

/** Work that yields between its units and returns its result at the end. */
export type Steps<T> = Generator<void, T, void>;

/** Runs `steps` to the end and returns the result. */
export function drain<T>(steps: Steps<T>): T {
  for (;;) {
    const next = steps.next();
    if (next.done) return next.value;
  }
}
