/**
 * The analyses this version runs, by kind, in the order they run (and their members appear in
 * the result). An `analyze` kind of the language without a row here is reported as not yet
 * available. A row's key is both the analysis keyword and its member of the §5 result.
 */
import type { AnalysisRequest } from '../circuit/analyses';
import { diagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { AcResult, NoiseResult, PolesResult, TransferResult } from '../circuit/result';
import { runAc } from './ac';
import type { AnalysisRunner } from './analysis-run';
import { runNoise } from './noise';
import { runPoles } from './poles';
import { runTransfer } from './transfer';

/** The result member each running analysis fills. */
export interface AnalysisMembers {
  ac: AcResult;
  transfer: TransferResult;
  noise: NoiseResult;
  poles: PolesResult;
}

export type RunningKind = keyof AnalysisMembers;

/** One runner per kind: the dispatch table. */
export const ANALYSIS_RUNNERS: { readonly [K in RunningKind]: AnalysisRunner<K, AnalysisMembers[K]> } = {
  ac: runAc,
  transfer: runTransfer,
  noise: runNoise,
  poles: runPoles,
};

/** The kinds that run, in table order. */
export const RUNNING_KINDS = Object.keys(ANALYSIS_RUNNERS) as RunningKind[];

export function isRunning(kind: AnalysisRequest['kind']): kind is RunningKind {
  return Object.hasOwn(ANALYSIS_RUNNERS, kind);
}

/** A warning for each requested analysis this version does not run yet; the line is skipped. */
export function unavailableAnalyses(analyses: readonly AnalysisRequest[]): Diagnostic[] {
  return analyses
    .filter((r) => !isRunning(r.kind))
    .map((r) => diagnostic('warning', 'analysis-not-available', r.loc, `analyze ${r.kind} is not yet available in this version; the line is skipped.`, 'the other analyses run as usual'));
}
