/**
 * Styles the panels share: status tags that carry a symbol and a word besides their colour
 * (never colour alone), and compact tables. Colours pass WCAG AA (≥ 4.5:1) on the paper surface.
 */
export const STATUS_STYLES = `
  .tag { display: inline-flex; align-items: center; gap: 3px; padding: 0 6px; border-radius: 10px;
    font-size: 0.8125rem; font-weight: 600; line-height: 1.5; white-space: nowrap; border: 1px solid transparent; }
  .tag.pass { color: #1E6B3C; background: #E3F0E6; border-color: #B9D8C2; }
  .tag.fail { color: #A3221B; background: #F9E0DD; border-color: #EBB8B2; }
  .tag.warn { color: #7A4A00; background: #F8EBD3; border-color: #E6CB97; }
  .tag.ok { color: var(--mat-sys-on-surface-variant); background: transparent; border-color: var(--mat-sys-outline-variant); font-weight: 400; }
  .num { font-variant-numeric: tabular-nums; white-space: nowrap; }
  .mono { font-family: ui-monospace, "DejaVu Sans Mono", Menlo, monospace; font-size: 0.8125rem; }
  .visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap; }
`;
