/**
 * The solver worker: netlist text in, the §5 result and the names it defines out.
 *
 * Requests that wait are coalesced: when several arrive while the worker is busy (or before its
 * module has loaded), only the newest is solved and the older ones get no reply — the bench
 * shows only the newest text's result anyway. A solve, once started, runs to the end; the bench
 * terminates this worker when that is not worth waiting for.
 */
import { solveNetlist } from '../../../solver';
import { namesOf } from './netlist-names';
import { SeedLibrary } from './seed-library';
import type { SolveReply, SolveRequest, WorkerMessage } from './solver-protocol';

/** The worker's global scope, typed by what is used (the app compiles against the DOM library). */
interface WorkerScope {
  addEventListener(type: 'message', listener: (event: MessageEvent<SolveRequest>) => void): void;
  postMessage(message: WorkerMessage): void;
}
const scope = self as unknown as WorkerScope;

/** The seed block library shipped with the app, beside the worker script. */
const library = new SeedLibrary(new URL('library/', self.location.href));

/** The newest request not started yet. */
let waiting: SolveRequest | undefined;
let draining = false;

scope.addEventListener('message', (event: MessageEvent<SolveRequest>) => {
  if (event.data?.type !== 'solve') return;
  waiting = event.data;
  if (!draining) {
    draining = true;
    // A task later, so that requests already queued behind this one are seen first.
    setTimeout(() => void drain(), 0);
  }
});

/** Solves the newest waiting request, then the newest of any that came meanwhile. */
async function drain(): Promise<void> {
  while (waiting) {
    const request = waiting;
    waiting = undefined;
    const started = performance.now();
    await library.preload(request.text);
    if (waiting) continue; // superseded while its library blocks were fetched
    const result = solveNetlist(request.text, { resolveUse: library.resolve });
    const reply: SolveReply = { type: 'solved', id: request.id, result, text: request.text, names: namesOf(request.text, library.resolve), solveMs: performance.now() - started };
    scope.postMessage(reply);
    await new Promise((resolve) => setTimeout(resolve, 0)); // let requests sent during the solve arrive
  }
  draining = false;
}

scope.postMessage({ type: 'ready' });
