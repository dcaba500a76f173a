/**
 * parseNetlist: text → { circuit, requests, diagnostics, symbols }. Runs the statement parser,
 * resolves `use` lines through the caller's resolver, elaborates, checks the topology and resolves
 * the requests. Reports every problem at once; never throws, whatever the input.
 */
import type { Requests } from '../circuit/analyses';
import { diagnostic, DiagnosticBag, tidyDiagnostic, type Diagnostic, type SourceLoc } from '../circuit/diagnostic';
import { elaborate, type Elaboration } from '../circuit/elaborate';
import { checkTopology } from '../circuit/topology';
import type { Circuit } from '../circuit/types';
import type { BlockDef, FileUnit } from './ast';
import { addElaboration, emptyOutline, outlineOfFile, type NetlistOutline } from './outline';
import { resolveRequests } from './requests';
import { parseFile } from './statements';

export interface ParseOptions {
  /**
   * Resolves `use path@version` to the source text of a library file that defines the block
   * (a file containing one `block NAME(...) ... end` whose NAME is the last path segment, and any
   * `model`s / nested blocks it needs). Returns undefined when unknown.
   */
  resolveUse?: (path: string, version: number) => string | undefined | UseLookup;
  /** Top-level parameter values that replace the written ones (how `analyze vary` re-runs). */
  paramOverrides?: Record<string, number>;
}

/**
 * A resolver may also answer with a reason: `{ ok: false, message, hint }` is reported at the
 * `use` line as written (e.g. "The library has no version 4 of `mirrors/wilson_npn`.").
 */
export type UseLookup = { ok: true; text: string } | { ok: false; message: string; hint?: string };

export interface NetlistSymbols {
  models: string[];
  blocks: { name: string; pins: string[]; params: string[] }[];
  params: string[];
  parts: string[];
  nodes: string[];
}

export interface ParseResult {
  /** Absent when the circuit itself has errors (errors only in analyze/ports/measure/check lines leave it). */
  circuit?: Circuit;
  requests: Requests;
  /** Lines of analyze, ports, measure and check statements (errors there drop only the request). */
  requestLines: ReadonlySet<number>;
  /** All problems at once, errors and warnings, sorted by line and column. */
  diagnostics: Diagnostic[];
  /** Names for editor completion. */
  symbols: NetlistSymbols;
  /** The names with their kinds, the measure, check and `use` lines: what the editor shows. */
  outline: NetlistOutline;
}

/** Most diagnostics returned; past this the netlist is surely not what was meant. */
export const MAX_DIAGNOSTICS = 500;
/** Deepest chain of library files using library files. */
const MAX_USE_DEPTH = 16;

function emptyRequests(): Requests {
  return { analyses: [], measures: [], checks: [], params: {} };
}

/** Parses library files brought in by `use`, recursively, registering their blocks. */
class UseResolver {
  readonly usedBlocks = new Map<FileUnit, Map<string, BlockDef>>();
  readonly anchors = new Map<FileUnit, SourceLoc>();
  /** Block names whose `use` failed (already reported), so their instances are not reported again. */
  readonly failedBlocks = new Set<string>();
  private readonly cache = new Map<string, FileUnit | null>();

  constructor(
    private readonly bag: DiagnosticBag,
    private readonly resolve: ParseOptions['resolveUse'],
  ) {}

  /** Resolves the uses of `file`; `anchor` is the user's `use` line for library files. */
  resolveFile(file: FileUnit, anchor: SourceLoc | undefined, stack: string[]): void {
    const blocks = new Map<string, BlockDef>();
    this.usedBlocks.set(file, blocks);
    for (const use of file.uses) {
      const key = `${use.path}@${use.version}`;
      const loc = anchor ?? use.loc;
      const prefix = file.origin ? `In \`${file.origin}\`: ` : '';
      if (stack.includes(key)) {
        this.bag.error('recursive-block', loc, `${prefix}\`${key}\` uses itself (${[...stack, key].join(' → ')}).`);
        continue;
      }
      if (stack.length >= MAX_USE_DEPTH) {
        this.bag.error('recursive-block', loc, `${prefix}Library files use each other more than ${MAX_USE_DEPTH} deep.`);
        continue;
      }
      const lib = this.load(use.path, use.version, key, loc, prefix);
      if (!lib) {
        this.failedBlocks.add(use.blockName);
        continue;
      }
      const def = lib.blocks.find((b) => b.name.text === use.blockName);
      if (!def) {
        this.failedBlocks.add(use.blockName);
        this.bag.error('unknown-use', loc, `${prefix}\`${key}\` does not define a block \`${use.blockName}\`.`);
        continue;
      }
      if (blocks.has(use.blockName) || file.blocks.some((b) => b.name.text === use.blockName)) {
        this.bag.error('duplicate-name', loc, `${prefix}A block named \`${use.blockName}\` is already defined.`, 'each block name may be defined or used once');
        continue;
      }
      blocks.set(use.blockName, def);
      if (!this.usedBlocks.has(lib)) {
        this.anchors.set(lib, loc);
        this.resolveFile(lib, loc, [...stack, key]);
      }
    }
  }

  private load(path: string, version: number, key: string, loc: SourceLoc, prefix: string): FileUnit | undefined {
    const cached = this.cache.get(key);
    if (cached !== undefined) return cached ?? undefined;
    let text: string | undefined;
    if (!this.resolve) {
      this.bag.error('unknown-use', loc, `${prefix}\`${key}\` cannot be resolved: no block library is available here.`, 'the command line reads the library from `library/` or `--lib DIR`');
      this.cache.set(key, null);
      return undefined;
    }
    try {
      const answer = this.resolve(path, version);
      if (typeof answer === 'string') text = answer;
      else if (answer && typeof answer === 'object' && answer.ok === true && typeof answer.text === 'string') text = answer.text;
      else if (answer && typeof answer === 'object' && answer.ok === false) {
        this.bag.error('unknown-use', loc, prefix + String(answer.message), answer.hint);
        this.cache.set(key, null);
        return undefined;
      }
    } catch {
      text = undefined;
    }
    if (typeof text !== 'string') {
      this.bag.error('unknown-use', loc, `${prefix}The block library has no \`${key}\`.`, 'check the path and the version number');
      this.cache.set(key, null);
      return undefined;
    }
    const libBag = new DiagnosticBag();
    const lib = parseFile(text, libBag, key);
    for (const d of libBag.items) {
      const message = `In \`${key}\` line ${d.line}: ${d.message}`;
      if (d.severity === 'error') this.bag.error(d.code, loc, prefix + message, d.hint);
      else this.bag.warning(d.code, loc, prefix + message, d.hint);
    }
    this.cache.set(key, lib);
    return lib;
  }
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
    elab = elaborate(file, bag, { usedBlocks: uses.usedBlocks, useAnchors: uses.anchors, failedBlocks: uses.failedBlocks, paramOverrides: options.paramOverrides });
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
  return { ...(elab && !circuitErrors ? { circuit: elab.circuit } : {}), requests, requestLines, diagnostics, symbols, outline };
}
