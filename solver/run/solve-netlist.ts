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
import { sensitivitySteps } from './sensitivity';
import { drain, type Steps } from './steps';
import { isSweep, sweepSteps } from './sweeps';

/** Options of a solve: how `use path@version` lines find their library files, and what to leave out. */
export interface SolveOptions {
  resolveUse?: ParseOptions['resolveUse'];
  /**
   * Analyses not to run here (the bench runs `mismatch` over a pool of workers instead); their
   * requests come back in `OutlinedSolve.skipped` when the circuit solved.
   */
  skip?: ReadonlyArray<'mismatch'>;
  /**
   * Leave the analyses that re-solve the circuit many times (`vary`, `temp`, `sensitivity`) to a
   * second stage, `OutlinedSolve.finish`: the bench paints the rest first and follows with them.
   */
  defer?: boolean;
}

/** A solve's result with the outline of the text from the same parse. */
export interface OutlinedSolve {
  /** The §5 result, exactly what solveNetlist returns. */
  result: SolveResult;
  outline: NetlistOutline;
  /** The requests `options.skip` left out, when the circuit solved (they would have run). */
  skipped: AnalysisRequest[];
  /**
   * With `options.defer`, when the circuit solved and the text asks for deferred analyses: runs
   * them and returns the whole result, exactly what a solve without `defer` gives. Never throws.
   */
  finish?: () => SolveResult;
  /**
   * `finish` as steps: yields between its units of work (a sweep value, a sensitivity knob), so
   * a caller with an event loop can drop it when newer text is waiting. Never throws.
   */
  finishSteps?: () => Steps<SolveResult>;
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
  let rest: (() => Steps<SolveResult>) | undefined;
  const skipped: AnalysisRequest[] = [];
  try {
    parsed = parseNetlist(typeof text === 'string' ? text : '', { resolveUse: options.resolveUse });
    ({ result, rest } = solveParsed(parsed, options.skip ?? [], options.defer ?? false));
    if (result.op && parsed.circuit) {
      const circuit = parsed.circuit;
      skipped.push(...parsed.requests.analyses.filter((a) => a.kind === 'mismatch' && options.skip?.includes(a.kind) && !mismatchPrecheck(circuit, a).some((d) => d.severity === 'error')));
    }
  } catch (err) {
    result = internalError(err);
  }
  const outline = parsed?.outline ?? emptyOutline();
  if (!rest) return { result: finalize(result), outline, skipped };
  const second = rest;
  const finishSteps = () => guardedSteps(second);
  return { result: finalize(result), outline, skipped, finish: () => drain(finishSteps()), finishSteps };
}

/** Runs a stage that may hit an engine defect, turning the surprise into a diagnostic, and finalizes its result. */
function* guardedSteps(stage: () => Steps<SolveResult>): Steps<SolveResult> {
  let result: SolveResult;
  try {
    result = yield* stage();
  } catch (err) {
    result = internalError(err);
  }
  return finalize(result);
}

/** The result of a solve that hit an engine defect: nothing but the error saying so. */
function internalError(err: unknown): SolveResult {
  const message = err instanceof Error ? err.message : String(err);
  const result = emptyResult('', 27);
  result.errors.push(diagnostic('error', 'internal-error', { line: 1, col: 1 }, `The solver hit an internal error: ${message}.`, 'this is a bug in Nodewright; please report it with the netlist'));
  return result;
}

/** Every number finite, and every message through the one helper that shortens long user tokens. */
function finalize(result: SolveResult): SolveResult {
  const clean = sanitize(result);
  clean.errors = clean.errors.map(tidyDiagnostic);
  clean.warnings = clean.warnings.map(tidyDiagnostic);
  return clean;
}

function emptyResult(title: string, tempC: number): SolveResult {
  return { title, temp_c: tempC, measures: {}, checks: [], warnings: [], errors: [] };
}

/**
 * The solve of a parsed text: the circuit's run (operating point, ports, the per-circuit analyses,
 * measures, checks) and mismatch, then the analyses that re-solve it many times (sweeps,
 * sensitivity) — at once, or, with `defer`, in `rest` for the caller to run next.
 */
function solveParsed(parsed: ParseResult, skip: ReadonlyArray<'mismatch'>, defer: boolean): { result: SolveResult; rest?: () => Steps<SolveResult> } {
  const diagnostics: Diagnostic[] = [...parsed.diagnostics];
  const circuit = parsed.circuit;
  let result = emptyResult(circuit?.title ?? '', circuit?.options.temp ?? 27);
  const order = (r: SolveResult, ds: Diagnostic[]): SolveResult => {
    const ordered = [...ds].sort((a, b) => a.line - b.line || a.col - b.col);
    return { ...r, errors: ordered.filter((d) => d.severity === 'error'), warnings: ordered.filter((d) => d.severity !== 'error') };
  };
  // The parser withholds the circuit when the circuit itself has errors; errors confined to
  // requests (a misspelt measure) leave it, and the rest of the results, in place.
  if (!circuit) return { result: order(result, diagnostics) };
  diagnostics.push(...unavailableAnalyses(parsed.requests.analyses.filter((a) => !isSweep(a.kind) && a.kind !== 'mismatch' && a.kind !== 'sensitivity')));
  const run = solveCircuit(circuit, parsed.requests);
  result = { ...result, ...run.result };
  diagnostics.push(...run.diagnostics);
  // The sweeps re-run the circuit per value; only worth it when it solved as written.
  if (!run.result.op) return { result: order(result, diagnostics) };
  let mismatch: SolveResult['mismatch'];
  if (!skip.includes('mismatch')) {
    const m = runMismatch(circuit, parsed.requests);
    mismatch = m.member;
    diagnostics.push(...m.diagnostics);
  } else {
    // The runs are left to the caller, but what is wrong with the line is said now.
    for (const request of parsed.requests.analyses) if (request.kind === 'mismatch') diagnostics.push(...mismatchPrecheck(circuit, request));
  }
  const base = result;
  const manyRuns = function* (): Steps<SolveResult> {
    const more = [...diagnostics];
    const sweeps = yield* sweepSteps({ ...parsed, circuit });
    more.push(...sweeps.diagnostics);
    const sensitivity = yield* sensitivitySteps(circuit, parsed.requests);
    more.push(...sensitivity.diagnostics);
    // One member order whichever way the stages ran.
    const whole: SolveResult = { ...base, ...sweeps.members };
    if (mismatch) whole.mismatch = mismatch;
    if (sensitivity.member) whole.sensitivity = sensitivity.member;
    return order(whole, more);
  };
  const deferred = parsed.requests.analyses.some((a) => isSweep(a.kind) || a.kind === 'sensitivity');
  if (!defer || !deferred) return { result: drain(manyRuns()) };
  const first: SolveResult = { ...base };
  if (mismatch) first.mismatch = mismatch;
  return { result: order(first, diagnostics), rest: manyRuns };
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
