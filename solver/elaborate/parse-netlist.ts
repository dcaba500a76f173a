/**
 * parseNetlist: text → { circuit, requests, diagnostics, symbols }. Runs the statement parser,
 * resolves `use` lines through the caller's resolver, elaborates, checks the topology and resolves
 * the requests. Reports every problem at once; never throws, whatever the input. Its types are
 * in parse/parse-netlist.ts.
 */
import type { Requests } from '../circuit/analyses';
import { diagnostic, DiagnosticBag, tidyDiagnostic, type Diagnostic } from '../circuit/diagnostic';
import { checkTopology } from '../circuit/topology';
import { addElaboration, emptyOutline, outlineOfFile } from '../parse/outline';
import type { NetlistSymbols, ParseOptions, ParseResult } from '../parse/parse-netlist';
import { resolveRequests } from '../parse/requests';
import { parseFile } from '../parse/statements';
import { UseResolver } from '../parse/use-resolver';
import { elaborate, type Elaboration } from './elaborate';

export type { NetlistSymbols, ParseOptions, ParseResult, UseLookup } from '../parse/parse-netlist';

/** Most diagnostics returned; past this the netlist is surely not what was meant. */
export const MAX_DIAGNOSTICS = 500;

function emptyRequests(): Requests {
  return { analyses: [], measures: [], checks: [], params: {} };
}

/** Sorted by position, long tokens shortened, duplicates (one block error seen through many instances) removed. */
function finish(items: Diagnostic[]): Diagnostic[] {
  const seen = new Set<string>();
  const unique: Diagnostic[] = [];
  for (const raw of items) {
    const d = tidyDiagnostic(raw);
    const key = `${d.severity}|${d.code}|${d.line}|${d.col}|${d.message}`;
    if (seen.has(key)) continue;
    seen.add(key);
    unique.push(d);
  }
  unique.sort((a, b) => a.line - b.line || a.col - b.col);
  if (unique.length > MAX_DIAGNOSTICS) {
    const last = unique[MAX_DIAGNOSTICS - 1];
    return [
      ...unique.slice(0, MAX_DIAGNOSTICS - 1),
      diagnostic('error', 'too-many', { line: last.line, col: last.col }, `${unique.length - MAX_DIAGNOSTICS + 1} further problems are not shown.`),
    ];
  }
  return unique;
}

/** Parses and elaborates a netlist. Never throws. */
export function parseNetlist(text: string, options: ParseOptions = {}): ParseResult {
  const bag = new DiagnosticBag();
  const symbols: NetlistSymbols = { models: [], blocks: [], params: [], parts: [], nodes: [] };
  let outline = emptyOutline();
  let requests = emptyRequests();
  let elab: Elaboration | undefined;
  let withParams: ParseResult['withParams'];
  const requestLines = new Set<number>();
  try {
    const source = typeof text === 'string' ? text : '';
    source.split('\n').forEach((l, i) => {
      if (/^\s*(analyze|ports|measure|check)\b/.test(l)) requestLines.add(i + 1);
    });
    const file = parseFile(source, bag);
    outline = outlineOfFile(file);
    for (const r of file.requests) requestLines.add(r.loc.line);
    const uses = new UseResolver(bag, options.resolveUse);
    uses.resolveFile(file, undefined, []);
    const elaborationOptions = { usedBlocks: uses.usedBlocks, useAnchors: uses.anchors, failedBlocks: uses.failedBlocks, paramOverrides: options.paramOverrides };
    elab = elaborate(file, bag, elaborationOptions);
    withParams = (overrides) => {
      const own = new DiagnosticBag();
      const variant = elaborate(file, own, { ...elaborationOptions, paramOverrides: { ...options.paramOverrides, ...overrides } });
      checkTopology(variant.circuit.parts, own, { brokenNodes: variant.brokenNodes });
      const params = Object.fromEntries([...variant.params].filter(([, v]) => Number.isFinite(v)));
      return { ...(own.hasErrors ? {} : { circuit: variant.circuit }), params, diagnostics: own.items };
    };
    addElaboration(outline, file, elab);
    symbols.models = outline.symbols.models.map((m) => m.name);
    symbols.blocks = outline.symbols.blocks;
    symbols.params = outline.symbols.params;
    symbols.parts = outline.symbols.parts.map((p) => p.name);
    symbols.nodes = outline.symbols.nodes;
    checkTopology(elab.circuit.parts, bag, { brokenNodes: elab.brokenNodes });
    requests = resolveRequests(file.requests, {
      parts: new Map(elab.circuit.parts.map((p) => [p.name, p])),
      nodes: new Set(elab.circuit.nodes),
      params: elab.params,
      attemptedParts: elab.attemptedParts,
      brokenInstances: elab.brokenInstances,
      bag,
    });
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    bag.error('internal', { line: 1, col: 1 }, `Internal error while reading the netlist (${message}); please report it with the netlist.`);
  }
  const diagnostics = finish(bag.items);
  // A mistake in an analyze, ports, measure or check line drops that request only: the circuit
  // still solves, so a designer typing a new measure keeps the bias and gains on screen.
  const circuitErrors = diagnostics.some((d) => d.severity === 'error' && (!requestLines.has(d.line) || d.code === 'internal'));
  return { ...(elab && !circuitErrors ? { circuit: elab.circuit, withParams } : {}), requests, requestLines, diagnostics, symbols, outline };
}
