/**
 * What a mismatch worker does with one chunk, apart from the messaging: parse the text once per
 * text (the same parse the CLI makes) and solve a range of runs with `mismatchSamples`. The
 * worker calls it; the specs' in-process workers call it too, so they answer exactly as it does.
 */
import { mismatchSamples, parseNetlist, type MismatchRequest, type ParseOptions } from '../../../../solver';
// The solver's own limit, so the bench refuses exactly what the CLI refuses.
import { MAX_MISMATCH_WORK } from '../../../../solver';
import type { ChunkReply, ChunkRequest } from './mismatch-protocol';

/** A parsed text ready to solve ranges of its runs, or why it cannot be. */
export type MismatchPlan =
  | { ok: true; solve: (from: number, to: number) => ReturnType<typeof mismatchSamples> }
  | { ok: false; message: string };

/** Parses `text` and checks its `analyze mismatch` line as the solver's one-thread run does. */
export function planMismatch(text: string, resolveUse?: ParseOptions['resolveUse']): MismatchPlan {
  const parsed = parseNetlist(text, { resolveUse });
  const circuit = parsed.circuit;
  const request = parsed.requests.analyses.find((a): a is MismatchRequest => a.kind === 'mismatch');
  if (!circuit) return { ok: false, message: 'The circuit has errors; fix them in the editor first.' };
  if (!request) return { ok: false, message: 'The netlist no longer asks for `analyze mismatch`.' };
  if (request.runs * Math.max(1, circuit.parts.length) > MAX_MISMATCH_WORK) {
    return { ok: false, message: `analyze mismatch would solve ${request.runs} runs of ${circuit.parts.length} parts, more than ${MAX_MISMATCH_WORK.toLocaleString('en-US')} in all: use fewer runs.` };
  }
  return { ok: true, solve: (from, to) => mismatchSamples(circuit, parsed.requests, request, from, Math.min(to, request.runs)) };
}

/** Keeps the plan of the last text (a pool sends many chunks of one text). */
export class ChunkSolver {
  private key: string | undefined;
  private plan: MismatchPlan | undefined;

  /** Answers one chunk; `resolveUse` resolves the text's `use` lines (already fetched). Never throws. */
  answer(chunk: ChunkRequest, resolveUse?: ParseOptions['resolveUse']): ChunkReply {
    const key = `${JSON.stringify(chunk.library)}\n${chunk.text}`;
    try {
      if (key !== this.key || !this.plan) {
        this.plan = planMismatch(chunk.text, resolveUse);
        this.key = key;
      }
      const plan = this.plan;
      if (!plan.ok) return { type: 'refused', job: chunk.job, message: plan.message };
      return { type: 'samples', job: chunk.job, from: chunk.from, to: chunk.to, samples: plan.solve(chunk.from, chunk.to) };
    } catch (err) {
      this.key = undefined;
      return { type: 'refused', job: chunk.job, message: `The solver hit an internal error: ${err instanceof Error ? err.message : String(err)}.` };
    }
  }

  /** Whether a chunk of this text and library would reuse the plan (no fetch, no parse). */
  knows(chunk: ChunkRequest): boolean {
    return this.key === `${JSON.stringify(chunk.library)}\n${chunk.text}`;
  }
}
