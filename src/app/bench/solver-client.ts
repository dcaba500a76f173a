/**
 * The bench's side of the solver worker: it decides WHEN to solve and makes sure only the
 * newest text's result is ever shown. The main thread never solves.
 *
 * Timing, chosen so results follow the typing with no quiet period to wait for:
 *  - every edit is solved at once (edits made in one task — a paste with its autoindent — are one
 *    solve); one solve runs at a time, and texts typed meanwhile are coalesced: only the newest
 *    is solved next;
 *  - a solve still running when newer text arrives is stale and its reply is dropped. Ending it
 *    has a price, because a worker cannot be interrupted, only terminated. So a stale solve that
 *    the previous solve's time says is nearly done is left to finish — for at most FINISH_MS more
 *    — and the newest text follows on the same worker; otherwise its worker is terminated and
 *    the newest text goes at once to a warm spare whose module is already loaded, and a new spare
 *    loads on the core the terminated solve just freed;
 *  - a solve longer than SLOW_MS raises `slow`, for a progress indicator with a cancel button.
 */
import { DestroyRef, inject, Injectable, InjectionToken, signal } from '@angular/core';
import type { SolveReply, SolveRequest, WorkerMessage } from './solver-protocol';

/** The part of a Worker the client uses (a fake stands in for it in unit tests). */
export interface WorkerLike {
  postMessage(message: SolveRequest): void;
  terminate(): void;
  onmessage: ((event: MessageEvent<WorkerMessage>) => void) | null;
  onerror: ((event: ErrorEvent) => void) | null;
}

export type WorkerFactory = () => WorkerLike;

/** Makes the real module worker; the builder bundles solver.worker.ts as its own lazy chunk. */
export const SOLVER_WORKER_FACTORY = new InjectionToken<WorkerFactory>('solver worker factory', {
  providedIn: 'root',
  factory: () => () => new Worker(new URL('./solver.worker', import.meta.url), { type: 'module' }) as unknown as WorkerLike,
});

/** The longest a stale solve is left to finish before its worker is terminated. */
export const FINISH_MS = 30;
export const SLOW_MS = 300;
/** After the first reply, the spare worker is spawned this much later (off the page's first paint). */
export const SPARE_DELAY_MS = 500;

export type SolveStatus = 'idle' | 'waiting' | 'solving' | 'cancelled' | 'failed';

/** The solve on the active worker. */
interface Running {
  id: number;
  startedAt: number;
  /** Newer text has arrived: the reply will be dropped. */
  stale: boolean;
}

@Injectable()
export class SolverClient {
  private readonly makeWorker = inject(SOLVER_WORKER_FACTORY);
  private worker: WorkerLike | undefined;
  /** A loaded, idle worker that takes over at once when the active one is terminated. */
  private spare: WorkerLike | undefined;
  private nextId = 1;
  private running: Running | undefined;
  private pendingText: string | undefined;
  private flushTimer: ReturnType<typeof setTimeout> | undefined;
  private finishTimer: ReturnType<typeof setTimeout> | undefined;
  private slowTimer: ReturnType<typeof setTimeout> | undefined;
  private spareTimer: ReturnType<typeof setTimeout> | undefined;
  /** Post-to-reply time of the last solve that finished, ms: how long the next is likely to take. */
  private lastSolveMs: number | undefined;
  private disposed = false;

  /** The newest reply (only ever for the newest text sent). */
  readonly reply = signal<SolveReply | undefined>(undefined);
  /** The newest reply whose circuit solved (it has an operating point); see `forgetLastSolved`. */
  readonly lastSolved = signal<SolveReply | undefined>(undefined);
  /** @deprecated The former name of `lastSolved`, kept until the bias panel reads the new one. */
  readonly lastClean = this.lastSolved;
  readonly status = signal<SolveStatus>('idle');
  /** True while a solve has taken longer than SLOW_MS. */
  readonly slow = signal(false);
  /** A worker failure that is not a netlist problem (e.g. the worker script failed to load). */
  readonly failure = signal<string | undefined>(undefined);
  /** How many running solves were terminated for newer text (for diagnostics and tests). */
  readonly abandoned = signal(0);

  constructor() {
    inject(DestroyRef, { optional: true })?.onDestroy(() => this.dispose());
  }

  /** Spawns the worker ahead of the first solve so its module is loaded by then. */
  warmUp(): void {
    this.ensureWorker();
  }

  /** New text from the editor: solved as soon as the worker is free (see the timing rules above). */
  edit(text: string): void {
    this.pendingText = text;
    this.status.set('waiting');
    this.flushTimer ??= setTimeout(() => this.flush(), 0);
  }

  /** Solve this text now (Ctrl-Enter, opening a file or an example). */
  solveNow(text: string): void {
    this.pendingText = text;
    this.flush();
  }

  /** Another netlist is opened: its results must not fall back on the previous one's. */
  forgetLastSolved(): void {
    this.lastSolved.set(undefined);
  }

  /** @deprecated The former name of `forgetLastSolved`, kept until the shared view calls the new one. */
  forgetClean(): void {
    this.forgetLastSolved();
  }

  /** Stops the solve in progress (and any scheduled one); the last result stays. */
  cancel(): void {
    this.clearFlush();
    this.pendingText = undefined;
    if (this.running) this.abandonRunning();
    this.status.set('cancelled');
  }

  /** Sends the pending text, unless a solve is running: then decides what becomes of that one. */
  private flush(): void {
    this.clearFlush();
    const text = this.pendingText;
    if (text === undefined || this.disposed) return;
    if (this.running) {
      this.running.stale = true;
      if (this.worthFinishing(this.running)) {
        this.finishTimer ??= setTimeout(() => this.giveUpOnStale(), FINISH_MS);
        return; // the reply of the stale solve sends the pending text
      }
      this.abandonRunning();
    }
    this.pendingText = undefined;
    const id = this.nextId++;
    this.running = { id, startedAt: performance.now(), stale: false };
    this.status.set('solving');
    this.clearSlow();
    this.slowTimer = setTimeout(() => this.slow.set(true), SLOW_MS);
    this.ensureWorker().postMessage({ type: 'solve', id, text });
  }

  /** Whether a stale solve is likely to end within FINISH_MS, judging by the last solve's time. */
  private worthFinishing(running: Running): boolean {
    if (this.lastSolveMs === undefined) return false;
    return this.lastSolveMs - (performance.now() - running.startedAt) <= FINISH_MS;
  }

  private giveUpOnStale(): void {
    this.finishTimer = undefined;
    if (!this.running?.stale) return;
    this.abandonRunning();
    this.flush();
  }

  private onMessage(source: WorkerLike, message: WorkerMessage): void {
    if (source !== this.worker || message.type !== 'solved' || message.id !== this.running?.id) return;
    const { stale, startedAt } = this.running;
    this.running = undefined;
    this.lastSolveMs = performance.now() - startedAt;
    this.clearFinish();
    this.clearSlow();
    this.failure.set(undefined);
    if (!stale) {
      this.reply.set(message);
      if (message.result.op) this.lastSolved.set(message);
    }
    this.scheduleSpare();
    if (this.pendingText !== undefined) this.flush();
    else this.status.set('idle');
  }

  private onError(source: WorkerLike, event: ErrorEvent): void {
    event.preventDefault?.();
    source.terminate();
    if (source === this.spare) {
      // A spare that fails to load is not worth a second try; the active worker carries on.
      this.spare = undefined;
      return;
    }
    this.running = undefined;
    this.clearFinish();
    this.clearSlow();
    this.worker = this.spare;
    this.spare = undefined;
    this.failure.set(event.message || 'The solver worker stopped unexpectedly.');
    this.status.set('failed');
  }

  /** Terminates the worker busy with stale text; the spare, when there is one, takes its place. */
  private abandonRunning(): void {
    this.running = undefined;
    this.clearFinish();
    this.clearSlow();
    this.worker?.terminate();
    this.worker = this.spare;
    this.abandoned.update((n) => n + 1);
    if (this.spare) {
      // The terminated solve freed a core: the next spare loads on it.
      this.spare = this.spawn();
    } else {
      // No spare yet: a fresh worker starts loading now; a spare follows its first reply.
      this.ensureWorker();
    }
  }

  private ensureWorker(): WorkerLike {
    this.worker ??= this.spawn();
    return this.worker;
  }

  private spawn(): WorkerLike {
    const worker = this.makeWorker();
    worker.onmessage = (e) => this.onMessage(worker, e.data);
    worker.onerror = (e) => this.onError(worker, e);
    return worker;
  }

  /** The first spare is spawned a little after a reply, so it never delays the page's first results. */
  private scheduleSpare(): void {
    if (this.spare || this.spareTimer !== undefined || this.disposed) return;
    this.spareTimer = setTimeout(() => {
      this.spareTimer = undefined;
      if (!this.disposed) this.spare ??= this.spawn();
    }, SPARE_DELAY_MS);
  }

  private clearFlush(): void {
    if (this.flushTimer !== undefined) clearTimeout(this.flushTimer);
    this.flushTimer = undefined;
  }

  private clearFinish(): void {
    if (this.finishTimer !== undefined) clearTimeout(this.finishTimer);
    this.finishTimer = undefined;
  }

  private clearSlow(): void {
    if (this.slowTimer !== undefined) clearTimeout(this.slowTimer);
    this.slowTimer = undefined;
    this.slow.set(false);
  }

  private dispose(): void {
    this.disposed = true;
    this.clearFlush();
    this.clearFinish();
    this.clearSlow();
    if (this.spareTimer !== undefined) clearTimeout(this.spareTimer);
    this.worker?.terminate();
    this.spare?.terminate();
    this.worker = undefined;
    this.spare = undefined;
  }
}
