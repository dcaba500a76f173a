/**
 * The editor's look: a paper surface, ink text, the warm accent for the cursor and selection,
 * the cool accent for focus and matched brackets. Colours come from the app's Material system
 * variables where one fits, so the editor follows the theme.
 */
import { EditorView } from '@codemirror/view';

export const editorTheme = EditorView.theme({
  '&': {
    height: '100%',
    backgroundColor: 'var(--mat-sys-surface-container-lowest)',
    color: 'var(--mat-sys-on-surface)',
    fontSize: '14px',
  },
  '&.cm-focused': { outline: '2px solid var(--mat-sys-tertiary)', outlineOffset: '-2px' },
  '.cm-scroller': { fontFamily: 'ui-monospace, "DejaVu Sans Mono", "Liberation Mono", Menlo, Consolas, monospace', lineHeight: '1.55' },
  '.cm-content': { caretColor: 'var(--mat-sys-primary)', padding: '6px 0' },
  '.cm-cursor, .cm-dropCursor': { borderLeftColor: 'var(--mat-sys-primary)', borderLeftWidth: '2px' },
  '&.cm-focused > .cm-scroller > .cm-selectionLayer .cm-selectionBackground, .cm-selectionBackground, .cm-content ::selection': {
    backgroundColor: '#f3d9c6',
  },
  '.cm-activeLine': { backgroundColor: 'rgba(168, 72, 31, 0.05)' },
  '.cm-gutters': {
    backgroundColor: 'var(--mat-sys-surface-container-low)',
    color: '#5b6170',
    borderRight: '1px solid var(--mat-sys-outline-variant)',
  },
  '.cm-activeLineGutter': { backgroundColor: 'var(--mat-sys-surface-container)', color: 'var(--mat-sys-on-surface)' },
  '.cm-lineNumbers .cm-gutterElement': { padding: '0 8px 0 6px', minWidth: '28px' },
  '&.cm-focused .cm-matchingBracket': { backgroundColor: '#cfe3ec', outline: '1px solid var(--mat-sys-tertiary)' },
  '&.cm-focused .cm-nonmatchingBracket': { backgroundColor: '#f6d2d2' },
  '.cm-placeholder': { color: '#5b6170', fontStyle: 'italic' },
  '.cm-tooltip': {
    backgroundColor: 'var(--mat-sys-surface-container-lowest)',
    color: 'var(--mat-sys-on-surface)',
    border: '1px solid var(--mat-sys-outline-variant)',
    borderRadius: '6px',
    boxShadow: '0 4px 14px rgba(29, 34, 48, 0.14)',
    fontFamily: '"Source Sans 3", sans-serif',
    fontSize: '14px',
  },
  '.cm-tooltip-lint': { padding: '0', maxWidth: '460px' },
  '.cm-diagnostic': { padding: '6px 10px', borderLeftWidth: '4px' },
  '.cm-diagnostic-error': { borderLeftColor: '#b3261e' },
  '.cm-diagnostic-warning': { borderLeftColor: '#9a6700' },
  '.nw-lint-hint': { marginTop: '4px', color: 'var(--mat-sys-tertiary)' },
  '.cm-lintRange-error': {
    backgroundImage: 'none',
    textDecoration: 'underline wavy #b3261e',
    textDecorationSkipInk: 'none',
    textUnderlineOffset: '3px',
  },
  '.cm-lintRange-warning': {
    backgroundImage: 'none',
    textDecoration: 'underline wavy #9a6700',
    textDecorationSkipInk: 'none',
    textUnderlineOffset: '3px',
  },
  // Block help on hover (library-hover.ts): the lint tooltip's surface; every text ≥ 5:1 on it.
  '.nw-block-doc': { padding: '8px 12px', maxWidth: '460px', lineHeight: '1.4' },
  '.nw-block-doc-head': { display: 'flex', flexWrap: 'wrap', alignItems: 'baseline', columnGap: '10px' },
  '.nw-block-doc code': { fontFamily: 'ui-monospace, "DejaVu Sans Mono", monospace', fontSize: '13px' },
  '.nw-block-doc-status': { fontSize: '13px', fontWeight: '600' },
  '.nw-tone-vetted': { color: 'var(--mat-sys-tertiary)' },
  '.nw-tone-caution': { color: '#8a5a00' },
  '.nw-tone-plain': { color: 'var(--mat-sys-on-surface-variant)' },
  '.nw-block-doc-title': { marginTop: '4px', fontWeight: '600' },
  '.nw-block-doc-summary': { margin: '4px 0 0' },
  '.nw-block-doc-caption': { marginTop: '8px', fontSize: '12px', fontWeight: '600', letterSpacing: '0.04em', textTransform: 'uppercase', color: '#5b6170' },
  '.nw-block-doc-names': { display: 'grid', gridTemplateColumns: 'max-content 1fr', columnGap: '12px', rowGap: '2px', margin: '2px 0 0' },
  '.nw-block-doc-names dd': { margin: '0' },
  '.nw-block-doc-default': { color: '#5b6170', fontFamily: 'ui-monospace, "DejaVu Sans Mono", monospace', fontSize: '13px' },
  '.nw-block-doc-missing': { color: '#5b6170', fontStyle: 'italic' },
  '.nw-block-doc-note': { marginTop: '8px', color: 'var(--mat-sys-tertiary)' },
  '.cm-tooltip-autocomplete > ul > li[aria-selected]': { backgroundColor: 'var(--mat-sys-secondary-container)', color: 'var(--mat-sys-on-secondary-container)' },
  '.cm-completionDetail': { color: '#5b6170', fontStyle: 'normal', marginLeft: '1em' },
  '.cm-completionLabel': { fontFamily: 'ui-monospace, "DejaVu Sans Mono", monospace' },
});
