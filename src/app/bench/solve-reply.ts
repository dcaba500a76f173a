/**
 * The worker's answer to one text, from the solver's one parse: the result, the names the text
 * defines (the outline's symbols with its `use` lines as resolved) and its measure and check lines.
 * The worker sends it; the specs' fake workers build theirs with it too, so they answer as it does.
 */
import { solveWithOutline, type OutlineUse, type SolveOptions } from '../../../solver';
import type { SolveReply, UsedBlock } from './solver-protocol';

/** What is known of a `use` line beyond the line itself: by default, nothing (no library). */
export type DescribeUse = (use: OutlineUse) => UsedBlock;

const UNRESOLVED: DescribeUse = (use) => ({ ...use, docs: [] });

/** Solves `text` once and shapes the reply to request `id`. */
export function solveReply(id: number, text: string, options: { resolveUse?: SolveOptions['resolveUse']; describeUse?: DescribeUse } = {}): SolveReply {
  const started = performance.now();
  const { result, outline } = solveWithOutline(text, { resolveUse: options.resolveUse });
  return {
    type: 'solved', id, result, text,
    names: { ...outline.symbols, uses: outline.uses.map(options.describeUse ?? UNRESOLVED) },
    lines: { measures: outline.measures, checks: outline.checks },
    solveMs: performance.now() - started,
  };
}
