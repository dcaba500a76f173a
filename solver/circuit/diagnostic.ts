/**
 * Diagnostics: every problem the solver reports, from the lexer to the DC solution.
 * A diagnostic always carries a 1-based line and column so the editor and CLI can point at it.
 */
export type Severity = 'error' | 'warning';

export interface Diagnostic {
  severity: Severity;
  /** Stable machine-readable code, e.g. `unknown-kind`, `meg-prefix`, `no-dc-path`. */
  code: string;
  /** 1-based line of the statement (first physical line when continued with `\`). */
  line: number;
  /** 1-based column where the problem starts. */
  col: number;
  /** 1-based column just past the problem, when known (for squiggles). */
  endCol?: number;
  /** One sentence. */
  message: string;
  /** What to do about it, e.g. "write M for mega" or "did you mean `npn`?". */
  hint?: string;
}

/** Where a statement or name stands in the source. */
export interface SourceLoc {
  line: number;
  col: number;
  endCol?: number;
}

/** A run of name or number characters longer than this is shortened in messages. */
export const LONG_TOKEN = 40;
/** How much of a shortened token a message keeps (then "…"). */
export const SHORT_TOKEN = 24;

const LONG_RUN = new RegExp(`[\\p{L}\\p{N}_.]{${LONG_TOKEN + 1},}`, 'gu');

/**
 * User text as a message quotes it: every name- or number-like run longer than LONG_TOKEN
 * characters shortened to its first SHORT_TOKEN characters and "…". A 500-character node name
 * must not push the one sentence of a message off the problems list, while names of ordinary
 * length (hierarchical ones included) stay whole so that "did you mean" remains usable.
 */
export function shortenTokens(text: string): string {
  return text.replace(LONG_RUN, (run) => Array.from(run).slice(0, SHORT_TOKEN).join('') + '\u2026');
}

/**
 * The diagnostic as it leaves the solver: message and hint with long tokens shortened. Applied
 * where diagnostics leave parseNetlist and solveNetlist, so every message that quotes user text
 * goes through the one helper whatever layer wrote it.
 */
export function tidyDiagnostic(d: Diagnostic): Diagnostic {
  const message = shortenTokens(d.message);
  const hint = d.hint === undefined ? undefined : shortenTokens(d.hint);
  return message === d.message && hint === d.hint ? d : { ...d, message, ...(hint !== undefined ? { hint } : {}) };
}

/** Collects diagnostics; never throws. */
export class DiagnosticBag {
  readonly items: Diagnostic[] = [];

  error(code: string, loc: SourceLoc, message: string, hint?: string): void {
    this.items.push({ severity: 'error', code, line: loc.line, col: loc.col, endCol: loc.endCol, message, ...(hint ? { hint } : {}) });
  }

  warning(code: string, loc: SourceLoc, message: string, hint?: string): void {
    this.items.push({ severity: 'warning', code, line: loc.line, col: loc.col, endCol: loc.endCol, message, ...(hint ? { hint } : {}) });
  }

  get hasErrors(): boolean {
    return this.items.some((d) => d.severity === 'error');
  }

  errors(): Diagnostic[] {
    return this.items.filter((d) => d.severity === 'error');
  }

  warnings(): Diagnostic[] {
    return this.items.filter((d) => d.severity === 'warning');
  }
}
