/**
 * What every analysis beyond the operating point is: a function of the elaborated circuit, the
 * bias point it was linearised at, and its own resolved request, returning its member of the
 * result and its diagnostics. New analyses are added as one such function and one row of the
 * table in `analyses.ts`; nothing else needs to know about them.
 */
import type { AnalysisRequest, PortsRequest } from '../circuit/analyses';
import type { Diagnostic } from '../circuit/diagnostic';
import type { Circuit } from '../circuit/types';
import type { AcSolver, LinearSystem, OperatingPoint } from '../analysis/engine-api';
import type { PortsOutcome } from '../analysis/ports';
import type { MeasureContext } from '../measure/functions';

/** The operating point and the small-signal circuit around it, shared by every analysis of one run. */
export interface BiasPoint {
  op: OperatingPoint;
  system: LinearSystem;
  solver: AcSolver;
  /** The resolved `ports` line and what solving it gave (its figures when it succeeded). */
  ports?: { request: PortsRequest; outcome: PortsOutcome };
}

/** One analysis's contribution to a run. */
export interface AnalysisOutcome<Member> {
  /** The result member (absent when the analysis could not produce one; its diagnostics say why). */
  member?: Member;
  diagnostics: Diagnostic[];
  /** What the analysis offers measures (`ac` offers its sweep to `ac(n)`, `corner`, …; `noise` its densities; `poles` its lists). */
  measures?: Partial<Pick<MeasureContext, 'ac' | 'noise' | 'poles'>>;
}

/** The request of one analysis kind. */
export type RequestOf<K extends AnalysisRequest['kind']> = Extract<AnalysisRequest, { kind: K }>;

/** An analysis: (circuit, bias point, its request) → its member and diagnostics. */
export type AnalysisRunner<K extends AnalysisRequest['kind'], Member> = (circuit: Circuit, bias: BiasPoint, request: RequestOf<K>) => AnalysisOutcome<Member>;

/** Top-level node names (those of block instances are dotted). */
export function topLevelNodes(circuit: Circuit): string[] {
  return circuit.nodes.filter((n) => !n.includes('.'));
}
