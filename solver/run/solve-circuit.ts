/**
 * One run over an elaborated circuit: the DC operating point, the small-signal circuit around
 * it, the ports figures, then every requested analysis through the dispatch table, then the
 * measures and checks over what they produced.
 */
import type { Requests } from '../circuit/analyses';
import type { Diagnostic } from '../circuit/diagnostic';
import type { Circuit } from '../circuit/types';
import type { SolveResult } from '../circuit/result';
import { createAcSolver } from '../analysis/ac-solve';
import { isOpFailure, solveOperatingPoint } from '../analysis/operating-point';
import { analyzePorts } from '../analysis/ports';
import { linearize } from '../analysis/small-signal';
import { evaluateMeasures } from '../measure/evaluate';
import type { MeasureContext } from '../measure/functions';
import { ANALYSIS_RUNNERS, RUNNING_KINDS, type AnalysisMembers, type RunningKind } from './analyses';
import type { AnalysisRunner, BiasPoint, RequestOf } from './analysis-run';

/** What one run over an elaborated circuit yields: result members and diagnostics. */
export interface CircuitRun {
  result: Pick<SolveResult, 'op' | 'ports' | RunningKind | 'measures' | 'checks'>;
  diagnostics: Diagnostic[];
  /** The operating point's unknowns (the shape's layout), for a caller that solves nearby from it. */
  unknowns?: Float64Array;
}

/**
 * One run of the per-circuit analyses. A function of the elaborated circuit and its requests
 * only, so the sweeping analyses (vary, temp, mismatch) can call it once per variant and compose
 * the runs. May throw on an engine defect; solveNetlist guards it.
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
  const bias: BiasPoint = { op, system, solver };
  // Requests that failed (reported on their own lines): measures that need them stay silent.
  const failed = new Set(requests.failed ?? []);
  const ctx: MeasureContext = { op: op.report, params: requests.params, linear: { system, solver }, failed };

  if (requests.ports) {
    const outcome = analyzePorts(system, solver, requests.ports);
    bias.ports = { request: requests.ports, outcome };
    diagnostics.push(...outcome.diagnostics);
    if (outcome.result && outcome.adm && outcome.acm) {
      result.ports = outcome.result;
      ctx.ports = { adm: outcome.adm, acm: outcome.acm, cmrr: outcome.result.cmrr, cmrrDb: outcome.result.cmrr_db, atHz: outcome.result.at_hz };
    } else failed.add('ports');
  }

  for (const kind of RUNNING_KINDS) {
    const request = requests.analyses.find((a): a is RequestOf<typeof kind> => a.kind === kind);
    // An analysis that gave no member reported why; the measures that need it stay silent.
    if (request && !runAnalysis(kind, circuit, bias, request, result, diagnostics, ctx)) failed.add(kind);
  }

  const measured = evaluateMeasures(requests.measures, requests.checks, ctx);
  result.measures = measured.measures;
  result.checks = measured.checks;
  diagnostics.push(...measured.diagnostics);
  // The result holds numbers only, never the solver: its LU can serve the next run of the shape.
  solver.release();
  return { result, diagnostics, unknowns: op.x };
}

/** Runs one analysis from the table and files its member, diagnostics and measure data; false when it gave no member. */
function runAnalysis<K extends RunningKind>(
  kind: K, circuit: Circuit, bias: BiasPoint, request: RequestOf<K>, result: Partial<AnalysisMembers>, diagnostics: Diagnostic[], ctx: MeasureContext,
): boolean {
  const runner: AnalysisRunner<K, AnalysisMembers[K]> = ANALYSIS_RUNNERS[kind];
  const outcome = runner(circuit, bias, request);
  if (outcome.member !== undefined) result[kind] = outcome.member;
  diagnostics.push(...outcome.diagnostics);
  Object.assign(ctx, outcome.measures);
  return outcome.member !== undefined;
}
