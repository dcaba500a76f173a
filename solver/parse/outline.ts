/**
 * The outline of a netlist: what the editor needs to know about the text it shows, taken from the
 * one parse of a solve so the bench never parses the text again. The names the netlist defines
 * (with the kinds of its models and parts), its measure, check and analyze lines, and its `use` lines.
 * Lines are 1-based and, for a statement continued with `\`, its first physical line.
 */
import type { Circuit } from '../circuit/types';
import type { BlockDef, FileUnit } from './ast';

/** The names a netlist defines, as the parser understood them. */
export interface OutlineSymbols {
  /** Top-level models with the device kind written (`npn`, `nmos`, …). */
  models: { name: string; kind: string }[];
  /** Blocks defined in the text or brought in by `use`, with their pins and parameters. */
  blocks: { name: string; pins: string[]; params: string[] }[];
  /** Top-level parameters. */
  params: string[];
  /** Every part of the flattened circuit (dotted inside block instances) with its kind. */
  parts: { name: string; kind: string }[];
  /** Every node except `gnd` (dotted inside block instances), in first-appearance order. */
  nodes: string[];
  /** Names of the measures written, in text order. */
  measures: string[];
}

/** A `measure NAME = EXPRESSION` line. */
export interface OutlineMeasure {
  name: string;
  line: number;
  /** The expression as written. */
  expression: string;
}

/** A `check …` line. */
export interface OutlineCheck {
  line: number;
  /** The comparison as written, e.g. `cmrr_db >= 80`. */
  expression: string;
}

/** A `use path@version` line of the text itself. */
export interface OutlineUse {
  path: string;
  version: number;
  line: number;
}

/** An `analyze KIND …` line, known by its kind word even while the rest of it is being typed. */
export interface OutlineAnalysis {
  /** The word after `analyze` as written (`ac`, `temp`, … or a misspelling). */
  kind: string;
  line: number;
}

export interface NetlistOutline {
  symbols: OutlineSymbols;
  measures: OutlineMeasure[];
  checks: OutlineCheck[];
  uses: OutlineUse[];
  analyses: OutlineAnalysis[];
}

export function emptyOutline(): NetlistOutline {
  return { symbols: { models: [], blocks: [], params: [], parts: [], nodes: [], measures: [] }, measures: [], checks: [], uses: [], analyses: [] };
}

/** The text's own lines: measures, checks and uses, known as soon as the file is parsed. */
export function outlineOfFile(file: FileUnit): NetlistOutline {
  const outline = emptyOutline();
  for (const r of file.requests) {
    if (r.kind === 'measure') outline.measures.push({ name: r.name.text, line: r.loc.line, expression: r.expr?.text.trim() ?? '' });
    else if (r.kind === 'check') outline.checks.push({ line: r.loc.line, expression: r.text });
    else if (r.kind === 'analyze' && r.tokens[1]?.type === 'ident') outline.analyses.push({ kind: r.tokens[1].text, line: r.loc.line });
  }
  outline.symbols.measures = outline.measures.map((m) => m.name);
  outline.uses = file.uses.map((u) => ({ path: u.path, version: u.version, line: u.loc.line }));
  return outline;
}

/** What elaboration adds: the models, blocks, params, parts and nodes. */
export function addElaboration(
  outline: NetlistOutline,
  file: FileUnit,
  elab: { circuit: Circuit; params: Map<string, number>; modelNames: string[]; blocks: BlockDef[] },
): void {
  const kinds = new Map(file.models.map((m) => [m.name.text, m.deviceKind.text]));
  outline.symbols.models = elab.modelNames.map((name) => ({ name, kind: kinds.get(name) ?? '' }));
  outline.symbols.blocks = elab.blocks.map((b) => ({ name: b.name.text, pins: b.pins.map((p) => p.text), params: b.params.map((p) => p.name.text) }));
  outline.symbols.params = [...elab.params.keys()];
  outline.symbols.parts = elab.circuit.parts.map((p) => ({ name: p.name, kind: p.kind }));
  outline.symbols.nodes = [...elab.circuit.nodes];
}
