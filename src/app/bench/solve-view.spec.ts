import { solveReply } from './solve-reply';
import { circuitSolved, decideView, type ViewInputs } from './solve-view';
import type { SolveReply } from './solver-protocol';

/** A small pair whose circuit solves; variants below break a request line or the circuit itself. */
const PAIR = [
  'title  Truth table pair',
  'model  qn: npn(is=1e-16, beta=100, va=80)',
  'vcc: vsrc(vcc, gnd) 10 V',
  'vee: vsrc(vee, gnd) -10 V',
  'q1:  npn(c=outa, b=gnd, e=tail) qn',
  'q2:  npn(c=outb, b=gnd, e=tail) qn',
  'rca: res(vcc, outa) 5k',
  'rcb: res(vcc, outb) 5k',
  'rt:  res(tail, vee) 4.65k',
  'measure vq1 = vce(q1)',
  'check vq1 > 3',
  '',
].join('\n');

let nextId = 1;
/** A real solve of `text`, as the worker would reply. */
function reply(text: string): SolveReply {
  return solveReply(nextId++, text);
}

const solved = reply(PAIR);
const requestError = reply(PAIR.replace('rca: res(vcc, outa) 5k', 'rca: res(vcc, outa) 9k') + 'measure broken = vce(q9)\n');
const circuitError = reply(PAIR.replace('4.65k', '4.65meg'));

function inputs(partial: Partial<ViewInputs>): ViewInputs {
  return { reply: undefined, lastSolved: undefined, status: 'idle', slow: false, ...partial };
}

describe('circuitSolved', () => {
  it('tells a request error (the circuit solved) from a circuit error (no operating point)', () => {
    expect(requestError.result.errors.length).toBeGreaterThan(0);
    expect(circuitSolved(requestError.result)).toBe(true);
    expect(circuitError.result.errors.length).toBeGreaterThan(0);
    expect(circuitSolved(circuitError.result)).toBe(false);
    expect(circuitSolved(solved.result)).toBe(true);
  });
});

describe('decideView', () => {
  it('shows nothing, fresh, before the first reply', () => {
    expect(decideView(inputs({}))).toEqual({ shown: undefined, stale: undefined });
  });

  it('shows the newest reply when its circuit solved', () => {
    expect(decideView(inputs({ reply: solved, lastSolved: solved }))).toEqual({ shown: solved, stale: undefined });
  });

  it('shows the newest reply, not an older one, when only a request line is broken', () => {
    // The broken measure drops that measure only; the circuit (with rca now 9k) still solved.
    const decision = decideView(inputs({ reply: requestError, lastSolved: requestError }));
    expect(decision).toEqual({ shown: requestError, stale: undefined });
    expect(requestError.result.checks.map((c) => c.pass)).toEqual([false]);
  });

  it('falls back on the last result that solved, marked stale, when the circuit did not solve', () => {
    expect(decideView(inputs({ reply: circuitError, lastSolved: solved }))).toEqual({ shown: solved, stale: 'circuit' });
  });

  it('shows the failed reply itself (its panels explain) when nothing solved before', () => {
    expect(decideView(inputs({ reply: circuitError }))).toEqual({ shown: circuitError, stale: undefined });
  });

  it('marks the shown result stale after a cancel, a worker failure, and during a long solve', () => {
    expect(decideView(inputs({ reply: solved, lastSolved: solved, status: 'cancelled' })).stale).toBe('cancelled');
    expect(decideView(inputs({ reply: solved, lastSolved: solved, status: 'failed' })).stale).toBe('failed');
    expect(decideView(inputs({ reply: solved, lastSolved: solved, status: 'solving', slow: true })).stale).toBe('solving');
    // A cancel over a fallback still shows the last result that solved.
    expect(decideView(inputs({ reply: circuitError, lastSolved: solved, status: 'cancelled' }))).toEqual({ shown: solved, stale: 'cancelled' });
  });

  it('does not mark a quick solve in progress (the panels would blink on every keystroke)', () => {
    expect(decideView(inputs({ reply: solved, lastSolved: solved, status: 'solving' })).stale).toBeUndefined();
    expect(decideView(inputs({ reply: solved, lastSolved: solved, status: 'waiting' })).stale).toBeUndefined();
  });
});
