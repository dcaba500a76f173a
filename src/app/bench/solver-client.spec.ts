import { TestBed } from '@angular/core/testing';
import type { SolveResult } from '../../../solver';
import { DEBOUNCE_MS, IDLE_MS, QUICK_MS, SLOW_MS, SOLVER_WORKER_FACTORY, SolverClient, type WorkerLike } from './solver-client';
import { NO_NAMES, type SolveRequest, type WorkerMessage } from './solver-protocol';

/** jsdom has no Worker: a fake that records what it is sent and answers when told to. */
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
  /** Answers the last request with a result titled by its text. */
  answer(request = this.sent[this.sent.length - 1]): void {
    if (this.terminated) return;
    const result = { title: request.text, temp_c: 27, measures: {}, checks: [], warnings: [], errors: [] } as SolveResult;
    this.onmessage?.({ data: { type: 'solved', id: request.id, result, text: request.text, names: NO_NAMES, solveMs: 1 } } as MessageEvent<WorkerMessage>);
  }
}

function live(): FakeWorker[] {
  return FakeWorker.made.filter((w) => !w.terminated);
}

describe('SolverClient', () => {
  let client: SolverClient;
  let clock = 0;

  beforeEach(() => {
    vi.useFakeTimers();
    FakeWorker.made = [];
    clock = 10_000;
    TestBed.configureTestingModule({ providers: [SolverClient, { provide: SOLVER_WORKER_FACTORY, useValue: () => new FakeWorker() }] });
    client = TestBed.inject(SolverClient);
  });
  afterEach(() => vi.useRealTimers());

  /** An edit at the client's clock `ms` after the previous one. */
  function type(text: string, afterMs: number): void {
    clock += afterMs;
    client.edit(text, clock);
  }

  it('solves an edit made after a pause almost at once, and never on the main thread', () => {
    client.warmUp();
    expect(FakeWorker.made).toHaveLength(1);
    type('a', IDLE_MS + 1);
    expect(client.status()).toBe('waiting');
    vi.advanceTimersByTime(QUICK_MS - 1);
    expect(FakeWorker.made[0].sent).toHaveLength(0);
    vi.advanceTimersByTime(1);
    expect(FakeWorker.made[0].sent.map((r) => r.text)).toEqual(['a']);
    expect(client.status()).toBe('solving');
    FakeWorker.made[0].answer();
    expect(client.reply()?.result.title).toBe('a');
    expect(client.status()).toBe('idle');
  });

  it('coalesces a burst of keystrokes into one solve, DEBOUNCE_MS after the last', () => {
    type('r', IDLE_MS + 1);
    vi.advanceTimersByTime(QUICK_MS);
    FakeWorker.made[0].answer();
    for (const text of ['rc', 'rc1', 'rc1:']) {
      type(text, 40);
      vi.advanceTimersByTime(40);
    }
    // 40 ms after the last keystroke of the burst: nothing new sent yet.
    expect(FakeWorker.made[0].sent.map((r) => r.text)).toEqual(['r']);
    vi.advanceTimersByTime(DEBOUNCE_MS - 40 - 1);
    expect(FakeWorker.made[0].sent).toHaveLength(1);
    vi.advanceTimersByTime(1);
    expect(FakeWorker.made[0].sent.map((r) => r.text)).toEqual(['r', 'rc1:']);
  });

  it('terminates a worker busy with stale text and solves the newest text on a fresh one', () => {
    client.solveNow('slow netlist');
    const first = FakeWorker.made[0];
    expect(first.sent).toHaveLength(1);
    type('newer', 50);
    expect(first.terminated).toBe(true);
    expect(client.abandoned()).toBe(1);
    expect(live()).toHaveLength(1);
    vi.advanceTimersByTime(DEBOUNCE_MS);
    const second = live()[0];
    expect(second.sent.map((r) => r.text)).toEqual(['newer']);
    second.answer();
    expect(client.reply()?.result.title).toBe('newer');
  });

  it('ignores a late reply to a request that was superseded', () => {
    client.solveNow('one');
    const w = FakeWorker.made[0];
    const firstRequest = w.sent[0];
    w.answer();
    client.solveNow('two');
    const w2 = live()[0];
    // A reply carrying the old id (as a worker that was not terminated might send) is dropped.
    w2.onmessage?.({ data: { type: 'solved', id: firstRequest.id, result: { title: 'stale' } as SolveResult, text: 'one', names: NO_NAMES, solveMs: 1 } } as MessageEvent<WorkerMessage>);
    expect(client.reply()?.result.title).toBe('one');
    w2.answer();
    expect(client.reply()?.result.title).toBe('two');
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
    // The fresh worker is idle and ready for the next text.
    expect(live()).toHaveLength(1);
    expect(live()[0].sent).toHaveLength(0);
  });

  it('cancel also drops a solve that was only scheduled', () => {
    type('pending', IDLE_MS + 1);
    client.cancel();
    vi.advanceTimersByTime(DEBOUNCE_MS * 2);
    expect(FakeWorker.made.flatMap((w) => w.sent)).toEqual([]);
  });

  it('reports a worker that fails to load instead of waiting forever, and recovers on the next edit', () => {
    client.solveNow('x');
    FakeWorker.made[0].onerror?.({ message: 'script failed', preventDefault() {} } as ErrorEvent);
    expect(client.status()).toBe('failed');
    expect(client.failure()).toBe('script failed');
    type('y', IDLE_MS + 1);
    vi.advanceTimersByTime(QUICK_MS);
    expect(live()).toHaveLength(1);
    live()[0].answer();
    expect(client.reply()?.result.title).toBe('y');
    expect(client.failure()).toBeUndefined();
  });

  it('terminates its worker when the bench goes away', () => {
    client.warmUp();
    TestBed.resetTestingModule();
    expect(FakeWorker.made[0].terminated).toBe(true);
  });
});
