/**
 * The bench's side of the solver worker: it decides WHEN to solve and makes sure only the
 * newest text's result is ever shown. The main thread never solves.
 *
 * Timing, chosen so results follow the typing with no quiet period to wait for:
 *  - every edit is sent to the worker at once (edits made in one task — a paste with its
 *    autoindent — are one request). A worker still busy queues it, and of the requests queued
 *    there only the newest is solved (see solver.worker.ts), so typing never piles up solves;
 *  - a solve still running when newer text arrives is stale and its reply is dropped. Ending it
 *    early has a price, because a worker cannot be interrupted, only terminated, and a fresh one
 *    must load its module first. So the client keeps a spare (spawned once the first result
 *    is on screen) and weighs when the newest text would be solved: after the stale solve, which
 *    the previous solve's time says ends in so many ms, with warm code; or on the spare — at once
 *    when it has loaded, else when it will have — with its code still cold, as slow as a fresh
 *    worker's first solve was. The stale solve is terminated only when the spare wins by more than
 *    FINISH_MS; otherwise it is left to finish, with a deadline that ends it should it overrun. A
 *    worker still loading is never terminated (a fresh one would load no sooner). A new spare
 *    loads on the core a terminated solve freed;
 *  - a solve longer than SLOW_MS raises `slow`, for a progress indicator with a cancel button;
 *  - a reply marked `pending` is shown at once; the worker then runs the second stage (sweeps,
 *    sensitivity) and its `completed` message replaces the shown result. The worker runs that
 *    stage in slices and drops it for newer text at a slice's end (`dropped`), so newer text
 *    waits about one step for it, which is weighed against the spare as for a stale solve.
 */
import { DestroyRef, inject, Injectable, InjectionToken, signal } from '@angular/core';
import { STEP_SLICE_MS, type CompletedMessage, type LibraryContext, type SolveReply, type SolveRequest, type WorkerMessage } from './solver-protocol';

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

/** A stale solve is terminated only if the spare would start the newest text this much sooner. */
export const FINISH_MS = 30;
export const SLOW_MS = 300;
/** After the first reply, the spare worker is spawned this much later (off the page's first paint). */
export const SPARE_DELAY_MS = 500;

export type SolveStatus = 'idle' | 'waiting' | 'solving' | 'cancelled' | 'failed';

/** A worker with the time it was spawned and, once its module has loaded, ready. */
interface Handle {
  worker: WorkerLike;
  spawnedAt: number;
  readyAt?: number;
  /** It has answered a solve: its code is compiled and warm. */
  warm?: boolean;
}

/** A request sent to the active worker. */
interface Request {
  id: number;
  text: string;
  /** When it was sent, or when the worker turned to it after a stale solve. */
  since: number;
  /** The worker is on this request's second stage, which gives way to newer text between slices. */
  second?: boolean;
}

@Injectable()
export class SolverClient {
  private readonly makeWorker = inject(SOLVER_WORKER_FACTORY);
  private active: Handle | undefined;
  /** An idle worker that takes over when the active one is terminated. */
  private spare: Handle | undefined;
  private nextId = 1;
  /** The newest request sent: the only one whose reply is shown. */
  private running: Request | undefined;
  /** The request the active worker is busy with: `running`, or a stale one before it. */
  private busy: Request | undefined;
  private pendingText: string | undefined;
  private flushTimer: ReturnType<typeof setTimeout> | undefined;
  private deadlineTimer: ReturnType<typeof setTimeout> | undefined;
  private slowTimer: ReturnType<typeof setTimeout> | undefined;
  private spareTimer: ReturnType<typeof setTimeout> | undefined;
  /** How long the last solve took inside the worker, ms: how long the next is likely to take. */
  private lastSolveMs: number | undefined;
  /** How long the last first solve of a fresh worker took, ms: a spare's solve costs about that. */
  private coldSolveMs: number | undefined;
  /** Spawn-to-ready time of the last worker that loaded, ms. */
  private loadMs: number | undefined;
  private disposed = false;
  /** Where `use` lines resolve from; sent with every request. */
  private library: LibraryContext = {};

  /** The newest reply (only ever for the newest text sent). */
  readonly reply = signal<SolveReply | undefined>(undefined);
  /** The newest reply whose circuit solved (it has an operating point); see `forgetLastSolved`. */
  readonly lastSolved = signal<SolveReply | undefined>(undefined);
  readonly status = signal<SolveStatus>('idle');
  /** True while a solve has taken longer than SLOW_MS. */
  readonly slow = signal(false);
  /** A worker failure that is not a netlist problem (e.g. the worker script failed to load). */
  readonly failure = signal<string | undefined>(undefined);
  /** How many busy workers were terminated for newer text or a cancel (for diagnostics and tests). */
  readonly abandoned = signal(0);

  constructor() {
    inject(DestroyRef, { optional: true })?.onDestroy(() => this.dispose());
  }

  /** Spawns the worker ahead of the first solve so its module is loaded by then. */
  warmUp(): void {
    this.ensureActive();
  }

  /** New text from the editor: sent at once (see the timing rules above). */
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

  /**
   * Where `use` lines resolve from from now on: the signed-in workspace's library, or the sources
   * a share link pins (see library-resolver.ts). Takes effect with the next solve; the caller
   * solves again when the text's results depend on it.
   */
  useLibrary(context: LibraryContext): void {
    this.library = context;
  }

  /** Another netlist is opened: its results must not fall back on the previous one's. */
  forgetLastSolved(): void {
    this.lastSolved.set(undefined);
  }

  /** Stops the solve in progress (and any scheduled one); the last result stays. */
  cancel(): void {
    this.clearFlush();
    this.pendingText = undefined;
    if (this.busy) this.terminateActive();
    this.running = undefined;
    this.status.set('cancelled');
  }

  /** Sends the pending text; a busy worker is kept (the text waits there) or terminated. */
  private flush(): void {
    this.clearFlush();
    const text = this.pendingText;
    if (text === undefined || this.disposed) return;
    this.pendingText = undefined;
    if (this.busy) {
      const wait = this.waitForBusy(this.busy);
      if (wait === undefined) this.terminateActive();
      else if (wait !== Infinity) this.deadlineTimer ??= setTimeout(() => this.giveUpOnStale(), wait + FINISH_MS);
    }
    this.send(text);
  }

  private send(text: string): void {
    const request: Request = { id: this.nextId++, text, since: performance.now() };
    this.running = request;
    this.busy ??= request;
    this.status.set('solving');
    this.clearSlow();
    this.slowTimer = setTimeout(() => this.slow.set(true), SLOW_MS);
    this.ensureActive().worker.postMessage({ type: 'solve', id: request.id, text, library: this.library });
  }

  /**
   * How long to let the busy worker's (now stale) solve run on, ms — Infinity while the worker is
   * still loading — or undefined when terminating it gets the newest text solved more than
   * FINISH_MS sooner on the spare (or on a fresh worker), counting that the spare's first solve
   * runs cold code (measured: 555 ms against 24 ms warm for the cascoded demo).
   */
  private waitForBusy(busy: Request): number | undefined {
    const now = performance.now();
    const active = this.active!;
    if (active.readyAt === undefined) return Infinity;
    // A second stage gives way at its next slice's end: within a slice and one step (a sweep
    // value or a sensitivity knob, about one first-stage solve), wherever it has got to.
    const finishesIn = this.lastSolveMs === undefined ? Infinity
      : busy.second ? this.lastSolveMs + STEP_SLICE_MS
      : Math.max(0, this.lastSolveMs - (now - Math.max(busy.since, active.readyAt)));
    const load = this.loadMs ?? 0;
    const spareIn = !this.spare ? load : this.spare.readyAt !== undefined ? 0 : Math.max(0, load - (now - this.spare.spawnedAt));
    // Weighed by when the newest text would be solved: here with warm code, on the spare cold.
    const warmSolve = this.lastSolveMs ?? 0;
    const coldSolve = Math.max(this.coldSolveMs ?? warmSolve, warmSolve);
    return finishesIn + warmSolve <= spareIn + coldSolve + FINISH_MS ? finishesIn : undefined;
  }

  /** The deadline of a stale solve passed: the newest text moves to the spare. */
  private giveUpOnStale(): void {
    this.deadlineTimer = undefined;
    const running = this.running;
    if (!running || this.busy === running) return;
    this.terminateActive();
    this.send(running.text);
  }

  private onMessage(source: Handle, message: WorkerMessage): void {
    const now = performance.now();
    if (message.type === 'ready') {
      source.readyAt = now;
      this.loadMs = now - source.spawnedAt;
      return;
    }
    if (source !== this.active) return;
    if (message.type === 'completed') {
      this.onCompleted(message);
      return;
    }
    if (message.type === 'dropped') {
      // The second stage gave way to the newest text, which the worker solves now.
      if (this.busy?.id !== message.id) return;
      this.clearDeadline();
      if (this.running) this.running.since = now;
      this.busy = this.running;
      return;
    }
    this.lastSolveMs = message.solveMs;
    // A worker's first solve runs its code cold (many times slower): what a spare's would cost.
    if (!source.warm) this.coldSolveMs = message.solveMs;
    source.warm = true;
    this.clearDeadline();
    if (message.id !== this.running?.id) {
      // A stale reply: the worker has turned to the newest request, which was waiting there.
      if (this.running) {
        this.running.since = now;
        this.busy = this.running;
      }
      return;
    }
    this.running = undefined;
    // A pending reply's worker goes on with the second stage: busy with it as with a stale solve.
    this.busy = message.pending ? { id: message.id, text: message.text, since: now, second: true } : undefined;
    this.clearSlow();
    this.failure.set(undefined);
    this.reply.set(message);
    if (message.result.op) this.lastSolved.set(message);
    this.scheduleSpare();
    if (this.pendingText === undefined) this.status.set('idle');
  }

  /** The second stage of the shown reply: its whole result joins the first stage's (see SolveReply.whole). */
  private onCompleted(message: CompletedMessage): void {
    if (this.busy?.id === message.id) this.busy = undefined;
    this.clearDeadline();
    const shown = this.reply();
    if (shown?.id !== message.id) return;
    const whole: SolveReply = { ...shown, whole: message.result, pending: false };
    this.reply.set(whole);
    if (this.lastSolved()?.id === message.id) this.lastSolved.set(whole);
  }

  private onError(source: Handle, event: ErrorEvent): void {
    event.preventDefault?.();
    source.worker.terminate();
    if (source === this.spare) {
      // A spare that fails to load is not worth a second try; the active worker carries on.
      this.spare = undefined;
      return;
    }
    if (source !== this.active) return;
    this.running = undefined;
    this.busy = undefined;
    this.clearDeadline();
    this.clearSlow();
    this.active = this.spare;
    this.spare = undefined;
    this.failure.set(event.message || 'The solver worker stopped unexpectedly.');
    this.status.set('failed');
  }

  /** Terminates the busy worker; the spare, when there is one, takes its place. */
  private terminateActive(): void {
    this.busy = undefined;
    this.clearDeadline();
    this.clearSlow();
    this.active?.worker.terminate();
    this.active = this.spare;
    this.abandoned.update((n) => n + 1);
    if (this.spare) {
      // The terminated solve freed a core: the next spare loads on it.
      this.spare = this.spawn();
    } else {
      // No spare yet: a fresh worker starts loading now; a spare follows its first reply.
      this.ensureActive();
    }
  }

  private ensureActive(): Handle {
    this.active ??= this.spawn();
    return this.active;
  }

  private spawn(): Handle {
    const handle: Handle = { worker: this.makeWorker(), spawnedAt: performance.now() };
    handle.worker.onmessage = (e) => this.onMessage(handle, e.data);
    handle.worker.onerror = (e) => this.onError(handle, e);
    return handle;
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

  private clearDeadline(): void {
    if (this.deadlineTimer !== undefined) clearTimeout(this.deadlineTimer);
    this.deadlineTimer = undefined;
  }

  private clearSlow(): void {
    if (this.slowTimer !== undefined) clearTimeout(this.slowTimer);
    this.slowTimer = undefined;
    this.slow.set(false);
  }

  private dispose(): void {
    this.disposed = true;
    this.clearFlush();
    this.clearDeadline();
    this.clearSlow();
    if (this.spareTimer !== undefined) clearTimeout(this.spareTimer);
    this.active?.worker.terminate();
    this.spare?.worker.terminate();
    this.active = undefined;
    this.spare = undefined;
  }
}
