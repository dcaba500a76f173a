/**
 * The Nodewright language mode for CodeMirror 6: a small line tokenizer (StreamLanguage) that
 * knows the statements of the netlist language (docs/netlist.md): keywords, part names and kinds,
 * pin and key names, quantities with SI prefixes and units, expressions, comments and free text.
 *
 * It only colours; the solver is the one judge of what is right (its diagnostics arrive through
 * the lint layer), so the tokenizer never needs to be exact about grammar.
 */
import { HighlightStyle, LanguageSupport, StreamLanguage, syntaxHighlighting, type StreamParser, type StringStream } from '@codemirror/language';
import { tags as t } from '@lezer/highlight';
import { ANALYSIS_SPECS, FIGURES, GROUND, MISMATCH_KEYS, PART_KINDS, STATEMENTS } from '../../../../solver';

/** Words that start a statement (the language's table). */
export const STATEMENT_KEYWORDS: readonly string[] = STATEMENTS.map((st) => st.keyword);

/**
 * Words that carry meaning inside `analyze` and `ports` lines: the analyses and mismatch keys of
 * the language's table, and the words that join their values (the parser reads those in place).
 */
export const ANALYSIS_WORDS: readonly string[] = [
  ...ANALYSIS_SPECS.map((a) => a.kind),
  'from', 'to', 'per', 'decade', 'step', 'over', 'out', 'in', 'runs', 'seed', 'at',
  ...MISMATCH_KEYS,
];

/** Built-in part kinds. */
export const PART_KIND_WORDS: readonly string[] = Object.keys(PART_KINDS);

const STATEMENT_WORDS = new Set(STATEMENT_KEYWORDS);
const ANALYSIS = new Set(ANALYSIS_WORDS);
const KINDS = new Set(PART_KIND_WORDS);
/** Names that mean something everywhere: the ports figures and the reference node. */
const CONSTANTS = new Set([...FIGURES.map((f) => f.name), GROUND]);

/** What the line began with; decides how the rest of it is read. */
type LineKind = 'none' | 'part' | 'model' | 'statement' | 'analysis' | 'expression' | 'title' | 'use' | 'block';

interface State {
  line: LineKind;
  /** Part line: the kind has been seen. */
  sawKind: boolean;
  /** Bracket depth inside a part's or model's parentheses. */
  depth: number;
  /** The line ended with a continuation backslash: the next physical line goes on. */
  continued: boolean;
  /** The last token was a number followed by its prefix/unit. */
  unitNext: boolean;
}

const IDENT = /^[A-Za-z_][A-Za-z0-9_]*(?:\.[A-Za-z_][A-Za-z0-9_]*)*/;
/** A number, then an SI prefix and/or a unit, written together or with one space. */
const QUANTITY = /^(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/;
const SUFFIX = /^(?: ?(?:[fpnuµμmkMGT]?(?:Ω|Ω|ohm|Hz|V|A|F|H|s|S)|[fpnuµμmkMGT]|%))(?![A-Za-z0-9_])/;

function startLine(state: State): void {
  if (state.continued) {
    state.continued = false;
    return;
  }
  state.line = 'none';
  state.sawKind = false;
  state.depth = 0;
}

function readIdentifier(stream: StringStream, state: State): string {
  const word = (stream.match(IDENT) as RegExpMatchArray)[0];
  const next = stream.peek();
  if (state.line === 'none') {
    // First word of the line: a part name (`q1:`) or a statement keyword.
    const rest = stream.string.slice(stream.pos);
    if (/^\s*:/.test(rest)) {
      state.line = 'part';
      return 'definition';
    }
    if (STATEMENT_WORDS.has(word)) {
      state.line =
        word === 'title' ? 'title'
        : word === 'model' ? 'model'
        : word === 'use' ? 'use'
        : word === 'block' ? 'block'
        : word === 'analyze' || word === 'ports' ? 'analysis'
        : word === 'measure' || word === 'check' ? 'expression'
        : 'statement';
      return 'keyword';
    }
    state.line = 'statement';
    return 'invalid';
  }
  if (state.line === 'part' && !state.sawKind) {
    state.sawKind = true;
    return KINDS.has(word) ? 'typeName' : 'blockName';
  }
  if (state.line === 'model') {
    if (!state.sawKind && stream.string.slice(stream.pos).trimStart().startsWith(':')) return 'definition';
    if (!state.sawKind && KINDS.has(word)) {
      state.sawKind = true;
      return 'typeName';
    }
  }
  if (state.line === 'block' && !state.sawKind) {
    state.sawKind = true;
    return 'definition';
  }
  // `pin=` and `key=` (but not `==`).
  if (/^\s*=(?!=)/.test(stream.string.slice(stream.pos))) return state.line === 'statement' || state.line === 'expression' ? 'definition' : 'propertyName';
  if (next === '(') return 'function';
  if (state.line === 'analysis' && ANALYSIS.has(word)) return 'modifier';
  if (CONSTANTS.has(word)) return 'constant';
  return 'variableName';
}

const parser: StreamParser<State> = {
  name: 'nodewright',
  startState: () => ({ line: 'none', sawKind: false, depth: 0, continued: false, unitNext: false }),
  copyState: (s) => ({ ...s }),
  token(stream, state) {
    if (stream.sol()) startLine(state);
    if (stream.eatSpace()) return null;
    const unitNext = state.unitNext;
    state.unitNext = false;
    if (unitNext && stream.match(SUFFIX)) return 'unit';
    const ch = stream.peek() as string;
    if (ch === '#') {
      stream.skipToEnd();
      return 'comment';
    }
    if (ch === '\\' && /^\\\s*(#.*)?$/.test(stream.string.slice(stream.pos))) {
      stream.next();
      state.continued = true;
      return 'meta';
    }
    if (state.line === 'title') {
      stream.match(/^[^#]*/);
      return 'heading';
    }
    if (state.line === 'use') {
      if (stream.match(/^[A-Za-z0-9_./-]+(@\d+)?/)) return 'string';
    }
    if (stream.match(QUANTITY)) {
      // The number and its prefix/unit are one token for the solver; the unit is coloured apart.
      state.unitNext = Boolean(stream.match(SUFFIX, false));
      return 'number';
    }
    if (IDENT.test(stream.string.slice(stream.pos))) return readIdentifier(stream, state);
    if (ch === '{') {
      stream.next();
      state.depth++;
      return 'brace';
    }
    if (ch === '}') {
      stream.next();
      state.depth = Math.max(0, state.depth - 1);
      return 'brace';
    }
    if (ch === '(' || ch === ')') {
      stream.next();
      state.depth += ch === '(' ? 1 : -1;
      return 'paren';
    }
    if (stream.match(/^(>=|<=|==|!=|\+-|[-+*/^<>±=!%])/)) return 'operator';
    if (stream.match(/^[,:@;]/)) return 'punctuation';
    stream.next();
    return null;
  },
  languageData: {
    commentTokens: { line: '#' },
    closeBrackets: { brackets: ['(', '{'] },
  },
  tokenTable: {
    definition: t.definition(t.variableName),
    blockName: t.className,
    invalid: t.invalid,
    modifier: t.modifier,
    constant: t.constant(t.variableName),
    function: t.function(t.variableName),
    heading: t.heading,
    unit: t.unit,
    brace: t.brace,
    paren: t.paren,
    meta: t.meta,
  },
};

/** The language itself (exported for tests that walk its tokens). */
export const nodewrightLanguage = StreamLanguage.define(parser);

/**
 * Colours chosen for the paper-like editor surface (#fffdf8): each foreground reaches at least
 * 4.5:1 contrast there (WCAG 2.1 AA for normal text), so meaning never rests on a pale tint.
 */
export const nodewrightHighlight = HighlightStyle.define([
  { tag: t.keyword, color: '#9a3f17', fontWeight: '600' },
  { tag: t.modifier, color: '#7a4a12' },
  { tag: t.comment, color: '#5b6170', fontStyle: 'italic' },
  { tag: t.heading, color: '#1d2230', fontWeight: '600' },
  { tag: t.definition(t.variableName), color: '#1d2230', fontWeight: '600' },
  { tag: t.typeName, color: '#1f5f7a', fontWeight: '600' },
  { tag: t.className, color: '#35508a', fontWeight: '600' },
  { tag: t.propertyName, color: '#6b4a00' },
  { tag: t.number, color: '#116340' },
  { tag: t.unit, color: '#116340' },
  { tag: t.function(t.variableName), color: '#1f5f7a' },
  { tag: t.constant(t.variableName), color: '#6a3c8c' },
  { tag: t.string, color: '#35508a' },
  { tag: t.operator, color: '#444a58' },
  { tag: t.invalid, color: '#a1142b', textDecoration: 'underline wavy' },
  { tag: t.meta, color: '#5b6170' },
]);

/** Language plus its colours, ready to put in an editor's extensions. */
export function nodewright(): LanguageSupport {
  return new LanguageSupport(nodewrightLanguage, [syntaxHighlighting(nodewrightHighlight)]);
}
