/**
 * The bench's side of the solver worker: it decides WHEN to solve and makes sure only the
 * newest text's result is ever shown. The main thread never solves.
 *
 * Timing, chosen so live solving feels immediate without solving every keystroke of a word:
 *  - an edit after a pause (nothing typed for IDLE_MS) is solved after QUICK_MS — one changed
 *    value shows its numbers at once;
 *  - edits in a burst are coalesced: the solve starts DEBOUNCE_MS after the last keystroke;
 *  - a solve still running when newer text arrives is stale: the worker is terminated and a fresh
 *    one spawned (a worker cannot be interrupted any other way), so a slow netlist never queues;
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

export const DEBOUNCE_MS = 150;
export const QUICK_MS = 20;
export const IDLE_MS = 600;
export const SLOW_MS = 300;

export type SolveStatus = 'idle' | 'waiting' | 'solving' | 'cancelled' | 'failed';

@Injectable()
export class SolverClient {
  private readonly makeWorker = inject(SOLVER_WORKER_FACTORY);
  private worker: WorkerLike | undefined;
  private nextId = 1;
  /** Id of the request in flight, if any. */
  private running: number | undefined;
  private pendingText: string | undefined;
  private debounceTimer: ReturnType<typeof setTimeout> | undefined;
  private slowTimer: ReturnType<typeof setTimeout> | undefined;
  private lastEditAt = Number.NEGATIVE_INFINITY;
  private disposed = false;

  /** The newest reply (only ever for the newest text sent). */
  readonly reply = signal<SolveReply | undefined>(undefined);
  /** The newest reply whose result has no errors (see `forgetClean`). */
  readonly lastClean = signal<SolveReply | undefined>(undefined);
  readonly status = signal<SolveStatus>('idle');
  /** True while a solve has taken longer than SLOW_MS. */
  readonly slow = signal(false);
  /** A worker failure that is not a netlist problem (e.g. the worker script failed to load). */
  readonly failure = signal<string | undefined>(undefined);
  /** How many running solves were abandoned for newer text (for diagnostics and tests). */
  readonly abandoned = signal(0);

  constructor() {
    inject(DestroyRef, { optional: true })?.onDestroy(() => this.dispose());
  }

  /** Spawns the worker ahead of the first solve so its module is loaded by then. */
  warmUp(): void {
    this.ensureWorker();
  }

  /** New text from the editor: solve it soon (see the timing rules above). */
  edit(text: string, now = performance.now()): void {
    const afterPause = now - this.lastEditAt >= IDLE_MS;
    this.lastEditAt = now;
    this.pendingText = text;
    if (this.running !== undefined) this.abandonRunning();
    this.clearDebounce();
    this.status.set('waiting');
    this.debounceTimer = setTimeout(() => this.flush(), afterPause ? QUICK_MS : DEBOUNCE_MS);
  }

  /** Solve this text now (Ctrl-Enter, opening a file or an example). */
  solveNow(text: string): void {
    this.pendingText = text;
    this.clearDebounce();
    this.lastEditAt = performance.now();
    this.flush();
  }

  /** Another netlist is opened: its results must not fall back on the previous one's. */
  forgetClean(): void {
    this.lastClean.set(undefined);
  }

  /** Stops the solve in progress (and any scheduled one); the last result stays. */
  cancel(): void {
    this.clearDebounce();
    this.pendingText = undefined;
    if (this.running !== undefined) this.abandonRunning();
    this.status.set('cancelled');
  }

  private flush(): void {
    this.debounceTimer = undefined;
    const text = this.pendingText;
    if (text === undefined || this.disposed) return;
    this.pendingText = undefined;
    if (this.running !== undefined) this.abandonRunning();
    const id = this.nextId++;
    this.running = id;
    this.status.set('solving');
    this.clearSlow();
    this.slowTimer = setTimeout(() => this.slow.set(true), SLOW_MS);
    this.ensureWorker().postMessage({ type: 'solve', id, text });
  }

  private onMessage(message: WorkerMessage): void {
    if (message.type !== 'solved' || message.id !== this.running) return;
    this.running = undefined;
    this.clearSlow();
    this.failure.set(undefined);
    this.reply.set(message);
    if (message.result.errors.length === 0) this.lastClean.set(message);
    this.status.set(this.pendingText !== undefined ? 'waiting' : 'idle');
  }

  private onError(event: ErrorEvent): void {
    event.preventDefault?.();
    this.running = undefined;
    this.clearSlow();
    this.worker?.terminate();
    this.worker = undefined;
    this.failure.set(event.message || 'The solver worker stopped unexpectedly.');
    this.status.set('failed');
  }

  /** Terminates the worker busy with stale text and spawns a fresh one. */
  private abandonRunning(): void {
    this.running = undefined;
    this.clearSlow();
    this.worker?.terminate();
    this.worker = undefined;
    this.abandoned.update((n) => n + 1);
    this.ensureWorker();
  }

  private ensureWorker(): WorkerLike {
    if (!this.worker) {
      const worker = this.makeWorker();
      worker.onmessage = (e) => this.onMessage(e.data);
      worker.onerror = (e) => this.onError(e);
      this.worker = worker;
    }
    return this.worker;
  }

  private clearDebounce(): void {
    if (this.debounceTimer !== undefined) clearTimeout(this.debounceTimer);
    this.debounceTimer = undefined;
  }

  private clearSlow(): void {
    if (this.slowTimer !== undefined) clearTimeout(this.slowTimer);
    this.slowTimer = undefined;
    this.slow.set(false);
  }

  private dispose(): void {
    this.disposed = true;
    this.clearDebounce();
    this.clearSlow();
    this.worker?.terminate();
    this.worker = undefined;
  }
}
