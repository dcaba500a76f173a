/**
 * solveNetlist: netlist text in, the §5 result out. The orchestration above the parser and the
 * engine: parse → one run over the circuit (solve-circuit.ts) → the result, with every message
 * tidied and every number finite.
 *
 * Never throws, never hangs, never returns NaN or Infinity: a catch-all turns surprises into an
 * `internal-error` diagnostic and a final pass replaces any non-finite number with 0 and reports it.
 */
import { diagnostic, tidyDiagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { AnalysisRequest } from '../circuit/analyses';
import type { SolveResult } from '../circuit/result';
import { emptyOutline, type NetlistOutline } from '../parse/outline';
import { parseNetlist } from '../elaborate/parse-netlist';
import type { ParseOptions, ParseResult } from '../parse/parse-netlist';
import { unavailableAnalyses } from './analyses';
import { solveCircuit } from './solve-circuit';
import { mismatchPrecheck, runMismatch } from './mismatch';
import { runSensitivity } from './sensitivity';
import { isSweep, runSweeps } from './sweeps';

/** Options of a solve: how `use path@version` lines find their library files, and what to leave out. */
export interface SolveOptions {
  resolveUse?: ParseOptions['resolveUse'];
  /**
   * Analyses not to run here (the bench runs `mismatch` over a pool of workers instead); their
   * requests come back in `OutlinedSolve.skipped` when the circuit solved.
   */
  skip?: ReadonlyArray<'mismatch'>;
}

/** A solve's result with the outline of the text from the same parse. */
export interface OutlinedSolve {
  /** The §5 result, exactly what solveNetlist returns. */
  result: SolveResult;
  outline: NetlistOutline;
  /** The requests `options.skip` left out, when the circuit solved (they would have run). */
  skipped: AnalysisRequest[];
}

/** Solves a netlist. Never throws. */
export function solveNetlist(text: string, options: SolveOptions = {}): SolveResult {
  return solveWithOutline(text, options).result;
}

/**
 * Solves a netlist and returns, beside the result, the outline of the text from the one parse
 * of the solve (names with kinds, measure, check and use lines): what the bench's editor needs,
 * without parsing the text a second time. Never throws.
 */
export function solveWithOutline(text: string, options: SolveOptions = {}): OutlinedSolve {
  let result: SolveResult;
  let parsed: ParseResult | undefined;
  const skipped: AnalysisRequest[] = [];
  try {
    parsed = parseNetlist(typeof text === 'string' ? text : '', { resolveUse: options.resolveUse });
    result = solveParsed(parsed, options.skip ?? []);
    if (result.op && parsed.circuit) {
      const circuit = parsed.circuit;
      skipped.push(...parsed.requests.analyses.filter((a) => a.kind === 'mismatch' && options.skip?.includes(a.kind) && !mismatchPrecheck(circuit, a).some((d) => d.severity === 'error')));
    }
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    result = emptyResult('', 27);
    result.errors.push(diagnostic('error', 'internal-error', { line: 1, col: 1 }, `The solver hit an internal error: ${message}.`, 'this is a bug in Nodewright; please report it with the netlist'));
  }
  const clean = sanitize(result);
  // Every message leaves through the one helper that shortens long user tokens.
  clean.errors = clean.errors.map(tidyDiagnostic);
  clean.warnings = clean.warnings.map(tidyDiagnostic);
  return { result: clean, outline: parsed?.outline ?? emptyOutline(), skipped };
}

function emptyResult(title: string, tempC: number): SolveResult {
  return { title, temp_c: tempC, measures: {}, checks: [], warnings: [], errors: [] };
}

function solveParsed(parsed: ParseResult, skip: ReadonlyArray<'mismatch'>): SolveResult {
  const diagnostics: Diagnostic[] = [...parsed.diagnostics];
  const circuit = parsed.circuit;
  let result = emptyResult(circuit?.title ?? '', circuit?.options.temp ?? 27);
  // The parser withholds the circuit when the circuit itself has errors; errors confined to
  // requests (a misspelt measure) leave it, and the rest of the results, in place.
  if (circuit) {
    diagnostics.push(...unavailableAnalyses(parsed.requests.analyses.filter((a) => !isSweep(a.kind) && a.kind !== 'mismatch' && a.kind !== 'sensitivity')));
    const run = solveCircuit(circuit, parsed.requests);
    result = { ...result, ...run.result };
    diagnostics.push(...run.diagnostics);
    // The sweeps re-run the circuit per value; only worth it when it solved as written.
    if (run.result.op) {
      const sweeps = runSweeps({ ...parsed, circuit });
      result = { ...result, ...sweeps.members };
      diagnostics.push(...sweeps.diagnostics);
      if (!skip.includes('mismatch')) {
        const mismatch = runMismatch(circuit, parsed.requests);
        if (mismatch.member) result.mismatch = mismatch.member;
        diagnostics.push(...mismatch.diagnostics);
      } else {
        // The runs are left to the caller, but what is wrong with the line is said now.
        for (const request of parsed.requests.analyses) if (request.kind === 'mismatch') diagnostics.push(...mismatchPrecheck(circuit, request));
      }
      const sensitivity = runSensitivity(circuit, parsed.requests);
      if (sensitivity.member) result.sensitivity = sensitivity.member;
      diagnostics.push(...sensitivity.diagnostics);
    }
  }
  const ordered = [...diagnostics].sort((a, b) => a.line - b.line || a.col - b.col);
  result.errors = ordered.filter((d) => d.severity === 'error');
  result.warnings = ordered.filter((d) => d.severity !== 'error');
  return result;
}

/**
 * Replaces every non-finite number with 0 and reports where it was: the result must be plain
 * JSON and a NaN printed as a figure would mislead. Such a value is a solver defect.
 */
function sanitize(result: SolveResult): SolveResult {
  const bad: string[] = [];
  const walk = (value: unknown, path: string): unknown => {
    if (typeof value === 'number') {
      if (Number.isFinite(value)) return value;
      bad.push(path);
      return 0;
    }
    if (Array.isArray(value)) return value.map((v, k) => walk(v, `${path}[${k}]`));
    if (value && typeof value === 'object') {
      const out: Record<string, unknown> = {};
      for (const [k, v] of Object.entries(value)) if (v !== undefined) out[k] = walk(v, path ? `${path}.${k}` : k);
      return out;
    }
    return value;
  };
  const clean = walk(result, '') as SolveResult;
  if (bad.length > 0) {
    const shown = bad.slice(0, 5).join(', ') + (bad.length > 5 ? ` and ${bad.length - 5} more` : '');
    clean.errors.push(diagnostic('error', 'non-finite-result', { line: 1, col: 1 }, `Some results came out non-finite and were replaced by 0: ${shown}.`, 'this is a bug in Nodewright; please report it with the netlist'));
  }
  return clean;
}
