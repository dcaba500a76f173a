import { runSteps } from './run-steps';

/** Steps that count how many ran, each taking about `ms` of busy time, and return the count. */
function* counting(n: number, ms: number, ran: { count: number }): Generator<void, number, void> {
  for (let k = 0; k < n; k++) {
    const until = performance.now() + ms;
    while (performance.now() < until) { /* a step's work */ }
    ran.count++;
    yield;
  }
  return ran.count;
}

describe('runSteps', () => {
  it('runs every step and returns the result when nothing newer waits', async () => {
    const ran = { count: 0 };
    expect(await runSteps(counting(5, 1, ran), () => false, 0)).toBe(5);
  });

  it('stops at the end of a slice once newer work waits, without running the rest', async () => {
    const ran = { count: 0 };
    let newer = false;
    // A message from elsewhere, taken in at the first turn of the event loop.
    setTimeout(() => (newer = true), 0);
    const result = await runSteps(counting(1000, 1, ran), () => newer, 3);
    expect(result).toBeUndefined();
    expect(ran.count).toBeGreaterThan(0);
    expect(ran.count).toBeLessThan(1000);
  });

  it('gives the event loop a turn only between slices, not after every step', async () => {
    const ran = { count: 0 };
    let turns = 0;
    const stop = () => {
      turns++;
      return false;
    };
    await runSteps(counting(40, 0.5, ran), stop, 5);
    expect(ran.count).toBe(40);
    // 40 steps of 0.5 ms in slices of 5 ms: a few turns, not forty.
    expect(turns).toBeGreaterThan(0);
    expect(turns).toBeLessThan(10);
  });
});
