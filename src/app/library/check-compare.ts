/**
 * The author's checks beside the same checks re-solved in this browser. A reviewer vets what the
 * solver says now, not what the author's browser said: any disagreement is flagged, never
 * smoothed over. Pure functions, so the rules are tested on their own.
 */
import type { CheckResult } from '../../../solver';
import type { CheckOutcome } from './library-api';

/**
 * Relative tolerance on a check's value. The same solver on the same text gives the same numbers
 * to the last bits; 1e-6 leaves room only for floating-point differences between browsers'
 * maths libraries (common practice for comparing iterative numeric results).
 */
export const VALUE_RTOL = 1e-6;

export interface CheckComparison {
  /** The line of the check in the version's source. */
  line: number;
  text: string;
  /** As submitted by the author; undefined when the author's checks lack it. */
  author?: CheckOutcome;
  /** As solved here; undefined when this solve lacks it. */
  here?: CheckOutcome;
  same: boolean;
  /** Why they differ, in one sentence; undefined when the same. */
  reason?: string;
}

/** The solver's checks as the author's browser sends them (a value that is not finite → null). */
export function outcomesOf(checks: readonly CheckResult[]): CheckOutcome[] {
  return checks.map((c) => ({ line: c.line, text: c.text, pass: c.pass, value: Number.isFinite(c.value) ? c.value : null }));
}

function finite(v: number | null | undefined): v is number {
  return typeof v === 'number' && Number.isFinite(v);
}

/**
 * Whether two check values agree: both absent (not a number), or both numbers within `rtol` of
 * the larger magnitude (equal numbers, zero included, always agree).
 */
export function valuesAgree(a: number | null | undefined, b: number | null | undefined, rtol = VALUE_RTOL): boolean {
  if (!finite(a) || !finite(b)) return !finite(a) && !finite(b);
  if (a === b) return true;
  return Math.abs(a - b) <= rtol * Math.max(Math.abs(a), Math.abs(b));
}

function verdict(pass: boolean): string {
  return pass ? 'passes' : 'fails';
}

/** Why one pair differs, or undefined when it does not. */
function difference(author: CheckOutcome, here: CheckOutcome): string | undefined {
  if (author.text.trim() !== here.text.trim()) return `The check on this line reads differently here: “${here.text}”.`;
  if (author.pass !== here.pass) return `It ${verdict(here.pass)} here but ${author.pass ? 'passed' : 'failed'} for the author.`;
  if (!valuesAgree(author.value, here.value)) {
    if (!finite(author.value)) return `Here it has the value ${here.value}; the author's had none.`;
    if (!finite(here.value)) return `The author's value was ${author.value}; here it has none.`;
    const rel = Math.abs(author.value - here.value) / Math.max(Math.abs(author.value), Math.abs(here.value));
    return `The value differs: ${here.value} here, ${author.value} for the author (relative difference ${rel.toPrecision(2)}).`;
  }
  return undefined;
}

/**
 * Pairs the author's checks with those solved here by line (in order when a line has several)
 * and says for each whether they are the same: the same verdict and a value within VALUE_RTOL.
 * A check on one side only is a mismatch too. Sorted by line.
 */
export function compareChecks(author: readonly CheckOutcome[], here: readonly CheckOutcome[]): CheckComparison[] {
  const waiting = new Map<number, CheckOutcome[]>();
  for (const h of here) waiting.set(h.line, [...(waiting.get(h.line) ?? []), h]);
  const rows: CheckComparison[] = [];
  for (const a of author) {
    const h = waiting.get(a.line)?.shift();
    if (!h) {
      rows.push({ line: a.line, text: a.text, author: a, same: false, reason: 'This solve has no check on this line.' });
      continue;
    }
    const reason = difference(a, h);
    rows.push({ line: a.line, text: a.text, author: a, here: h, same: !reason, ...(reason ? { reason } : {}) });
  }
  for (const rest of waiting.values()) {
    for (const h of rest) rows.push({ line: h.line, text: h.text, here: h, same: false, reason: 'The author’s checks have none on this line.' });
  }
  return rows.sort((x, y) => x.line - y.line);
}

/** Counts for the summary line above the table. */
export function comparisonCounts(rows: readonly CheckComparison[]): { same: number; mismatched: number; failingHere: number } {
  return {
    same: rows.filter((r) => r.same).length,
    mismatched: rows.filter((r) => !r.same).length,
    failingHere: rows.filter((r) => r.here && !r.here.pass).length,
  };
}
