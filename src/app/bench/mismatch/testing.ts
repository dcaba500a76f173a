/**
 * For the specs: a pair with `analyze mismatch`, and a worker that runs in-process with the very
 * code the real mismatch worker runs (ChunkSolver), answering a task later as a worker would.
 */
import { RESISTOR_PAIR } from '../../../../solver/testing/pair-netlist';
import type { ChunkReply, ChunkRequest } from './mismatch-protocol';
import { ChunkSolver } from './mismatch-chunk';
import type { MismatchWorkerLike } from './mismatch-pool';

/** The solver tests' resistor-loaded pair (docs/netlist.md §6) with mismatch, a measure and checks; the analyze line is line 13. */
export function mismatchedPair(mismatch = 'runs 200 seed 1 beta 5% is 2% res 0.5%'): string {
  return `title  Mismatched pair
${RESISTOR_PAIR}analyze mismatch ${mismatch}
measure a0 = db(adm)
check a0 >= 45
check cmrr_db >= 40
`;
}

export class InProcessWorker implements MismatchWorkerLike {
  static made: InProcessWorker[] = [];
  readonly solver = new ChunkSolver();
  received: ChunkRequest[] = [];
  terminated = false;
  onmessage: ((event: MessageEvent<ChunkReply>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;

  constructor() {
    InProcessWorker.made.push(this);
  }

  postMessage(message: ChunkRequest): void {
    if (this.terminated) throw new Error('posted to a terminated worker');
    this.received.push(message);
    setTimeout(() => {
      if (this.terminated) return;
      const reply = this.solver.answer(message);
      this.onmessage?.({ data: reply } as MessageEvent<ChunkReply>);
    }, 0);
  }

  terminate(): void {
    this.terminated = true;
  }
}
