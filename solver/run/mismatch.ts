/**
 * `analyze mismatch runs N seed S beta 5% is 2% res 0.5% vth 2m …`: Monte Carlo over device and
 * resistor mismatch (netlist language §3, §5). Each run perturbs every resistor, capacitor and
 * device independently — relative normal spreads for `beta`, `is`, `va`, `ucox`, `lambda`, `res`,
 * `cap`, an absolute one (volts) for `vth` — re-solves the operating point and the ports,
 * evaluates the measures and checks, and finds the input offset `vos`: the DC differential input
 * that brings the differential output to zero (single-ended: back to its value without mismatch),
 * by solving — a secant search on re-solved operating points, started from the linear guess
 * −vod/adm — not by the linear guess alone.
 *
 * Run i draws from a stream of (seed, i) only (numeric/random.ts), so the samples are the same
 * however the runs are split between workers: `mismatchSamples` solves any range of runs and
 * `summarizeMismatch` turns the samples of all runs, in any order, into the §5 member.
 */
import type { MismatchRequest, PortsRequest, Requests } from '../circuit/analyses';
import { diagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { ComplexFigure, MismatchResult, SolveResult } from '../circuit/result';
import type { Circuit, Part } from '../circuit/types';
import { isOpFailure, solveOperatingPoint } from '../analysis/operating-point';
import { streamFor, type RandomStream } from '../numeric/random';
import { sampleStats } from '../numeric/stats';
import { solveCircuit } from './solve-circuit';

/** At most this many runs × parts in one mismatch analysis. */
export const MAX_MISMATCH_WORK = 200_000;

/** What one run gave: its figures by name and whether every check passed, or why it did not solve. */
export interface MismatchSample {
  run: number;
  values?: Record<string, number>;
  /** Every check passed in this run (true when there are none). */
  pass?: boolean;
  error?: string;
}

/** The circuit of run `run`: every part with its own independent draw. */
export function perturbedCircuit(circuit: Circuit, request: MismatchRequest, run: number): Circuit {
  const rng = streamFor(request.seed, run);
  return { ...circuit, parts: circuit.parts.map((p) => perturbPart(p, request.sigmas, rng)) };
}

function perturbPart(part: Part, sigmas: Record<string, number>, rng: RandomStream): Part {
  // A relative spread; the factor is kept positive (a 5 % spread would need a −19σ draw to reach 0).
  const rel = (key: string, value: number): number => {
    const s = sigmas[key];
    return s ? value * Math.max(1e-3, 1 + s * rng.normal()) : value;
  };
  switch (part.kind) {
    case 'res': return { ...part, value: rel('res', part.value) };
    case 'cap': return { ...part, value: rel('cap', part.value) };
    case 'npn':
    case 'pnp': {
      const m = part.model;
      return { ...part, model: { ...m, beta: rel('beta', m.beta), is: rel('is', m.is), va: Number.isFinite(m.va) ? rel('va', m.va) : m.va } };
    }
    case 'nmos':
    case 'pmos': {
      const m = part.model;
      const vth = sigmas.vth ? m.vth + sigmas.vth * rng.normal() : m.vth;
      return { ...part, model: { ...m, vth, ucox: rel('ucox', m.ucox), lambda: rel('lambda', m.lambda) } };
    }
    case 'diode': return { ...part, model: { ...part.model, is: rel('is', part.model.is) } };
    default: return part;
  }
}

/** A complex figure as one number: its signed real value when real (at 0 Hz), else its magnitude. */
function scalar(f: ComplexFigure): number {
  return f.im === 0 ? f.re : f.mag;
}

/** What each run solves: no curve analyses unless a measure reads a curve. */
export function perRunRequests(requests: Requests): Requests {
  const readsCurves = [...requests.measures.map((m) => m.expr), ...requests.checks.flatMap((c) => [c.lhs, c.rhs])].some((e) => /\b(ac|at|corner|unity|margin)\s*\(/.test(e));
  return { ...requests, analyses: readsCurves ? requests.analyses.filter((a) => a.kind === 'ac') : [] };
}

/** Solves runs `from` (inclusive) to `to` (exclusive). Never throws. */
export function mismatchSamples(circuit: Circuit, requests: Requests, request: MismatchRequest, from: number, to: number): MismatchSample[] {
  const perRun = perRunRequests(requests);
  const target = requests.ports ? nominalTarget(circuit, requests.ports) : undefined;
  const samples: MismatchSample[] = [];
  for (let run = from; run < to; run++) {
    try {
      samples.push(oneRun(perturbedCircuit(circuit, request, run), perRun, run, target));
    } catch (err) {
      samples.push({ run, error: err instanceof Error ? err.message : String(err) });
    }
  }
  return samples;
}

function oneRun(circuit: Circuit, requests: Requests, run: number, target: number | undefined): MismatchSample {
  const solved = solveCircuit(circuit, requests);
  if (!solved.result.op) return { run, error: solved.diagnostics.find((d) => d.severity === 'error')?.message ?? 'the operating point did not converge' };
  const figures = figuresOf(solved.result, requests);
  // vos sits after the ports figures and before the measures, as the §5 member lists them.
  const values: Record<string, number> = {};
  for (const [name, v] of Object.entries(figures)) {
    if (name === 'cmrr_db' && requests.ports) {
      values[name] = v;
      const vos = inputOffset(circuit, requests.ports, target ?? 0, figures.adm);
      if (vos !== undefined) values.vos = vos;
    } else values[name] = v;
  }
  return { run, values, pass: solved.result.checks.every((c) => c.pass) };
}

/** The figures of one run by name: adm, acm, cmrr_db (with ports), then every finite measure. */
export function figuresOf(result: Pick<SolveResult, 'ports' | 'measures'>, requests: Requests): Record<string, number> {
  const values: Record<string, number> = {};
  const ports = result.ports;
  if (ports && requests.ports) {
    values.adm = scalar(ports.adm);
    values.acm = scalar(ports.acm);
    values.cmrr_db = ports.cmrr_db;
  }
  for (const [name, v] of Object.entries(result.measures)) if (Number.isFinite(v)) values[name] = v;
  return values;
}

/** The output a nulled input returns to: 0 V differential, or the single-ended output without mismatch. */
function nominalTarget(circuit: Circuit, ports: PortsRequest): number | undefined {
  if (ports.outN) return 0;
  const op = solveOperatingPoint(circuit);
  return isOpFailure(op) ? undefined : op.report.nodes[ports.outP] ?? 0;
}

/**
 * The DC differential input (split ±½ over the two input sources) that brings the output to
 * `target`, by the secant method on re-solved operating points (each warm-started from the last);
 * undefined when the inputs are not voltage sources or the search does not settle.
 */
export function inputOffset(circuit: Circuit, ports: PortsRequest, target: number, admDc: number): number | undefined {
  const inP = circuit.parts.find((p) => p.name === ports.inP);
  const inN = circuit.parts.find((p) => p.name === ports.inN);
  if (inP?.kind !== 'vsrc' || inN?.kind !== 'vsrc') return undefined;
  let warm: Float64Array | undefined;
  const error = (vid: number): number | undefined => {
    const parts = circuit.parts.map((p) => (p === inP ? { ...inP, dc: inP.dc + vid / 2 } : p === inN ? { ...inN, dc: inN.dc - vid / 2 } : p));
    const op = solveOperatingPoint({ ...circuit, parts }, warm ? { x: warm } : undefined);
    if (isOpFailure(op)) return undefined;
    warm = op.x;
    const nodes = op.report.nodes;
    const out = (nodes[ports.outP] ?? 0) - (ports.outN ? nodes[ports.outN] ?? 0 : 0);
    return out - target;
  };
  let x0 = 0;
  let f0 = error(x0);
  if (f0 === undefined) return undefined;
  let x1 = admDc !== 0 && Number.isFinite(admDc) ? -f0 / admDc : 1e-3;
  for (let k = 0; k < 30; k++) {
    const f1 = error(x1);
    if (f1 === undefined) return undefined;
    if (Math.abs(x1 - x0) <= 1e-13 + 1e-10 * Math.abs(x1) || f1 === 0) return x1;
    if (f1 === f0) return Math.abs(f1) < 1e-9 ? x1 : undefined;
    const x2: number = x1 - (f1 * (x1 - x0)) / (f1 - f0);
    [x0, f0, x1] = [x1, f1, x2];
  }
  return undefined;
}

/** The §5 member from the samples of every run (any order). */
export function summarizeMismatch(request: MismatchRequest, samples: readonly MismatchSample[]): MismatchResult {
  const ordered = [...samples].sort((a, b) => a.run - b.run);
  const solved = ordered.filter((s) => s.values);
  const names: string[] = [];
  for (const s of solved) for (const name of Object.keys(s.values!)) if (!names.includes(name)) names.push(name);
  const sampleArrays: Record<string, number[]> = {};
  const stats: MismatchResult['stats'] = {};
  for (const name of names) {
    sampleArrays[name] = solved.flatMap((s) => (name in s.values! ? [s.values![name]] : []));
    stats[name] = sampleStats(sampleArrays[name]);
  }
  const passing = solved.filter((s) => s.pass).length;
  return {
    runs: request.runs,
    seed: request.seed,
    stats,
    samples: sampleArrays,
    yield: solved.length ? passing / solved.length : 0,
    failed_runs: ordered.length - solved.length,
  };
}

/** The whole analysis in one thread (the CLI, tests); the bench splits `mismatchSamples` over workers. */
export function runMismatch(circuit: Circuit, requests: Requests): { member?: MismatchResult; diagnostics: Diagnostic[] } {
  const request = requests.analyses.find((a): a is MismatchRequest => a.kind === 'mismatch');
  if (!request) return { diagnostics: [] };
  const diagnostics: Diagnostic[] = [];
  if (request.runs * Math.max(1, circuit.parts.length) > MAX_MISMATCH_WORK) {
    diagnostics.push(diagnostic('error', 'sweep-too-large', request.loc,
      `analyze mismatch would solve ${request.runs} runs of ${circuit.parts.length} parts, more than ${MAX_MISMATCH_WORK.toLocaleString('en-US')} in all.`, 'use fewer runs'));
    return { diagnostics };
  }
  if (Object.keys(request.sigmas).length === 0) {
    diagnostics.push(diagnostic('warning', 'sweep-value-failed', request.loc, 'analyze mismatch has no spreads: every run is the circuit as written.', 'add spreads, e.g. `beta 5% is 2% res 0.5%`'));
  }
  const member = summarizeMismatch(request, mismatchSamples(circuit, requests, request, 0, request.runs));
  if (member.failed_runs > 0) {
    diagnostics.push(diagnostic('warning', 'sweep-value-failed', request.loc, `analyze mismatch: ${member.failed_runs} of ${request.runs} runs did not solve; the statistics are over the other runs.`));
  }
  return { member, diagnostics };
}
