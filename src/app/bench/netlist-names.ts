/**
 * The names a netlist defines, for editor completion: the parser's symbols (what it really
 * understood) plus the device kinds of models and parts read off the text, which completion
 * needs to offer the right pins, models and result functions.
 */
import { parseNetlist } from '../../../solver';
import type { ParseOptions } from '../../../solver/parse';
import type { NetlistNames } from './solver-protocol';

const MODEL_LINE = /^\s*model\s+([A-Za-z_][A-Za-z0-9_]*)\s*:\s*([A-Za-z_][A-Za-z0-9_]*)/;
const PART_LINE = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*:\s*([A-Za-z_][A-Za-z0-9_]*)\s*\(/;
const MEASURE_LINE = /^\s*measure\s+([A-Za-z_][A-Za-z0-9_]*)\s*=/;

/** Kinds written in the text, by name (models and top-level parts). */
function scanKinds(text: string): { models: Map<string, string>; parts: Map<string, string>; measures: string[] } {
  const models = new Map<string, string>();
  const parts = new Map<string, string>();
  const measures: string[] = [];
  for (const line of text.split('\n')) {
    const m = MODEL_LINE.exec(line);
    if (m) {
      models.set(m[1], m[2]);
      continue;
    }
    const p = PART_LINE.exec(line);
    if (p && !['model', 'block'].includes(p[1])) parts.set(p[1], p[2]);
    const me = MEASURE_LINE.exec(line);
    if (me) measures.push(me[1]);
  }
  return { models, parts, measures };
}

/** Names for completion; never throws (the parser never does). */
export function namesOf(text: string, resolveUse?: ParseOptions['resolveUse']): NetlistNames {
  const { symbols } = parseNetlist(text, { resolveUse });
  const kinds = scanKinds(text);
  return {
    models: symbols.models.map((name) => ({ name, kind: kinds.models.get(name) ?? '' })),
    blocks: symbols.blocks,
    params: symbols.params,
    parts: symbols.parts.map((name) => ({ name, kind: kinds.parts.get(name) ?? '' })),
    nodes: symbols.nodes,
    measures: kinds.measures,
    uses: [],
  };
}
