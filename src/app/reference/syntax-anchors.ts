/**
 * Where in the language reference a diagnostic's "Syntax" link leads: one table from statement
 * keywords and diagnostic codes to the reference's section anchors (docs/netlist.md, see
 * slugOf in reference-doc.ts).
 */
import type { Diagnostic } from '../../../solver';

/** A section of the reference and what leads to it. */
export interface SyntaxEntry {
  /** The section's anchor in the rendered reference. */
  anchor: string;
  /** Words for the link: "Syntax of …". */
  topic: string;
  /**
   * Statements that lead here: the first word of the line (`param`), `analyze KIND` for an
   * analysis, `part` for a part line (`name: kind(…)`).
   */
  keywords?: readonly string[];
  /** Diagnostic codes that lead here whatever line they are on. */
  codes?: readonly string[];
  /** Anchors to use when this one is not in the reference (a section still to be written). */
  fallback?: readonly string[];
}

const LATER = ['later-analyses', 'analyses'];

/** The one table: statements and diagnostic codes → sections of the reference. */
export const SYNTAX_SECTIONS: readonly SyntaxEntry[] = [
  { anchor: 'lines-names-numbers', topic: 'names and numbers', codes: ['meg-prefix', 'bad-quantity', 'bad-unit', 'unit-mismatch', 'gnd-redefined'] },
  { anchor: 'statements', topic: 'statements', codes: ['unknown-statement'] },
  { anchor: 'title', topic: 'title', keywords: ['title'] },
  { anchor: 'param', topic: 'param', keywords: ['param'] },
  { anchor: 'option', topic: 'option', keywords: ['option'], codes: ['unknown-option', 'bad-temperature'] },
  { anchor: 'model', topic: 'model', keywords: ['model'], codes: ['unknown-model', 'model-kind-mismatch'] },
  { anchor: 'parts', topic: 'parts', keywords: ['part'], codes: ['unknown-kind', 'named-pins', 'pin-count', 'missing-pin', 'unknown-pin', 'duplicate-pin'] },
  { anchor: 'blocks', topic: 'blocks', keywords: ['block', 'end'], codes: ['unterminated-block', 'stray-end', 'recursive-block', 'not-in-block'] },
  { anchor: 'use-blocks-from-the-library', topic: 'use', keywords: ['use'], codes: ['unknown-use'] },
  { anchor: 'device-models', topic: 'device models', codes: ['bjt-saturated', 'bjt-reverse', 'bjt-cutoff', 'mos-triode', 'mos-cutoff'] },
  { anchor: 'analyses', topic: 'analyze', keywords: ['analyze'], codes: ['unknown-analysis', 'op-no-convergence', 'op-singular', 'op-numerically-singular', 'gmin-stepping', 'source-stepping'] },
  { anchor: 'analyze-ac', topic: 'analyze ac', keywords: ['analyze ac'], codes: ['bad-ac-sweep', 'no-ac-source'] },
  { anchor: 'analyze-transfer', topic: 'analyze transfer', keywords: ['analyze transfer'], codes: ['bad-transfer', 'transfer-source', 'transfer-point'] },
  { anchor: 'analyze-vary', topic: 'analyze vary', keywords: ['analyze vary'], fallback: LATER },
  { anchor: 'analyze-temp', topic: 'analyze temp', keywords: ['analyze temp'], fallback: LATER },
  { anchor: 'analyze-noise', topic: 'analyze noise', keywords: ['analyze noise'], codes: ['bad-noise-request', 'noise-no-gain', 'noise-singular'], fallback: LATER },
  { anchor: 'analyze-mismatch', topic: 'analyze mismatch', keywords: ['analyze mismatch'], fallback: LATER },
  { anchor: 'analyze-poles', topic: 'analyze poles', keywords: ['analyze poles'], codes: ['poles-too-large', 'poles-singular', 'poles-no-transfer', 'poles-out-ignored'], fallback: LATER },
  { anchor: 'later-analyses', topic: 'later analyses', codes: ['analysis-not-available'], fallback: ['analyses'] },
  {
    anchor: 'the-differential-ports', topic: 'ports', keywords: ['ports'],
    codes: ['no-ports', 'ports-unknown-source', 'ports-unknown-node', 'ports-singular', 'ports-same-source', 'ports-no-response', 'ports-frequency', 'ports-current-drive', 'not-a-source', 'cmrr-unbounded'],
  },
  { anchor: 'measures', topic: 'measure', keywords: ['measure'], codes: ['measure-error', 'reserved-name', 'wrong-kind'] },
  { anchor: 'checks', topic: 'check', keywords: ['check'] },
  { anchor: 'diagnostics', topic: 'diagnostics', codes: ['no-dc-path', 'vsource-loop', 'single-connection'] },
];

const BY_KEYWORD = new Map(SYNTAX_SECTIONS.flatMap((e) => (e.keywords ?? []).map((k) => [k, e] as const)));
const BY_CODE = new Map(SYNTAX_SECTIONS.flatMap((e) => (e.codes ?? []).map((c) => [c, e] as const)));
const BY_ANCHOR = new Map(SYNTAX_SECTIONS.map((e) => [e.anchor, e] as const));
const DIAGNOSTICS = BY_ANCHOR.get('diagnostics')!;

/**
 * The statement a netlist line starts: `part` for `name: kind(…)`, `analyze KIND` for an
 * analysis, else its first word ('' for a blank or comment line).
 */
export function statementOf(line: string): string {
  const text = line.replace(/#.*$/, '').trim();
  if (/^[A-Za-z_][\w.]*\s*:/.test(text)) return 'part';
  const words = text.split(/\s+/);
  if (words[0] === 'analyze') return words[1] ? `analyze ${words[1]}` : 'analyze';
  return words[0] ?? '';
}

/**
 * The reference section for a diagnostic. The statement on its line decides (so `analyze noise`
 * with nothing after it leads to the noise section); a code that means the same whatever the
 * line (a unit that does not fit, a node with no DC path) decides when the statement does not;
 * the list of diagnostics is the last resort.
 */
export function syntaxSection(d: Pick<Diagnostic, 'code'>, lineText: string | undefined): SyntaxEntry {
  const statement = lineText === undefined ? '' : statementOf(lineText);
  const byCode = BY_CODE.get(d.code);
  // Codes about the value, not the statement, win over the statement (a bad unit in a part line).
  if (byCode && ['lines-names-numbers', 'device-models', 'diagnostics'].includes(byCode.anchor)) return byCode;
  const analysis = /^analyze \w+$/.test(statement) ? (BY_KEYWORD.get(statement) ?? BY_KEYWORD.get('analyze')) : undefined;
  return analysis ?? BY_KEYWORD.get(statement) ?? byCode ?? DIAGNOSTICS;
}

/** The address of the reference at a diagnostic's section. */
export function syntaxHref(d: Pick<Diagnostic, 'code'>, lineText: string | undefined): string {
  return `/reference#${syntaxSection(d, lineText).anchor}`;
}

/**
 * The anchor to show for an address's fragment: itself when the reference has it, else the first
 * of its fallbacks it has; undefined when none (the page then opens at the top).
 */
export function resolveAnchor(fragment: string | null | undefined, anchors: ReadonlySet<string>): string | undefined {
  if (!fragment) return undefined;
  if (anchors.has(fragment)) return fragment;
  return BY_ANCHOR.get(fragment)?.fallback?.find((a) => anchors.has(a));
}
