/**
 * The differential ports: differential- and common-mode gains and CMRR of a two-input stage.
 *
 * The two named sources are driven by the tool itself, whatever their own `ac=` says:
 *   differential mode: +½ on the first, −½ on the second  → vid = 1, vic = 0;
 *   common mode:       +1 on both                          → vid = 0, vic = 1.
 * With a differential output vod = v(outP) − v(outN), voc = (v(outP) + v(outN))/2; with a single
 * output vod = voc = v(outP). adm = vod/vid, acm = voc/vic, cmrr = |adm/acm|.
 *
 * An ideal, perfectly symmetric circuit with a differential output has acm = 0 exactly and an
 * unbounded CMRR. JSON has no infinity and a designer reads "more than any real circuit", so
 * CMRR is capped at CMRR_CAP (1e15, 300 dB) and a warning says so.
 */
import { diagnostic, type Diagnostic, type DiagnosticCode, type SourceLoc } from '../circuit/diagnostic';
import { GROUND } from '../circuit/types';
import type { PortsRequest } from '../circuit/analyses';
import type { Curve, PortsResult } from '../circuit/result';
import type { AcSolution, AcSolver, Excitation, LinearSystem } from './engine-api';
import { cadd, cscale, csub, cx, decibels, magnitude, toFigure, type Phasor } from '../numeric/complex';
import { curveFromPhasors } from '../numeric/phasor-curve';
import { isSingular } from './ac-solve';

/** Largest CMRR reported (300 dB): stands for "unbounded" when acm is exactly zero. */
export const CMRR_CAP = 1e15;

export interface PortsOutcome {
  /** The §5 `ports` member; absent when the request could not be honoured (see diagnostics). */
  result?: PortsResult;
  /** adm and acm as phasors at the ports frequency, for measures. */
  adm?: Phasor;
  acm?: Phasor;
  /** adm, acm and cmrr over the ac sweep, when one was given. */
  curves?: { adm: Curve; acm: Curve; cmrr: Curve };
  diagnostics: Diagnostic[];
}

/** CMRR from the two gains, capped at CMRR_CAP. `degenerate` when acm = 0 (or both are 0). */
export function cmrrOf(adm: Phasor, acm: Phasor): { cmrr: number; capped: boolean; silent: boolean } {
  const a = magnitude(adm);
  const c = magnitude(acm);
  if (a === 0 && c === 0) return { cmrr: 1, capped: false, silent: true };
  if (c === 0 || a / c > CMRR_CAP) return { cmrr: CMRR_CAP, capped: true, silent: false };
  return { cmrr: a / c, capped: false, silent: false };
}

/** Problems of the ports line point at its start (line and column only, as they always have). */
function warning(code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): Diagnostic {
  return diagnostic('warning', code, { line: loc.line, col: loc.col }, message, hint);
}

function error(code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): Diagnostic {
  return diagnostic('error', code, { line: loc.line, col: loc.col }, message, hint);
}

/** The definitions, in words, with the netlist's own names. */
export function portsConventions(req: PortsRequest): string {
  const [a, b] = [req.inP, req.inN];
  const out = req.outN
    ? `vod = v(${req.outP}) − v(${req.outN}), voc = (v(${req.outP}) + v(${req.outN}))/2`
    : `single-ended output: vod = voc = v(${req.outP})`;
  return (
    `vid = ${a} − ${b}, vic = (${a} + ${b})/2 (differential drive +½/−½, common-mode drive +1/+1, the sources' own ac= ignored); ` +
    `${out}; adm = vod/vid, acm = voc/vic, cmrr = |adm/acm|, cmrr_db = 20·log10(cmrr); ` +
    `small-signal at ${req.atHz} Hz${req.atHz === 0 ? ' (capacitors open, inductors shorted)' : ''}; cmrr capped at 1e15 (300 dB).`
  );
}

/** The two excitations: differential mode first, common mode second. */
function excitations(req: PortsRequest): Excitation[] {
  return [
    { sources: new Map([[req.inP, cx(0.5)], [req.inN, cx(-0.5)]]) },
    { sources: new Map([[req.inP, cx(1)], [req.inN, cx(1)]]) },
  ];
}

function gains(req: PortsRequest, [dm, cm]: AcSolution[]): { adm: Phasor; acm: Phasor } {
  const v = (s: AcSolution, n: string) => (n === GROUND ? cx(0) : s.v(n));
  if (req.outN === undefined) return { adm: v(dm, req.outP), acm: v(cm, req.outP) };
  const vod = csub(v(dm, req.outP), v(dm, req.outN));
  const voc = cscale(cadd(v(cm, req.outP), v(cm, req.outN)), 0.5);
  // vid = 1 in the differential drive and vic = 1 in the common-mode drive: the gains are the outputs.
  return { adm: vod, acm: voc };
}

/**
 * Solves the ports request at its own frequency and, when `sweepHz` is given, over the sweep.
 * The request is resolved (two different independent sources, existing nodes, a frequency of
 * 0 Hz or more: checked where the ports line is read). Never throws: problems of the solve come
 * back as diagnostics on the `ports` line.
 */
export function analyzePorts(system: LinearSystem, solver: AcSolver, req: PortsRequest, sweepHz?: number[]): PortsOutcome {
  const diagnostics: Diagnostic[] = [];
  const drive = excitations(req);
  const atSolutions = solver.solve(req.atHz, drive);
  if (atSolutions.some(isSingular)) {
    return { diagnostics: [error('ports-singular', req.loc, `ports: the small-signal circuit is singular at ${req.atHz} Hz, so the gains are undefined.`, 'look for a loop of voltage sources or a node held only by capacitors')] };
  }
  const { adm, acm } = gains(req, atSolutions);
  const { cmrr, capped, silent } = cmrrOf(adm, acm);
  if (silent) {
    diagnostics.push(warning('ports-no-response', req.loc, `ports: the output does not respond to either input at ${req.atHz} Hz (adm = acm = 0).`, 'check that the output nodes connect to the stage the sources drive'));
  } else if (capped) {
    diagnostics.push(warning('cmrr-unbounded', req.loc, 'ports: the common-mode gain is zero (a perfectly symmetric circuit), so CMRR is unbounded; it is reported as 1e15 (300 dB).', 'add mismatch or a finite tail impedance to see a real CMRR'));
  }
  if ([req.inP, req.inN].some((s) => system.sources.get(s)?.kind === 'isrc')) {
    diagnostics.push(warning('ports-current-drive', req.loc, 'ports: a current source drives the input, so adm and acm are transimpedances in ohms.'));
  }
  const result: PortsResult = {
    at_hz: req.atHz,
    output: req.outN === undefined ? 'single-ended' : 'differential',
    adm: toFigure(adm),
    acm: toFigure(acm),
    cmrr,
    cmrr_db: decibels(cmrr),
    conventions: portsConventions(req),
  };
  const outcome: PortsOutcome = { result, adm, acm, diagnostics };
  if (sweepHz && sweepHz.length > 0) outcome.curves = portsCurves(solver, req, sweepHz);
  return outcome;
}

/** adm, acm and cmrr of a ports request over a frequency sweep (the ac analysis's ports curves). */
export function portsCurves(solver: AcSolver, req: PortsRequest, sweepHz: readonly number[]): { adm: Curve; acm: Curve; cmrr: Curve } {
  const drive = excitations(req);
  const admPoints: Phasor[] = [];
  const acmPoints: Phasor[] = [];
  const cmrrPoints: Phasor[] = [];
  for (const f of sweepHz) {
    const g = gains(req, solver.solve(f, drive));
    admPoints.push(g.adm);
    acmPoints.push(g.acm);
    // cmrr is a magnitude by definition: its curve is real and positive (phase 0).
    cmrrPoints.push(cx(cmrrOf(g.adm, g.acm).cmrr));
  }
  return { adm: curveFromPhasors(admPoints), acm: curveFromPhasors(acmPoints), cmrr: curveFromPhasors(cmrrPoints) };
}
