/**
 * Phase 2's outage: PostgreSQL stopped `stopAfterMs` into the phase and started 5 s after it is
 * down; then, from the clients' answers and the watcher's probes, when the outage was and how long
 * the server took to acknowledge a save once the database was back.
 */
import type { ClusterControl, Watch } from './cluster';
import type { Outage } from './report';
import type { PhaseResult } from './tally';

const DOWN_FOR_MS = 5000;

export interface Restart {
  /** Epoch ms of each step. */
  marks: { stopAsked?: number; stopDone?: number; startAsked?: number; startDone?: number };
  /** Whether the cluster is stopped by us and not yet started again. */
  down(): boolean;
  /** Settles when the restart is over (or was never begun); rejects if a step failed. */
  done(): Promise<void>;
  cancel(): void;
}

export function scheduleRestart(control: ClusterControl, database: string, stopAfterMs: number, stopped: Promise<void>): Restart {
  const marks: Restart['marks'] = {};
  let down = false;
  let cancelled = false;
  let running: Promise<void> = Promise.resolve();
  const sequence = async () => {
    marks.stopAsked = Date.now();
    down = true;
    await control.stop();
    marks.stopDone = Date.now();
    await Promise.race([new Promise((r) => setTimeout(r, DOWN_FOR_MS)), stopped]);
    if (cancelled) return;
    marks.startAsked = Date.now();
    await control.start(database);
    marks.startDone = Date.now();
    down = false;
  };
  const timer = setTimeout(() => {
    running = sequence();
    running.catch(() => undefined);
  }, stopAfterMs);
  return {
    marks,
    down: () => down,
    done: () => running,
    cancel() {
      cancelled = true;
      clearTimeout(timer);
    },
  };
}

/** The outage as the phase saw it, in seconds from the phase's start. */
export function outageOf(phase: PhaseResult, marks: Restart['marks'], watch: Watch): Outage {
  const rel = (at: number | undefined) => (at === undefined ? null : Math.round((at - phase.startedAt) / 100) / 10);
  const earliest = (...times: (number | undefined)[]) => {
    const known = times.filter((t): t is number => t !== undefined);
    return known.length ? Math.min(...known) : undefined;
  };
  // Down: the watcher's first refusal, or pg_ctl's return if that came sooner; up likewise.
  const downAt = earliest(watch.changes.find((c) => !c.up && c.at >= (marks.stopAsked ?? Infinity))?.at, marks.stopDone);
  const upAt = earliest(watch.changes.find((c) => c.up && c.at > (downAt ?? Infinity))?.at, marks.startDone);
  const firstSave = upAt === undefined ? undefined : phase.acks.find((a) => a.at >= upAt)?.at;
  return {
    stopAskedAt: rel(marks.stopAsked) ?? 0,
    downAt: rel(downAt),
    startAskedAt: rel(marks.startAsked),
    upAt: rel(upAt),
    clientsFirstFailure: rel(phase.firstFailureAt),
    clientsLastFailure: rel(phase.lastFailureAt),
    recovery: upAt !== undefined && firstSave !== undefined ? Math.round((firstSave - upAt) / 100) / 10 : null,
  };
}
