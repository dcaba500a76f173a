import { TestBed } from '@angular/core/testing';
import type { SolveResult } from '../../../solver';
import { FINISH_MS, SLOW_MS, SOLVER_WORKER_FACTORY, SolverClient, SPARE_DELAY_MS, type WorkerLike } from './solver-client';
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
  /** Answers the last request with a result titled by its text (a circuit that solved, unless told otherwise). */
  answer(request = this.sent[this.sent.length - 1], solved = true): void {
    if (this.terminated) return;
    const op = solved ? { nodes: {}, sources: {}, parts: {}, devices: {} } : undefined;
    const result = { title: request.text, temp_c: 27, op, measures: {}, checks: [], warnings: [], errors: [] } as SolveResult;
    this.onmessage?.({ data: { type: 'solved', id: request.id, result, text: request.text, names: NO_NAMES, solveMs: 1 } } as MessageEvent<WorkerMessage>);
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

  /** The texts each worker was sent, in order of creation. */
  function sent(): string[][] {
    return FakeWorker.made.map((w) => w.sent.map((r) => r.text));
  }

  /** A first solve that took `ms`, so the client knows how long solves of this netlist take. */
  function firstSolve(text: string, ms: number): FakeWorker {
    client.solveNow(text);
    vi.advanceTimersByTime(ms);
    const w = live()[0];
    w.answer();
    return w;
  }

  it('solves every edit at once, in the worker, with no quiet period to wait for', () => {
    client.warmUp();
    expect(FakeWorker.made).toHaveLength(1);
    client.edit('a');
    expect(client.status()).toBe('waiting');
    vi.advanceTimersByTime(0);
    expect(sent()).toEqual([['a']]);
    expect(client.status()).toBe('solving');
    FakeWorker.made[0].answer();
    expect(client.reply()?.result.title).toBe('a');
    expect(client.status()).toBe('idle');
  });

  it('makes one solve of the edits of one task (a paste and its autoindent)', () => {
    client.edit('r');
    client.edit('rc');
    vi.advanceTimersByTime(0);
    expect(sent()).toEqual([['rc']]);
  });

  it('lets a nearly finished stale solve end, drops its reply, and then solves only the newest text', () => {
    const w = firstSolve('r', 5);
    client.edit('rc');
    vi.advanceTimersByTime(0);
    // Two more keystrokes while `rc` solves: it is stale, but the last solve says it ends soon.
    client.edit('rc1');
    vi.advanceTimersByTime(0);
    client.edit('rc1:');
    vi.advanceTimersByTime(0);
    expect(w.terminated).toBe(false);
    expect(client.status()).toBe('waiting');
    w.answer(); // the reply for `rc` is dropped and `rc1:` follows on the same worker
    expect(client.reply()?.result.title).toBe('r');
    expect(sent()[0]).toEqual(['r', 'rc', 'rc1:']);
    w.answer();
    expect(client.reply()?.result.title).toBe('rc1:');
    expect(client.abandoned()).toBe(0);
  });

  it(`terminates a stale solve that has not ended within ${FINISH_MS} ms and hands the newest text to the spare`, () => {
    const first = firstSolve('quick', 5);
    vi.advanceTimersByTime(SPARE_DELAY_MS);
    expect(FakeWorker.made).toHaveLength(2); // the spare, loaded after the first reply
    const spare = FakeWorker.made[1];
    client.solveNow('turned slow');
    client.edit('newer');
    vi.advanceTimersByTime(FINISH_MS - 1);
    expect(first.terminated).toBe(false);
    vi.advanceTimersByTime(1);
    expect(first.terminated).toBe(true);
    expect(client.abandoned()).toBe(1);
    // The spare takes the newest text at once (its module is loaded); a new spare starts loading.
    expect(spare.sent.map((r) => r.text)).toEqual(['newer']);
    expect(live()).toHaveLength(2);
    spare.answer();
    expect(client.reply()?.result.title).toBe('newer');
  });

  it('terminates at once a stale solve that the last solve says will run long', () => {
    firstSolve('slow netlist', 400);
    client.solveNow('slow netlist, edited');
    vi.advanceTimersByTime(50);
    client.edit('newer');
    vi.advanceTimersByTime(0);
    expect(FakeWorker.made[0].terminated).toBe(true);
    expect(client.abandoned()).toBe(1);
    expect(live()).toHaveLength(1);
    expect(live()[0].sent.map((r) => r.text)).toEqual(['newer']);
  });

  it('ignores a late reply to a request that was superseded', () => {
    client.solveNow('one');
    const w = FakeWorker.made[0];
    const firstRequest = w.sent[0];
    w.answer();
    client.solveNow('two');
    // A reply carrying the old id (as a worker that was not terminated might send) is dropped.
    w.onmessage?.({ data: { type: 'solved', id: firstRequest.id, result: { title: 'stale' } as SolveResult, text: 'one', names: NO_NAMES, solveMs: 1 } } as MessageEvent<WorkerMessage>);
    expect(client.reply()?.result.title).toBe('one');
    w.answer();
    expect(client.reply()?.result.title).toBe('two');
  });

  it('keeps the last reply whose circuit solved, and forgets it for another netlist', () => {
    const w = firstSolve('solves', 5);
    client.solveNow('circuit broken');
    w.answer(undefined, false);
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
