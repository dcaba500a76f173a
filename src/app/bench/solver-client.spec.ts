import { TestBed } from '@angular/core/testing';
import type { SolveResult } from '../../../solver';
import { FINISH_MS, SLOW_MS, SOLVER_WORKER_FACTORY, SolverClient, SPARE_DELAY_MS, type WorkerLike } from './solver-client';
import { NO_LINES, NO_NAMES, STEP_SLICE_MS, type SolveRequest, type WorkerMessage } from './solver-protocol';

/**
 * jsdom has no Worker: a fake that records what it is sent and answers when told to. Like the
 * real one it says when its module has loaded (`ready`), and answers any request it is told to:
 * the tests play the worker's part, coalescing included.
 */
class FakeWorker implements WorkerLike {
  static made: FakeWorker[] = [];
  sent: SolveRequest[] = [];
  terminated = false;
  onmessage: ((event: MessageEvent<WorkerMessage>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  constructor() {
    FakeWorker.made.push(this);
  }
  postMessage(message: SolveRequest): void {
    if (this.terminated) throw new Error('posted to a terminated worker');
    this.sent.push(message);
  }
  terminate(): void {
    this.terminated = true;
  }
  /** Its module has loaded. */
  ready(): this {
    this.onmessage?.({ data: { type: 'ready' } } as MessageEvent<WorkerMessage>);
    return this;
  }
  /** Answers a request (the last by default) with a result titled by its text, after `solveMs` in the worker. */
  answer(request = this.sent[this.sent.length - 1], { solved = true, solveMs = 5, pending = false } = {}): void {
    if (this.terminated) return;
    const op = solved ? { nodes: {}, sources: {}, parts: {}, devices: {} } : undefined;
    const result = { title: request.text, temp_c: 27, op, measures: {}, checks: [], warnings: [], errors: [] } as SolveResult;
    this.onmessage?.({ data: { type: 'solved', id: request.id, result, text: request.text, names: NO_NAMES, lines: NO_LINES, solveMs, ...(pending ? { pending } : {}) } } as MessageEvent<WorkerMessage>);
  }
  /** The second stage of a pending reply: the whole result, with its sweep. */
  complete(request = this.sent[this.sent.length - 1]): void {
    if (this.terminated) return;
    const result = { title: request.text, temp_c: 27, op: { nodes: {}, sources: {}, parts: {}, devices: {} }, temp: { values_c: [0, 50], runs: [] }, measures: {}, checks: [], warnings: [], errors: [] } as unknown as SolveResult;
    this.onmessage?.({ data: { type: 'completed', id: request.id, result, solveMs: 20 } } as MessageEvent<WorkerMessage>);
  }
  /** The second stage of a pending reply gave way to newer text. */
  drop(request: SolveRequest): void {
    if (this.terminated) return;
    this.onmessage?.({ data: { type: 'dropped', id: request.id } } as MessageEvent<WorkerMessage>);
  }
  texts(): string[] {
    return this.sent.map((r) => r.text);
  }
}

function live(): FakeWorker[] {
  return FakeWorker.made.filter((w) => !w.terminated);
}

describe('SolverClient', () => {
  let client: SolverClient;

  beforeEach(() => {
    vi.useFakeTimers();
    FakeWorker.made = [];
    TestBed.configureTestingModule({ providers: [SolverClient, { provide: SOLVER_WORKER_FACTORY, useValue: () => new FakeWorker() }] });
    client = TestBed.inject(SolverClient);
  });
  afterEach(() => vi.useRealTimers());

  /** A loaded worker that has answered a first solve that took `solveMs` (so the client knows). */
  function firstSolve(text: string, solveMs: number): FakeWorker {
    client.warmUp();
    const w = FakeWorker.made[0].ready();
    client.solveNow(text);
    vi.advanceTimersByTime(solveMs);
    w.answer(undefined, { solveMs });
    return w;
  }

  it('shows a pending reply at once and its whole result when the second stage completes', () => {
    const w = firstSolve('a', 5);
    client.edit('b');
    vi.advanceTimersByTime(0);
    w.answer(undefined, { pending: true });
    expect(client.reply()?.result.title).toBe('b');
    expect(client.reply()?.pending).toBe(true);
    expect(client.reply()?.result.temp).toBeUndefined();
    expect(client.status()).toBe('idle');
    const first = client.reply()!.result;
    w.complete();
    expect(client.reply()?.pending).toBe(false);
    expect(client.reply()?.whole?.temp?.values_c).toEqual([0, 50]);
    // The first stage's result is kept as it was: panels that read only it are not redrawn.
    expect(client.reply()?.result).toBe(first);
    expect(client.lastSolved()?.whole?.temp).toBeDefined();
  });

  it('ignores a completion of text whose newer reply is already shown', () => {
    const w = firstSolve('a', 5);
    client.edit('b');
    vi.advanceTimersByTime(0);
    w.answer(undefined, { pending: true });
    const b = w.sent[w.sent.length - 1];
    client.edit('c');
    vi.advanceTimersByTime(0);
    expect(w.texts()).toEqual(['a', 'b', 'c']);
    w.answer();
    expect(client.reply()?.result.title).toBe('c');
    w.complete(b);
    expect(client.reply()?.result.title).toBe('c');
    expect(client.reply()?.whole).toBeUndefined();
  });

  it('completes the shown reply while newer text waits behind its second stage', () => {
    const w = firstSolve('a', 5);
    client.edit('b');
    vi.advanceTimersByTime(0);
    w.answer(undefined, { pending: true });
    const b = w.sent[w.sent.length - 1];
    client.edit('c');
    vi.advanceTimersByTime(0);
    w.complete(b);
    expect(client.reply()?.result.title).toBe('b');
    expect(client.reply()?.pending).toBe(false);
    w.answer();
    expect(client.reply()?.result.title).toBe('c');
  });

  it('waits for a second stage to give way instead of terminating its worker, then lets the newest text solve there', () => {
    // A 20 ms first stage: the second gives way within a step and a slice, about 28 ms.
    const w = firstSolve('a', 20);
    vi.advanceTimersByTime(SPARE_DELAY_MS);
    FakeWorker.made[1].ready();
    client.edit('b');
    vi.advanceTimersByTime(20);
    w.answer(undefined, { pending: true, solveMs: 20 });
    const b = w.sent[w.sent.length - 1];
    client.edit('c');
    vi.advanceTimersByTime(0);
    expect(w.texts()).toEqual(['a', 'b', 'c']);
    expect(w.terminated).toBe(false);
    vi.advanceTimersByTime(15);
    w.drop(b);
    // The worker is on the newest text now: no deadline ends it while it solves.
    vi.advanceTimersByTime(20 + STEP_SLICE_MS + FINISH_MS + 10);
    expect(w.terminated).toBe(false);
    expect(client.abandoned()).toBe(0);
    w.answer();
    expect(client.reply()?.result.title).toBe('c');
  });

  it('still moves newest text to the spare when a second stage would take longer to give way than the spare to start', () => {
    // A 200 ms first stage: a step of the second stage takes as long; the ready spare wins.
    const w = firstSolve('a', 200);
    vi.advanceTimersByTime(SPARE_DELAY_MS);
    const spare = FakeWorker.made[1].ready();
    client.edit('b');
    vi.advanceTimersByTime(200);
    w.answer(undefined, { pending: true, solveMs: 200 });
    client.edit('c');
    vi.advanceTimersByTime(0);
    expect(w.terminated).toBe(true);
    expect(spare.texts()).toEqual(['c']);
  });

  it('counts that the spare would solve with cold code: a stale solve it could outrun on warm code is left to finish', () => {
    // The page's first solve ran cold (500 ms); warm solves take 60 ms.
    const w = firstSolve('a', 500);
    vi.advanceTimersByTime(SPARE_DELAY_MS);
    const spare = FakeWorker.made[1].ready();
    client.solveNow('b');
    vi.advanceTimersByTime(60);
    w.answer(undefined, { solveMs: 60 });
    client.solveNow('c');
    client.edit('d');
    vi.advanceTimersByTime(0);
    // Here: 60 ms more of 'c', then 60 for 'd'; on the spare: 500 cold. It stays.
    expect(w.terminated).toBe(false);
    expect(spare.texts()).toEqual([]);
    expect(w.texts()).toEqual(['a', 'b', 'c', 'd']);
  });

  it('sends every edit at once, to the worker, with no quiet period to wait for', () => {
    client.warmUp();
    expect(FakeWorker.made).toHaveLength(1);
    client.edit('a');
    expect(client.status()).toBe('waiting');
    vi.advanceTimersByTime(0);
    expect(FakeWorker.made[0].texts()).toEqual(['a']);
    expect(client.status()).toBe('solving');
    FakeWorker.made[0].answer();
    expect(client.reply()?.result.title).toBe('a');
    expect(client.status()).toBe('idle');
  });

  it('makes one request of the edits of one task (a paste and its autoindent)', () => {
    client.edit('r');
    client.edit('rc');
    vi.advanceTimersByTime(0);
    expect(FakeWorker.made[0].texts()).toEqual(['rc']);
  });

  it('lets a nearly finished stale solve end, queues the newest text behind it, and drops the stale reply', () => {
    const w = firstSolve('r', 5);
    for (const text of ['rc', 'rc1', 'rc1:']) {
      client.edit(text);
      vi.advanceTimersByTime(0);
    }
    // `rc` is stale but ends within FINISH_MS: the newer texts wait on the same worker.
    expect(w.terminated).toBe(false);
    expect(w.texts()).toEqual(['r', 'rc', 'rc1', 'rc1:']);
    w.answer(w.sent[1]); // the worker ends `rc`, then solves only the newest (it coalesces)
    expect(client.reply()?.result.title).toBe('r');
    expect(client.status()).toBe('solving');
    w.answer();
    expect(client.reply()?.result.title).toBe('rc1:');
    expect(client.abandoned()).toBe(0);
  });

  it('terminates a stale solve that overruns its expected time and sends the newest text to the loaded spare', () => {
    const first = firstSolve('quick', 5);
    vi.advanceTimersByTime(SPARE_DELAY_MS);
    expect(FakeWorker.made).toHaveLength(2);
    const spare = FakeWorker.made[1].ready();
    client.solveNow('turned slow');
    client.solveNow('newer');
    expect(first.texts()).toEqual(['quick', 'turned slow', 'newer']);
    vi.advanceTimersByTime(5 + FINISH_MS - 1);
    expect(first.terminated).toBe(false);
    vi.advanceTimersByTime(1);
    expect(first.terminated).toBe(true);
    expect(client.abandoned()).toBe(1);
    expect(spare.texts()).toEqual(['newer']);
    expect(live()).toHaveLength(2); // a new spare loads on the freed core
    spare.answer();
    expect(client.reply()?.result.title).toBe('newer');
  });

  it('lets the worker be once the stale solve has ended and it has turned to the newest text', () => {
    const w = firstSolve('quick', 5);
    client.solveNow('a');
    client.solveNow('b');
    w.answer(w.sent[1]); // `a` ends in time: the worker is on `b` now
    vi.advanceTimersByTime(5 + FINISH_MS + 100);
    expect(w.terminated).toBe(false);
    w.answer();
    expect(client.reply()?.result.title).toBe('b');
  });

  it('terminates at once a stale solve that the last solve says will run long', () => {
    const first = firstSolve('slow netlist', 400);
    vi.advanceTimersByTime(SPARE_DELAY_MS);
    const spare = FakeWorker.made[1].ready();
    client.solveNow('slow netlist, edited');
    vi.advanceTimersByTime(50);
    client.edit('newer');
    vi.advanceTimersByTime(0);
    expect(first.terminated).toBe(true);
    expect(spare.texts()).toEqual(['newer']);
  });

  it('waits for a spare still loading when that is sooner than a stale solve, not for one that loads later', () => {
    // Workers take 200 ms to load here; solves 100 ms.
    client.warmUp();
    vi.advanceTimersByTime(200);
    const first = FakeWorker.made[0].ready();
    client.solveNow('a');
    vi.advanceTimersByTime(100);
    first.answer(undefined, { solveMs: 100 });
    vi.advanceTimersByTime(SPARE_DELAY_MS);
    expect(FakeWorker.made).toHaveLength(2); // the spare, loading
    client.solveNow('b');
    vi.advanceTimersByTime(10);
    client.solveNow('c'); // `b` ends in 90 ms; the spare is loaded in 200 ms: keep `b`
    expect(first.terminated).toBe(false);
    expect(first.texts()).toEqual(['a', 'b', 'c']);
  });

  it('never terminates a worker still loading its module: the newest text waits there', () => {
    client.warmUp();
    client.solveNow('a');
    client.edit('ab');
    vi.advanceTimersByTime(0);
    const w = FakeWorker.made[0];
    expect(w.terminated).toBe(false);
    expect(w.texts()).toEqual(['a', 'ab']);
    w.ready().answer(); // the loaded worker solves only the newest
    expect(client.reply()?.result.title).toBe('ab');
    expect(client.status()).toBe('idle');
  });

  it('ignores a late reply to a request that was superseded', () => {
    client.solveNow('one');
    const w = FakeWorker.made[0];
    const firstRequest = w.sent[0];
    w.answer();
    client.solveNow('two');
    // A reply carrying the old id (as a worker that was not terminated might send) is dropped.
    w.onmessage?.({ data: { type: 'solved', id: firstRequest.id, result: { title: 'stale' } as SolveResult, text: 'one', names: NO_NAMES, lines: NO_LINES, solveMs: 1 } } as MessageEvent<WorkerMessage>);
    expect(client.reply()?.result.title).toBe('one');
    w.answer();
    expect(client.reply()?.result.title).toBe('two');
  });

  it('keeps the last reply whose circuit solved, and forgets it for another netlist', () => {
    const w = firstSolve('solves', 5);
    client.solveNow('circuit broken');
    w.answer(undefined, { solved: false });
    expect(client.reply()?.result.title).toBe('circuit broken');
    expect(client.lastSolved()?.result.title).toBe('solves');
    client.forgetLastSolved();
    expect(client.lastSolved()).toBeUndefined();
  });

  it('raises `slow` only for a solve longer than SLOW_MS, and cancel stops it and keeps the last result', () => {
    client.solveNow('quick');
    vi.advanceTimersByTime(SLOW_MS - 10);
    FakeWorker.made[0].answer();
    expect(client.slow()).toBe(false);
    vi.advanceTimersByTime(100);
    expect(client.slow()).toBe(false);

    client.solveNow('long');
    vi.advanceTimersByTime(SLOW_MS);
    expect(client.slow()).toBe(true);
    client.cancel();
    expect(client.slow()).toBe(false);
    expect(client.status()).toBe('cancelled');
    expect(FakeWorker.made[0].terminated).toBe(true);
    expect(client.reply()?.result.title).toBe('quick');
    // A worker is idle and ready for the next text.
    expect(live().length).toBeGreaterThanOrEqual(1);
    expect(live().every((w) => w.sent.length === 0)).toBe(true);
  });

  it('cancel also drops a solve that was only scheduled', () => {
    client.edit('pending');
    client.cancel();
    vi.advanceTimersByTime(SLOW_MS);
    expect(FakeWorker.made.flatMap((w) => w.sent)).toEqual([]);
  });

  it('reports a worker that fails to load instead of waiting forever, and recovers on the next edit', () => {
    client.solveNow('x');
    FakeWorker.made[0].onerror?.({ message: 'script failed', preventDefault() {} } as ErrorEvent);
    expect(client.status()).toBe('failed');
    expect(client.failure()).toBe('script failed');
    client.edit('y');
    vi.advanceTimersByTime(0);
    expect(live()).toHaveLength(1);
    live()[0].answer();
    expect(client.reply()?.result.title).toBe('y');
    expect(client.failure()).toBeUndefined();
  });

  it('terminates its workers, spare included, when the bench goes away', () => {
    firstSolve('a', 5);
    vi.advanceTimersByTime(SPARE_DELAY_MS);
    expect(FakeWorker.made).toHaveLength(2);
    TestBed.resetTestingModule();
    expect(live()).toHaveLength(0);
  });
});
