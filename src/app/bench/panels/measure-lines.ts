/**
 * Where each `measure` stands in the netlist text. The result JSON gives measures as
 * name → value only; the panels read the netlist the bench already holds to find each
 * measure's line (to jump there) and its expression (to guess its unit).
 */
import type { Unit } from './si-format';
import { guessUnit } from './units';

/** One `measure NAME = EXPR` statement. */
export interface MeasureDefinition {
  name: string;
  /** The expression as written, comments stripped, continuation lines joined. */
  expr: string;
  /** 1-based line of the statement (its first physical line). */
  line: number;
}

/** Every measure statement of `netlist`, in order. Blocks' inner lines are ignored (measures are top level). */
export function measureDefinitions(netlist: string | undefined): MeasureDefinition[] {
  if (!netlist) return [];
  const physical = netlist.split(/\r\n|\r|\n/);
  const found: MeasureDefinition[] = [];
  for (let k = 0; k < physical.length; k++) {
    const first = k + 1;
    let text = stripComment(physical[k]);
    // A line ending in a backslash continues on the next one (§1).
    while (/\\\s*$/.test(text) && k + 1 < physical.length) {
      text = text.replace(/\\\s*$/, ' ') + stripComment(physical[++k]);
    }
    const m = /^\s*measure\s+([A-Za-z_][A-Za-z0-9_]*)\s*=\s*(.+?)\s*$/.exec(text);
    if (m) found.push({ name: m[1], expr: m[2].replace(/\s+/g, ' '), line: first });
  }
  return found;
}

function stripComment(line: string): string {
  const hash = line.indexOf('#');
  return hash >= 0 ? line.slice(0, hash) : line;
}

/**
 * The unit of every measure of `netlist`, in statement order so that a measure built on an
 * earlier one (`measure vmin = …` then `check vmin > 0.3`) inherits its unit.
 */
export function measureUnits(definitions: readonly MeasureDefinition[]): Record<string, Unit> {
  const known: Record<string, Unit> = {};
  for (const d of definitions) known[d.name] = guessUnit(d.expr, known);
  return known;
}
