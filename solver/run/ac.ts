/**
 * `analyze ac`: the small-signal response over a log-spaced sweep, driven by the sources' own
 * `ac=` values, plus the ports curves (adm, acm, cmrr) when a `ports` line solved. The result
 * member is `ac` (`freq_hz` and the curves); measures get the solutions for `ac(n)` and friends.
 */
import { diagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { Circuit } from '../circuit/types';
import type { Curve, AcResult } from '../circuit/result';
import { logSweep } from '../analysis/frequency';
import type { Excitation } from '../analysis/engine-api';
import { portsCurves } from '../analysis/ports';
import { fromPolar, type Phasor } from '../numeric/complex';
import { curveFromPhasors } from '../numeric/phasor-curve';
import { topLevelNodes, type AnalysisRunner } from './analysis-run';

/** The excitation of the sources' own `ac=` values. */
function ownExcitation(circuit: Circuit): Excitation & { sources: Map<string, Phasor> } {
  const sources = new Map<string, Phasor>();
  for (const p of circuit.parts) {
    if ((p.kind === 'vsrc' || p.kind === 'isrc') && p.ac && p.ac.mag !== 0) sources.set(p.name, fromPolar(p.ac.mag, p.ac.phaseDeg));
  }
  return { sources };
}

/** Runs the ac sweep of a resolved request (its range and point count were checked where it was read). */
export const runAc: AnalysisRunner<'ac', AcResult> = (circuit, bias, request) => {
  const diagnostics: Diagnostic[] = [];
  const sweep = logSweep(request.fromHz, request.toHz, request.perDecade);
  const ports = bias.ports?.outcome.result ? portsCurves(bias.solver, bias.ports.request, sweep) : undefined;
  const excitation = ownExcitation(circuit);
  if (excitation.sources.size === 0 && !bias.ports) {
    diagnostics.push(diagnostic('warning', 'no-ac-source', request.loc, 'analyze ac: no source has an `ac=` value, so every ac(n) curve is zero.', 'give the input source an excitation, e.g. `vin: vsrc(in, gnd) 0 ac=1`'));
  }
  const solutions = sweep.map((f) => bias.solver.solve(f, [excitation])[0]);
  const curves: Record<string, Curve> = {};
  if (ports) Object.assign(curves, ports);
  for (const n of topLevelNodes(circuit)) curves[`ac(${n})`] = curveFromPhasors(solutions.map((s) => s.v(n)));
  return { member: { freq_hz: sweep, curves }, diagnostics, measures: { ac: { freqHz: sweep, portsCurves: ports, solutions } } };
};
