/**
 * The Mismatch tab's pool of workers. `analyze mismatch` solves each run from scratch (and
 * searches for its offset), so many runs take seconds: the live solve leaves it out and this pool
 * spreads the runs over max(1, hardwareConcurrency − 1) module workers — one core stays with the
 * page and the live solver — in chunks of CHUNK_RUNS handed out as workers free up, IN_FLIGHT per
 * worker so that a worker never waits for the page to hand it the next one. Run i draws
 * from (seed, i) alone, so the merged result (`summarizeMismatch`) is the CLI's to the last digit
 * however the chunks were shared out.
 *
 * A job runs until done or cancelled; cancel terminates the busy workers (a worker cannot be
 * interrupted). Idle workers are kept a little while for the next job, then let go.
 */
import { DestroyRef, inject, Injectable, InjectionToken, signal } from '@angular/core';
import { summarizeMismatch, type MismatchResult, type MismatchSample } from '../../../../solver';
import type { MismatchAsk } from '../solver-protocol';
import type { ChunkReply, ChunkRequest } from './mismatch-protocol';

/** The part of a Worker the pool uses (an in-process stand-in in unit tests). */
export interface MismatchWorkerLike {
  postMessage(message: ChunkRequest): void;
  terminate(): void;
  onmessage: ((event: MessageEvent<ChunkReply>) => void) | null;
  onerror: ((event: ErrorEvent) => void) | null;
}

/** Makes the real module worker; the builder bundles mismatch.worker.ts as its own lazy chunk. */
export const MISMATCH_WORKER_FACTORY = new InjectionToken<() => MismatchWorkerLike>('mismatch worker factory', {
  providedIn: 'root',
  factory: () => () => new Worker(new URL('./mismatch.worker', import.meta.url), { type: 'module' }) as unknown as MismatchWorkerLike,
});

/** How many workers the pool may use: the cores but one, at least one. */
export const MISMATCH_WORKER_COUNT = new InjectionToken<() => number>('mismatch worker count', {
  providedIn: 'root',
  factory: () => () => poolSize(typeof navigator === 'undefined' ? undefined : navigator.hardwareConcurrency),
});

/** max(1, cores − 1); an unknown core count counts as 2. */
export function poolSize(cores: number | undefined): number {
  return Math.max(1, Math.floor(cores && cores > 0 ? cores : 2) - 1);
}

/** Runs per chunk: small enough for a smooth progress bar, large enough that messaging is noise. */
export const CHUNK_RUNS = 25;
/**
 * Chunks a worker holds at once: the one it solves and the next, queued in its inbox, so it goes
 * straight on while the page (busy painting, or on another core's share) takes in the reply.
 */
export const IN_FLIGHT = 2;
/** Idle workers are terminated after this long without a job. */
export const IDLE_MS = 30_000;

export type MismatchJobStatus = 'running' | 'done' | 'cancelled' | 'failed';

/** One run of the pool over a text's `analyze mismatch`. */
export interface MismatchJob {
  /** The text run (the solver worker's text for the same reply). */
  text: string;
  ask: MismatchAsk;
  status: MismatchJobStatus;
  /** Runs solved so far, of `total`. */
  done: number;
  total: number;
  /** Workers the job was spread over, and how many of them answered at least one chunk. */
  workers: number;
  answered: number;
  result?: MismatchResult;
  /** Why the job failed. */
  error?: string;
  /** Wall time from start to the merged result, ms. */
  ms?: number;
}

interface Handle {
  worker: MismatchWorkerLike;
  /** Chunks handed to it and not answered yet (at most IN_FLIGHT). */
  pending: number;
  answered: boolean;
}

@Injectable({ providedIn: 'root' })
export class MismatchPool {
  private readonly makeWorker = inject(MISMATCH_WORKER_FACTORY);
  private readonly workerCount = inject(MISMATCH_WORKER_COUNT);
  private handles: Handle[] = [];
  private jobId = 0;
  /** Chunks not handed out yet, in run order. */
  private queue: ChunkRequest[] = [];
  private samples: MismatchSample[] = [];
  private started = 0;
  private idleTimer: ReturnType<typeof setTimeout> | undefined;

  /** The newest job: running, done, cancelled or failed. */
  readonly job = signal<MismatchJob | undefined>(undefined);

  constructor() {
    inject(DestroyRef).onDestroy(() => this.terminateAll());
  }

  /** Whether the newest job was for this text and library (whatever became of it). */
  isFor(text: string, ask: MismatchAsk): boolean {
    const job = this.job();
    return !!job && job.text === text && sameLibrary(job.ask, ask);
  }

  /** Runs `ask` of `text` over the pool; a job still running is cancelled first. */
  start(text: string, ask: MismatchAsk): void {
    if (this.job()?.status === 'running') this.cancel();
    clearTimeout(this.idleTimer);
    const job = ++this.jobId;
    this.queue = [];
    for (let from = 0; from < ask.runs; from += CHUNK_RUNS) {
      this.queue.push({ type: 'chunk', job, text, library: ask.library, from, to: Math.min(ask.runs, from + CHUNK_RUNS) });
    }
    this.samples = [];
    this.started = performance.now();
    const wanted = Math.max(1, Math.min(this.workerCount(), this.queue.length));
    while (this.handles.length < wanted) this.handles.push(this.spawn());
    // Spare idle workers beyond what this job can use are let go.
    for (const extra of this.handles.splice(wanted)) extra.worker.terminate();
    for (const h of this.handles) h.answered = false;
    this.job.set({ text, ask, status: 'running', done: 0, total: ask.runs, workers: wanted, answered: 0 });
    if (this.queue.length === 0) return this.finish();
    for (const h of this.handles) this.handOut(h);
  }

  /** Stops the running job: its workers are terminated and the tab says it was cancelled. */
  cancel(): void {
    const job = this.job();
    if (job?.status !== 'running') return;
    this.jobId++;
    this.queue = [];
    this.terminateAll();
    this.job.set({ ...job, status: 'cancelled' });
  }

  /** Tops the worker up to IN_FLIGHT chunks, while any are left. */
  private handOut(handle: Handle): void {
    while (handle.pending < IN_FLIGHT && this.queue.length > 0) {
      handle.worker.postMessage(this.queue.shift()!);
      handle.pending++;
    }
  }

  private onReply(handle: Handle, reply: ChunkReply): void {
    const job = this.job();
    if (reply.job !== this.jobId || job?.status !== 'running') return;
    if (reply.type === 'refused') return this.fail(reply.message);
    handle.pending--;
    handle.answered = true;
    this.samples.push(...reply.samples);
    this.job.set({ ...job, done: this.samples.length, answered: this.handles.filter((h) => h.answered).length });
    if (this.queue.length > 0) this.handOut(handle);
    else if (this.handles.every((h) => h.pending === 0)) this.finish();
  }

  private finish(): void {
    const job = this.job()!;
    const result = summarizeMismatch({ kind: 'mismatch', runs: job.ask.runs, seed: job.ask.seed, sigmas: job.ask.sigmas, loc: { line: job.ask.line, col: 1 } }, this.samples);
    this.samples = [];
    this.job.set({ ...job, status: 'done', done: job.total, result, ms: performance.now() - this.started });
    this.idleTimer = setTimeout(() => this.terminateAll(), IDLE_MS);
  }

  private fail(message: string): void {
    const job = this.job();
    this.jobId++;
    this.queue = [];
    this.terminateAll();
    if (job) this.job.set({ ...job, status: 'failed', error: message });
  }

  private spawn(): Handle {
    const handle: Handle = { worker: this.makeWorker(), pending: 0, answered: false };
    handle.worker.onmessage = (e) => this.onReply(handle, e.data);
    handle.worker.onerror = (e) => {
      e.preventDefault?.();
      if (this.handles.includes(handle) && this.job()?.status === 'running') this.fail(e.message || 'A mismatch worker stopped unexpectedly.');
    };
    return handle;
  }

  private terminateAll(): void {
    clearTimeout(this.idleTimer);
    for (const h of this.handles) h.worker.terminate();
    this.handles = [];
  }
}

function sameLibrary(a: MismatchAsk, b: MismatchAsk): boolean {
  return JSON.stringify(a.library) === JSON.stringify(b.library);
}
