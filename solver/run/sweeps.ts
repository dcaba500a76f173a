/**
 * `analyze vary` and `analyze temp`: the per-circuit run (solve-circuit.ts) repeated at each
 * value — the operating point, the ports, the ac sweep, the measures and the checks — and
 * composed into `vary.runs[i]` / `temp.runs[i]` (netlist language §3, §5).
 *
 * The text is read and its `use` lines resolved once. `vary` elaborates the circuit again per
 * value (a param may set any value of any part or model, so the circuit is rebuilt from the
 * parsed statements with that param replaced); `temp` changes only the solve temperature, which
 * the devices read when they are stamped, so the one elaborated circuit serves every value.
 * Requests (the ac range, the ports frequency) were evaluated once with the written params.
 *
 * A value at which the circuit does not solve keeps its place, with `errors`, and one warning on
 * the analyze line names those values; the other values are still reported.
 */
import type { Steps } from './steps';
import type { AnalysisRequest, Requests, TempRequest, VaryRequest } from '../circuit/analyses';
import { diagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { SweepRun, TempResult, VaryResult } from '../circuit/result';
import type { Circuit } from '../circuit/types';
import { formatSi } from '../report/si-format';
import type { ParseResult } from '../parse/parse-netlist';
import { solveCircuit } from './solve-circuit';

/** The sweeping kinds, in the order their members appear in the result. */
export const SWEEP_KINDS = ['vary', 'temp'] as const;
export type SweepKind = (typeof SWEEP_KINDS)[number];

/** At most this many ac points over all values of one sweep (values × points of the ac sweep). */
export const MAX_SWEEP_WORK = 200_000;
/** What one poles run counts for in MAX_SWEEP_WORK, in ac points. */
export const POLES_SWEEP_POINTS = 20;

/** What the sweeps add to a result. */
export interface SweepMembers {
  vary?: VaryResult;
  temp?: TempResult;
}

export function isSweep(kind: AnalysisRequest['kind']): kind is SweepKind {
  return (SWEEP_KINDS as readonly string[]).includes(kind);
}


/** Runs every sweep the netlist asks for over a parsed netlist whose circuit elaborated, yielding after each value's run (run/steps.ts). */
export function* sweepSteps(parsed: ParseResult & { circuit: Circuit }): Steps<{ members: SweepMembers; diagnostics: Diagnostic[] }> {
  const members: SweepMembers = {};
  const diagnostics: Diagnostic[] = [];
  const perValue = perValueRequests(parsed.requests);
  const vary = parsed.requests.analyses.find((a): a is VaryRequest => a.kind === 'vary');
  if (vary && parsed.withParams && fits(vary, vary.values.length, perValue, diagnostics)) {
    const withParams = parsed.withParams;
    const runs: SweepRun[] = [];
    for (const value of vary.values) {
      const variant = withParams({ [vary.param]: value });
      runs.push(variant.circuit ? runAt(variant.circuit, { ...perValue, params: variant.params }) : failedRun(variant.diagnostics));
      yield;
    }
    members.vary = { param: vary.param, values: vary.values, runs };
    diagnostics.push(...failures(vary, runs, vary.values.map((v) => `${vary.param} = ${formatSi(v)}`)));
  }
  const temp = parsed.requests.analyses.find((a): a is TempRequest => a.kind === 'temp');
  if (temp && fits(temp, temp.valuesC.length, perValue, diagnostics)) {
    const circuit = parsed.circuit;
    const runs: SweepRun[] = [];
    for (const t of temp.valuesC) {
      runs.push(runAt({ ...circuit, options: { ...circuit.options, temp: t } }, perValue));
      yield;
    }
    members.temp = { values_c: temp.valuesC, runs };
    diagnostics.push(...failures(temp, runs, temp.valuesC.map((t) => `${t} °C`)));
  }
  return { members, diagnostics };
}

/** What each value re-runs: the ac and noise sweeps and the poles only of the analyses (not the transfer curve, not another sweep). */
function perValueRequests(requests: Requests): Requests {
  return { ...requests, analyses: requests.analyses.filter((a) => a.kind === 'ac' || a.kind === 'noise' || a.kind === 'poles') };
}

/** False (with an error on the analyze line) when the sweep would compute too many ac and noise points. */
function fits(request: VaryRequest | TempRequest, values: number, requests: Requests, diagnostics: Diagnostic[]): boolean {
  let points = 0;
  for (const a of requests.analyses) if (a.kind === 'ac' || a.kind === 'noise') points += Math.floor(Math.log10(a.toHz / a.fromHz) * a.perDecade + 1e-9) + 1;
  // A poles run (one LU and one eigenvalue decomposition) costs about as much as this many ac points.
  if (requests.analyses.some((a) => a.kind === 'poles')) points += POLES_SWEEP_POINTS;
  points = Math.max(points, 1);
  if (values * points <= MAX_SWEEP_WORK) return true;
  diagnostics.push(diagnostic('error', 'sweep-too-large', request.loc,
    `analyze ${request.kind} would solve ${values} values × ${points} ac and noise points, more than ${MAX_SWEEP_WORK.toLocaleString('en-US')}.`,
    'use fewer values, or fewer ac or noise points per decade'));
  return false;
}

/** One value: the run's members, or why the circuit did not solve there. */
function runAt(circuit: Circuit, requests: Requests): SweepRun {
  const run = solveCircuit(circuit, requests);
  const { op, ports, ac, noise, poles, measures, checks } = run.result;
  if (op) return { op, ...(ports ? { ports } : {}), ...(ac ? { ac } : {}), ...(noise ? { noise } : {}), ...(poles ? { poles } : {}), measures, checks };
  return failedRun(run.diagnostics);
}

function failedRun(diagnostics: readonly Diagnostic[]): SweepRun {
  const errors = diagnostics.filter((d) => d.severity === 'error').map(({ line, col, message }) => ({ line, col, message }));
  return { measures: {}, checks: [], errors: errors.length ? errors : [{ line: 1, col: 1, message: 'The circuit did not solve at this value.' }] };
}

/** One warning naming the values at which the circuit did not solve. */
function failures(request: VaryRequest | TempRequest, runs: readonly SweepRun[], labels: readonly string[]): Diagnostic[] {
  const failed = runs.flatMap((r, k) => (r.errors ? [labels[k]] : []));
  if (failed.length === 0) return [];
  const named = failed.slice(0, 4).join(', ') + (failed.length > 4 ? ` and ${failed.length - 4} more` : '');
  const first = runs.find((r) => r.errors)!.errors![0].message;
  return [diagnostic('warning', 'sweep-value-failed', request.loc,
    `analyze ${request.kind}: the circuit did not solve at ${failed.length} of ${runs.length} values (${named}); first: ${first}`,
    'those values are reported with their errors and no figures')];
}
