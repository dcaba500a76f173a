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
