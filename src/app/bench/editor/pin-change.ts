/**
 * Moving a `use` line's pin in the editor, as one undoable change (from a lint tooltip's button
 * or the problems list).
 */
import type { EditorView } from '@codemirror/view';
import type { Diagnostic } from '../../../../solver';
import { pinDigits, type LibraryNotice, type PinChange } from '../library-notices';

/** The pin change a diagnostic offers, if it is a library notice with one. */
export function pinChangeOf(d: Diagnostic): PinChange | undefined {
  return (d as Partial<LibraryNotice>).change;
}

/** Rewrites the version on the change's line; false when the line no longer pins `path@from`. */
export function applyPinChange(view: EditorView, change: PinChange): boolean {
  if (change.line < 1 || change.line > view.state.doc.lines) return false;
  const line = view.state.doc.line(change.line);
  const at = pinDigits(line.text, change);
  if (!at) return false;
  view.dispatch({ changes: { from: line.from + at.from, to: line.from + at.to, insert: String(change.to) }, userEvent: 'input.pin' });
  return true;
}
