import { TestBed } from '@angular/core/testing';
import { solveNetlist } from '../../../../solver';
import { solveReply } from '../solve-reply';
import type { MismatchAsk } from '../solver-protocol';
import { CHUNK_RUNS, IN_FLIGHT, MISMATCH_WORKER_COUNT, MISMATCH_WORKER_FACTORY, MismatchPool, poolSize } from './mismatch-pool';
import { InProcessWorker, mismatchedPair } from './testing';

function pool(workers: number): MismatchPool {
  InProcessWorker.made = [];
  TestBed.configureTestingModule({
    providers: [
      { provide: MISMATCH_WORKER_FACTORY, useValue: () => new InProcessWorker() },
      { provide: MISMATCH_WORKER_COUNT, useValue: () => workers },
    ],
  });
  return TestBed.inject(MismatchPool);
}

/** What the live solve reports for the text: its mismatch request (the solve itself leaves it out). */
function ask(text: string): MismatchAsk {
  return solveReply(1, text).mismatch!;
}

async function settle(p: MismatchPool): Promise<void> {
  for (let k = 0; k < 2000 && p.job()?.status === 'running'; k++) await new Promise((r) => setTimeout(r, 0));
}

describe('MismatchPool', () => {
  it('leaves mismatch out of the live solve and reports its request instead', () => {
    const text = mismatchedPair();
    const reply = solveReply(7, text);
    expect(reply.result.mismatch).toBeUndefined();
    expect(reply.result.op).toBeDefined();
    expect(reply.mismatch).toEqual({ line: 13, runs: 200, seed: 1, sigmas: { beta: 0.05, is: 0.02, res: 0.005 }, library: {} });
    expect(solveReply(8, text.replace(/^analyze mismatch.*$/m, '')).mismatch).toBeUndefined();
  });

  it('gives the CLI’s numbers exactly, whatever the number of workers (the seed fixes every run)', async () => {
    const text = mismatchedPair('runs 120 seed 5 beta 5% is 2% res 0.5%');
    // The CLI's path: solveNetlist runs the whole analysis in one thread.
    const cli = solveNetlist(text).mismatch!;
    for (const workers of [3, 1]) {
      TestBed.resetTestingModule();
      const p = pool(workers);
      p.start(text, ask(text));
      expect(p.job()!.status).toBe('running');
      await settle(p);
      const job = p.job()!;
      expect(job.status).toBe('done');
      expect(job.result).toEqual(cli);
      expect(job.workers).toBe(workers);
      expect(job.answered).toBe(workers);
      // Chunks of CHUNK_RUNS handed out as workers freed up, each run once.
      const chunks = InProcessWorker.made.flatMap((w) => w.received).map((c) => [c.from, c.to]).sort((a, b) => a[0] - b[0]);
      expect(chunks).toEqual(Array.from({ length: Math.ceil(120 / CHUNK_RUNS) }, (_, k) => [k * CHUNK_RUNS, Math.min(120, (k + 1) * CHUNK_RUNS)]));
    }
  });

  it('keeps IN_FLIGHT chunks with each worker, so none waits for the page between chunks', async () => {
    const p = pool(2);
    const text = mismatchedPair('runs 200 seed 1 beta 5% is 2% res 0.5%');
    p.start(text, ask(text));
    // Before any reply: each of the two workers holds two chunks.
    expect(InProcessWorker.made.map((w) => w.received.length)).toEqual([IN_FLIGHT, IN_FLIGHT]);
    await settle(p);
    expect(p.job()?.status).toBe('done');
    expect(InProcessWorker.made.reduce((n, w) => n + w.received.length, 0)).toBe(200 / CHUNK_RUNS);
  });

  it('reports progress, and a cancel terminates the workers and says so', async () => {
    const text = mismatchedPair('runs 400 seed 2 beta 5%');
    const p = pool(2);
    p.start(text, ask(text));
    const seen: number[] = [];
    while (p.job()!.done < 100) {
      await new Promise((r) => setTimeout(r, 0));
      if (seen.at(-1) !== p.job()!.done) seen.push(p.job()!.done);
    }
    expect(seen.every((d, k) => k === 0 || d > seen[k - 1])).toBe(true);
    expect(p.job()!.total).toBe(400);
    p.cancel();
    const job = p.job()!;
    expect(job.status).toBe('cancelled');
    expect(job.done).toBeLessThan(400);
    expect(InProcessWorker.made.every((w) => w.terminated)).toBe(true);
    await new Promise((r) => setTimeout(r, 5));
    expect(p.job()!.status).toBe('cancelled');
    // Run again: fresh workers, the whole analysis.
    p.start(text, ask(text));
    await settle(p);
    expect(p.job()!.result!.runs).toBe(400);
    expect(p.job()!.done).toBe(400);
  });

  it('refuses what the CLI refuses: more than 200,000 runs × parts', async () => {
    const text = mismatchedPair('runs 50000 seed 1 beta 5%');
    // The live solve says so on the line and hands the tab no run to make …
    expect(solveReply(1, text).mismatch).toBeUndefined();
    // … and a pool asked all the same refuses with the CLI's words.
    const line = text.split('\n').findIndex((l) => l.startsWith('analyze mismatch')) + 1;
    const p = pool(2);
    p.start(text, { line, runs: 50000, seed: 1, sigmas: { beta: 0.05 }, library: {} });
    await settle(p);
    expect(p.job()!.status).toBe('failed');
    expect(p.job()!.error).toMatch(/50000 runs of 9 parts, more than 200,000/);
    const cli = solveNetlist(text).errors.find((e) => e.code === 'sweep-too-large')!;
    expect(p.job()!.error).toContain(cli.message.replace(/\.$/, ''));
  });

  it('uses the cores but one, at least one', () => {
    expect([poolSize(1), poolSize(2), poolSize(4), poolSize(16), poolSize(undefined)]).toEqual([1, 1, 3, 15, 1]);
  });
});
