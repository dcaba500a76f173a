/**
 * Diagnostics: every problem the solver reports, from the lexer to the DC solution.
 * A diagnostic always carries a 1-based line and column so the editor and CLI can point at it.
 */
export type Severity = 'error' | 'warning';

/**
 * Every code the solver emits, by the stage that finds the problem. Codes appear in the CLI's
 * JSON and are a contract: a new problem gets a new member here, a code is never renamed, and a
 * check lives in one stage only (requests are checked where they are resolved, not again by the
 * analysis that runs them).
 */
export const DIAGNOSTIC_CODES = [
  // Reading the text: lines, tokens, quantities, expressions.
  'syntax', 'unknown-statement', 'not-in-block', 'stray-end', 'unterminated-block', 'missing-value',
  'bad-quantity', 'bad-unit', 'meg-prefix', 'unit-mismatch', 'bad-expression', 'unknown-function',
  // Library files.
  'unknown-use', 'recursive-block',
  // Elaboration: names, kinds, pins, models, values, options.
  'duplicate-name', 'gnd-redefined', 'unknown-kind', 'unknown-model', 'model-kind-mismatch', 'unknown-pin',
  'missing-pin', 'duplicate-pin', 'named-pins', 'pin-count', 'unknown-param', 'unknown-option', 'bad-value',
  'bad-temperature', 'too-large',
  // Topology of the elaborated circuit.
  'single-connection', 'no-dc-path', 'vsource-loop',
  // Requests (analyze, ports, measure, check) resolved against the circuit.
  'unknown-analysis', 'duplicate-analysis', 'bad-ac-sweep', 'bad-transfer', 'unknown-name', 'unknown-node',
  'not-a-source', 'wrong-kind', 'no-ports', 'reserved-name', 'bad-noise-request',
  // The DC operating point and the device regions.
  'op-no-convergence', 'op-singular', 'op-numerically-singular', 'op-non-finite',
  'bjt-saturated', 'bjt-reverse', 'bjt-cutoff', 'mos-triode', 'mos-cutoff',
  // Analyses.
  'analysis-not-available', 'ports-singular', 'ports-no-response', 'ports-current-drive', 'cmrr-unbounded',
  'no-ac-source', 'transfer-point', 'sweep-value-failed', 'sweep-too-large',
  'noise-no-gain', 'noise-singular',
  'poles-too-large', 'poles-singular', 'poles-no-transfer', 'poles-out-ignored',
  // Measures and checks evaluated over the results.
  'measure-error',
  // The solver itself.
  'too-many', 'internal', 'internal-error', 'non-finite-result',
] as const;

/** A code of {@link DIAGNOSTIC_CODES}. */
export type DiagnosticCode = (typeof DIAGNOSTIC_CODES)[number];

export interface Diagnostic {
  severity: Severity;
  /**
   * Stable machine-readable code, e.g. `unknown-kind`, `meg-prefix`, `no-dc-path`: one of
   * {@link DiagnosticCode} when the solver wrote it (the bench adds notices of its own).
   */
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

/** A diagnostic as the solver writes it: its code is one of the solver's own. */
export interface SolverDiagnostic extends Diagnostic {
  code: DiagnosticCode;
}

/**
 * The one factory of diagnostics: every problem the solver reports is made here, so its code is
 * a {@link DiagnosticCode} and its shape the same whichever stage found it. `endCol` is kept only
 * when known; the hint only when there is one.
 */
export function diagnostic(severity: Severity, code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): SolverDiagnostic {
  return { severity, code, line: loc.line, col: loc.col, ...(loc.endCol ? { endCol: loc.endCol } : {}), message, ...(hint ? { hint } : {}) };
}

/** Collects diagnostics; never throws. */
export class DiagnosticBag {
  readonly items: SolverDiagnostic[] = [];

  error(code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): void {
    this.items.push(diagnostic('error', code, loc, message, hint));
  }

  warning(code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): void {
    this.items.push(diagnostic('warning', code, loc, message, hint));
  }

  get hasErrors(): boolean {
    return this.items.some((d) => d.severity === 'error');
  }

  errors(): SolverDiagnostic[] {
    return this.items.filter((d) => d.severity === 'error');
  }

  warnings(): SolverDiagnostic[] {
    return this.items.filter((d) => d.severity === 'warning');
  }
}
