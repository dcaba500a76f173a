/**
 * `analyze mismatch runs N seed S beta 5% is 2% res 0.5% vth 2m …`: Monte Carlo over device and
 * resistor mismatch (netlist language §3, §5). Each run perturbs every resistor, capacitor and
 * device independently — relative normal spreads for `beta`, `is`, `va`, `ucox`, `lambda`, `res`,
 * `cap`, an absolute one (volts) for `vth` — re-solves the operating point and the ports,
 * evaluates the measures and checks, and finds the input offset `vos`: the DC differential input
 * that brings the differential output to zero (single-ended: back to its value without mismatch),
 * by solving — a bracketing search on re-solved operating points, from the linear guess −vod/adm,
 * closed by Illinois regula falsi — not by the linear guess alone.
 *
 * Run i draws from a stream of (seed, i) only (numeric/random.ts), so the samples are the same
 * however the runs are split between workers: `mismatchSamples` solves any range of runs and
 * `summarizeMismatch` turns the samples of all runs, in any order, into the §5 member.
 */
import type { MismatchRequest, PortsRequest, Requests } from '../circuit/analyses';
import { diagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { ComplexFigure, MismatchResult, SolveResult } from '../circuit/result';
import type { Circuit, Part, VoltageSource } from '../circuit/types';
import { borrowWorkspace, releaseWorkspace } from '../analysis/newton';
import { nodeRow } from '../analysis/mna';
import { isOpFailure, solveOperatingPoint, solveUnknowns } from '../analysis/operating-point';
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

/** What each run solves: no curve, noise or poles analyses unless a measure reads a curve, a noise figure or a pole. */
export function perRunRequests(requests: Requests): Requests {
  const expressions = [...requests.measures.map((m) => m.expr), ...requests.checks.flatMap((c) => [c.lhs, c.rhs])];
  const readsCurves = expressions.some((e) => /\b(ac|at|corner|unity|margin)\s*\(/.test(e));
  // The noise sweep likewise, only for a measure or check that reads noise_out, noise_in_rms, ….
  const readsNoise = expressions.some((e) => /\bnoise_(out|in)(_rms)?\s*\(/.test(e));
  // And the poles, for a pole(k) or zero(k).
  const readsPoles = expressions.some((e) => /\b(pole|zero)\s*\(/.test(e));
  return { ...requests, analyses: requests.analyses.filter((a) => (readsCurves && a.kind === 'ac') || (readsNoise && a.kind === 'noise') || (readsPoles && a.kind === 'poles')) };
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
      const vos = inputOffset(circuit, requests.ports, target ?? 0, figures.adm, solved.unknowns);
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
 * The largest input offset searched for, volts. A pair's offset is millivolts; past a volt the
 * stage is far outside its linear range and "the input that nulls the output" says nothing.
 */
export const VOS_SEARCH_LIMIT = 1;

/**
 * The DC differential input (split ±½ over the two input sources) that brings the output to
 * `target`, on re-solved operating points (each warm-started from the last): from the linear
 * guess −error/adm, the step is doubled until the error changes sign (within ±VOS_SEARCH_LIMIT),
 * then the bracket is closed by regula falsi with the Illinois modification (Dowell & Jarratt,
 * BIT 11, 1971), which keeps the root bracketed where a plain secant would leap off a saturated,
 * flat stretch of the transfer curve to a far, meaningless crossing. Undefined when the inputs are
 * not voltage sources, no sign change lies within the limit, or an operating point fails.
 * `solvedAtZero`, the circuit's own operating-point unknowns when the caller has them, is the
 * search's first point (one solve fewer per run).
 */
export function inputOffset(circuit: Circuit, ports: PortsRequest, target: number, admDc: number, solvedAtZero?: Float64Array): number | undefined {
  const inP = circuit.parts.find((p) => p.name === ports.inP);
  const inN = circuit.parts.find((p) => p.name === ports.inN);
  if (inP?.kind !== 'vsrc' || inN?.kind !== 'vsrc') return undefined;
  // Private copies of the two sources, moved per trial on one workspace (as dc-sweep.ts does):
  // the circuit's shape is laid out and analysed once for the whole search.
  const movedP: VoltageSource = { ...inP };
  const movedN: VoltageSource = { ...inN };
  const moved: Circuit = { ...circuit, parts: circuit.parts.map((p) => (p === inP ? movedP : p === inN ? movedN : p)) };
  const ws = borrowWorkspace(moved);
  const outP = nodeRow(ws.layout, ports.outP);
  const outN = ports.outN ? nodeRow(ws.layout, ports.outN) : -1;
  /** The output's error from the target at a solution of the unknowns. */
  const errorAt = (x: Float64Array) => (outP >= 0 ? x[outP] : 0) - (outN >= 0 ? x[outN] : 0) - target;
  let warm: Float64Array | undefined;
  const error = (vid: number): number | undefined => {
    movedP.dc = inP.dc + vid / 2;
    movedN.dc = inN.dc - vid / 2;
    // Only the output nodes are read: the unknowns, without the operating-point report.
    const x = solveUnknowns(ws, warm ? { x: warm } : undefined);
    if (isOpFailure(x)) return undefined;
    warm = x;
    return errorAt(x);
  };
  try {
    // The circuit's own operating point (no input moved) is the search's first point, when given.
    const atZero = solvedAtZero?.length === ws.n ? solvedAtZero : undefined;
    if (atZero) warm = atZero;
    const f0 = atZero ? errorAt(atZero) : error(0);
    return f0 === undefined ? undefined : nullingInput(error, f0, admDc, target);
  } finally {
    releaseWorkspace(ws);
  }
}

/** The root of `error` (f0 at 0) within ±VOS_SEARCH_LIMIT: bracketed from the linear guess, closed by {@link illinois}. */
function nullingInput(error: (vid: number) => number | undefined, f0: number, admDc: number, target: number): number | undefined {
  if (f0 === 0) return 0;
  // Bracket: from the linear guess outwards, doubling, in the guess's direction first.
  const guess = admDc !== 0 && Number.isFinite(admDc) ? -f0 / admDc : 1e-3;
  let step = Math.min(Math.max(Math.abs(guess), 1e-9), VOS_SEARCH_LIMIT) * (guess < 0 ? -1 : 1);
  let a = 0;
  let fa = f0;
  let b: number | undefined;
  let fb = 0;
  for (let tries = 0; tries < 80 && b === undefined; tries++) {
    const f = error(step);
    if (f === undefined) return undefined;
    if (f === 0) return step;
    if (Math.sign(f) !== Math.sign(f0)) {
      b = step;
      fb = f;
    } else if (Math.abs(step) >= VOS_SEARCH_LIMIT) {
      // Nothing this way: the other direction once, from the guess's size.
      if (Math.sign(step) === Math.sign(guess || 1)) step = -Math.min(Math.max(Math.abs(guess), 1e-9), VOS_SEARCH_LIMIT) * Math.sign(step);
      else return undefined;
    } else {
      a = step;
      fa = f;
      step = Math.sign(step) * Math.min(2 * Math.abs(step), VOS_SEARCH_LIMIT);
    }
  }
  if (b === undefined) return undefined;
  return illinois(error, a, fa, b, fb, target);
}

/** Closes the bracket [a, b] (errors fa, fb of opposite signs) on a root of `error`. */
function illinois(error: (x: number) => number | undefined, a: number, fa: number, b: number, fb: number, target: number): number | undefined {
  // Illinois: the end that stays twice in a row has its error halved, so both ends move.
  let side = 0;
  for (let k = 0; k < 100; k++) {
    const x: number = (a * fb - b * fa) / (fb - fa);
    if (Math.abs(b - a) <= 1e-13 + 1e-10 * Math.abs(x)) return x;
    const f = error(x);
    if (f === undefined) return undefined;
    if (f === 0) return x;
    if (Math.sign(f) === Math.sign(fb)) {
      b = x;
      fb = f;
      if (side === -1) fa /= 2;
      side = -1;
    } else {
      a = x;
      fa = f;
      if (side === 1) fb /= 2;
      side = 1;
    }
    if (Math.abs(f) <= 1e-12 * Math.max(1, Math.abs(target))) return x;
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

/**
 * What can be said of an `analyze mismatch` line before any run: too much work (an error: it will
 * not run) or no spreads (a warning). The bench's live solve leaves the runs to the Mismatch tab
 * but still shows these on the line as it is typed.
 */
export function mismatchPrecheck(circuit: Circuit, request: MismatchRequest): Diagnostic[] {
  if (request.runs * Math.max(1, circuit.parts.length) > MAX_MISMATCH_WORK) {
    return [diagnostic('error', 'sweep-too-large', request.loc,
      `analyze mismatch would solve ${request.runs} runs of ${circuit.parts.length} parts, more than ${MAX_MISMATCH_WORK.toLocaleString('en-US')} in all.`, 'use fewer runs')];
  }
  if (Object.keys(request.sigmas).length === 0) {
    return [diagnostic('warning', 'sweep-value-failed', request.loc, 'analyze mismatch has no spreads: every run is the circuit as written.', 'add spreads, e.g. `beta 5% is 2% res 0.5%`')];
  }
  return [];
}

/** The whole analysis in one thread (the CLI, tests); the bench splits `mismatchSamples` over workers. */
export function runMismatch(circuit: Circuit, requests: Requests): { member?: MismatchResult; diagnostics: Diagnostic[] } {
  const request = requests.analyses.find((a): a is MismatchRequest => a.kind === 'mismatch');
  if (!request) return { diagnostics: [] };
  const diagnostics = mismatchPrecheck(circuit, request);
  if (diagnostics.some((d) => d.severity === 'error')) return { diagnostics };
  const member = summarizeMismatch(request, mismatchSamples(circuit, requests, request, 0, request.runs));
  if (member.failed_runs > 0) {
    diagnostics.push(diagnostic('warning', 'sweep-value-failed', request.loc, `analyze mismatch: ${member.failed_runs} of ${request.runs} runs did not solve; the statistics are over the other runs.`));
  }
  const withoutVos = requests.ports && member.samples.vos ? (member.runs - member.failed_runs) - member.samples.vos.length : 0;
  if (withoutVos > 0) {
    diagnostics.push(diagnostic('warning', 'sweep-value-failed', request.loc,
      `analyze mismatch: in ${withoutVos} of ${member.runs - member.failed_runs} runs no input within ±${VOS_SEARCH_LIMIT} V brings the output back, so vos is over the other runs.`, 'the output may be pinned at a rail in those runs: look at the spread of the output voltage'));
  }
  return { member, diagnostics };
}
