/**
 * Completion for the netlist editor. It reads the line up to the cursor, decides what may stand
 * there (a statement keyword, a part kind, a pin, a node, a model, a key, a result function…)
 * and offers the names the netlist defines (from the parser's symbols) plus the language's own.
 */
import type { Completion, CompletionContext, CompletionResult, CompletionSource } from '@codemirror/autocomplete';
import { MODEL_KEYS, OPTION_KEYS, PART_KINDS, modelFamily } from '../../../../solver/parse/kinds';
import type { NetlistNames } from '../solver-protocol';
import { STATEMENT_KEYWORDS } from './nodewright-language';

const STATEMENT_DETAIL: Record<string, string> = {
  title: 'free text shown with the results',
  param: 'param NAME = VALUE',
  option: 'option NAME = VALUE',
  model: 'model NAME: KIND(key=value, …)',
  block: 'block NAME(pins) … end',
  end: 'closes a block',
  use: 'use path@version',
  analyze: 'analyze ac | transfer | …',
  ports: 'ports in=(a, b) out=(x, y)',
  measure: 'measure NAME = EXPRESSION',
  check: 'check EXPRESSION >= LIMIT',
};

const KIND_DETAIL: Record<string, string> = {
  res: 'resistor (a, b) Ω', cap: 'capacitor (a, b) F', ind: 'inductor (a, b) H',
  vsrc: 'voltage source (p, n) V', isrc: 'current source (from, to) A',
  vcvs: 'voltage-controlled voltage source (p, n, cp, cn)', vccs: 'voltage-controlled current source (from, to, cp, cn)',
  npn: 'bipolar (c=, b=, e=)', pnp: 'bipolar (c=, b=, e=)',
  nmos: 'MOS (d=, g=, s=, b=)', pmos: 'MOS (d=, g=, s=, b=)', diode: 'diode (a=, k=)',
};

const PIN_DETAIL: Record<string, string> = { c: 'collector', b: 'base / body', e: 'emitter', d: 'drain', g: 'gate', s: 'source', a: 'anode', k: 'cathode' };

const ANALYSES: Completion[] = [
  { label: 'ac', type: 'keyword', detail: 'from 10 Hz to 1 GHz per decade 20', apply: 'ac from 10 Hz to 1 GHz per decade 20' },
  { label: 'transfer', type: 'keyword', detail: 'SOURCE from -100m to 100m step 1m' },
  { label: 'vary', type: 'keyword', detail: 'PARAM over … | from … to … per decade N' },
  { label: 'temp', type: 'keyword', detail: 'over -40 27 125' },
  { label: 'noise', type: 'keyword', detail: 'out NODE in SOURCE from … to … per decade N' },
  { label: 'mismatch', type: 'keyword', detail: 'runs 500 seed 7 beta 5% is 2% res 0.5%' },
  { label: 'poles', type: 'keyword', detail: 'poles and zeros' },
];

/** Result functions of measures and checks, with what their argument names. */
const FUNCTIONS: { name: string; detail: string; arg?: 'node' | 'part' | 'bjt' | 'mos' | 'device' | 'source' | 'curve' }[] = [
  { name: 'v', detail: 'DC volts of a node, v(n) or v(a, b)', arg: 'node' },
  { name: 'i', detail: 'DC amps through a part or source', arg: 'part' },
  ...['ic', 'ib', 'ie', 'vbe', 'vce', 'rpi', 'ro', 'cpi', 'cmu'].map((name) => ({ name, detail: 'bipolar operating point', arg: 'bjt' as const })),
  ...['id', 'vgs', 'vds', 'vov', 'gds'].map((name) => ({ name, detail: 'MOS operating point', arg: 'mos' as const })),
  { name: 'gm', detail: 'transconductance of a device', arg: 'device' },
  { name: 'db', detail: '20·log10 of a magnitude' },
  { name: 'mag', detail: 'magnitude' },
  { name: 'phase', detail: 'phase in degrees' },
  { name: 'at', detail: 'at(curve, f): a curve at a frequency', arg: 'curve' },
  { name: 'corner', detail: '−3 dB frequency of a curve', arg: 'curve' },
  { name: 'unity', detail: 'frequency where |curve| crosses 1', arg: 'curve' },
  { name: 'margin', detail: '180° + phase at the unity crossing', arg: 'curve' },
  { name: 'zin', detail: 'impedance seen by a source', arg: 'source' },
  { name: 'zout', detail: 'impedance from a node to ground', arg: 'node' },
  { name: 'ac', detail: 'small-signal curve of a node', arg: 'node' },
  { name: 'min', detail: 'smallest of' }, { name: 'max', detail: 'largest of' },
  { name: 'abs', detail: 'absolute value' }, { name: 'sqrt', detail: 'square root' }, { name: 'log10', detail: 'decimal logarithm' },
];
const FIGURES: Completion[] = [
  { label: 'adm', type: 'constant', detail: 'differential gain vod/vid' },
  { label: 'acm', type: 'constant', detail: 'common-mode gain voc/vic' },
  { label: 'cmrr', type: 'constant', detail: '|adm/acm|' },
  { label: 'cmrr_db', type: 'constant', detail: '20·log10(cmrr)' },
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
    label: `${p}=`, type: 'property', boost: all.length - index, detail: spec ? `${PIN_DETAIL[p] ?? 'pin'}${spec.defaults?.[p] ? ` (defaults to ${spec.defaults[p]})` : ''}` : `pin of ${kind}`,
  }));
}

/** Measures and checks: functions, figures, measure names, params; names inside a call. */
function inExpression(before: string, names: NetlistNames): Completion[] {
  const call = /([A-Za-z_][A-Za-z0-9_]*)\(\s*(?:[A-Za-z0-9_.]*)$/.exec(before);
  if (call) {
    const fn = FUNCTIONS.find((f) => f.name === call[1]);
    switch (fn?.arg) {
      case 'node': return node(names);
      case 'part': return partsOf(names, (k) => !modelFamily(k));
      case 'bjt': return partsOf(names, (k) => k === 'npn' || k === 'pnp' || k === '', 'device');
      case 'mos': return partsOf(names, (k) => k === 'nmos' || k === 'pmos' || k === '', 'device');
      case 'device': return partsOf(names, (k) => !!modelFamily(k) || k === '', 'device');
      case 'source': return partsOf(names, (k) => k === 'vsrc' || k === 'isrc', 'source');
      case 'curve': return [...FIGURES.slice(0, 3), ...FUNCTIONS.filter((f) => f.name === 'ac').map((f) => ({ label: 'ac', type: 'function', detail: f.detail, apply: 'ac(' }))];
      default: break;
    }
  }
  return [
    ...FUNCTIONS.map((f) => ({ label: f.name, type: 'function', detail: f.detail, apply: `${f.name}(` })),
    ...FIGURES,
    ...names.measures.map((m) => ({ label: m, type: 'variable', detail: 'measure' })),
    ...names.params.map((p) => ({ label: p, type: 'variable', detail: 'param' })),
  ];
}

/** The completions for the text of a line before the cursor, or undefined when none fit. */
export function completionsFor(before: string, names: NetlistNames): Completion[] | undefined {
  if (/#/.test(before)) return undefined;
  if (/^\s*[A-Za-z_]*$/.test(before)) return STATEMENT_KEYWORDS.map((k) => ({ label: k, type: 'keyword', detail: STATEMENT_DETAIL[k] }));
  if (/^\s*title\b/.test(before) || /^\s*use\b/.test(before)) return undefined;
  let m: RegExpExecArray | null;
  if ((m = /^\s*model\s+[A-Za-z_]\w*\s*:\s*(\w*)\s*\(([^)]*)$/.exec(before))) {
    const family = modelFamily(m[1]);
    if (!family || /=\s*[^,\s]*$/.test(m[2])) return undefined;
    return Object.entries(MODEL_KEYS[family]).map(([k, spec]) => ({ label: `${k}=`, type: 'property', detail: spec.what }));
  }
  if (/^\s*model\s+[A-Za-z_]\w*\s*:\s*\w*$/.test(before)) return ['npn', 'pnp', 'nmos', 'pmos', 'diode'].map((k) => ({ label: k, type: 'type', detail: `${k} model`, apply: `${k}(` }));
  if (/^\s*option\s+\w*$/.test(before)) return Object.entries(OPTION_KEYS).map(([k, s]) => ({ label: k, type: 'property', detail: s.what }));
  if (/^\s*analyze\s+\w*$/.test(before)) return ANALYSES;
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
      ...Object.keys(PART_KINDS).map((k) => ({ label: k, type: 'type', detail: KIND_DETAIL[k], apply: `${k}(` })),
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
