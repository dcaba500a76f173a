/**
 * The types of parseNetlist (solver/elaborate/parse-netlist.ts): its options, the answers a `use`
 * resolver may give, and its result. They stay in parse/ because the bench and the tools import
 * them from here, and because nothing in them needs the elaborator.
 */
import type { Requests } from '../circuit/analyses';
import type { Diagnostic } from '../circuit/diagnostic';
import type { Circuit } from '../circuit/types';
import type { NetlistOutline } from './outline';

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
  /**
   * The circuit elaborated again with some top-level params replaced (how `analyze vary` re-runs):
   * the text is not read again and `use` lines are not resolved again. Present when the circuit
   * elaborated; the variant's own problems (a value that makes a part invalid) come back with it.
   */
  withParams?: (overrides: Record<string, number>) => ParamVariant;
}

/** One elaboration of the circuit with replaced params. */
export interface ParamVariant {
  /** Absent when the replaced values make the circuit invalid (its errors say why). */
  circuit?: Circuit;
  /** Every top-level param after evaluation, the replaced ones included. */
  params: Record<string, number>;
  diagnostics: Diagnostic[];
}
