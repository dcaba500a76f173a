/**
 * solveNetlist: netlist text in, the §5 result out. The orchestration above the parser and the
 * engine: parse → DC operating point → linearise → ports / ac / transfer → measures → checks.
 *
 * Each analysis is a function of the elaborated circuit (and what it asks for) that returns its
 * own member of the result plus diagnostics; the result is their composition. Later analyses
 * (vary, temp, noise, mismatch, poles) slot in as further such functions.
 *
 * Never throws, never hangs, never returns NaN or Infinity: a catch-all turns surprises into an
 * `internal-error` diagnostic and a final pass replaces any non-finite number with 0 and reports it.
 */
import type { AcRequest, AnalysisRequest, Requests, TransferRequest } from './circuit/analyses';
import { tidyDiagnostic, type Diagnostic, type SourceLoc } from './circuit/diagnostic';
import type { Circuit, Part } from './circuit/types';
import type { AcResult, Curve, SolveResult, TransferResult } from './result';
import type { AcSolution, AcSolver, Excitation, OperatingPoint, Phasor } from './analysis/engine-api';
import { isOpFailure, solveOperatingPoint } from './analysis/operating-point';
import { linearize } from './analysis/small-signal';
import { createAcSolver } from './analysis/ac-solve';
import { dcSweep } from './analysis/dc-sweep';
import { logSweep } from './analysis/ac-solve';
import { analyzePorts, type PortsOutcome } from './analysis/ports';
import { parseNetlist, type ParseOptions } from './parse/parse-netlist';
import { fromPolar } from './measure/complex';
import { curveFromPhasors } from './measure/curve';
import { evaluateMeasures } from './measure/evaluate';
import type { MeasureContext } from './measure/functions';

/** Options of a solve: how `use path@version` lines find their library files. */
export interface SolveOptions {
  resolveUse?: ParseOptions['resolveUse'];
}

/** More frequency points than this is a typo in the sweep, not a request. */
export const MAX_AC_POINTS = 20_001;
/** More transfer points than this is a typo in the step. */
export const MAX_TRANSFER_POINTS = 20_001;

const LATER_ANALYSES = new Set(['vary', 'temp', 'noise', 'mismatch', 'poles']);

function diag(severity: 'error' | 'warning', code: string, loc: SourceLoc, message: string, hint?: string): Diagnostic {
  return { severity, code, line: loc.line, col: loc.col, ...(loc.endCol ? { endCol: loc.endCol } : {}), message, ...(hint ? { hint } : {}) };
}

/** Solves a netlist. Never throws. */
export function solveNetlist(text: string, options: SolveOptions = {}): SolveResult {
  let result: SolveResult;
  try {
    result = solveUnguarded(typeof text === 'string' ? text : '', options);
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    result = emptyResult('', 27);
    result.errors.push(diag('error', 'internal-error', { line: 1, col: 1 }, `The solver hit an internal error: ${message}.`, 'this is a bug in Nodewright; please report it with the netlist'));
  }
  const clean = sanitize(result);
  // Every message leaves through the one helper that shortens long user tokens.
  clean.errors = clean.errors.map(tidyDiagnostic);
  clean.warnings = clean.warnings.map(tidyDiagnostic);
  return clean;
}

function emptyResult(title: string, tempC: number): SolveResult {
  return { title, temp_c: tempC, measures: {}, checks: [], warnings: [], errors: [] };
}

function solveUnguarded(text: string, options: SolveOptions): SolveResult {
  const parsed = parseNetlist(text, { resolveUse: options.resolveUse });
  const diagnostics: Diagnostic[] = [...parsed.diagnostics];
  const circuit = parsed.circuit;
  let result = emptyResult(circuit?.title ?? '', circuit?.options.temp ?? 27);
  // The parser withholds the circuit when the circuit itself has errors; errors confined to
  // requests (a misspelt measure) leave it, and the rest of the results, in place.
  if (circuit) {
    for (const r of parsed.requests.analyses) {
      if (LATER_ANALYSES.has(r.kind)) {
        diagnostics.push(diag('warning', 'analysis-not-available', r.loc, `analyze ${r.kind} is not yet available in this version; the line is skipped.`, 'the other analyses run as usual'));
      }
    }
    const run = solveCircuit(circuit, parsed.requests);
    result = { ...result, ...run.result };
    diagnostics.push(...run.diagnostics);
  }
  const ordered = [...diagnostics].sort((a, b) => a.line - b.line || a.col - b.col);
  result.errors = ordered.filter((d) => d.severity === 'error');
  result.warnings = ordered.filter((d) => d.severity !== 'error');
  return result;
}

/** What one run over an elaborated circuit yields: result members and diagnostics. */
export interface CircuitRun {
  result: Pick<SolveResult, 'op' | 'ports' | 'ac' | 'transfer' | 'measures' | 'checks'>;
  diagnostics: Diagnostic[];
}

/**
 * One run of the per-circuit analyses: operating point, ports, ac, transfer, then measures and
 * checks over their results. A function of the elaborated circuit and its requests only, so the
 * sweeping analyses (vary, temp, mismatch) can call it once per variant and compose the runs.
 * May throw on an engine defect; solveNetlist guards it.
 */
export function solveCircuit(circuit: Circuit, requests: Requests): CircuitRun {
  const diagnostics: Diagnostic[] = [];
  const result: CircuitRun['result'] = { measures: {}, checks: [] };
  const op = solveOperatingPoint(circuit);
  if (isOpFailure(op)) return { result, diagnostics: op.errors };
  result.op = op.report;
  diagnostics.push(...op.warnings);

  const system = linearize(circuit, op);
  const solver = createAcSolver(system);
  // Requests that failed (reported on their own lines): measures that need them stay silent.
  const failed = new Set(requests.failed ?? []);
  const ctx: MeasureContext = { op: op.report, params: requests.params, linear: { system, solver }, failed };

  const acRequest = firstOfKind(requests.analyses, 'ac', diagnostics) as AcRequest | undefined;
  const sweep = acRequest ? acFrequencies(acRequest, diagnostics) : undefined;
  if (acRequest && !sweep) failed.add('ac');

  let ports: PortsOutcome | undefined;
  if (requests.ports) {
    ports = analyzePorts(system, solver, requests.ports, sweep);
    diagnostics.push(...ports.diagnostics);
    if (ports.result && ports.adm && ports.acm) {
      result.ports = ports.result;
      ctx.ports = { adm: ports.adm, acm: ports.acm, cmrr: ports.result.cmrr, cmrrDb: ports.result.cmrr_db, atHz: ports.result.at_hz };
    } else failed.add('ports');
  }

  if (acRequest && sweep) {
    const ac = runAc(circuit, solver, sweep, ports, requests, acRequest, diagnostics);
    result.ac = ac.result;
    ctx.ac = { freqHz: sweep, portsCurves: ports?.curves, solutions: ac.solutions };
  }

  const transferRequest = firstOfKind(requests.analyses, 'transfer', diagnostics) as TransferRequest | undefined;
  if (transferRequest) {
    const transfer = runTransfer(circuit, op, transferRequest, diagnostics);
    if (transfer) result.transfer = transfer;
  }

  const measured = evaluateMeasures(requests.measures, requests.checks, ctx);
  result.measures = measured.measures;
  result.checks = measured.checks;
  diagnostics.push(...measured.diagnostics);
  return { result, diagnostics };
}

/** The first request of a kind; a warning on each further one, which is ignored. */
function firstOfKind(analyses: AnalysisRequest[], kind: 'ac' | 'transfer', diagnostics: Diagnostic[]): AnalysisRequest | undefined {
  const all = analyses.filter((a) => a.kind === kind);
  for (const extra of all.slice(1)) {
    diagnostics.push(diag('warning', 'duplicate-analysis', extra.loc, `A second \`analyze ${kind}\` is ignored; the first one (line ${all[0].loc.line}) runs.`, 'keep one line per analysis'));
  }
  return all[0];
}

/** Frequencies of the sweep, or undefined with an error when the request is unusable. */
function acFrequencies(req: AcRequest, diagnostics: Diagnostic[]): number[] | undefined {
  const { fromHz, toHz, perDecade } = req;
  if (!(Number.isFinite(fromHz) && Number.isFinite(toHz) && fromHz > 0 && toHz > fromHz)) {
    diagnostics.push(diag('error', 'bad-ac-sweep', req.loc, 'analyze ac: the sweep must run from a frequency above 0 Hz up to a higher one.', 'write e.g. `analyze ac from 10 Hz to 1 GHz per decade 20`'));
    return undefined;
  }
  if (!(Number.isFinite(perDecade) && perDecade >= 1)) {
    diagnostics.push(diag('error', 'bad-ac-sweep', req.loc, 'analyze ac: `per decade` must be at least 1.'));
    return undefined;
  }
  const points = Math.log10(toHz / fromHz) * perDecade + 1;
  if (points > MAX_AC_POINTS) {
    diagnostics.push(diag('error', 'bad-ac-sweep', req.loc, `analyze ac: the sweep would have ${Math.round(points)} points (at most ${MAX_AC_POINTS}).`, 'use fewer points per decade or a narrower range'));
    return undefined;
  }
  return logSweep(fromHz, toHz, perDecade);
}

/** The excitation of the sources' own `ac=` values. */
function ownExcitation(circuit: Circuit): Excitation {
  const sources = new Map<string, Phasor>();
  for (const p of circuit.parts) {
    if ((p.kind === 'vsrc' || p.kind === 'isrc') && p.ac && p.ac.mag !== 0) sources.set(p.name, fromPolar(p.ac.mag, p.ac.phaseDeg));
  }
  return { sources };
}

function topLevelNodes(circuit: Circuit): string[] {
  return circuit.nodes.filter((n) => !n.includes('.'));
}

function runAc(
  circuit: Circuit,
  solver: AcSolver,
  sweep: number[],
  ports: PortsOutcome | undefined,
  requests: Requests,
  req: AcRequest,
  diagnostics: Diagnostic[],
): { result: AcResult; solutions: AcSolution[] } {
  const excitation = ownExcitation(circuit);
  if (excitation.sources!.size === 0 && !requests.ports) {
    diagnostics.push(diag('warning', 'no-ac-source', req.loc, 'analyze ac: no source has an `ac=` value, so every ac(n) curve is zero.', 'give the input source an excitation, e.g. `vin: vsrc(in, gnd) 0 ac=1`'));
  }
  const solutions = sweep.map((f) => solver.solve(f, [excitation])[0]);
  const curves: Record<string, Curve> = {};
  if (ports?.curves) Object.assign(curves, ports.curves);
  for (const n of topLevelNodes(circuit)) curves[`ac(${n})`] = curveFromPhasors(solutions.map((s) => s.v(n)));
  return { result: { freq_hz: sweep, curves }, solutions };
}

/** Sweep values from `from` to `to` by `step`, both ends included (the last clipped to `to`). */
function transferValues(req: TransferRequest, diagnostics: Diagnostic[]): number[] | undefined {
  const { from, to, step } = req;
  if (![from, to, step].every(Number.isFinite) || step === 0 || Math.sign(to - from) * Math.sign(step) < 0) {
    diagnostics.push(diag('error', 'bad-transfer', req.loc, 'analyze transfer: the step must be non-zero and lead from the start value to the end value.', 'write e.g. `analyze transfer va from -100m to 100m step 1m`'));
    return undefined;
  }
  const count = Math.floor(Math.abs((to - from) / step) * (1 + 1e-12)) + 1;
  if (count > MAX_TRANSFER_POINTS) {
    diagnostics.push(diag('error', 'bad-transfer', req.loc, `analyze transfer: the sweep would have ${count} points (at most ${MAX_TRANSFER_POINTS}).`, 'use a larger step'));
    return undefined;
  }
  const values = Array.from({ length: count }, (_, k) => from + k * step);
  if (Math.abs(values[count - 1] - to) > Math.abs(step) * 1e-9) values.push(to);
  else values[count - 1] = to;
  return values;
}

function isTwoTerminal(p: Part): boolean {
  return p.kind === 'res' || p.kind === 'cap' || p.kind === 'ind' || p.kind === 'vsrc' || p.kind === 'isrc';
}

function runTransfer(circuit: Circuit, op: OperatingPoint, req: TransferRequest, diagnostics: Diagnostic[]): TransferResult | undefined {
  const swept = circuit.parts.find((p) => p.name === req.source);
  if (!swept || (swept.kind !== 'vsrc' && swept.kind !== 'isrc')) {
    diagnostics.push(diag('error', 'bad-transfer', req.loc, `analyze transfer: \`${req.source}\` is not an independent source.`, 'sweep a vsrc or isrc'));
    return undefined;
  }
  const values = transferValues(req, diagnostics);
  if (!values) return undefined;
  const sweep = dcSweep(circuit, req.source, values, op);
  diagnostics.push(...sweep.errors);
  const curves: Record<string, number[]> = {};
  for (const n of topLevelNodes(circuit)) curves[`v(${n})`] = sweep.points.map((pt) => pt.nodes[n] ?? 0);
  for (const p of circuit.parts.filter(isTwoTerminal)) {
    curves[`i(${p.name})`] = sweep.points.map((pt) => (pt.parts[p.name] ?? pt.sources[p.name])?.i ?? 0);
  }
  return { source: req.source, x: sweep.x, curves };
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
    clean.errors.push(diag('error', 'non-finite-result', { line: 1, col: 1 }, `Some results came out non-finite and were replaced by 0: ${shown}.`, 'this is a bug in Nodewright; please report it with the netlist'));
  }
  return clean;
}

