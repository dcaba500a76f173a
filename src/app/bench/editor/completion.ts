/**
 * Completion for the netlist editor. It reads the line up to the cursor, decides what may stand
 * there (a statement keyword, a part kind, a pin, a node, a model, a key, a result function…)
 * and offers the names the netlist defines (from the parser's symbols) plus the language's own.
 */
import type { Completion, CompletionContext, CompletionResult, CompletionSource } from '@codemirror/autocomplete';
import { ANALYSIS_SPECS, FIGURES, FUNCTIONS, MODEL_KEYS, MODEL_KINDS, OPTION_KEYS, PART_KINDS, PIN_DOCS, STATEMENTS, functionSpec, modelFamily } from '../../../../solver';
import type { NetlistNames } from '../solver-protocol';

/** Statement keywords with their shapes (the language's table). */
const STATEMENT_OPTIONS: Completion[] = STATEMENTS.map((st) => ({ label: st.keyword, type: 'keyword', detail: st.syntax === st.keyword ? st.doc : st.syntax }));

/** The analyses; `ac` is completed with its usual sweep. */
const ANALYSIS_OPTIONS: Completion[] = ANALYSIS_SPECS.map((a) => ({
  label: a.kind, type: 'keyword', detail: a.detail, ...(a.kind === 'ac' ? { apply: `ac ${a.detail}` } : {}),
}));

/** Result functions of measures and checks, with what they return. */
const FUNCTION_OPTIONS: Completion[] = FUNCTIONS.map((f) => ({ label: f.name, type: 'function', detail: f.doc, apply: `${f.name}(` }));

/** The ports figures. */
const FIGURE_OPTIONS: Completion[] = FIGURES.map((f) => ({ label: f.name, type: 'constant', detail: f.doc }));
/** Inside a curve function: the figures that stand for their curves, and `ac(`. */
const CURVE_OPTIONS: Completion[] = [
  ...FIGURES.filter((f) => f.curve).map((f) => ({ label: f.name, type: 'constant', detail: f.doc })),
  { label: 'ac', type: 'function', detail: functionSpec('ac')?.doc, apply: 'ac(' },
];

const WORD = /(?<![0-9.])[A-Za-z_][A-Za-z0-9_.]*$/;

function node(names: NetlistNames): Completion[] {
  const all = new Set(['gnd', ...names.nodes.filter((n) => !n.includes('.'))]);
  return [...all].map((n) => ({ label: n, type: 'variable', detail: n === 'gnd' ? 'reference node, 0 V' : 'node' }));
}

function partsOf(names: NetlistNames, accept: (kind: string) => boolean, detail = 'part'): Completion[] {
  return names.parts.filter((p) => accept(p.kind)).map((p) => ({ label: p.name, type: 'variable', detail: p.kind ? `${p.kind} ${detail}` : detail }));
}

/** What may follow `NAME: KIND(...)` on a part line. */
function afterConnections(kind: string, names: NetlistNames): Completion[] {
  const family = modelFamily(kind);
  if (family) {
    const models = names.models.filter((m) => !m.kind || modelFamily(m.kind) === family).map((m) => ({ label: m.name, type: 'class', detail: m.kind ? `${m.kind} model` : 'model' }));
    const keys = Object.entries(PART_KINDS[kind as keyof typeof PART_KINDS].keys).map(([k, spec]) => ({ label: `${k}=`, type: 'property', detail: spec.what }));
    return [...models, ...keys];
  }
  const spec = PART_KINDS[kind as keyof typeof PART_KINDS];
  if (spec) return [...Object.entries(spec.keys).map(([k, s]) => ({ label: `${k}=`, type: 'property', detail: s.what })), ...names.params.map((p) => ({ label: p, type: 'variable', detail: 'param' }))];
  const block = names.blocks.find((b) => b.name === kind);
  return block ? block.params.map((p) => ({ label: `${p}=`, type: 'property', detail: `param of ${block.name}` })) : [];
}

/** Inside `NAME: KIND(` — pins not yet given (named kinds and blocks) or nodes. */
function insideConnections(kind: string, inside: string, names: NetlistNames): Completion[] {
  const afterEquals = /=\s*[A-Za-z0-9_.]*$/.test(inside);
  const spec = PART_KINDS[kind as keyof typeof PART_KINDS];
  const block = names.blocks.find((b) => b.name === kind);
  const named = spec?.named || !!block;
  if (!named || afterEquals) return node(names);
  const used = new Set([...inside.matchAll(/([A-Za-z_][A-Za-z0-9_]*)\s*=/g)].map((m) => m[1]));
  const pins = spec ? spec.pins : block!.pins;
  // Boosted in pin order, so the list reads c, b, e (d, g, s, b) rather than alphabetically.
  return pins.filter((p) => !used.has(p)).map((p, index, all) => ({
    label: `${p}=`, type: 'property', boost: all.length - index, detail: spec ? `${PIN_DOCS[p] ?? 'pin'}${spec.defaults?.[p] ? ` (defaults to ${spec.defaults[p]})` : ''}` : `pin of ${kind}`,
  }));
}

/** Measures and checks: functions, figures, measure names, params; names inside a call. */
function inExpression(before: string, names: NetlistNames): Completion[] {
  const call = /([A-Za-z_][A-Za-z0-9_]*)\(\s*(?:[A-Za-z0-9_.]*)$/.exec(before);
  if (call) {
    switch (functionSpec(call[1])?.arg) {
      case 'node': return node(names);
      case 'part': return partsOf(names, (k) => !modelFamily(k));
      // Every part's kind is known, block instances' parts too (the solver's elaborated circuit).
      case 'bjt': return partsOf(names, (k) => modelFamily(k) === 'bjt', 'device');
      case 'mos': return partsOf(names, (k) => modelFamily(k) === 'mos', 'device');
      case 'device': return partsOf(names, (k) => !!modelFamily(k), 'device');
      case 'source': return partsOf(names, (k) => k === 'vsrc' || k === 'isrc', 'source');
      case 'curve': return CURVE_OPTIONS;
      default: break;
    }
  }
  return [
    ...FUNCTION_OPTIONS,
    ...FIGURE_OPTIONS,
    ...names.measures.map((m) => ({ label: m, type: 'variable', detail: 'measure' })),
    ...names.params.map((p) => ({ label: p, type: 'variable', detail: 'param' })),
  ];
}

/** The completions for the text of a line before the cursor, or undefined when none fit. */
export function completionsFor(before: string, names: NetlistNames): Completion[] | undefined {
  if (/#/.test(before)) return undefined;
  if (/^\s*[A-Za-z_]*$/.test(before)) return STATEMENT_OPTIONS;
  if (/^\s*title\b/.test(before) || /^\s*use\b/.test(before)) return undefined;
  let m: RegExpExecArray | null;
  if ((m = /^\s*model\s+[A-Za-z_]\w*\s*:\s*(\w*)\s*\(([^)]*)$/.exec(before))) {
    const family = modelFamily(m[1]);
    if (!family || /=\s*[^,\s]*$/.test(m[2])) return undefined;
    return Object.entries(MODEL_KEYS[family]).map(([k, spec]) => ({ label: `${k}=`, type: 'property', detail: spec.what }));
  }
  if (/^\s*model\s+[A-Za-z_]\w*\s*:\s*\w*$/.test(before)) return MODEL_KINDS.map((k) => ({ label: k, type: 'type', detail: `${k} model`, apply: `${k}(` }));
  if (/^\s*option\s+\w*$/.test(before)) return Object.entries(OPTION_KEYS).map(([k, s]) => ({ label: k, type: 'property', detail: s.what }));
  if (/^\s*analyze\s+\w*$/.test(before)) return ANALYSIS_OPTIONS;
  if ((m = /^\s*analyze\s+(\w+)\b/.exec(before))) {
    if (m[1] === 'transfer' && /^\s*analyze\s+transfer\s+\w*$/.test(before)) return partsOf(names, (k) => k === 'vsrc' || k === 'isrc', 'source');
    if (m[1] === 'vary' && /^\s*analyze\s+vary\s+\w*$/.test(before)) return names.params.map((p) => ({ label: p, type: 'variable', detail: 'param' }));
    if (m[1] === 'noise') return /\bout\s+\w*$/.test(before) ? node(names) : /\bin\s+\w*$/.test(before) ? partsOf(names, (k) => k === 'vsrc' || k === 'isrc', 'source') : undefined;
    return undefined;
  }
  if (/^\s*ports\b/.test(before)) {
    if (/in\s*=\s*\([^)]*$/.test(before)) return partsOf(names, (k) => k === 'vsrc', 'source');
    if (/out\s*=\s*(\([^)]*)?[A-Za-z0-9_]*$/.test(before)) return node(names);
    return [{ label: 'in=', type: 'property', detail: 'the two drive sources' }, { label: 'out=', type: 'property', detail: 'one node or two' }, { label: 'at', type: 'keyword', detail: 'the frequency of the figures' }];
  }
  if (/^\s*(measure\s+\w+\s*=|check\b)/.test(before)) return inExpression(before, names);
  if (/^\s*param\s+\w+\s*=/.test(before)) return names.params.map((p) => ({ label: p, type: 'variable', detail: 'param' }));
  if ((m = /^\s*[A-Za-z_]\w*\s*:\s*(\w*)$/.exec(before))) {
    return [
      ...Object.values(PART_KINDS).map((k) => ({ label: k.kind, type: 'type', detail: k.doc, apply: `${k.kind}(` })),
      ...names.blocks.map((b) => ({ label: b.name, type: 'class', detail: `block (${b.pins.join(', ')})`, apply: `${b.name}(` })),
    ];
  }
  if ((m = /^\s*[A-Za-z_]\w*\s*:\s*(\w+)\s*\(([^)]*)$/.exec(before))) return insideConnections(m[1], m[2], names);
  if ((m = /^\s*[A-Za-z_]\w*\s*:\s*(\w+)\s*\([^)]*\)(.*)$/.exec(before))) {
    if (/=\s*[^\s]*$/.test(m[2])) return names.params.map((p) => ({ label: p, type: 'variable', detail: 'param' }));
    return afterConnections(m[1], names);
  }
  return undefined;
}

/** A CodeMirror completion source over the names `names()` returns at the time of asking. */
export function netlistCompletion(names: () => NetlistNames): CompletionSource {
  return (context: CompletionContext): CompletionResult | null => {
    const line = context.state.doc.lineAt(context.pos);
    const before = line.text.slice(0, context.pos - line.from);
    const word = WORD.exec(before);
    const from = word ? context.pos - word[0].length : context.pos;
    // Unasked, offer names only where one is plainly expected: in a word, or just after ( = , :
    if (!word && !context.explicit && !/(?:[(=]|[,:]\s*)$/.test(before)) return null;
    const options = completionsFor(before.slice(0, from - line.from), names());
    if (!options || options.length === 0) return null;
    return { from, options, validFor: /^[A-Za-z0-9_.]*$/ };
  };
}
