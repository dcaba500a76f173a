/**
 * What the results show, derived from a SolverClient's replies. The bench and the shared view
 * both read their numbers through this one class, so a reviewer opening a share link sees
 * exactly what the author's bench showed for the same text.
 *
 * The rule (docs/netlist.md, note 19): a mistake confined to a request line (measure, check,
 * analyze, ports) drops that request only, and the circuit still solves — so the panels show the
 * current text's results, request errors and all. Only when the circuit itself could not be
 * solved (no operating point) do they fall back on the last result that solved, and then that
 * result is marked stale, as it is after a cancel, a worker failure or while a long solve runs.
 */
import { computed, type Signal } from '@angular/core';
import type { Diagnostic, SolveResult } from '../../../solver';
import type { SolverClient, SolveStatus } from './solver-client';
import { libraryNotices } from './library-notices';
import { NO_LINES, NO_NAMES, type NetlistNames, type RequestLines, type SolveReply } from './solver-protocol';

/** Why the figures on screen are not the current text's. */
export type StaleReason =
  /** The text's circuit did not solve (errors in its parts, models or params, or no convergence). */
  | 'circuit'
  /** The solve of the current text was cancelled. */
  | 'cancelled'
  /** The solver worker stopped. */
  | 'failed'
  /** The current text is still solving, past SLOW_MS. */
  | 'solving';

/** What the client knows, as the decision reads it. */
export interface ViewInputs {
  /** The newest reply (for the newest text sent). */
  reply: SolveReply | undefined;
  /** The newest reply whose circuit solved. */
  lastSolved: SolveReply | undefined;
  status: SolveStatus;
  slow: boolean;
}

/** What the panels show: a reply, and whether (and why) it is not the current text's. */
export interface ViewDecision {
  shown: SolveReply | undefined;
  stale: StaleReason | undefined;
}

/** Whether a result's circuit solved: request errors leave the operating point in place. */
export function circuitSolved(result: SolveResult): boolean {
  return !!result.op;
}

/** The decision table of what the panels show (see the file comment). */
export function decideView({ reply, lastSolved, status, slow }: ViewInputs): ViewDecision {
  const fallBack = !!reply && !circuitSolved(reply.result) && !!lastSolved;
  const shown = fallBack ? lastSolved : reply;
  if (!shown) return { shown, stale: undefined };
  if (status === 'failed') return { shown, stale: 'failed' };
  if (status === 'cancelled') return { shown, stale: 'cancelled' };
  if (slow) return { shown, stale: 'solving' };
  return { shown, stale: fallBack ? 'circuit' : undefined };
}

/** A reply's whole result: the second stage's when it completed, else the first's. */
function wholeOf(reply: SolveReply | undefined): SolveResult | undefined {
  return reply?.whole ?? reply?.result;
}

/** Equal plain data (small: a netlist's diagnostics or names). */
function sameData<T>(a: T, b: T): boolean {
  return a === b || JSON.stringify(a) === JSON.stringify(b);
}

export class SolveView {
  /** The newest result, for the newest text. */
  readonly latest: Signal<SolveResult | undefined>;
  /** Errors and warnings of the newest result, in text order. */
  readonly diagnostics: Signal<Diagnostic[]>;
  readonly errorCount: Signal<number>;
  readonly names: Signal<NetlistNames>;
  readonly solveMs: Signal<number | undefined>;
  /**
   * What the panels show (see `decideView`): the first stage's result, the same object once the
   * second stage completes, so panels that read only it are not redrawn then.
   */
  readonly shown: Signal<SolveResult | undefined>;
  /** The shown reply's whole result: with its sweeps and sensitivity once they completed. */
  readonly shownWhole: Signal<SolveResult | undefined>;
  /** The measure and check lines of the shown result's text, from the parse that gave it. */
  readonly shownLines: Signal<RequestLines>;
  /** Why the shown result is not the current text's, if it is not. */
  readonly staleReason: Signal<StaleReason | undefined>;
  /** The shown result is not the current text's: every figure is marked and nothing shows a pass in green. */
  readonly stale: Signal<boolean>;
  /** The shown result's sweeps and sensitivity are still being solved (see SolveReply.pending). */
  readonly pending: Signal<boolean>;

  constructor(client: SolverClient) {
    this.latest = computed(() => wholeOf(client.reply()));
    // Most keystrokes change values, not diagnostics or names: keeping the same array (and object)
    // then spares the editor's lint and completion, and the problems list, a redo per keystroke.
    this.diagnostics = computed(() => {
      const reply = client.reply();
      if (!reply) return [];
      const r = wholeOf(reply)!;
      return [...r.errors, ...r.warnings, ...libraryNotices(reply.names.uses, reply.text)].sort((a, b) => a.line - b.line || a.col - b.col);
    }, { equal: sameData });
    this.errorCount = computed(() => this.latest()?.errors.length ?? 0);
    this.names = computed(() => client.reply()?.names ?? NO_NAMES, { equal: sameData });
    this.solveMs = computed(() => client.reply()?.solveMs);
    const decision = computed(() => decideView({ reply: client.reply(), lastSolved: client.lastSolved(), status: client.status(), slow: client.slow() }));
    this.shown = computed(() => decision().shown?.result);
    this.shownWhole = computed(() => wholeOf(decision().shown));
    this.shownLines = computed(() => decision().shown?.lines ?? NO_LINES);
    this.staleReason = computed(() => decision().stale);
    this.stale = computed(() => decision().stale !== undefined);
    this.pending = computed(() => decision().shown?.pending === true);
  }
}
