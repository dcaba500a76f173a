/**
 * The worker's answer to one text, from the solver's one parse: the result, the names the text
 * defines (the outline's symbols with its `use` lines as resolved) and its measure and check lines.
 * The worker sends it; the specs' fake workers build theirs with it too, so they answer as it does.
 */
import { solveWithOutline, type MismatchRequest, type OutlineUse, type SolveOptions, type SolveResult, type Steps } from '../../../solver';
import type { LibraryContext, MismatchAsk, SolveReply, UsedBlock } from './solver-protocol';

/** What is known of a `use` line beyond the line itself: by default, nothing (no library). */
export type DescribeUse = (use: OutlineUse) => UsedBlock;

const UNRESOLVED: DescribeUse = (use) => ({ ...use, docs: [] });

/** Options of a reply: where `use` lines resolve from and what is known of them. */
export interface ReplyOptions {
  resolveUse?: SolveOptions['resolveUse'];
  describeUse?: DescribeUse;
  library?: LibraryContext;
}

/**
 * Solves `text` once and shapes the reply to request `id`. `analyze mismatch` is left out of the
 * solve and reported in `mismatch` (with `library`, where the text's `use` lines resolved from):
 * the Mismatch tab runs it over a pool of workers (see mismatch/mismatch-pool.ts).
 */
export function solveReply(id: number, text: string, options: ReplyOptions = {}): SolveReply {
  return stagedSolveReply(id, text, options, false).reply;
}

/**
 * The worker's two-stage reply: with `defer`, `reply` holds everything but the analyses that
 * re-solve the circuit many times (`vary`, `temp`, `sensitivity`) and says so (`pending`);
 * `finishSteps` then solves those, in steps, and gives the whole result, the very one `solveReply` gives.
 */
export function stagedSolveReply(id: number, text: string, options: ReplyOptions, defer: boolean): { reply: SolveReply; finishSteps?: () => Steps<SolveResult> } {
  const started = performance.now();
  const { result, outline, skipped, finishSteps } = solveWithOutline(text, { resolveUse: options.resolveUse, skip: ['mismatch'], defer });
  const mismatch = skipped.find((a): a is MismatchRequest => a.kind === 'mismatch');
  const reply: SolveReply = {
    type: 'solved', id, result, text,
    names: { ...outline.symbols, uses: outline.uses.map(options.describeUse ?? UNRESOLVED) },
    lines: { measures: outline.measures, checks: outline.checks, analyses: outline.analyses },
    solveMs: performance.now() - started,
    ...(mismatch ? { mismatch: mismatchAsk(mismatch, options.library ?? {}) } : {}),
    ...(finishSteps ? { pending: true } : {}),
  };
  return { reply, finishSteps };
}

function mismatchAsk(request: MismatchRequest, library: LibraryContext): MismatchAsk {
  return { line: request.loc.line, runs: request.runs, seed: request.seed, sigmas: { ...request.sigmas }, library };
}
