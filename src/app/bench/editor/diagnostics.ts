/**
 * The solver's diagnostics as CodeMirror lint diagnostics: a squiggle under the problem, its
 * message and hint on hover, a marker in the gutter.
 */
import type { Diagnostic as LintDiagnostic } from '@codemirror/lint';
import type { Text } from '@codemirror/state';
import type { Diagnostic } from '../../../../solver';

/** Document range of a solver diagnostic: its columns, else the word at its column, else the line. */
export function rangeOf(doc: Text, d: Pick<Diagnostic, 'line' | 'col' | 'endCol'>): { from: number; to: number } {
  const lineNo = Math.min(Math.max(1, Math.floor(d.line) || 1), doc.lines);
  const line = doc.line(lineNo);
  const col = Math.min(Math.max(1, Math.floor(d.col) || 1), line.length + 1);
  const from = line.from + col - 1;
  if (d.endCol && d.endCol > col) return { from, to: Math.min(line.to, line.from + d.endCol - 1) };
  const rest = line.text.slice(col - 1);
  const word = /^[^\s,()=]+/.exec(rest);
  if (word) return { from, to: from + word[0].length };
  // Nothing to underline at the column (e.g. end of line): mark the whole line's text.
  const start = line.from + (line.text.length - line.text.trimStart().length);
  return start < line.to ? { from: start, to: line.to } : { from: line.from, to: line.to };
}

/** Solver diagnostics → lint diagnostics with message and hint. */
export function toLintDiagnostics(doc: Text, diagnostics: readonly Diagnostic[]): LintDiagnostic[] {
  return diagnostics.map((d) => {
    const { from, to } = rangeOf(doc, d);
    return {
      from,
      to,
      severity: d.severity === 'error' ? 'error' : 'warning',
      message: d.hint ? `${d.message} Hint: ${d.hint}.` : d.message,
      renderMessage: () => renderMessage(d),
    };
  });
}

function renderMessage(d: Diagnostic): HTMLElement {
  const box = document.createElement('div');
  box.className = 'nw-lint-message';
  const message = document.createElement('div');
  message.className = 'nw-lint-text';
  message.textContent = d.message;
  box.append(message);
  if (d.hint) {
    const hint = document.createElement('div');
    hint.className = 'nw-lint-hint';
    hint.textContent = `Hint: ${d.hint}`;
    box.append(hint);
  }
  return box;
}
