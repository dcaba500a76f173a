/**
 * What the read-only netlist views (one revision, or two compared) share: the bench's language
 * colours and editor look, line numbers, and our own diff tints — warm for the older side, cool
 * for the newer, each with a gutter bar so the difference never rests on colour alone.
 */
import { EditorState, type Extension } from '@codemirror/state';
import { EditorView, lineNumbers } from '@codemirror/view';
import { editorTheme } from '../bench/editor/editor-theme';
import { nodewright } from '../bench/editor/nodewright-language';

const diffTheme = EditorView.theme({
  '&': { height: 'auto', fontSize: '13px' },
  '&.cm-merge-a .cm-changedLine': { backgroundColor: 'rgba(168, 72, 31, 0.09)' },
  '&.cm-merge-b .cm-changedLine': { backgroundColor: 'rgba(31, 95, 122, 0.09)' },
  '&.cm-merge-a .cm-changedText': { background: 'linear-gradient(#963f1a99, #963f1a99) bottom/100% 2px no-repeat' },
  '&.cm-merge-b .cm-changedText': { background: 'linear-gradient(#1f5f7aaa, #1f5f7aaa) bottom/100% 2px no-repeat' },
  '&.cm-merge-a .cm-changedLineGutter': { background: 'var(--mat-sys-primary)' },
  '&.cm-merge-b .cm-changedLineGutter': { background: 'var(--mat-sys-tertiary)' },
  '.cm-collapsedLines': {
    color: 'var(--mat-sys-on-surface-variant)',
    background: 'var(--mat-sys-surface-container)',
    fontFamily: '"Source Sans 3", sans-serif',
  },
  // The default fold marks are a glyph our font lacks; the "N unchanged lines" text says enough.
  '.cm-collapsedLines:before, .cm-collapsedLines:after': { content: 'none' },
});

/** Extensions for a read-only view of netlist text; `label` names it for screen readers. */
export function readOnlyNetlist(label: string): Extension {
  return [
    lineNumbers(),
    nodewright(),
    editorTheme,
    diffTheme,
    // Read-only but still focusable, so keyboard users can move through and copy the text.
    EditorState.readOnly.of(true),
    EditorView.contentAttributes.of({ 'aria-label': label, 'aria-readonly': 'true' }),
  ];
}
