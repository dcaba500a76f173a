/**
 * The solver's diagnostics as CodeMirror lint diagnostics: a squiggle under the problem, its
 * message and hint on hover with a link to the syntax in the language reference, a marker in
 * the gutter.
 */
import type { Diagnostic as LintDiagnostic } from '@codemirror/lint';
import type { Text } from '@codemirror/state';
import type { Diagnostic } from '../../../../solver';
import { syntaxSection } from '../../reference/syntax-anchors';
import { applyPinChange, pinChangeOf } from './pin-change';

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
      renderMessage: () => renderMessage(d, lineText(doc, d.line)),
      ...pinActions(d),
    };
  });
}

/** A library notice's one-click pin change, as a button in its tooltip. */
function pinActions(d: Diagnostic): Pick<LintDiagnostic, 'actions'> {
  const change = pinChangeOf(d);
  if (!change) return {};
  return { actions: [{ name: `Use @${change.to}`, apply: (view) => void applyPinChange(view, change) }] };
}

/** The text of a diagnostic's line, when the document has it. */
function lineText(doc: Text, line: number): string | undefined {
  return line >= 1 && line <= doc.lines ? doc.line(line).text : undefined;
}

/**
 * The link to the reference section for a diagnostic. It opens a new tab: the bench keeps its
 * text, undo history and cursor while the reader looks the syntax up.
 */
export function syntaxLink(d: Diagnostic, line: string | undefined): HTMLAnchorElement {
  const section = syntaxSection(d, line);
  const a = document.createElement('a');
  a.className = 'nw-lint-syntax';
  a.href = `/reference#${section.anchor}`;
  a.target = '_blank';
  a.rel = 'noopener';
  a.textContent = `Syntax of ${section.topic}`;
  // Styled here: the editor theme belongs to the editor, this link to the reference.
  a.style.display = 'inline-block';
  a.style.marginTop = '4px';
  const note = document.createElement('span');
  note.className = 'cdk-visually-hidden';
  note.textContent = ' (opens in a new tab)';
  a.append(note);
  return a;
}

function renderMessage(d: Diagnostic, line: string | undefined): HTMLElement {
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
  box.append(syntaxLink(d, line));
  return box;
}
